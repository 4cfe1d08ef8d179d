import { describe, expect, it } from "vitest";
import { convertExact, formatEngineering, formatIn, parseQuantity } from "@/lib/scaling/units";
import { expectClose } from "./close";

// All checks: SI prefixes per the SI Brochure (BIPM, 9th ed., 2019, Table 7) — exact decimal factors.
describe("parseQuantity(text, unit)", () => {
  it.each([
    ["20nm", "m", 2e-8],
    ["0.02 µm", "m", 2e-8],
    ["0.02 μm", "m", 2e-8],
    ["0.02um", "m", 2e-8],
    ["20 nm", "m", 2e-8],
    ["2e-8", "m", 2e-8],
    ["1.5fF", "F", 1.5e-15],
    ["1.5f", "F", 1.5e-15],
    ["2kohm", "ohm", 2000],
    ["2 kΩ", "ohm", 2000],
    ["3Mohm", "ohm", 3e6],
    ["10ps", "s", 1e-11],
    ["20m", "m", 20],
    ["5mm", "m", 5e-3],
    ["0.75V", "V", 0.75],
    ["2GHz", "Hz", 2e9],
    ["3.9", "", 3.9],
  ] as const)("%s (%s) → %d", (text, unit, expected) => {
    expectClose(parseQuantity(text, unit), expected, 1e-15);
  });
  it.each([
    ["abc", "m"],
    ["20xm", "m"],
    ["20nF", "m"],
    ["1.5fF", ""],
    ["", "m"],
    ["1e999", "m"],
  ] as const)("rejects %s as %s", (text, unit) => {
    expect(() => parseQuantity(text, unit)).toThrow(RangeError);
  });
  it("names the expected unit in the error", () => {
    expect(() => parseQuantity("20 apples", "m")).toThrow(/metres/);
  });
});

describe("formatEngineering(valueSI, unit, significant)", () => {
  it("formats exactly, never 19.999999", () => {
    expect(formatEngineering(2e-8, "m")).toBe("20 nm");
    expect(formatEngineering(0.1 + 0.2, "m")).toBe("300 mm");
    expect(formatEngineering(1.5e-15, "F")).toBe("1.5 fF");
    expect(formatEngineering(1999.9999999, "Ω")).toBe("2 kΩ");
    expect(formatEngineering(19.999999999e-9, "m")).toBe("20 nm");
    expect(formatEngineering(0, "s")).toBe("0 s");
    expect(formatEngineering(-4.2e-12, "s")).toBe("-4.2 ps");
  });
  it("formatIn and convertExact give exact decimal conversions", () => {
    expect(formatIn(2e-8, 1e-9, "nm")).toBe("20 nm");
    expect(formatIn(1.9e-10, 1e-9, "fF/µm")).toBe("0.19 fF/µm");
    expect(convertExact(2e-8, 1e-9)).toBe(20);
    expect(convertExact(7e-9, 1e-9)).toBe(7);
  });
});

describe("exact decimal scaling (common practice, no source)", () => {
  it("fromNm/fromUm round once: 24 nm is the double nearest 2.4e-8", async () => {
    const { fromNm, fromUm } = await import("@/lib/scaling/units");
    expect(fromNm(24)).toBe(2.4e-8);
    expect(24 * 1e-9).not.toBe(2.4e-8); // the naive product is one ulp off, which is why the helper exists
    expect(fromUm(0.3)).toBe(3e-7);
    expect(fromNm(0.1)).toBe(1e-10);
  });
  it("the wire-class CSV stores exact SI values", async () => {
    const { parseWireClassCsv } = await import("@/lib/import/wire-classes");
    const csv =
      "class,tier,width_nm,thickness_nm,spacing_nm,ild_below_nm,ild_above_nm,barrier_nm,metal,k,net_count,mean_length_um,driver_ohm,load_ff,activity\nm1,local,24,48,24,30,,2,Cu,2.7,100,4.1,8000,0.3,0.1\n";
    const { classes, errors } = parseWireClassCsv(csv);
    expect(errors).toEqual([]);
    expect(classes[0]?.widthM).toBe(2.4e-8);
    expect(classes[0]?.meanLengthM).toBe(4.1e-6);
    expect(classes[0]?.loadF).toBe(3e-16);
  });
});

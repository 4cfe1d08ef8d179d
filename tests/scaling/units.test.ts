import { describe, expect, it } from "vitest";
import { convertExact, formatEngineering, formatIn, parseQuantity } from "@/lib/scaling/units";
import { expectClose } from "./close";

// All checks: SI prefixes per the SI Brochure (BIPM, 9th ed., 2019, Table 7) — exact decimal factors.
describe("parseQuantity(text, unit)", () => {
  it.each([
    ["20nm", "m", 2e-8], ["0.02 µm", "m", 2e-8], ["0.02 μm", "m", 2e-8], ["0.02um", "m", 2e-8], ["20 nm", "m", 2e-8], ["2e-8", "m", 2e-8],
    ["1.5fF", "F", 1.5e-15], ["1.5f", "F", 1.5e-15], ["2kohm", "ohm", 2000], ["2 kΩ", "ohm", 2000], ["3Mohm", "ohm", 3e6], ["10ps", "s", 1e-11],
    ["20m", "m", 20], ["5mm", "m", 5e-3], ["0.75V", "V", 0.75], ["2GHz", "Hz", 2e9], ["3.9", "", 3.9],
  ] as const)("%s (%s) → %d", (text, unit, expected) => {
    expectClose(parseQuantity(text, unit), expected, 1e-15);
  });
  it.each([["abc", "m"], ["20xm", "m"], ["20nF", "m"], ["1.5fF", ""], ["", "m"], ["1e999", "m"]] as const)("rejects %s as %s", (text, unit) => {
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

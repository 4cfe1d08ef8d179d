import { readFileSync } from "node:fs";
import { describe, expect, it } from "vitest";
import { parseHistogramCsv, parseWireClassCsv, validateWireClassRow, WIRE_CLASS_COLUMNS } from "@/scaling/csv";
import { expectClose } from "./close";

// Format: shared/design/PRODUCT.md, "CSV formats" (ours; common practice, no source).
const HEADER = "class,tier,width_nm,thickness_nm,spacing_nm,ild_below_nm,ild_above_nm,barrier_nm,metal,k,net_count,mean_length_um,driver_ohm,load_ff,activity";
const ROW = "m1,local,24,48,24,30,,2,Cu,2.7,1000,4,8000,0.4,0.15";

describe("parseWireClassCsv(text)", () => {
  it("reads the Skua demo baseline", () => {
    const r = parseWireClassCsv(readFileSync("scaling/examples/skua-baseline.csv", "utf8"));
    expect(r.errors).toEqual([]);
    expect(r.classes.map((c) => c.name)).toEqual(["local", "intermediate", "semi-global", "global"]);
    expect(r.classes[3]!.ildAboveM).toBeNull();
  });
  it("converts to SI units", () => {
    const c = parseWireClassCsv(`${HEADER}\n${ROW}\n`).classes[0]!;
    expectClose(c.widthM, 24e-9, 1e-15);
    expectClose(c.meanLengthM, 4e-6, 1e-15);
    expectClose(c.loadF, 0.4e-15, 1e-15);
    expect(c.ildAboveM).toBeNull();
  });
  it("accepts BOM, CRLF, quotes, semicolons and any column order", () => {
    const cols = HEADER.split(",");
    const vals = ROW.split(",");
    const order = cols.map((_, i) => i).reverse();
    const text = "\uFEFF" + order.map((i) => `"${cols[i]}"`).join(";") + "\r\n" + order.map((i) => `"${vals[i]}"`).join(";") + "\r\n";
    const r = parseWireClassCsv(text);
    expect(r.errors).toEqual([]);
    expect(r.delimiter).toBe(";");
    expect(r.classes[0]!.name).toBe("m1");
    expectClose(r.classes[0]!.thicknessM, 48e-9, 1e-15);
  });
  it("names line, column, value and reason", () => {
    const r = parseWireClassCsv(`${HEADER}\n${ROW}\nm2,local,-5,48,24,30,,2,Cu,2.7,1000,4,8000,0.4,0.15\nm3,local,24,48,24,30,,2,Xx,0.5,1000,4,8000,0.4,1.5\n`);
    expect(r.errors).toContainEqual({ line: 3, column: "width_nm", value: "-5", message: "width_nm must be > 0" });
    expect(r.errors.find((e) => e.line === 4 && e.column === "metal")!.message).toMatch(/Cu, Al/);
    expect(r.errors.find((e) => e.line === 4 && e.column === "k")!.message).toBe("k must be >= 1");
    expect(r.errors.find((e) => e.line === 4 && e.column === "activity")!.message).toBe("activity must be <= 1");
  });
  it("reports missing columns, decimal commas, duplicates and empty planes", () => {
    expect(parseWireClassCsv("class,tier\nm1,local\n").errors.map((e) => e.column)).toContain("width_nm");
    const comma = parseWireClassCsv(`${HEADER.replaceAll(",", ";")}\n${ROW.replaceAll(",", ";").replace(";2.7;", ";2,7;")}\n`);
    expect(comma.errors[0]).toMatchObject({ line: 2, column: "k", value: "2,7" });
    const dup = parseWireClassCsv(`${HEADER}\n${ROW}\n${ROW}\n`);
    expect(dup.errors[0]).toMatchObject({ line: 3, column: "class" });
    const noPlane = parseWireClassCsv(`${HEADER}\n${ROW.replace(",30,,", ",,,")}\n`);
    expect(noPlane.errors[0]!.message).toMatch(/at least one plane/);
  });
  it("counts lines across quoted newlines", () => {
    const r = parseWireClassCsv(`${HEADER}\n"m\n1",local,24,48,24,30,,2,Cu,2.7,1000,4,8000,0.4,0.15\nm2,local,x,48,24,30,,2,Cu,2.7,1000,4,8000,0.4,0.15\n`);
    expect(r.errors[0]).toMatchObject({ line: 4, column: "width_nm" });
  });
  it("exposes the column list and a reusable row validator", () => {
    expect(WIRE_CLASS_COLUMNS.map((c) => c.name).join(",")).toBe(HEADER);
    const rec = Object.fromEntries(HEADER.split(",").map((h, i) => [h, ROW.split(",")[i]!]));
    expect(validateWireClassRow(rec, 7).wireClass!.name).toBe("m1");
    expect(validateWireClassRow({ ...rec, tier: "upper" }, 7).errors[0]).toMatchObject({ line: 7, column: "tier" });
  });
});

describe("parseHistogramCsv(text)", () => {
  it("reads the Skua histograms: 48 bins per class, counts near the net counts", () => {
    const r = parseHistogramCsv(readFileSync("scaling/examples/skua-histograms.csv", "utf8"));
    expect(r.errors).toEqual([]);
    expect(Object.keys(r.bins)).toEqual(["local", "intermediate", "semi-global", "global"]);
    for (const bins of Object.values(r.bins)) expect(bins.length).toBe(48);
    const local = r.bins["local"]!.reduce((s, b) => s + b.count, 0);
    expect(local / 1.2e6).toBeGreaterThan(0.95);
    expect(local / 1.2e6).toBeLessThan(1.05);
  });
});

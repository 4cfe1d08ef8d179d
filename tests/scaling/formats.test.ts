import fs from "node:fs";
import os from "node:os";
import path from "node:path";
import { afterAll, describe, expect, it } from "vitest";
import {
  HISTOGRAM_COLUMNS,
  HISTOGRAM_FORMAT,
  parseCell,
  resolveHeader,
  suggestColumn,
  validateHistogramRow,
  validateWireClassRow,
  WIRE_CLASS_COLUMNS,
  WIRE_CLASS_FORMAT,
} from "@/lib/scaling/formats";
import { HistogramAccumulator } from "@/lib/import/histogram-accumulator";
import { parseHistogramBins, parseHistogramCsv } from "@/lib/import/histograms";
import { ImportFatalError, type ImportIssue } from "@/lib/import/types";
import { parseWireClassCsv, parseWireClassStream } from "@/lib/import/wire-classes";
import { run } from "@/scaling/cli";

// Formats: ours (docs/csv-formats.md "CSV formats"; common practice, no source). Demo data: invented (scaling/examples/README.md).
const DEMO_CLASSES = fs.readFileSync("scaling/examples/skua-baseline.csv", "utf8");
const DEMO_HISTOGRAMS = fs.readFileSync("scaling/examples/skua-histograms.csv", "utf8");
const HEADER = "class,tier,width_nm,thickness_nm,spacing_nm,ild_below_nm,ild_above_nm,barrier_nm,metal,k,net_count,mean_length_um,driver_ohm,load_ff,activity";
const ROW = "m1,local,24,48,24,30,,2,Cu,2.7,1000,4,8000,0.4,0.15";
const record = (row: string): Record<string, string> => Object.fromEntries(HEADER.split(",").map((h, i) => [h, row.split(",")[i] ?? ""]));

describe("lib/scaling/formats: columns, header rules, row rules", () => {
  it("the wire-class columns are the templates' header, in order; the histogram columns too", () => {
    // engine 2 appends four optional via columns after the templates' columns, then the two optional air-gap columns
    // (issue 11); the templates stay valid without them
    expect(
      WIRE_CLASS_COLUMNS.slice(0, 15)
        .map((c) => c.name)
        .join(","),
    ).toBe(HEADER);
    expect(WIRE_CLASS_COLUMNS.slice(15).map((c) => [c.name, c.required])).toEqual([
      ["vias_per_net", false],
      ["via_ohm", false],
      ["via_width_nm", false],
      ["via_height_nm", false],
      ["k_gap", false],
      ["gap_fraction", false],
    ]);
    expect(DEMO_CLASSES.split("\n")[0]).toBe(HEADER);
    expect(HISTOGRAM_COLUMNS.map((c) => c.name).join(",")).toBe(DEMO_HISTOGRAMS.split("\n")[0]);
    expect(fs.readFileSync("public/templates/wire-classes-template.csv", "utf8")).toBe(DEMO_CLASSES);
    expect(fs.readFileSync("public/templates/length-histograms-template.csv", "utf8")).toBe(DEMO_HISTOGRAMS);
  });

  it("converts a row to SI exactly (decimal shift: 24 nm is the double nearest 2.4e-8)", () => {
    const c = validateWireClassRow(record(ROW.replace(",0.4,", ",0.3,").replace(",4,", ",4.1,")), 2).wireClass!;
    expect(c).toMatchObject({ name: "m1", tier: "local", metal: "Cu", ildAboveM: null, k: 2.7, netCount: 1000, driverOhm: 8000, activity: 0.15 });
    expect(c.widthM).toBe(2.4e-8);
    expect(c.thicknessM).toBe(4.8e-8);
    expect(c.ildBelowM).toBe(3e-8);
    expect(c.meanLengthM).toBe(4.1e-6);
    expect(c.loadF).toBe(3e-16);
    expect(24 * 1e-9).not.toBe(2.4e-8); // the binary product is one ulp off, which is why the shift exists
  });

  it("names line, column, value and reason for every bad cell of a row", () => {
    const r = validateWireClassRow(record("m2,upper,-5,48,24,,,2,Xx,0.5,10.5,4,8000,0.4,1.5"), 7);
    expect(r.wireClass).toBeNull();
    expect(r.errors).toEqual([
      { line: 7, column: "tier", value: "upper", message: "must be one of local, intermediate, semi-global, global" },
      { line: 7, column: "width_nm", value: "-5", message: "must be > 0" },
      { line: 7, column: "ild_below_nm", value: "", message: "is empty and so is ild_above_nm: a line needs at least one plane (below or above)" },
      { line: 7, column: "metal", value: "Xx", message: 'must be one of Cu, Al, W, Co, Ru (got "Xx")' },
      { line: 7, column: "k", value: "0.5", message: "must be ≥ 1" },
      { line: 7, column: "net_count", value: "10.5", message: "must be a whole number" },
      { line: 7, column: "activity", value: "1.5", message: "must be ≤ 1" },
    ]);
    expect(validateWireClassRow(record(ROW.replace(",24,48,24,", ",4,48,24,")), 2).errors).toEqual([
      { line: 2, column: "barrier_nm", value: "2", message: "must be < width_nm/2 and < thickness_nm" },
    ]);
    expect(
      parseCell(
        WIRE_CLASS_COLUMNS.find((c) => c.name === "k")!,
        "2,7",
      ),
    ).toEqual({ ok: false, reason: "is not a number: use a decimal point, not a comma" });
    expect(
      parseCell(
        WIRE_CLASS_COLUMNS.find((c) => c.name === "k")!,
        "1e999",
      ),
    ).toEqual({ ok: false, reason: "must be a finite number" });
  });

  it("matches tier and metal ignoring case, and keeps the metal's catalogue id", () => {
    expect(validateWireClassRow(record(ROW.replace("local,24", "LOCAL,24").replace(",Cu,", ",copper,")), 2).wireClass).toMatchObject({
      tier: "local",
      metal: "Cu",
    });
  });

  it("header: any order, case and spaces ignored; unknown, repeated and missing columns rejected with the expected list", () => {
    const ok = resolveHeader(["Count", " length um ", "CLASS"], HISTOGRAM_FORMAT);
    expect(ok.ok && [...ok.index]).toEqual([
      ["count", 0],
      ["length_um", 1],
      ["class", 2],
    ]);
    expect(resolveHeader(["class", "length_um", "count", ""], HISTOGRAM_FORMAT).ok).toBe(true); // a trailing delimiter
    expect(resolveHeader(["class", "length_um", "count", "weight"], HISTOGRAM_FORMAT)).toEqual({
      ok: false,
      issue: { line: 1, column: null, value: '"weight"', message: 'Unknown column "weight". Expected columns for length histograms: class, length_um, count.' },
    });
    expect(resolveHeader(["class", "length_um", "count", "Count"], HISTOGRAM_FORMAT)).toEqual({
      ok: false,
      issue: {
        line: 1,
        column: "count",
        value: "Count",
        message: 'Column "count" appears twice in the header. Expected columns for length histograms: class, length_um, count.',
      },
    });
    const missing = resolveHeader(["class", "tier"], WIRE_CLASS_FORMAT);
    expect(!missing.ok && missing.issue.message).toMatch(
      /^Missing required columns width_nm, thickness_nm, spacing_nm, barrier_nm, metal, k, net_count, mean_length_um, driver_ohm, load_ff, activity\. Expected columns for wire classes: class, tier, width_nm, thickness_nm, spacing_nm, ild_below_nm \(optional\)/,
    );
    const tabs = resolveHeader(["class\tlength_um\tcount"], HISTOGRAM_FORMAT);
    expect(!tabs.ok && tabs.issue.message).toMatch(/not tabs/);
  });

  it("air-gap columns (optional): set only when present; k_gap 1 … k, gap_fraction 0 … 1, bad cells named", () => {
    const plain = validateWireClassRow(record(ROW), 2).wireClass!;
    expect(["kGap", "gapFraction"].filter((k) => k in plain)).toEqual([]);
    // empty cells = absent: exactly the class a file without the columns gives
    expect(validateWireClassRow({ ...record(ROW), k_gap: "", gap_fraction: " " }, 2).wireClass).toEqual(plain);
    expect(validateWireClassRow({ ...record(ROW), k_gap: "1", gap_fraction: "0.5" }, 2).wireClass).toEqual({ ...plain, kGap: 1, gapFraction: 0.5 });
    expect(validateWireClassRow({ ...record(ROW), k_gap: "2.7" }, 2).wireClass).toEqual({ ...plain, kGap: 2.7 }); // = k
    expect(validateWireClassRow({ ...record(ROW), gap_fraction: "0" }, 2).wireClass).toEqual({ ...plain, gapFraction: 0 });
    const bad = (cells: Record<string, string>, line: number) => validateWireClassRow({ ...record(ROW), ...cells }, line);
    expect(bad({ k_gap: "2.8" }, 4)).toEqual({ wireClass: null, errors: [{ line: 4, column: "k_gap", value: "2.8", message: "must not exceed k (2.7)" }] });
    expect(bad({ k_gap: "0.9", gap_fraction: "1.2" }, 5).errors).toEqual([
      { line: 5, column: "k_gap", value: "0.9", message: "must be ≥ 1" },
      { line: 5, column: "gap_fraction", value: "1.2", message: "must be ≤ 1" },
    ]);
    expect(bad({ gap_fraction: "-0.1", k_gap: "air" }, 6).errors).toEqual([
      { line: 6, column: "k_gap", value: "air", message: expect.stringMatching(/^is not a number/) },
      { line: 6, column: "gap_fraction", value: "-0.1", message: "must be ≥ 0" },
    ]);
    // a bad k is named once, not again as a k_gap problem
    expect(bad({ k: "0.5", k_gap: "1" }, 7).errors).toEqual([{ line: 7, column: "k", value: "0.5", message: "must be ≥ 1" }]);
  });

  it("air-gap columns through the one reader: stored on the class, errors naming line and column, files without them unchanged", () => {
    const text = `${HEADER},k_gap,gap_fraction\n${ROW},1,0.6\n${ROW.replace(/^m1/, "m2")},,\n${ROW.replace(/^m1/, "m3")},1.5,\n`;
    const r = parseWireClassCsv(text);
    expect(r.ok).toBe(true);
    expect(r.classes.map((c) => [c.name, c.kGap, c.gapFraction])).toEqual([
      ["m1", 1, 0.6],
      ["m2", undefined, undefined],
      ["m3", 1.5, undefined],
    ]);
    expect(["kGap", "gapFraction"].filter((k) => k in r.classes[1]!)).toEqual([]);
    expect(parseWireClassCsv(`${HEADER}\n${ROW}\n`).classes).toEqual([r.classes[1]!].map((c) => ({ ...c, name: "m1" })));
    const bad = parseWireClassCsv(`${HEADER},gap_fraction,k_gap\n${ROW},0.5,1\n${ROW.replace(/^m1/, "m2")},1.2,3\n`);
    expect(bad.ok).toBe(false);
    expect(bad.errors).toEqual([
      { line: 3, column: "gap_fraction", value: "1.2", message: "must be ≤ 1" },
      { line: 3, column: "k_gap", value: "3", message: "must not exceed k (2.7)" },
    ]);
    expect(bad.classes).toEqual([]);
    // the command line reads them through the same reader and stops on the first problem, naming line and column
    const cli = run(["evaluate", "--baseline", file(`${HEADER},k_gap\n${ROW},2.8\n`), "--s", "1.4", "--json"]);
    expect(cli.code).toBe(2);
    expect(cli.stderr).toMatch(/line 2, column k_gap, value "2\.8": must not exceed k \(2\.7\)/);
  });

  it("histogram rows: exact SI length, whole counts, every problem named", () => {
    expect(validateHistogramRow({ class: " local ", length_um: "0.3", count: "12" }, 4)).toEqual({
      className: "local",
      bin: { lengthM: 3e-7, count: 12 },
      errors: [],
    });
    expect(validateHistogramRow({ class: "", length_um: "0", count: "-1" }, 4).errors).toEqual([
      { line: 4, column: "class", value: "", message: "is required" },
      { line: 4, column: "length_um", value: "0", message: "must be > 0" },
      { line: 4, column: "count", value: "-1", message: "must be ≥ 0" },
    ]);
    expect(validateHistogramRow({ class: "a", length_um: "1", count: "9007199254740993" }, 2).errors[0]!.message).toBe("is too large");
  });
});

// ---------------------------------------------------------------------------------------------------------------
// One reader: the command line (parseWireClassCsv / parseHistogramBins, synchronous) and the web (the streaming
// parsers, fed in chunks as an upload arrives) must give the same classes and the same errors for the same file.

const enc = new TextEncoder();
async function* chunks(text: string, size: number): AsyncGenerator<Uint8Array> {
  const bytes = enc.encode(text);
  for (let i = 0; i < bytes.length; i += size) yield bytes.subarray(i, i + size);
}
type Outcome<T> = { fatal: ImportIssue } | { result: T };
async function outcome<T>(f: () => T | Promise<T>): Promise<Outcome<T>> {
  try {
    return { result: await f() };
  } catch (e) {
    if (e instanceof ImportFatalError) return { fatal: e.issue };
    throw e;
  }
}

const lines = DEMO_CLASSES.trimEnd().split("\n");
const quoteAll = (l: string) =>
  l
    .split(",")
    .map((c) => `"${c}"`)
    .join(",");
const CLASS_FILES: [string, string, boolean][] = [
  ["the demo CSV", DEMO_CLASSES, true],
  ["the demo CSV plus one extra column", lines.map((l, i) => `${l},${i === 0 ? "colour" : "red"}`).join("\n") + "\n", false],
  ["class names that differ only in case", `${DEMO_CLASSES}${lines[1]!.replace(/^local/, "LOCAL")}\n`, false],
  ["semicolons", DEMO_CLASSES.replace(/,/g, ";"), true],
  ["a BOM", `\uFEFF${DEMO_CLASSES}`, true],
  ["CRLF line ends", DEMO_CLASSES.replace(/\n/g, "\r\n"), true],
  ["every field quoted", lines.map(quoteAll).join("\n") + "\n", true],
  ["a quoted class name with a comma", `${HEADER}\n${ROW.replace(/^m1/, '"m,1"')}\n`, true],
  // names are one line: a line break inside a quoted name is a control character (issue 12 finding 10)
  ["a quoted class name with a newline", `${HEADER}\n${ROW.replace(/^m1/, '"m,\n1"')}\n`, false],
  ["a repeated column", `${HEADER},k\n${ROW},2.7\n`, false],
  ["a row with one field too many", `${HEADER}\n${ROW},1\n`, false],
  ["a decimal comma (semicolon file)", `${HEADER.replace(/,/g, ";")}\n${ROW.replace(/,/g, ";").replace(";2.7;", ";2,7;")}\n`, false],
  ["a width above the app's 100 µm", `${HEADER}\n${ROW.replace("m1,local,24,", "m1,local,240000,")}\n`, false],
  ["an unclosed quote", `${HEADER}\n${ROW}\n"m2,local,24,48,24,30,,2,Cu,2.7,1000,4,8000,0.4,0.15\n`, false],
  ["a header only", `${HEADER}\n`, false],
];

const tmp = fs.mkdtempSync(path.join(os.tmpdir(), "plateau-formats-"));
afterAll(() => fs.rmSync(tmp, { recursive: true, force: true }));
let fileNo = 0;
const file = (text: string) => {
  const f = path.join(tmp, `f${fileNo++}.csv`);
  fs.writeFileSync(f, text);
  return f;
};

describe("one reader: command line and web give identical results", () => {
  it.each(CLASS_FILES)("wire classes, %s", async (_name, text, accepted) => {
    const cli = await outcome(() => parseWireClassCsv(text));
    for (const size of [1, 7, 4096]) expect(await outcome(() => parseWireClassStream(chunks(text, size), { maxBytes: 1 << 20 }))).toEqual(cli);
    const ok = "result" in cli && cli.result.ok;
    expect(ok).toBe(accepted);
    // the command line itself: exit 0 on the accepted files, else exit 2 naming line, column and reason of the first problem
    const r = run(["evaluate", "--baseline", file(text), "--s", "1.4", "--json"]);
    expect(r.code).toBe(accepted ? 0 : 2);
    if (accepted)
      expect(JSON.parse(r.stdout).classes.map((c: { class: string }) => c.class)).toEqual("result" in cli ? cli.result.classes.map((c) => c.name) : []);
    else {
      const first = "fatal" in cli ? cli.fatal : cli.result.errors[0]!;
      expect(r.stderr).toContain(first.message);
      if (first.line !== null) expect(r.stderr).toContain(`line ${first.line}`);
      if (first.column) expect(r.stderr).toContain(`column ${first.column}`);
      expect(r.stderr.trim().split("\n")).toHaveLength(1);
    }
  });

  it("the extra column and the case-only duplicate are rejected with the format's messages", async () => {
    const extra = await outcome(() => parseWireClassCsv(CLASS_FILES[1]![1]));
    expect("fatal" in extra && extra.fatal.message).toMatch(/^Unknown column "colour"\. Expected columns for wire classes: class, tier, width_nm/);
    const dup = parseWireClassCsv(CLASS_FILES[2]![1]);
    expect(dup.errors).toEqual([
      { line: 6, column: "class", value: "LOCAL", message: "is already defined on line 2 (class names must be unique, ignoring case)" },
    ]);
    expect(dup.classes).toEqual([]);
  });

  const names = ["local", "intermediate", "semi-global", "global"];
  const hLines = DEMO_HISTOGRAMS.trimEnd().split("\n");
  const HIST_FILES: [string, string, boolean][] = [
    ["the demo histograms", DEMO_HISTOGRAMS, true],
    ["the demo histograms plus one extra column", hLines.map((l, i) => `${l},${i === 0 ? "weight" : "1"}`).join("\n") + "\n", false],
    ["semicolons, a BOM and CRLF", `\uFEFF${DEMO_HISTOGRAMS.replace(/,/g, ";").replace(/\n/g, "\r\n")}`, true],
    ["every field quoted", hLines.map(quoteAll).join("\n") + "\n", true],
    ["an unknown class", `${DEMO_HISTOGRAMS}M7,1,1\n`, false],
    ["a class in the wrong case", `${DEMO_HISTOGRAMS}Local,1,1\n`, false],
    ["a repeated bin", `${DEMO_HISTOGRAMS}${hLines[1]}\n`, false],
    ["a fractional count", `${DEMO_HISTOGRAMS}local,1,2.5\n`, false],
  ];
  it.each(HIST_FILES)("histograms, %s", async (_name, text, accepted) => {
    const cli = await outcome(() => {
      const r = parseHistogramBins(text, names);
      return { ...r, sink: null };
    });
    for (const size of [1, 7, 4096]) {
      const web = await outcome(async () => {
        const acc = new HistogramAccumulator(names.length);
        const r = await parseHistogramCsv(chunks(text, size), names, { maxBytes: 1 << 20, sink: acc });
        const bins: Record<string, { lengthM: number; count: number }[]> = {};
        if (r.ok) for (const ci of acc.classIndices()) bins[names[ci]!] = acc.lengthBins(ci);
        return { ...r, sink: null, bins };
      });
      expect(web).toEqual(cli);
    }
    expect("result" in cli && cli.result.ok).toBe(accepted);
    const r = run(["evaluate", "--baseline", file(DEMO_CLASSES), "--histograms", file(text), "--s", "1.4", "--json"]);
    expect(r.code).toBe(accepted ? 0 : 2);
    if (accepted)
      expect(JSON.parse(r.stdout).classes.map((c: { baseline: { distribution: { source: string } } }) => c.baseline.distribution.source)).toEqual([
        "histogram",
        "histogram",
        "histogram",
        "histogram",
      ]);
    else {
      const first = "fatal" in cli ? cli.fatal : cli.result.errors[0]!;
      expect(r.stderr).toContain(first.message);
    }
  });

  it("the demo histograms: 48 bins per class in ascending length, counts near the net counts", () => {
    const r = parseHistogramBins(DEMO_HISTOGRAMS, names);
    expect(r.ok).toBe(true);
    expect(Object.keys(r.bins)).toEqual(names);
    for (const bins of Object.values(r.bins)) {
      expect(bins.length).toBe(48);
      for (let i = 1; i < bins.length; i++) expect(bins[i]!.lengthM).toBeGreaterThan(bins[i - 1]!.lengthM);
    }
    const local = r.bins["local"]!.reduce((s, b) => s + b.count, 0);
    expect(local / 1.2e6).toBeGreaterThan(0.95); // invented data: histogram totals within ±5% of net_count
    expect(local / 1.2e6).toBeLessThan(1.05);
  });
});

describe("header unit variants (issue 13 item 9)", () => {
  const header = (cells: string[]) =>
    resolveHeader(
      [
        "class",
        "tier",
        ...cells,
        "thickness_nm",
        "spacing_nm",
        "ild_below_nm",
        "ild_above_nm",
        "barrier_nm",
        "metal",
        "k",
        "net_count",
        "mean_length_um",
        "driver_ohm",
        "load_ff",
        "activity",
      ],
      WIRE_CLASS_FORMAT,
    );
  it("accepts the same unit in parentheses or brackets and any case", () => {
    for (const h of ["width (nm)", "Width_NM", "WIDTH [nm]", "width nm"]) {
      const r = header([h]);
      expect(r.ok, h).toBe(true);
      if (r.ok) expect(r.index.get("width_nm")).toBe(2);
    }
  });
  it("names the column it probably is for a unit that cannot be converted exactly, or another spelling", () => {
    for (const [h, hint] of [
      ["width_mil", "width_nm"],
      ["width", "width_nm"],
    ] as const) {
      const r = header([h]);
      expect(r.ok, h).toBe(false);
      if (!r.ok)
        expect(r.issue.message).toMatch(new RegExp(`^Unknown column "${h}" \\(did you mean ${hint}\\? Give the values in nm\\.\\)\\. Expected columns`));
    }
    expect(suggestColumn("Width (mils)", WIRE_CLASS_COLUMNS)).toBe("width_nm");
    expect(suggestColumn("driver_mohm", WIRE_CLASS_COLUMNS)).toBe("driver_ohm"); // milli or mega? not converted
    expect(suggestColumn("netcount", WIRE_CLASS_COLUMNS)).toBe("net_count");
    expect(suggestColumn("colour", WIRE_CLASS_COLUMNS)).toBeNull();
  });
  it("accepts other units of a column's family and reads the cells in that unit (issue 13 item 9)", () => {
    for (const [h, exp] of [
      ["width_um", -6],
      ["width (µm)", -6],
      ["Width [μm]", -6],
      ["width_mm", -3],
      ["width_pm", -12],
      ["width (Å)", -10],
      ["width_m", 0],
      ["width_nm", -9],
    ] as const) {
      const r = header([h]);
      expect(r.ok, h).toBe(true);
      if (r.ok) {
        expect(r.index.get("width_nm"), h).toBe(2);
        expect(r.exp10.get("width_nm"), h).toBe(exp);
      }
    }
    const all = resolveHeader(
      [
        "class",
        "tier",
        "width_um",
        "thickness (µm)",
        "spacing_um",
        "ild_below_um",
        "ild_above_um",
        "barrier_um",
        "metal",
        "k",
        "net_count",
        "mean_length_mm",
        "driver (kΩ)",
        "load_af",
        "activity",
        "via_ohm",
        "via_width_um",
        "via_height_mm",
      ],
      WIRE_CLASS_FORMAT,
    );
    expect(all.ok).toBe(true);
    if (all.ok) {
      expect(Object.fromEntries(all.exp10)).toEqual({
        width_nm: -6,
        thickness_nm: -6,
        spacing_nm: -6,
        ild_below_nm: -6,
        ild_above_nm: -6,
        barrier_nm: -6,
        k: 0,
        net_count: 0,
        mean_length_um: -3,
        driver_ohm: 3,
        load_ff: -18,
        activity: 0,
        via_ohm: 0,
        via_width_nm: -6,
        via_height_nm: -3,
      });
    }
    expect(header(["driver_kohm"]).ok).toBe(false); // width_nm is then missing: the variant names driver_ohm…
    const twice = resolveHeader(["class", "length_um", "length (nm)", "count"], HISTOGRAM_FORMAT);
    expect(twice.ok).toBe(false);
    if (!twice.ok) expect(twice.issue.message).toMatch(/^Column "length_um" appears twice in the header/);
    const h = resolveHeader(["class", "Length (mm)", "count"], HISTOGRAM_FORMAT);
    expect(h.ok && h.exp10.get("length_um")).toBe(-3);
    // unit-less and text columns take no unit variants
    expect(resolveHeader(["class", "length_um", "count_k"], HISTOGRAM_FORMAT).ok).toBe(false);
  });
  it("converts cells in another unit exactly: the same doubles as the column's own unit", () => {
    // exact: the decimal exponent is shifted in the text (parseScaled), never a float multiply (µm × 1000 → nm × 1e-9
    // would store 0.018 µm as 1.8000000000000002e-8 m)
    expect(0.018 * 1000 * 1e-9).not.toBe(1.8e-8);
    const inNm = validateWireClassRow(record(ROW), 2).wireClass!;
    const inUm = validateWireClassRow(
      {
        ...record(ROW),
        width_nm: "0.024",
        thickness_nm: "0.048",
        spacing_nm: "0.024",
        ild_below_nm: "0.03",
        barrier_nm: "0.002",
        mean_length_um: "0.004",
        driver_ohm: "8",
        load_ff: "400",
      },
      2,
      new Map([
        ["width_nm", -6],
        ["thickness_nm", -6],
        ["spacing_nm", -6],
        ["ild_below_nm", -6],
        ["barrier_nm", -6],
        ["mean_length_um", -3],
        ["driver_ohm", 3],
        ["load_ff", -18],
      ]),
    ).wireClass!;
    expect(inUm).toEqual(inNm);
    expect(validateWireClassRow({ ...record(ROW), width_nm: "0.018" }, 2, new Map([["width_nm", -6]])).wireClass!.widthM).toBe(
      validateWireClassRow({ ...record(ROW), width_nm: "18" }, 2).wireClass!.widthM,
    );
    expect(validateWireClassRow({ ...record(ROW), width_nm: "0.018" }, 2, new Map([["width_nm", -6]])).wireClass!.widthM).toBe(1.8e-8);
    // 1e-3 mm = 1 µm exactly; 317 nm = 0.317 µm exactly
    expect(validateHistogramRow({ class: "a", length_um: "1e-3", count: "1" }, 2, -3).bin).toEqual({ lengthM: 1e-6, count: 1 });
    expect(validateHistogramRow({ class: "a", length_um: "317", count: "1" }, 2, -9).bin).toEqual(
      validateHistogramRow({ class: "a", length_um: "0.317", count: "1" }, 2).bin,
    );
    expect(
      parseCell(
        WIRE_CLASS_COLUMNS.find((c) => c.name === "width_nm")!,
        "0.3",
        -6,
      ),
    ).toEqual({ ok: true, value: 3e-7 });
    // rules apply to the SI value, whatever the unit: 0 µm is still not > 0
    expect(validateWireClassRow({ ...record(ROW), width_nm: "0" }, 4, new Map([["width_nm", -6]])).errors).toEqual([
      { line: 4, column: "width_nm", value: "0", message: "must be > 0" },
    ]);
  });
});

import fs from "node:fs";
import { describe, expect, it } from "vitest";
import { detectDelimiter } from "@/lib/import/csv-stream";
import { fastScaled, parseHistogramCsv } from "@/lib/import/histograms";
import { HistogramAccumulator } from "@/lib/import/histogram-accumulator";
import { multipartField } from "@/lib/import/request-body";
import { formatScaled, HISTOGRAM_FORMAT, parseScaled, WIRE_CLASS_FORMAT } from "@/lib/scaling";
import { convertDecimalCommas } from "@/lib/import/decimal-comma";
import { invalidCsvMessage } from "@/lib/import/errors";
import { ImportFatalError, type ImportIssue } from "@/lib/import/types";
import { parseWireClassCsv, parseWireClassStream } from "@/lib/import/wire-classes";
import { mulberry32 } from "../helpers/prng";

const enc = new TextEncoder();
/** Bytes in small chunks, so multi-byte characters, CRLF and quotes are split across chunk edges. */
async function* chunks(data: string | Uint8Array, size = 7): AsyncGenerator<Uint8Array> {
  const bytes = typeof data === "string" ? enc.encode(data) : data;
  for (let i = 0; i < bytes.length; i += size) yield bytes.subarray(i, i + size);
}

const HEADER = "class,tier,width_nm,thickness_nm,spacing_nm,ild_below_nm,ild_above_nm,barrier_nm,metal,k,net_count,mean_length_um,driver_ohm,load_ff,activity";
const ROW_LOCAL = "local,local,24,48,24,30,30,2,Cu,2.7,1200000,4,8000,0.4,0.15";
const ROW_GLOBAL = "global,global,400,800,400,400,,5,Cu,3.0,4000,1500,300,5.0,0.1";
const classes = (text: string, size = 7) => parseWireClassStream(chunks(text, size), { maxBytes: 1 << 20 });
const hist = (text: string | Uint8Array, names = ["local", "global"], size = 7) =>
  parseHistogramCsv(chunks(text, size), names, { maxBytes: 1 << 20, sink: new HistogramAccumulator(names.length) });

async function fatal(p: Promise<unknown>): Promise<ImportIssue & { status: number }> {
  try {
    await p;
  } catch (e) {
    if (e instanceof ImportFatalError) return { ...e.issue, status: e.status };
    throw e;
  }
  throw new Error("expected an ImportFatalError");
}

describe("parseScaled / formatScaled", () => {
  it("converts exactly in decimal", () => {
    expect(parseScaled("24", -9)).toEqual({ ok: true, value: 2.4e-8 });
    expect(parseScaled("0.3", -6)).toEqual({ ok: true, value: 3e-7 });
    expect(parseScaled("1.5e3", -6)).toEqual({ ok: true, value: 1.5e-3 });
    expect(formatScaled(2.4e-8, -9)).toBe("24");
    expect(formatScaled(3e-7, -6)).toBe("0.3");
  });
  it("rejects non-numbers, decimal commas and non-finite values", () => {
    expect(parseScaled("abc", 0)).toEqual({ ok: false, reason: "is not a number" });
    expect(parseScaled("1,5", 0)).toEqual({ ok: false, reason: "is not a number: use a decimal point, not a comma" });
    expect(parseScaled("NaN", 0)).toEqual({ ok: false, reason: "must be a finite number" });
    expect(parseScaled("Infinity", 0)).toEqual({ ok: false, reason: "must be a finite number" });
    expect(parseScaled("1e400", 0)).toEqual({ ok: false, reason: "must be a finite number" });
    expect(parseScaled("", 0)).toEqual({ ok: false, reason: "is required" });
  });
  it("round-trips random doubles exactly through the display unit (seeded: the same 2,000 values every run)", () => {
    const random = mulberry32(20261201);
    for (let i = 0; i < 2000; i++) {
      const v = random() * 10 ** (Math.floor(random() * 10) - 12);
      const back = parseScaled(formatScaled(v, -9), -9);
      expect(back.ok && back.value).toBe(v);
    }
  });
});

describe("detectDelimiter(headerLine)", () => {
  it("uses semicolons only when the header clearly does", () => {
    expect(detectDelimiter("class;length_um;count")).toBe(";");
    expect(detectDelimiter("class,length_um,count")).toBe(",");
    expect(detectDelimiter('"a;b",c,d')).toBe(",");
  });
});

describe("parseWireClassStream (wire-class CSV)", () => {
  it("reads the engine's demo file, exactly converted to SI", async () => {
    const text = fs.readFileSync("scaling/examples/skua-baseline.csv", "utf8");
    const r = await classes(text);
    expect(r.ok).toBe(true);
    expect(r.classes.map((c) => c.name)).toEqual(["local", "intermediate", "semi-global", "global"]);
    const local = r.classes[0]!;
    expect(local.widthM).toBe(2.4e-8);
    expect(local.meanLengthM).toBe(4e-6);
    expect(local.loadF).toBe(4e-16);
    expect(r.classes[3]!.ildAboveM).toBeNull();
  });

  it("accepts a BOM, CRLF, quoted fields, a trailing newline and another column order", async () => {
    const cols = HEADER.split(",");
    const order = [...cols].reverse();
    const vals = ROW_LOCAL.split(",");
    const row = order.map((c) => vals[cols.indexOf(c)]!);
    row[order.indexOf("class")] = '"local"';
    const text = "\uFEFF" + order.join(",") + "\r\n" + row.join(",") + "\r\n";
    const r = await classes(text, 3);
    expect(r.errors).toEqual([]);
    expect(r.classes[0]!.name).toBe("local");
    expect(r.classes[0]!.widthM).toBe(2.4e-8);
  });

  it("accepts semicolons when the file uses them", async () => {
    const r = await classes(HEADER.replace(/,/g, ";") + "\n" + ROW_GLOBAL.replace(/,/g, ";") + "\n");
    expect(r.ok).toBe(true);
    expect(r.delimiter).toBe(";");
  });

  it("rejects an unknown column, listing the expected ones", async () => {
    const e = await fatal(classes(HEADER + ",colour\n" + ROW_LOCAL + ",red\n"));
    expect(e.line).toBe(1);
    expect(e.message).toContain('Unknown column "colour"');
    expect(e.message).toContain("Expected columns for wire classes: class, tier, width_nm");
  });

  it("rejects missing required columns, listing them and the expected ones", async () => {
    const e = await fatal(classes(HEADER.replace(",metal", "").replace(",k,", ",") + "\n"));
    expect(e.message).toMatch(/^Missing required columns metal, k\. Expected columns for wire classes: class, tier/);
  });

  it("rejects a repeated class name (ignoring case) on the second line", async () => {
    const r = await classes(`${HEADER}\n${ROW_LOCAL}\n${ROW_LOCAL.replace(/^local/, "LOCAL")}\n`);
    expect(r.ok).toBe(false);
    expect(r.errors).toEqual([
      { line: 3, column: "class", value: "LOCAL", message: "is already defined on line 2 (class names must be unique, ignoring case)" },
    ]);
  });

  it("names line, column, value and reason for a bad number", async () => {
    const r = await classes(`${HEADER}\n${ROW_LOCAL}\n${ROW_GLOBAL.replace("global,global,400", "global,global,-4")}\n`);
    expect(r.errors).toEqual([{ line: 3, column: "width_nm", value: "-4", message: "must be > 0" }]);
  });

  it("rejects non-finite numbers", async () => {
    const r = await classes(`${HEADER}\n${ROW_LOCAL.replace(",2.7,", ",Infinity,")}\n`);
    expect(r.errors[0]).toMatchObject({ line: 2, column: "k", value: "Infinity" });
    expect(r.errors[0]!.message).toMatch(/number/);
  });

  it("rejects an unknown metal and points at the catalogue", async () => {
    const r = await classes(`${HEADER}\n${ROW_LOCAL.replace(",Cu,", ",Unobtainium,")}\n`);
    expect(r.errors[0]).toMatchObject({ line: 2, column: "metal", value: "Unobtainium" });
    expect(r.errors[0]!.message).toContain("Cu, Al, W, Co, Ru");
    expect(r.errors[0]!.message).toContain("/help/csv#metals");
  });

  it("applies the app's limits (a width above 100 µm is a forgotten unit)", async () => {
    const r = await classes(`${HEADER}\n${ROW_LOCAL.replace("local,local,24,", "local,local,240000,")}\n`);
    expect(r.errors[0]).toMatchObject({ line: 2, column: "width_nm", value: "240000" });
    expect(r.errors[0]!.message).toContain("at most 100 µm");
  });

  it("reports a row with the wrong number of fields", async () => {
    const r = await classes(`${HEADER}\n${ROW_LOCAL},extra,more\n`);
    expect(r.errors).toEqual([{ line: 2, column: null, value: null, message: "has 17 fields, the header has 15" }]);
  });

  it("rejects an empty file and a header without rows", async () => {
    expect((await fatal(classes(""))).message).toBe("The file is empty.");
    expect((await fatal(classes("\uFEFF\r\n  \n"))).message).toBe("The file is empty.");
    expect((await fatal(classes(HEADER + "\n"))).message).toBe("The file has a header but no wire classes.");
  });

  it("rejects binary files (NUL bytes) and invalid UTF-8", async () => {
    const zip = new Uint8Array([0x50, 0x4b, 0x03, 0x04, 0x14, 0x00, 0x06, 0x00]);
    expect((await fatal(parseWireClassStream(chunks(zip), { maxBytes: 1 << 20 }))).message).toMatch(/NUL bytes: it looks like a binary file/);
    const latin1 = new Uint8Array([...enc.encode(HEADER + "\nM\xe9tal"), 0xe9, 0x0a]);
    expect((await fatal(parseWireClassStream(chunks(latin1), { maxBytes: 1 << 20 }))).message).toMatch(/not valid UTF-8/);
  });

  it("stops above the size limit with 413", async () => {
    const e = await fatal(parseWireClassStream(chunks(`${HEADER}\n${ROW_LOCAL}\n`.repeat(10)), { maxBytes: 500 }));
    expect(e.status).toBe(413);
  });
});

describe("parseHistogramCsv (length histograms)", () => {
  it("reads the demo histograms with per-class totals", async () => {
    const text = fs.readFileSync("scaling/examples/skua-histograms.csv", "utf8");
    const r = await hist(text, ["local", "intermediate", "semi-global", "global"], 4096);
    expect(r.ok).toBe(true);
    expect(r.rows).toBe(192);
    expect(r.perClass.map((c) => [c.name, c.bins])).toEqual([
      ["local", 48],
      ["intermediate", 48],
      ["semi-global", 48],
      ["global", 48],
    ]);
    expect(r.sink?.binCount(0)).toBe(48);
  });

  it("rejects an unknown class name, suggesting the known ones", async () => {
    const r = await hist("class,length_um,count\nlocal,1,2\nLocal,2,3\nM7,1,1\n");
    expect(r.errors).toEqual([
      {
        line: 3,
        column: "class",
        value: "Local",
        message: 'is not a class of this baseline (did you mean "local"? names are case-sensitive)',
      },
      { line: 4, column: "class", value: "M7", message: "is not a class of this baseline; known classes: local, global" },
    ]);
    expect(r.sink).toBeNull();
  });

  it("rejects the same class and length twice, in order or not", async () => {
    const sorted = await hist("class,length_um,count\nlocal,1,2\nlocal,1,3\n");
    expect(sorted.errors).toEqual([
      {
        line: 3,
        column: "length_um",
        value: "1",
        message: 'repeats the bin of class "local" at this length from line 2 (one row per class and length)',
      },
    ]);
    const unsorted = await hist("class,length_um,count\nlocal,5,2\nlocal,1,3\nglobal,5,1\nlocal,5.0,9\n");
    expect(unsorted.errors).toEqual([
      {
        line: 5,
        column: "length_um",
        value: "5",
        message: 'repeats the bin of class "local" at this length from line 2 (one row per class and length)',
      },
    ]);
  });

  it("rejects bad lengths and counts with line, column, value and reason", async () => {
    const r = await hist("class,length_um,count\nlocal,-4,2\nlocal,0,1\nlocal,2,1.5\nlocal,3,-1\nlocal,4,NaN\nlocal,1e999,1\nlocal,5,\n");
    expect(r.errors).toEqual([
      { line: 2, column: "length_um", value: "-4", message: "must be > 0" },
      { line: 3, column: "length_um", value: "0", message: "must be > 0" },
      { line: 4, column: "count", value: "1.5", message: "must be a whole number" },
      { line: 5, column: "count", value: "-1", message: "must be ≥ 0" },
      { line: 6, column: "count", value: "NaN", message: "must be a finite number" },
      { line: 7, column: "length_um", value: "1e999", message: "must be a finite number" },
      { line: 8, column: "count", value: "", message: "is required" },
    ]);
  });

  it("caps the listed errors but counts them all", async () => {
    let text = "class,length_um,count\n";
    for (let i = 0; i < 500; i++) text += `local,${i + 1},x\n`;
    const r = await parseHistogramCsv(chunks(text, 1000), ["local"], {
      maxBytes: 1 << 20,
      maxErrors: 200,
      sink: new HistogramAccumulator(1),
    });
    expect(r.errors.length).toBe(200);
    expect(r.errorCount).toBe(500);
  });

  it("counts physical lines across quoted fields with newlines", async () => {
    const r = await hist('class,length_um,count\n"local",1,2\n"glo\nbal",1,2\nlocal,x,1\n');
    expect(r.errors).toEqual([
      { line: 3, column: "class", value: "glo\nbal", message: "is not a class of this baseline; known classes: local, global" },
      { line: 5, column: "length_um", value: "x", message: "is not a number" },
    ]);
  });

  it("reports an unclosed quote", async () => {
    const r = await hist('class,length_um,count\nlocal,1,2\n"local,2,3\n');
    expect(r.errors[0]).toMatchObject({ line: 3, message: "a quoted field is not closed" });
  });

  it("rejects a header-only file, duplicate columns and tabs", async () => {
    expect((await fatal(hist("class,length_um,count\r\n"))).message).toBe("The file has a header but no data rows.");
    expect((await fatal(hist("class,length_um,count,count\n"))).message).toMatch(/Column "count" appears twice/);
    expect((await fatal(hist("class\tlength_um\tcount\nlocal\t1\t1\n"))).message).toMatch(/not tabs/);
  });
});

describe("histogram cells: fast path and general path agree", () => {
  it("fastScaled gives exactly parseScaled's value for plain decimals, and NaN for everything it leaves to the general path", () => {
    let seed = 12345;
    const rnd = (n: number) => ((seed = (seed * 1103515245 + 12345) % 2147483648), seed % n);
    for (let i = 0; i < 20_000; i++) {
      const intDigits = rnd(9);
      const fracDigits = rnd(7);
      let t = "";
      for (let d = 0; d < intDigits; d++) t += String(rnd(10));
      if (fracDigits > 0 || rnd(4) === 0) t += ".";
      for (let d = 0; d < fracDigits; d++) t += String(rnd(10));
      if (!/\d/.test(t)) continue;
      for (const exp of [-6, 0]) {
        const slow = parseScaled(t, exp);
        expect(slow.ok, t).toBe(true);
        expect(fastScaled(t, exp), `${t} e${exp}`).toBe(slow.ok ? slow.value : NaN);
      }
    }
    expect(fastScaled("0.3", -6)).toBe(3e-7);
    expect(fastScaled("123456789012345", 0)).toBe(123456789012345);
    for (const t of ["", ".", "1.2.3", "-4", "+4", " 4", "4 ", "1e3", "1,5", "NaN", "Infinity", "1234567890123456", "0x10"])
      expect(fastScaled(t, -6), t).toBeNaN();
  });

  it("cells outside the fast path are read as before (spaces, signs, exponents), and sorted by length for storage", async () => {
    const r = await hist("class,length_um,count\nlocal, 5 ,+3\nlocal,1e0,2.0\nlocal,0.5,007\nglobal,2.50,1\n");
    expect(r.errors).toEqual([]);
    const acc = r.sink!;
    const local = acc.sorted(0);
    expect([...local.lengthsM]).toEqual([5e-7, 1e-6, 5e-6]);
    expect([...local.counts]).toEqual([7, 2, 3]);
    expect([...acc.sorted(1).lengthsM]).toEqual([2.5e-6]);
    expect(r.perClass.map((c) => [c.name, c.bins, c.nets])).toEqual([
      ["local", 3, 12],
      ["global", 1, 1],
    ]);
  });

  it("names the first line of a length for every repeat, in order or not", async () => {
    const asc = await hist("class,length_um,count\nlocal,1,2\nlocal,1,3\nlocal,1,4\n");
    expect(asc.errors.map((e) => [e.line, e.message])).toEqual([
      [3, 'repeats the bin of class "local" at this length from line 2 (one row per class and length)'],
      [4, 'repeats the bin of class "local" at this length from line 2 (one row per class and length)'],
    ]);
    const mixed = await hist("class,length_um,count\nlocal,9,1\nlocal,2,1\nglobal,9,1\nlocal,9.0,1\nlocal,3,1\nlocal,9,1\nlocal,2,1\n");
    expect(mixed.errors).toEqual([
      {
        line: 5,
        column: "length_um",
        value: "9",
        message: 'repeats the bin of class "local" at this length from line 2 (one row per class and length)',
      },
      {
        line: 7,
        column: "length_um",
        value: "9",
        message: 'repeats the bin of class "local" at this length from line 2 (one row per class and length)',
      },
      {
        line: 8,
        column: "length_um",
        value: "2",
        message: 'repeats the bin of class "local" at this length from line 3 (one row per class and length)',
      },
    ]);
    expect(mixed.sink).toBeNull();
  });

  it("the quote-free fast lane gives exactly what the papaparse path gives (errors, lines, totals, bins)", async () => {
    const names = ["local", "global", "M 3"];
    let body = "";
    let seed = 7;
    const rnd = (n: number) => ((seed = (seed * 1103515245 + 12345) % 2147483648), seed % n);
    const cells = ["1", "2.5", "0.3", "10", "0", "-1", "1e2", " 4", "4 ", "x", "", "1.5", "007", "3.", ".5", "99999999999999999"];
    const classes = ["local", "local", "local", "global", "global", "M 3", "'M 3", "Local", "", "nope"];
    for (let i = 0; i < 3000; i++) {
      const r = rnd(40);
      if (r === 0)
        body += "\n"; // blank line
      else if (r === 1)
        body += `local,${i + 1},2,\n`; // trailing delimiter
      else if (r === 2)
        body += `local,${i + 1}\n`; // too few fields
      else if (r === 3)
        body += `global,${i},1,1,1\n`; // too many
      else if (r === 4) body += "   \n";
      else
        body += `${classes[rnd(classes.length)]},${rnd(3) ? String(rnd(500) + 1) : cells[rnd(cells.length)]},${rnd(3) ? String(rnd(1000)) : cells[rnd(cells.length)]}\n`;
    }
    const variants: [string, string][] = [
      ["class,length_um,count", body],
      ["count;class;length_um", body.replace(/^([^,\n]*),([^,\n]*),([^,\n]*)/gm, "$3;$1;$2").replace(/,/g, ";")],
      ["class,length_um,count", body.replace(/\n/g, "\r\n")],
    ];
    for (const [head, text] of variants) {
      for (const size of [5, 4096, 65536]) {
        const run = async (tapped: boolean) => {
          const acc = new HistogramAccumulator(names.length);
          const r = await parseHistogramCsv(
            chunks(`${head}\n${text}`.replace(/\n/g, text.includes("\r\n") ? "\r\n" : "\n").replace(/\r\r/g, "\r"), size),
            names,
            {
              maxBytes: 1 << 24,
              maxErrors: 100_000,
              sink: acc,
              ...(tapped ? { tap: { row: () => undefined } } : {}), // a row tap turns the fast lane off
            },
          );
          return { ...r, sink: null, bins: names.map((_, i) => [...acc.sorted(i).lengthsM, ...acc.sorted(i).counts]) };
        };
        const fast = await run(false);
        const slow = await run(true);
        expect(fast.errorCount).toBeGreaterThan(100);
        expect(fast.perClass.length).toBe(3);
        expect(fast).toEqual(slow);
      }
    }
  });

  it("rejects counts whose sum a stored histogram cannot hold exactly", async () => {
    const r = await hist("class,length_um,count\nlocal,1,9007199254740991\nlocal,2,1\nglobal,1,9007199254740991\n");
    expect(r.errors).toEqual([
      {
        line: null,
        column: "count",
        value: null,
        message: 'The counts of class "local" add up to more than 9,007,199,254,740,991 nets, more than a histogram can hold.',
      },
    ]);
    expect(r.sink).toBeNull();
  });

  it("collects many unsorted bins in ascending order with their counts", async () => {
    let text = "class,length_um,count\n";
    const n = 5000;
    for (let i = 0; i < n; i++) text += `local,${((i * 7919) % n) + 1},${i}\n`;
    const r = await hist(text, ["local", "global"], 4096);
    expect(r.ok).toBe(true);
    const s = r.sink!.sorted(0);
    expect(s.lengthsM.length).toBe(n);
    for (let k = 0; k < n; k++) {
      expect(s.lengthsM[k]).toBe(Number(`${k + 1}e-6`));
      // row i holds length ((i*7919) % n) + 1 and count i
      expect((Number(s.counts[k]) * 7919) % n).toBe(k);
    }
  });
});

describe("multipartField(source, boundary, field)", () => {
  it("extracts the file field across chunk edges and ignores other fields", async () => {
    const b = "----plateau123";
    const body =
      `--${b}\r\nContent-Disposition: form-data; name="note"\r\n\r\nhello\r\n` +
      `--${b}\r\nContent-Disposition: form-data; name="file"; filename="h.csv"\r\nContent-Type: text/csv\r\n\r\n` +
      `class,length_um,count\r\nlocal,1,2\r\n--not-the-boundary\r\n` +
      `\r\n--${b}--\r\n`;
    for (const size of [1, 5, 13, 1000]) {
      let out = "";
      const dec = new TextDecoder();
      for await (const c of multipartField(chunks(body, size), b, "file")) out += dec.decode(c, { stream: true });
      expect(out).toBe("class,length_um,count\r\nlocal,1,2\r\n--not-the-boundary\r\n");
    }
  });
});

describe("readCsv limits on pathological input", () => {
  it("rejects a first line longer than 64 KiB (not a CSV header)", async () => {
    const e = await fatal(hist("x".repeat(200_000), ["local"], 65536));
    expect(e).toMatchObject({ line: 1, message: "The first line is longer than 64 KiB: this does not look like a CSV header." });
  });
  it("rejects a record longer than 1 MiB (an unclosed quote) without quadratic re-parsing", async () => {
    const t0 = performance.now();
    const text = `class,length_um,count\nlocal,1,2\n"local,2,3\n${"local,3,4\n".repeat(300_000)}`;
    const e = await fatal(parseHistogramCsv(chunks(text, 65536), ["local"], { maxBytes: 64 << 20, sink: new HistogramAccumulator(1) }));
    expect(e).toMatchObject({
      line: 3,
      message: "Line 3 starts a record longer than 1 MiB: a quote is probably not closed, or this is not a CSV file.",
    });
    expect(performance.now() - t0).toBeLessThan(5000);
  });
});

// Issue 13 item 8: a file with decimal commas gets ONE issue naming the cause and the fix, not one per cell or row.
describe("decimal commas (issue 13 item 8)", () => {
  const TEMPLATE = fs.readFileSync("public/templates/wire-classes-template.csv", "utf8");
  const HIST_TEMPLATE = fs.readFileSync("public/templates/length-histograms-template.csv", "utf8");
  /** The file a spreadsheet in a decimal-comma locale saves: semicolons between fields, commas in numbers. */
  const semicolonCommas = (text: string) => text.replace(/,/g, ";").replace(/(\d)\.(\d)/g, "$1,$2");
  const decimalCells = (text: string) => (text.match(/\d\.\d/g) ?? []).length;

  it("a semicolon file with decimal commas: one issue with the count, the first cell and the fix", async () => {
    const text = semicolonCommas(TEMPLATE);
    const r = await classes(text);
    expect(r.ok).toBe(false);
    expect(r.errorCount).toBe(1);
    expect(r.errors).toHaveLength(1);
    const cells = decimalCells(TEMPLATE);
    expect(cells).toBeGreaterThan(5);
    expect(r.errors[0]).toMatchObject({ line: null, column: "k", value: "2,7" });
    expect(r.errors[0]!.message).toBe(
      `The file writes numbers with a decimal comma: ${cells} cells such as "2,7" (line 2, k). Plateau reads numbers with a decimal point (2.7, not 2,7). Convert the file in the import preview ("Convert to decimal points" rewrites it comma-separated with decimal points, exactly), or save it from your spreadsheet with "." as the decimal separator.`,
    );
    expect(r.decimalCommas).toEqual({ cells, splitRows: 0, first: { line: 2, column: "k", value: "2,7" }, convertible: true });
    // the server's 400 message is that one issue (lib/import/errors.ts)
    expect(invalidCsvMessage(r.errors, r.errorCount)).toBe(`${r.errors[0]!.message} Nothing was stored.`);
    // the command line's synchronous reader says the same
    expect(parseWireClassCsv(text).errors).toEqual(r.errors);
  });

  it("histograms: a semicolon file with decimal commas gets one issue too (fast lane and papaparse path alike)", async () => {
    const text = semicolonCommas(HIST_TEMPLATE);
    const names = ["local", "intermediate", "semi-global", "global"];
    for (const size of [7, 1 << 16]) {
      const r = await hist(text, names, size);
      expect(r.errorCount).toBe(1);
      expect(r.errors[0]).toMatchObject({ line: null, column: "length_um", value: "0,317" });
      expect(r.errors[0]!.message).toMatch(/^The file writes numbers with a decimal comma: \d+ cells such as "0,317" \(line 2, length_um\)\./);
      expect(r.decimalCommas?.cells).toBe(decimalCells(HIST_TEMPLATE));
    }
  });

  it("a stray decimal comma splitting a comma-separated row: one issue instead of 'has 16 fields'", async () => {
    const r = await classes(`${HEADER}\n${ROW_LOCAL.replace(",2.7,", ",2,7,")}\n${ROW_GLOBAL.replace(",5.0,", ",5,0,")}\n`);
    expect(r.errorCount).toBe(1);
    expect(r.errors.some((e) => e.message === "has 16 fields, the header has 15")).toBe(false);
    expect(r.errors[0]).toMatchObject({ line: null, column: null, value: "2,7" });
    expect(r.errors[0]!.message).toBe(
      '2 rows have more fields than the header: probably numbers written with a decimal comma, split into two fields in a comma-separated file (the first: line 2 has 16 fields, the header has 15; "2,7"). Plateau reads numbers with a decimal point (2.7, not 2,7): write them so, or save the file from your spreadsheet with "." as the decimal separator.',
    );
    expect(r.decimalCommas).toMatchObject({ splitRows: 2, cells: 0, convertible: false });
    const h = await hist("class,length_um,count\nlocal,0,5,10\nlocal,1,25,3\n");
    expect(h.errorCount).toBe(1);
    expect(h.errors[0]).toMatchObject({ line: null, value: "0,5" });
    expect(h.errors[0]!.message).toMatch(
      /^2 rows have more fields than the header: .* \(the first: line 2 has 4 fields, the header has 3; "0,5"\)\. Plateau reads numbers with a decimal point \(0\.5, not 0,5\)/,
    );
    // a row that also reads as one field too many says so
    const extra = await classes(`${HEADER}\n${ROW_LOCAL},1\n`);
    expect(extra.errors).toHaveLength(1);
    expect(extra.errors[0]!.message).toMatch(
      /^Line 2 has 16 fields, the header has 15: probably a number written with a decimal comma \("4,8000"\), split into two fields in a comma-separated file, or a field too many at the end\. /,
    );
  });

  it("other errors stay listed after the one decimal-comma issue; rows split for other reasons keep their message", async () => {
    const r = await classes(
      `${HEADER}\n${ROW_LOCAL.replace(",2.7,", ",2,7,")}\n${ROW_GLOBAL.replace(",Cu,", ",Xx,")}\n${ROW_LOCAL.replace(/^local,/, "m2,")},extra,more\n`,
    );
    expect(r.errorCount).toBe(3);
    expect(r.errors.map((e) => [e.line, e.column])).toEqual([
      [null, null],
      [3, "metal"],
      [4, null],
    ]);
    expect(r.errors[2]!.message).toBe("has 17 fields, the header has 15");
    // a text comma is not a decimal comma: an unquoted class name with a comma keeps the field-count message
    const t = await classes(`${HEADER}\n${ROW_LOCAL.replace(/^local,/, "m1, top,")}\n`);
    expect(t.errors).toEqual([{ line: 2, column: null, value: null, message: "has 16 fields, the header has 15" }]);
    expect(t.decimalCommas).toBeNull();
  });

  it("convertDecimalCommas rewrites a semicolon file exactly: comma-separated, decimal points, text quoted where needed", async () => {
    const semi = semicolonCommas(TEMPLATE);
    const converted = convertDecimalCommas(semi, WIRE_CLASS_FORMAT);
    expect(converted).toBe(TEMPLATE); // the template has no text commas: exactly the original file
    const r = await classes(converted);
    expect(r.ok).toBe(true);
    expect(r.classes).toEqual((await classes(TEMPLATE)).classes);
    // strings, not floats: every digit kept, nothing rounded; text cells with commas or quotes quoted; CRLF kept
    const odd =
      "class;tier;width_nm;thickness_nm;spacing_nm;ild_below_nm;ild_above_nm;barrier_nm;metal;k;net_count;mean_length_um;driver_ohm;load_ff;activity\r\n" +
      'M1, "top";local;24,000;48;24;30;30;2;Cu;2,7000000000000000000001;1200000;4;8000;0,1000000000000000055511151231257827;1,5E-1\r\n' +
      "9,5;local;24;48;24;30;30;2;Cu;2,7;1200000;4;8000;-0,4;,15\r\n";
    expect(convertDecimalCommas(odd, WIRE_CLASS_FORMAT)).toBe(
      "class,tier,width_nm,thickness_nm,spacing_nm,ild_below_nm,ild_above_nm,barrier_nm,metal,k,net_count,mean_length_um,driver_ohm,load_ff,activity\r\n" +
        '"M1, ""top""",local,24.000,48,24,30,30,2,Cu,2.7000000000000000000001,1200000,4,8000,0.1000000000000000055511151231257827,1.5E-1\r\n' +
        '"9,5",local,24,48,24,30,30,2,Cu,2.7,1200000,4,8000,-0.4,.15\r\n',
    );
    // histograms, with a BOM and a header in µm's other spelling
    expect(convertDecimalCommas("\uFEFFclass;length (µm);count\nlocal;0,317;3553\n", HISTOGRAM_FORMAT)).toBe("class,length (µm),count\nlocal,0.317,3553\n");
  });
});

// Issue 13 item 9: headers in another unit of the column's family are read in that unit, converted exactly.
describe("header unit variants through the reader (issue 13 item 9)", () => {
  it("a wire-class file in µm, mm, kΩ and aF gives exactly the classes of the same file in nm, µm, Ω and fF", async () => {
    const other =
      "class,tier,width (µm),thickness_um,spacing_um,ild_below_um,ild_above_um,barrier_um,metal,k,net_count,mean_length_mm,driver (kΩ),load_af,activity\n" +
      "local,local,0.024,0.048,0.024,0.03,0.03,0.002,Cu,2.7,1200000,0.004,8,400,0.15\n" +
      "global,global,0.4,0.8,0.4,0.4,,0.005,Cu,3.0,4000,1.5,0.3,5000,0.1\n";
    const r = await classes(other);
    expect(r.errors).toEqual([]);
    expect(r.classes).toEqual((await classes(`${HEADER}\n${ROW_LOCAL}\n${ROW_GLOBAL}\n`)).classes);
    // 0.018 µm → 18 nm exactly (no float multiply: 0.018 * 1000 * 1e-9 = 1.8000000000000002e-8)
    const w = await classes(
      `${HEADER.replace("width_nm", "width_um")}\n${ROW_LOCAL.replace("local,local,24,", "local,local,0.018,").replace(",2,Cu,", ",0,Cu,")}\n`,
    );
    expect(w.classes[0]!.widthM).toBe(1.8e-8);
  });

  it("histograms in nm or mm: the same bins as in µm, on the fast lane and the papaparse path, exactly", async () => {
    const um = "class,length_um,count\nlocal,0.317,3553\nlocal,0.354,4679\nlocal,1,7\n";
    const nm = "class,length_nm,count\nlocal,317,3553\nlocal,354,4679\nlocal,1000,7\n";
    const mm = 'class,"Length (mm)",count\nlocal,0.000317,3553\nlocal,3.54e-4,4679\nlocal,1e-3,7\n';
    const bins = async (text: string, size: number) => {
      const acc = new HistogramAccumulator(1);
      const r = await parseHistogramCsv(chunks(text, size), ["local"], { maxBytes: 1 << 20, sink: acc });
      expect(r.errors).toEqual([]);
      return acc.lengthBins(0);
    };
    const want = await bins(um, 1 << 16);
    expect(want.map((b) => b.lengthM)).toEqual([3.17e-7, 3.54e-7, 1e-6]);
    for (const size of [5, 1 << 16]) {
      expect(await bins(nm, size)).toEqual(want);
      expect(await bins(mm, size)).toEqual(want);
    }
  });
});

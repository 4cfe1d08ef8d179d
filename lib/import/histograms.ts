import { formatScaled, type LengthBin } from "@/lib/scaling/client";
import { HISTOGRAM_FORMAT, validateHistogramRow } from "@/lib/scaling/formats";
import { readCsv, readCsvSync, type CsvConsumer, type CsvReadOptions, type CsvReadResult, type Delimiter } from "./csv-stream";
import { DecimalCommas, type DecimalCommaFinding } from "./decimal-comma";
import { resolveHeader, unneutralise } from "./header";
import { HistogramAccumulator } from "./histogram-accumulator";
import { MAX_IMPORT_BYTES, MAX_LISTED_ERRORS } from "./limits";
import { ImportFatalError, IssueList, type ImportIssue } from "./types";

export interface ClassTotal {
  name: string;
  bins: number;
  nets: number;
  minLengthM: number;
  maxLengthM: number;
}

/**
 * Where validated rows go: the server's HistogramAccumulator (typed arrays per class), or the
 * browser preview's. `findRepeats`, when present, finds repeated lengths of classes whose rows did
 * not ascend (ascending repeats are caught while reading).
 */
export interface HistogramSink {
  push(classIndex: number, lengthM: number, count: number, line: number): void;
  findRepeats?(classIndex: number, found: (line: number, firstLine: number, lengthM: number) => void): void;
}

export interface HistogramParse<S extends HistogramSink = HistogramSink> {
  ok: boolean;
  errors: ImportIssue[];
  errorCount: number;
  rows: number;
  bytes: number;
  delimiter: Delimiter;
  perClass: ClassTotal[];
  /** The sink holding the validated rows (only when ok). */
  sink: S | null;
  /** Decimal commas found (reported as one issue instead of one per cell or row), or null. */
  decimalCommas: DecimalCommaFinding | null;
}

const POW10 = [1, 1e1, 1e2, 1e3, 1e4, 1e5, 1e6, 1e7, 1e8, 1e9, 1e10, 1e11, 1e12, 1e13, 1e14, 1e15, 1e16, 1e17, 1e18, 1e19, 1e20, 1e21, 1e22];

/**
 * Fast path of parseScaled for the common cell: an unsigned plain decimal ("12", "0.25", "5.", ".5")
 * with at most 15 digits and nothing else (no sign, exponent or spaces). The mantissa is then an
 * exact integer and 10^k an exact double (k ≤ 22), so one IEEE division (or multiplication) gives the
 * correctly rounded value — exactly what parseScaled's decimal shift gives. NaN: use the general path.
 */
export function fastScaled(s: string, exp10: number): number {
  return fastScaledAt(s, 0, s.length, exp10);
}

/** fastScaled of the cell text[start, end), read in place. */
export function fastScaledAt(text: string, start: number, end: number, exp10: number): number {
  if (end <= start || end - start > 16) return NaN;
  let m = 0;
  let frac = 0;
  let digits = 0;
  let dot = false;
  for (let i = start; i < end; i++) {
    const c = text.charCodeAt(i);
    if (c >= 48 && c <= 57) {
      m = m * 10 + (c - 48);
      digits += 1;
      if (dot) frac += 1;
    } else if (c === 46 && !dot) dot = true;
    else return NaN;
  }
  if (digits === 0 || digits > 15) return NaN;
  const k = frac - exp10;
  if (k === 0) return m;
  if (k > 0) return k <= 22 ? m / POW10[k]! : NaN;
  return -k <= 22 ? m * POW10[-k]! : NaN;
}

export type HistogramParseOptions<S extends HistogramSink> = CsvReadOptions & { sink: S; maxErrors?: number };

/**
 * Stream-parse and validate a histogram CSV against the baseline's class names (web uploads and the
 * browser preview). Valid rows go to the sink; nothing touches the database. Duplicated (class,
 * length) pairs are errors: a bin is one row. Checked on the fly while each class's lengths ascend
 * (the usual export order); otherwise at the end by the sink (`findRepeats`) for the classes that did not.
 * Throws ImportFatalError for a file that cannot be read at all (empty, binary, not UTF-8, too large, bad header).
 */
export async function parseHistogramCsv<S extends HistogramSink>(
  source: AsyncIterable<Uint8Array>,
  classNames: readonly string[],
  opts: HistogramParseOptions<S>,
): Promise<HistogramParse<S>> {
  const p = histogramPipeline(classNames, opts.sink, opts.maxErrors ?? MAX_LISTED_ERRORS);
  return p.finish(await readCsv(source, p.consumer, opts));
}

/**
 * parseHistogramCsv over text or bytes in memory, synchronously (the command line, the demo seeder, the engine's
 * tests): the same reader and rules.
 */
export function parseHistogramCsvSync<S extends HistogramSink>(
  input: string | Uint8Array,
  classNames: readonly string[],
  opts: Partial<CsvReadOptions> & { sink: S; maxErrors?: number },
): HistogramParse<S> {
  const p = histogramPipeline(classNames, opts.sink, opts.maxErrors ?? MAX_LISTED_ERRORS);
  return p.finish(readCsvSync(input, p.consumer, { ...opts, maxBytes: opts.maxBytes ?? MAX_IMPORT_BYTES }));
}

/**
 * parseHistogramCsvSync into bins per class name, each in ascending length order (empty until `ok`): the command
 * line and the demo seeder.
 */
export function parseHistogramBins(
  input: string | Uint8Array,
  classNames: readonly string[],
  opts: Partial<CsvReadOptions> & { maxErrors?: number } = {},
): HistogramParse<HistogramAccumulator> & { bins: Record<string, LengthBin[]> } {
  const acc = new HistogramAccumulator(classNames.length);
  const r = parseHistogramCsvSync(input, classNames, { ...opts, sink: acc });
  const bins: Record<string, LengthBin[]> = {};
  if (r.ok) for (const ci of acc.classIndices()) bins[classNames[ci]!] = acc.lengthBins(ci);
  return { ...r, bins };
}

/**
 * The one histogram pipeline, as a reader consumer: header by the format's rules (lib/scaling/formats.ts), rows by
 * validateHistogramRow (exact SI values; every message the format's own), class names against the baseline's.
 * The usual row — the same class as the row before, plain valid numbers — is taken by a hand-written fast path
 * (fastScaled, and `plainRecord` reading the cells in place) that gives exactly the general path's values;
 * anything else (signs, exponents, spaces, bad values, a new class) takes the general path.
 */
function histogramPipeline<S extends HistogramSink>(
  classNames: readonly string[],
  sink: S,
  maxErrors: number,
): { consumer: CsvConsumer; finish(res: CsvReadResult): HistogramParse<S> } {
  const issues = new IssueList(maxErrors);
  const classIndex = new Map(classNames.map((n, i) => [n, i]));
  const lowerIndex = new Map(classNames.map((n) => [n.toLowerCase(), n]));
  // per-class totals in typed arrays (touched once per row)
  const bins = new Float64Array(classNames.length);
  const nets = new Float64Array(classNames.length);
  const minLength = new Float64Array(classNames.length).fill(Infinity);
  const maxLength = new Float64Array(classNames.length);
  const lastLength = new Float64Array(classNames.length).fill(-1);
  const lastLine = new Uint32Array(classNames.length);
  const unsorted = new Set<number>();
  let colCls = 0;
  let colLen = 1;
  let colCnt = 2;
  let width = 3;
  /** Power of ten of the length unit the header gives (length_um: -6; length_nm, length_mm… are converted exactly). */
  let lenExp = -6;
  const commas = new DecimalCommas();
  /** Issues of a row, except decimal commas (counted, for one issue about the whole file). */
  const addRowIssue = (e: ImportIssue) => {
    if (!(e.column !== null && e.column !== "class" && commas.cell(e))) issues.add(e);
  };
  // the class cell usually repeats row after row: remember the last known one
  let lastRawName: string | null = null;
  let lastCi = -1;
  let delimiter: string = ",";

  /** A valid row: the repeat check, then order, totals, sink. */
  const take = (ci: number, lengthM: number, count: number, line: number, lenText: string) => {
    if (lengthM === lastLength[ci]) {
      issues.add({
        line,
        column: "length_um",
        value: lenText,
        message: `repeats the bin of class "${classNames[ci]}" at this length from line ${lastLine[ci]} (one row per class and length)`,
      });
      return;
    }
    if (lengthM < lastLength[ci]!) unsorted.add(ci);
    lastLength[ci] = lengthM;
    lastLine[ci] = line;
    bins[ci]! += 1;
    nets[ci]! += count;
    if (lengthM < minLength[ci]!) minLength[ci] = lengthM;
    if (lengthM > maxLength[ci]!) maxLength[ci] = lengthM;
    sink.push(ci, lengthM, count, line);
  };

  const consumer: CsvConsumer = {
    header(h) {
      const { index: idx, exp10 } = resolveHeader(h.fields, HISTOGRAM_FORMAT);
      lenExp = exp10.get("length_um") ?? -6;
      colCls = idx.get("class")!;
      colLen = idx.get("length_um")!;
      colCnt = idx.get("count")!;
      width = h.fields.length;
      delimiter = h.delimiter;
    },
    malformed(line, message) {
      issues.add({ line, column: null, value: null, message });
    },
    row(f, line) {
      if (f.length !== width && !(f.length === width + 1 && f[width] === "")) {
        if (
          commas.splitRow(
            f,
            width,
            line,
            (g) => validateHistogramRow({ class: g[colCls]!, length_um: g[colLen]!, count: g[colCnt]! }, line, lenExp).errors.length === 0,
          )
        )
          return;
        issues.add({ line, column: null, value: null, message: `has ${f.length} fields, the header has ${width}` });
        return;
      }
      const rawName = f[colCls]!;
      const lenText = f[colLen]!;
      const cntText = f[colCnt]!;
      // the class: the same cell as the row before, or looked up (and remembered when known)
      let ci: number | undefined;
      if (rawName === lastRawName) ci = lastCi;
      else {
        ci = classIndex.get(unneutralise(rawName.trim()));
        if (ci !== undefined) {
          lastRawName = rawName;
          lastCi = ci;
        }
      }
      if (ci !== undefined) {
        // fast path: exactly parseCell's values for plain decimals (tests/lib/csv-import.test.ts)
        const lengthM = fastScaled(lenText, lenExp);
        const count = fastScaled(cntText, 0);
        if (lengthM > 0 && Number.isInteger(count)) {
          take(ci, lengthM, count, line, lenText);
          return;
        }
      }
      // general path: the format's row rules and messages
      const r = validateHistogramRow({ class: unneutralise(rawName.trim()), length_um: lenText, count: cntText }, line, lenExp);
      if (ci === undefined && r.className !== "") {
        const near = lowerIndex.get(r.className.toLowerCase());
        const known = classNames.length
          ? classNames.slice(0, 12).join(", ") + (classNames.length > 12 ? ", …" : "")
          : "(the baseline has no classes yet: import the wire classes first)";
        issues.add({
          line,
          column: "class",
          value: rawName,
          message: near
            ? `is not a class of this baseline (did you mean "${near}"? names are case-sensitive)`
            : `is not a class of this baseline; known classes: ${known}`,
        });
      }
      for (const e of r.errors) addRowIssue(e);
      if (ci === undefined || r.bin === null) return;
      take(ci, r.bin.lengthM, r.bin.count, line, lenText);
    },
    plainRecord(text, start, end, line) {
      // The usual row, read in place: three cells, the same class as the row before, both numbers
      // plain and valid, no repeat. Anything else returns false and goes through row() above.
      if (width !== 3) return false;
      const d1 = text.indexOf(delimiter, start);
      if (d1 === -1 || d1 >= end) return false;
      const d2 = text.indexOf(delimiter, d1 + 1);
      if (d2 === -1 || d2 >= end) return false;
      let e3 = end;
      const d3 = text.indexOf(delimiter, d2 + 1);
      if (d3 !== -1 && d3 < end) {
        if (d3 !== end - 1) return false;
        e3 = d3; // a trailing delimiter: a fourth, empty field
      }
      const cs = colCls === 0 ? start : colCls === 1 ? d1 + 1 : d2 + 1;
      const ce = colCls === 0 ? d1 : colCls === 1 ? d2 : e3;
      if (lastRawName === null || ce - cs !== lastRawName.length || !text.startsWith(lastRawName, cs)) return false;
      const ci = lastCi;
      const lengthM =
        colLen === 0 ? fastScaledAt(text, start, d1, lenExp) : colLen === 1 ? fastScaledAt(text, d1 + 1, d2, lenExp) : fastScaledAt(text, d2 + 1, e3, lenExp);
      if (!(lengthM > 0) || lengthM === lastLength[ci]) return false;
      const count = colCnt === 0 ? fastScaledAt(text, start, d1, 0) : colCnt === 1 ? fastScaledAt(text, d1 + 1, d2, 0) : fastScaledAt(text, d2 + 1, e3, 0);
      if (!Number.isInteger(count)) return false;
      take(ci, lengthM, count, line, "");
      return true;
    },
  };

  const finish = (res: CsvReadResult): HistogramParse<S> => {
    if (res.rows === 0 && issues.total === 0) {
      throw new ImportFatalError({ line: 2, column: null, value: null, message: "The file has a header but no data rows." });
    }
    if (unsorted.size > 0 && sink.findRepeats) findUnsortedDuplicates(sink, unsorted, classNames, issues, lenExp);
    for (let i = 0; i < classNames.length; i++) {
      if (nets[i]! > Number.MAX_SAFE_INTEGER) {
        issues.add({
          line: null,
          column: "count",
          value: null,
          message: `The counts of class "${classNames[i]}" add up to more than ${Number.MAX_SAFE_INTEGER.toLocaleString("en-US")} nets, more than a histogram can hold.`,
        });
      }
    }
    const commaIssue = commas.issue();
    if (commaIssue) issues.addFirst(commaIssue);
    const ok = issues.ok;
    issues.items.sort((a, b) => (a.line ?? 0) - (b.line ?? 0));
    return {
      ok,
      errors: issues.items,
      errorCount: issues.total,
      rows: res.rows,
      bytes: res.bytes,
      delimiter: res.delimiter,
      perClass: classNames
        .map((name, i) => ({ name, bins: bins[i]!, nets: nets[i]!, minLengthM: minLength[i]!, maxLengthM: maxLength[i]! }))
        .filter((t) => t.bins > 0),
      sink: ok ? sink : null,
      decimalCommas: commas.finding(),
    };
  };
  return { consumer, finish };
}

/** Repeats in classes whose lengths did not ascend, added in line order (as a pass over the file would). */
function findUnsortedDuplicates(sink: HistogramSink, unsorted: Set<number>, classNames: readonly string[], issues: IssueList, lenExp: number): void {
  const found: { line: number; first: number; ci: number; lengthM: number }[] = [];
  for (const ci of unsorted) sink.findRepeats!(ci, (line, first, lengthM) => found.push({ line, first, ci, lengthM }));
  found.sort((a, b) => a.line - b.line);
  for (const r of found) {
    issues.add({
      line: r.line,
      column: "length_um",
      value: formatScaled(r.lengthM, lenExp),
      message: `repeats the bin of class "${classNames[r.ci]}" at this length from line ${r.first} (one row per class and length)`,
    });
  }
}

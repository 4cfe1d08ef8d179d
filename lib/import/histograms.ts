import { histogramCountSchema, histogramLengthSchema } from "@/lib/validation/import";
import { readCsv, type CsvReadOptions, type Delimiter } from "./csv-stream";
import { resolveHeader, unneutralise, type ColumnSpec } from "./header";
import { MAX_LISTED_ERRORS } from "./limits";
import { formatScaled, parseScaled } from "./numbers";
import { ImportFatalError, IssueList, type ImportIssue } from "./types";

/** Columns of a length-histogram CSV: one row per (class, length bin). */
export const HISTOGRAM_COLUMNS: readonly (ColumnSpec & { unit: string; description: string })[] = [
  { name: "class", required: true, unit: "", description: "Name of a wire class of the baseline (exactly as in the class table)." },
  { name: "length_um", required: true, unit: "µm", description: "Wire length of the bin, > 0." },
  { name: "count", required: true, unit: "nets", description: "Number of nets in the bin, a whole number ≥ 0." },
];

export interface ClassTotal {
  name: string;
  bins: number;
  nets: number;
  minLengthM: number;
  maxLengthM: number;
}

/** Where validated rows go: a disk spool on the server; nothing in the browser preview. */
export interface HistogramSink {
  push(classIndex: number, lengthM: number, count: number, line: number): void;
  close(): void;
  dispose(): void;
  /** Read the rows back (the duplicate check for classes whose lengths do not ascend needs it). */
  batches?(): Iterable<{ classIndex: number; lengthM: number; line: number }[]>;
}

export interface HistogramParse<S extends HistogramSink = HistogramSink> {
  ok: boolean;
  errors: ImportIssue[];
  errorCount: number;
  rows: number;
  bytes: number;
  delimiter: Delimiter;
  perClass: ClassTotal[];
  /** Validated rows (only when ok); the caller stores and disposes it. */
  spool: S | null;
}

/**
 * Stream-parse and validate a histogram CSV against the baseline's class names. Valid rows are
 * spooled to a temporary file; nothing touches the database. Duplicated (class, length) pairs
 * are errors: a bin is one row. Checked on the fly while each class's lengths ascend (the usual
 * export order); otherwise by a second pass over the spool for the classes that did not.
 */
export async function parseHistogramCsv<S extends HistogramSink>(
  source: AsyncIterable<Uint8Array>,
  classNames: readonly string[],
  opts: CsvReadOptions & { sink: S; maxErrors?: number },
): Promise<HistogramParse<S>> {
  const issues = new IssueList(opts.maxErrors ?? MAX_LISTED_ERRORS);
  const classIndex = new Map(classNames.map((n, i) => [n, i]));
  const lowerIndex = new Map(classNames.map((n) => [n.toLowerCase(), n]));
  const totals = classNames.map((name) => ({ name, bins: 0, nets: 0, minLengthM: Infinity, maxLengthM: 0 }));
  const lastLength = new Float64Array(classNames.length).fill(-1);
  const lastLine = new Uint32Array(classNames.length);
  const unsorted = new Set<number>();
  const spool = opts.sink;
  let col = { cls: 0, len: 1, cnt: 2 };
  let width = 3;
  try {
    const res = await readCsv(
      source,
      {
        header(h) {
          const idx = resolveHeader(h.fields, HISTOGRAM_COLUMNS, "length histograms");
          col = { cls: idx.get("class")!, len: idx.get("length_um")!, cnt: idx.get("count")! };
          width = h.fields.length;
        },
        malformed(line, message) {
          issues.add({ line, column: null, value: null, message });
        },
        row(f, line) {
          if (f.length !== width && !(f.length === width + 1 && f[width] === "")) {
            issues.add({ line, column: null, value: null, message: `has ${f.length} fields, the header has ${width}` });
            return;
          }
          const rawName = f[col.cls]!;
          const name = rawName.charCodeAt(0) === 39 ? unneutralise(rawName.trim()) : rawName.trim();
          const ci = classIndex.get(name);
          let ok = true;
          if (name === "") {
            issues.add({ line, column: "class", value: rawName, message: "is required" });
            ok = false;
          } else if (ci === undefined) {
            const near = lowerIndex.get(name.toLowerCase());
            const known = classNames.length ? classNames.slice(0, 12).join(", ") + (classNames.length > 12 ? ", …" : "") : "(the baseline has no classes yet: import the wire classes first)";
            issues.add({
              line,
              column: "class",
              value: rawName,
              message: near ? `is not a class of this baseline (did you mean "${near}"? names are case-sensitive)` : `is not a class of this baseline; known classes: ${known}`,
            });
            ok = false;
          }
          const lenText = f[col.len]!;
          const cntText = f[col.cnt]!;
          const len = parseScaled(lenText, -6);
          let lengthM = 0;
          if (!len.ok) {
            issues.add({ line, column: "length_um", value: lenText, message: len.reason });
            ok = false;
          } else {
            const z = histogramLengthSchema.safeParse(len.value);
            if (!z.success) {
              issues.add({ line, column: "length_um", value: lenText, message: z.error.issues[0]!.message });
              ok = false;
            } else lengthM = z.data;
          }
          const cnt = parseScaled(cntText, 0);
          let count = 0;
          if (!cnt.ok) {
            issues.add({ line, column: "count", value: cntText, message: cnt.reason });
            ok = false;
          } else {
            const z = histogramCountSchema.safeParse(cnt.value);
            if (!z.success) {
              issues.add({ line, column: "count", value: cntText, message: z.error.issues[0]!.message });
              ok = false;
            } else count = z.data;
          }
          if (!ok || ci === undefined) return;
          const prev = lastLength[ci]!;
          if (lengthM === prev) {
            issues.add({ line, column: "length_um", value: lenText, message: `repeats the bin of class "${name}" at this length from line ${lastLine[ci]} (one row per class and length)` });
            return;
          }
          if (lengthM < prev) unsorted.add(ci);
          lastLength[ci] = lengthM;
          lastLine[ci] = line;
          const t = totals[ci]!;
          t.bins += 1;
          t.nets += count;
          if (lengthM < t.minLengthM) t.minLengthM = lengthM;
          if (lengthM > t.maxLengthM) t.maxLengthM = lengthM;
          spool.push(ci, lengthM, count, line);
        },
      },
      opts,
    );
    if (res.rows === 0 && issues.total === 0) {
      throw new ImportFatalError({ line: 2, column: null, value: null, message: "The file has a header but no data rows." });
    }
    if (unsorted.size > 0) findUnsortedDuplicates(spool, unsorted, classNames, issues);
    spool.close();
    const ok = issues.ok;
    if (!ok) spool.dispose();
    issues.items.sort((a, b) => (a.line ?? 0) - (b.line ?? 0));
    return {
      ok,
      errors: issues.items,
      errorCount: issues.total,
      rows: res.rows,
      bytes: res.bytes,
      delimiter: res.delimiter,
      perClass: totals.filter((t) => t.bins > 0).map((t) => ({ ...t, minLengthM: Number.isFinite(t.minLengthM) ? t.minLengthM : 0 })),
      spool: ok ? spool : null,
    };
  } catch (e) {
    spool.dispose();
    throw e;
  }
}

/** Second pass for classes whose lengths did not ascend: a map of length → first line per such class. */
function findUnsortedDuplicates(spool: HistogramSink, unsorted: Set<number>, classNames: readonly string[], issues: IssueList): void {
  if (!spool.batches) return; // the server checks again with its spool
  const seen = new Map<number, Map<number, number>>();
  for (const ci of unsorted) seen.set(ci, new Map());
  for (const batch of spool.batches()) {
    for (const r of batch) {
      const m = seen.get(r.classIndex);
      if (!m) continue;
      const first = m.get(r.lengthM);
      if (first !== undefined) {
        issues.add({
          line: r.line,
          column: "length_um",
          value: formatScaled(r.lengthM, -6),
          message: `repeats the bin of class "${classNames[r.classIndex]}" at this length from line ${first} (one row per class and length)`,
        });
      } else m.set(r.lengthM, r.line);
    }
  }
}

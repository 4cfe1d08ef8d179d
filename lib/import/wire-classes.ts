import { validateWireClassRow, WIRE_CLASS_FORMAT } from "@/lib/scaling/formats";
import { MAX_CLASSES, wireClassSchema, type WireClassInput } from "@/lib/validation/wire-class";
import { readCsv, readCsvSync, type CsvConsumer, type CsvReadOptions, type CsvReadResult, type Delimiter } from "./csv-stream";
import { DecimalCommas, type DecimalCommaFinding } from "./decimal-comma";
import { resolveHeader, unneutralise } from "./header";
import { MAX_IMPORT_BYTES, MAX_LISTED_ERRORS } from "./limits";
import { ImportFatalError, IssueList, type ImportIssue } from "./types";

const FIELD_COLUMN: Record<string, string> = {
  name: "class",
  tier: "tier",
  widthM: "width_nm",
  thicknessM: "thickness_nm",
  spacingM: "spacing_nm",
  ildBelowM: "ild_below_nm",
  ildAboveM: "ild_above_nm",
  barrierM: "barrier_nm",
  metal: "metal",
  k: "k",
  netCount: "net_count",
  meanLengthM: "mean_length_um",
  driverOhm: "driver_ohm",
  loadF: "load_ff",
  activity: "activity",
  viasPerNet: "vias_per_net",
  viaOhm: "via_ohm",
  viaWidthM: "via_width_nm",
  viaHeightM: "via_height_nm",
  kGap: "k_gap",
  gapFraction: "gap_fraction",
};

/** Text columns: trimmed, and the export's formula neutralising undone. */
const TEXT_COLUMNS = new Set(WIRE_CLASS_FORMAT.columns.filter((c) => c.exp10 === null).map((c) => c.name));

export type ImportedClass = Omit<WireClassInput, "id">;

export interface WireClassParse {
  ok: boolean;
  errors: ImportIssue[];
  errorCount: number;
  rows: number;
  bytes: number;
  delimiter: Delimiter;
  classes: ImportedClass[];
  /** Decimal commas found (reported as one issue instead of one per cell or row), or null. */
  decimalCommas: DecimalCommaFinding | null;
}

export type WireClassParseOptions = CsvReadOptions & { maxErrors?: number };

const METAL_HINT = "see the metals catalogue on the CSV help page, /help/csv#metals";

/**
 * The one wire-class pipeline, as a reader consumer: header by the format's rules (lib/scaling/formats.ts: any order;
 * unknown, repeated or missing columns rejected), each row through the format's validateWireClassRow (exact SI values,
 * messages naming line, column, value and reason), then the app's wireClassSchema (limits such as ≤ 100 µm); class
 * names must be unique ignoring case; at most MAX_CLASSES classes.
 */
function wireClassPipeline(maxErrors: number): { consumer: CsvConsumer; finish(res: CsvReadResult): WireClassParse } {
  const issues = new IssueList(maxErrors);
  const classes: ImportedClass[] = [];
  const seen = new Map<string, number>();
  const commas = new DecimalCommas();
  let index = new Map<string, number>();
  let exp10: ReadonlyMap<string, number> = new Map();
  let width = 0;
  const recordOf = (f: readonly string[]): Record<string, string> => {
    const record: Record<string, string> = {};
    for (const [name, i] of index) record[name] = TEXT_COLUMNS.has(name) ? unneutralise((f[i] ?? "").trim()) : (f[i] ?? "");
    return record;
  };
  const consumer: CsvConsumer = {
    header(h) {
      ({ index, exp10 } = resolveHeader(h.fields, WIRE_CLASS_FORMAT));
      width = h.fields.length;
    },
    malformed(line, message) {
      issues.add({ line, column: null, value: null, message });
    },
    row(f, line) {
      if (f.length !== width && !(f.length === width + 1 && f[width] === "")) {
        const valid = (g: string[]) => {
          const w = validateWireClassRow(recordOf(g), line, exp10).wireClass;
          return w !== null && wireClassSchema.safeParse(w).success;
        };
        if (commas.splitRow(f, width, line, valid)) return;
        issues.add({ line, column: null, value: null, message: `has ${f.length} fields, the header has ${width}` });
        return;
      }
      const record = recordOf(f);
      const r = validateWireClassRow(record, line, exp10);
      for (const e of r.errors)
        if (!(e.column !== null && !TEXT_COLUMNS.has(e.column) && commas.cell(e)))
          issues.add(e.column === "metal" && e.message.startsWith("must be one of") ? { ...e, message: `${e.message}; ${METAL_HINT}` } : e);
      if (!r.wireClass) return;
      const z = wireClassSchema.safeParse(r.wireClass);
      if (!z.success) {
        for (const issue of z.error.issues) {
          const col = FIELD_COLUMN[String(issue.path[0] ?? "")] ?? null;
          issues.add({ line, column: col, value: col ? (record[col] ?? "") : null, message: issue.message });
        }
        return;
      }
      const key = z.data.name.toLowerCase();
      const first = seen.get(key);
      if (first !== undefined) {
        issues.add({
          line,
          column: "class",
          value: z.data.name,
          message: `is already defined on line ${first} (class names must be unique, ignoring case)`,
        });
        return;
      }
      seen.set(key, line);
      if (classes.length >= MAX_CLASSES) {
        issues.add({ line, column: null, value: null, message: `is beyond the limit of ${MAX_CLASSES} classes per baseline` });
        return;
      }
      const { id: _id, ...data } = z.data;
      classes.push(data);
    },
  };
  const finish = (res: CsvReadResult): WireClassParse => {
    if (res.rows === 0 && issues.total === 0) {
      throw new ImportFatalError({ line: 2, column: null, value: null, message: "The file has a header but no wire classes." });
    }
    const commaIssue = commas.issue();
    if (commaIssue) issues.addFirst(commaIssue);
    issues.items.sort((a, b) => (a.line ?? 0) - (b.line ?? 0));
    return {
      ok: issues.ok,
      errors: issues.items,
      errorCount: issues.total,
      rows: res.rows,
      bytes: res.bytes,
      delimiter: res.delimiter,
      classes: issues.ok ? classes : [],
      decimalCommas: commas.finding(),
    };
  };
  return { consumer, finish };
}

/**
 * Stream-parse and validate a wire-class CSV (web uploads and the browser preview). Nothing is usable unless `ok`.
 * Throws ImportFatalError for a file that cannot be read at all (empty, binary, not UTF-8, too large, bad header).
 */
export async function parseWireClassStream(source: AsyncIterable<Uint8Array>, opts: WireClassParseOptions): Promise<WireClassParse> {
  const p = wireClassPipeline(opts.maxErrors ?? MAX_LISTED_ERRORS);
  return p.finish(await readCsv(source, p.consumer, opts));
}

/**
 * parseWireClassStream over text or bytes in memory, synchronously (the command line, the demo seeder, the engine's
 * tests): the same reader and rules, so the same file gets the same classes and the same errors everywhere.
 */
export function parseWireClassCsv(input: string | Uint8Array, opts: Partial<WireClassParseOptions> = {}): WireClassParse {
  const p = wireClassPipeline(opts.maxErrors ?? MAX_LISTED_ERRORS);
  return p.finish(readCsvSync(input, p.consumer, { ...opts, maxBytes: opts.maxBytes ?? MAX_IMPORT_BYTES }));
}

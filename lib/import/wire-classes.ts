import { validateWireClassRow, WIRE_CLASS_COLUMNS } from "@/scaling/csv";
import { MAX_CLASSES, wireClassSchema, type WireClassInput } from "@/lib/validation/wire-class";
import { readCsv, type CsvReadOptions, type Delimiter } from "./csv-stream";
import { resolveHeader, unneutralise } from "./header";
import { MAX_LISTED_ERRORS } from "./limits";
import { parseScaled } from "./numbers";
import { ImportFatalError, IssueList, type ImportIssue } from "./types";

/** Power of ten of each numeric column's unit: the exact SI conversion (24 nm → 2.4e-8, not 2.4000000000000003e-8). */
const EXP10: Record<string, number> = {
  width_nm: -9,
  thickness_nm: -9,
  spacing_nm: -9,
  ild_below_nm: -9,
  ild_above_nm: -9,
  barrier_nm: -9,
  k: 0,
  net_count: 0,
  mean_length_um: -6,
  driver_ohm: 0,
  load_ff: -15,
  activity: 0,
};

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
};

export type ImportedClass = Omit<WireClassInput, "id">;

export interface WireClassParse {
  ok: boolean;
  errors: ImportIssue[];
  errorCount: number;
  rows: number;
  bytes: number;
  delimiter: Delimiter;
  classes: ImportedClass[];
}

const METAL_HINT = "see the metals catalogue on the CSV help page, /help/csv#metals";

/** Strip a leading column name the engine's messages carry ("width_nm must be > 0" → "must be > 0"). */
function reason(column: string, message: string): string {
  return message.startsWith(`${column} `) ? message.slice(column.length + 1) : message;
}

/**
 * Stream-parse and validate a wire-class CSV: header by name in any order (unknown or missing
 * columns rejected), each row through the engine's validateWireClassRow (messages), values
 * converted exactly to SI, then the app's wireClassSchema (limits such as ≤ 100 µm); class names
 * must be unique (case-insensitive). At most MAX_CLASSES classes.
 */
export async function parseWireClassStream(source: AsyncIterable<Uint8Array>, opts: CsvReadOptions & { maxErrors?: number }): Promise<WireClassParse> {
  const issues = new IssueList(opts.maxErrors ?? MAX_LISTED_ERRORS);
  const classes: ImportedClass[] = [];
  const seen = new Map<string, number>();
  let index = new Map<string, number>();
  let width = 0;
  const res = await readCsv(
    source,
    {
      header(h) {
        index = resolveHeader(h.fields, WIRE_CLASS_COLUMNS, "wire classes");
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
        const record: Record<string, string> = {};
        for (const [name, i] of index) record[name] = name === "class" || name === "metal" || name === "tier" ? unneutralise((f[i] ?? "").trim()) : (f[i] ?? "");
        const r = validateWireClassRow(record, line);
        for (const e of r.errors) {
          const msg = reason(e.column, e.message);
          issues.add({ line, column: e.column, value: e.value, message: e.column === "metal" ? `${msg}; ${METAL_HINT}` : msg });
        }
        if (!r.wireClass) return;
        const c = r.wireClass;
        const exact = (col: string) => {
          const t = (record[col] ?? "").trim();
          if (t === "") return null;
          const v = parseScaled(t, EXP10[col]!);
          return v.ok ? v.value : null;
        };
        const candidate = {
          name: c.name,
          tier: c.tier,
          widthM: exact("width_nm"),
          thicknessM: exact("thickness_nm"),
          spacingM: exact("spacing_nm"),
          ildBelowM: exact("ild_below_nm"),
          ildAboveM: exact("ild_above_nm"),
          barrierM: exact("barrier_nm"),
          metal: c.metal,
          k: exact("k"),
          netCount: exact("net_count"),
          meanLengthM: exact("mean_length_um"),
          driverOhm: exact("driver_ohm"),
          loadF: exact("load_ff"),
          activity: exact("activity"),
        };
        const z = wireClassSchema.safeParse(candidate);
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
          issues.add({ line, column: "class", value: z.data.name, message: `is already defined on line ${first} (class names must be unique, ignoring case)` });
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
    },
    opts,
  );
  if (res.rows === 0 && issues.total === 0) {
    throw new ImportFatalError({ line: 2, column: null, value: null, message: "The file has a header but no wire classes." });
  }
  issues.items.sort((a, b) => (a.line ?? 0) - (b.line ?? 0));
  return { ok: issues.ok, errors: issues.items, errorCount: issues.total, rows: res.rows, bytes: res.bytes, delimiter: res.delimiter, classes: issues.ok ? classes : [] };
}

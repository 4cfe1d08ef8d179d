/**
 * Wire-class and length-histogram CSV (formats in shared/design/PRODUCT.md) → engine inputs in SI units.
 * Pure: takes a string, no file access, so the command line and the app share it. Accepts a BOM, CRLF, quoted
 * fields, semicolons (or tabs) when the file uses them, and any column order; unknown columns are ignored.
 */
import Papa from "papaparse";
import { getMetal } from "./materials";
import { TIERS, type LengthBin, type Tier, type WireClass } from "../lib/scaling/types";
import { fromNm, fromUm, scaleExact } from "../lib/scaling/units";

export interface CsvError {
  /** 1-based line in the file (the header is line 1). */
  line: number;
  column: string;
  value: string;
  message: string;
}

export interface ColumnSpec {
  name: string;
  unit: string;
  required: boolean;
  description: string;
}

/** Columns of the wire-class CSV: name, unit, whether required. Empty ild_below_nm / ild_above_nm = no plane. */
export const WIRE_CLASS_COLUMNS: readonly ColumnSpec[] = [
  { name: "class", unit: "", required: true, description: "class name, unique" },
  { name: "tier", unit: "", required: true, description: TIERS.join(" | ") },
  { name: "width_nm", unit: "nm", required: true, description: "line width" },
  { name: "thickness_nm", unit: "nm", required: true, description: "line thickness" },
  { name: "spacing_nm", unit: "nm", required: true, description: "edge-to-edge spacing to each neighbour" },
  { name: "ild_below_nm", unit: "nm", required: false, description: "dielectric height to the plane below; empty = no plane" },
  { name: "ild_above_nm", unit: "nm", required: false, description: "dielectric height to the plane above; empty = no plane" },
  { name: "barrier_nm", unit: "nm", required: true, description: "barrier/liner thickness (sidewalls and bottom)" },
  { name: "metal", unit: "", required: true, description: "metal id: Cu, Al, W, Co, Ru" },
  { name: "k", unit: "", required: true, description: "relative permittivity, >= 1 (effective k for air gaps)" },
  { name: "net_count", unit: "", required: true, description: "number of nets, whole number >= 0" },
  { name: "mean_length_um", unit: "µm", required: true, description: "mean net length" },
  { name: "driver_ohm", unit: "Ω", required: true, description: "driver output resistance" },
  { name: "load_ff", unit: "fF", required: true, description: "load capacitance" },
  { name: "activity", unit: "", required: true, description: "transitions per clock cycle, 0..1" },
];

export const HISTOGRAM_COLUMNS: readonly ColumnSpec[] = [
  { name: "class", unit: "", required: true, description: "class name (matches the wire-class CSV)" },
  { name: "length_um", unit: "µm", required: true, description: "bin length" },
  { name: "count", unit: "", required: true, description: "nets in the bin, >= 0" },
];

const NUMBER = /^[+-]?(?:\d+\.?\d*|\.\d+)(?:[eE][+-]?\d+)?$/;

function num(
  record: Record<string, string>, line: number, column: string, errors: CsvError[],
  opts: { min?: number; minExclusive?: number; max?: number; integer?: boolean; optional?: boolean },
): number | null {
  const raw = (record[column] ?? "").trim();
  if (raw === "") {
    if (opts.optional) return null;
    errors.push({ line, column, value: raw, message: `${column} is required` });
    return null;
  }
  if (!NUMBER.test(raw)) {
    errors.push({ line, column, value: raw, message: `${column} must be a number with a decimal point${raw.includes(",") ? " (found a comma)" : ""}` });
    return null;
  }
  const v = Number(raw);
  const fail = (m: string) => { errors.push({ line, column, value: raw, message: `${column} ${m}` }); return null; };
  if (!Number.isFinite(v)) return fail("must be finite");
  if (opts.minExclusive !== undefined && !(v > opts.minExclusive)) return fail(`must be > ${opts.minExclusive}`);
  if (opts.min !== undefined && v < opts.min) return fail(`must be >= ${opts.min}`);
  if (opts.max !== undefined && v > opts.max) return fail(`must be <= ${opts.max}`);
  if (opts.integer && !Number.isInteger(v)) return fail("must be a whole number");
  return v;
}

/**
 * Validates one wire-class record (keys = normalized column names) and converts it to SI units.
 * Reusable by streaming uploads. Returns the class when the row is valid, and every error found.
 */
export function validateWireClassRow(record: Record<string, string>, line: number): { wireClass: WireClass | null; errors: CsvError[] } {
  const errors: CsvError[] = [];
  const name = (record["class"] ?? "").trim();
  if (name === "") errors.push({ line, column: "class", value: "", message: "class is required" });
  const tierRaw = (record["tier"] ?? "").trim().toLowerCase();
  const tier = (TIERS as readonly string[]).includes(tierRaw) ? (tierRaw as Tier) : null;
  if (!tier) errors.push({ line, column: "tier", value: record["tier"] ?? "", message: `tier must be one of ${TIERS.join(", ")}` });
  const width = num(record, line, "width_nm", errors, { minExclusive: 0 });
  const thickness = num(record, line, "thickness_nm", errors, { minExclusive: 0 });
  const spacing = num(record, line, "spacing_nm", errors, { minExclusive: 0 });
  const below = num(record, line, "ild_below_nm", errors, { minExclusive: 0, optional: true });
  const above = num(record, line, "ild_above_nm", errors, { minExclusive: 0, optional: true });
  if (below === null && above === null && (record["ild_below_nm"] ?? "").trim() === "" && (record["ild_above_nm"] ?? "").trim() === "") {
    errors.push({ line, column: "ild_below_nm", value: "", message: "ild_below_nm or ild_above_nm must be given (a line needs at least one plane)" });
  }
  const barrier = num(record, line, "barrier_nm", errors, { min: 0 });
  const metalRaw = (record["metal"] ?? "").trim();
  let metal: string | null = null;
  try {
    metal = getMetal(metalRaw).id;
  } catch (e) {
    errors.push({ line, column: "metal", value: metalRaw, message: (e as Error).message });
  }
  const k = num(record, line, "k", errors, { min: 1 });
  const nets = num(record, line, "net_count", errors, { min: 0, integer: true });
  const mean = num(record, line, "mean_length_um", errors, { minExclusive: 0 });
  const driver = num(record, line, "driver_ohm", errors, { min: 0 });
  const load = num(record, line, "load_ff", errors, { min: 0 });
  const activity = num(record, line, "activity", errors, { min: 0, max: 1 });
  if (width !== null && barrier !== null && thickness !== null && !(width - 2 * barrier > 0 && thickness - barrier > 0)) {
    errors.push({ line, column: "barrier_nm", value: record["barrier_nm"] ?? "", message: "barrier_nm must be < width_nm/2 and < thickness_nm" });
  }
  if (errors.length > 0 || !tier || width === null || thickness === null || spacing === null || barrier === null || metal === null ||
      k === null || nets === null || mean === null || driver === null || load === null || activity === null) {
    return { wireClass: null, errors };
  }
  return {
    wireClass: {
      name, tier, widthM: fromNm(width), thicknessM: fromNm(thickness), spacingM: fromNm(spacing),
      ildBelowM: below === null ? null : fromNm(below), ildAboveM: above === null ? null : fromNm(above),
      barrierM: fromNm(barrier), metal, k, netCount: nets, meanLengthM: fromUm(mean), driverOhm: driver, loadF: scaleExact(load, -15), activity,
    },
    errors,
  };
}

/** Validates one histogram record (class, length_um, count). */
export function validateHistogramRow(record: Record<string, string>, line: number): { className: string; bin: LengthBin | null; errors: CsvError[] } {
  const errors: CsvError[] = [];
  const className = (record["class"] ?? "").trim();
  if (className === "") errors.push({ line, column: "class", value: "", message: "class is required" });
  const length = num(record, line, "length_um", errors, { minExclusive: 0 });
  const count = num(record, line, "count", errors, { min: 0 });
  return { className, bin: length !== null && count !== null && errors.length === 0 ? { lengthM: fromUm(length), count } : null, errors };
}

/** Normalizes a header cell: trims, drops a BOM and quotes, lower-cases. */
export function normalizeHeader(h: string): string {
  return h.replace(/^\uFEFF/, "").trim().replace(/^"|"$/g, "").trim().toLowerCase();
}

interface Table {
  header: string[];
  rows: { cells: string[]; line: number }[];
  delimiter: string;
  errors: CsvError[];
}

function readTable(text: string, columns: readonly ColumnSpec[]): Table {
  const src = text.replace(/^\uFEFF/, "");
  const parsed = Papa.parse<string[]>(src, { delimitersToGuess: [",", ";", "\t"], skipEmptyLines: false });
  const delimiter = parsed.meta.delimiter || ",";
  const errors: CsvError[] = [];
  const data = parsed.data;
  // Physical line of each record: count the newlines inside quoted fields of earlier records.
  const lines: number[] = [];
  let line = 1;
  for (const row of data) {
    lines.push(line);
    let extra = 0;
    for (const cell of row) for (let i = 0; i < cell.length; i++) if (cell.charCodeAt(i) === 10) extra++;
    line += 1 + extra;
  }
  for (const e of parsed.errors) {
    if (e.code === "UndetectableDelimiter") continue;
    errors.push({ line: e.row !== undefined ? (lines[e.row] ?? e.row + 1) : 0, column: "", value: "", message: `CSV: ${e.message}` });
  }
  const headerRow = data[0] ?? [];
  const header = headerRow.map(normalizeHeader);
  const seen = new Set<string>();
  for (const h of header) {
    if (h !== "" && seen.has(h)) errors.push({ line: 1, column: h, value: h, message: `column ${h} appears twice` });
    seen.add(h);
  }
  for (const c of columns) {
    if (c.required && !seen.has(c.name)) errors.push({ line: 1, column: c.name, value: "", message: `missing column ${c.name}${c.unit ? ` (${c.unit})` : ""}` });
  }
  const rows: Table["rows"] = [];
  for (let i = 1; i < data.length; i++) {
    const cells = data[i]!;
    if (cells.every((c) => c.trim() === "")) continue;
    rows.push({ cells, line: lines[i] ?? i + 1 });
  }
  return { header, rows, delimiter, errors };
}

function toRecord(header: string[], cells: string[]): Record<string, string> {
  const r: Record<string, string> = {};
  for (let j = 0; j < header.length; j++) r[header[j]!] = cells[j] ?? "";
  return r;
}

/**
 * Parses a wire-class CSV. Nothing is usable unless `errors` is empty (the caller stores nothing then).
 * @returns classes in SI units, errors naming line, column, value and reason, and the delimiter found
 */
export function parseWireClassCsv(text: string): { classes: WireClass[]; errors: CsvError[]; delimiter: string } {
  const t = readTable(text, WIRE_CLASS_COLUMNS);
  const errors = [...t.errors];
  const classes: WireClass[] = [];
  if (errors.some((e) => e.line === 1)) return { classes, errors, delimiter: t.delimiter };
  if (t.rows.length === 0) errors.push({ line: 2, column: "", value: "", message: "the file has a header but no wire classes" });
  const names = new Map<string, number>();
  for (const row of t.rows) {
    if (row.cells.length !== t.header.length) {
      errors.push({ line: row.line, column: "", value: row.cells.join(t.delimiter), message: `expected ${t.header.length} fields, found ${row.cells.length}` });
      continue;
    }
    const r = validateWireClassRow(toRecord(t.header, row.cells), row.line);
    errors.push(...r.errors);
    if (r.wireClass) {
      const prev = names.get(r.wireClass.name);
      if (prev !== undefined) errors.push({ line: row.line, column: "class", value: r.wireClass.name, message: `class ${r.wireClass.name} already defined on line ${prev}` });
      else names.set(r.wireClass.name, row.line);
      classes.push(r.wireClass);
    }
  }
  return { classes, errors, delimiter: t.delimiter };
}

/** Parses a length-histogram CSV (class, length_um, count) into bins per class, in SI units. */
export function parseHistogramCsv(text: string): { bins: Record<string, LengthBin[]>; errors: CsvError[]; delimiter: string } {
  const t = readTable(text, HISTOGRAM_COLUMNS);
  const errors = [...t.errors];
  const bins: Record<string, LengthBin[]> = {};
  if (errors.some((e) => e.line === 1)) return { bins, errors, delimiter: t.delimiter };
  for (const row of t.rows) {
    const r = validateHistogramRow(toRecord(t.header, row.cells), row.line);
    errors.push(...r.errors);
    if (r.bin) (bins[r.className] ??= []).push(r.bin);
  }
  return { bins, errors, delimiter: t.delimiter };
}

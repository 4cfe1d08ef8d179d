/**
 * Plateau's two CSV formats — wire classes and length histograms (ours; common practice, no source): their columns
 * (unit, power of ten of the unit for the exact SI conversion, required, meaning), the header rules and the row
 * validation, with one set of messages. Pure: no CSV parser and no I/O here; lib/import reads the files (web upload,
 * browser preview, command line, demo seeder and tests all use that one reader) and hands header cells and rows to
 * these functions.
 */
import { getMetal, METALS } from "./materials";
import { TIERS, type LengthBin, type Tier, type WireClass } from "./types";
import { parseScaled, type NumberCheck } from "./units";

/** What accepted numbers of a column look like (checked on the SI value). */
export interface NumberRule {
  min: number;
  /** true: the value must be > min; otherwise ≥ min. */
  minExclusive?: boolean;
  max?: number;
  /** Message when the value is above max (default "must be ≤ max"). */
  maxMessage?: string;
  integer?: boolean;
}

export interface ColumnSpec {
  /** Column name in the header (matched ignoring case, surrounding spaces, and spaces vs underscores). */
  name: string;
  /** Display unit the column's numbers are written in ("" for none). */
  unit: string;
  /** Power of ten of the unit: SI value = cell × 10^exp10, converted exactly (parseScaled); null for a text column. */
  exp10: number | null;
  /** Required columns must be in the header; optional ones may be left out or left empty. */
  required: boolean;
  description: string;
  /** Accepted numbers (numeric columns only). */
  rule?: NumberRule;
}

export interface CsvFormat {
  /** Plural name used in messages: "Expected columns for wire classes: …". */
  title: string;
  columns: readonly ColumnSpec[];
}

/** One problem in a file: 1-based physical line (1 = header; null for the whole file), column, cell text and reason. */
export interface FormatIssue {
  line: number | null;
  column: string | null;
  value: string | null;
  message: string;
}

const NM = -9;
const UM = -6;

/** Columns of the wire-class CSV, in the templates' order. Empty ild_below_nm / ild_above_nm = no plane on that side. */
export const WIRE_CLASS_COLUMNS: readonly ColumnSpec[] = [
  { name: "class", unit: "", exp10: null, required: true, description: "class name, unique in the file (ignoring case)" },
  { name: "tier", unit: "", exp10: null, required: true, description: TIERS.join(" | ") },
  { name: "width_nm", unit: "nm", exp10: NM, required: true, description: "line width", rule: { min: 0, minExclusive: true } },
  { name: "thickness_nm", unit: "nm", exp10: NM, required: true, description: "line thickness", rule: { min: 0, minExclusive: true } },
  { name: "spacing_nm", unit: "nm", exp10: NM, required: true, description: "edge-to-edge spacing to each neighbour", rule: { min: 0, minExclusive: true } },
  {
    name: "ild_below_nm",
    unit: "nm",
    exp10: NM,
    required: false,
    description: "dielectric height to the plane below; empty = no plane",
    rule: { min: 0, minExclusive: true },
  },
  {
    name: "ild_above_nm",
    unit: "nm",
    exp10: NM,
    required: false,
    description: "dielectric height to the plane above; empty = no plane",
    rule: { min: 0, minExclusive: true },
  },
  { name: "barrier_nm", unit: "nm", exp10: NM, required: true, description: "barrier/liner thickness (sidewalls and bottom)", rule: { min: 0 } },
  { name: "metal", unit: "", exp10: null, required: true, description: `metal id: ${Object.keys(METALS).join(", ")}` },
  {
    name: "k",
    unit: "",
    exp10: 0,
    required: true,
    description: "relative permittivity, ≥ 1 (or a first-order effective k for an air gap; k_gap and gap_fraction give the gap as geometry)",
    rule: { min: 1 },
  },
  { name: "net_count", unit: "", exp10: 0, required: true, description: "number of nets, whole number ≥ 0", rule: { min: 0, integer: true } },
  { name: "mean_length_um", unit: "µm", exp10: UM, required: true, description: "mean net length", rule: { min: 0, minExclusive: true } },
  { name: "driver_ohm", unit: "Ω", exp10: 0, required: true, description: "driver output resistance", rule: { min: 0 } },
  { name: "load_ff", unit: "fF", exp10: -15, required: true, description: "load capacitance", rule: { min: 0 } },
  { name: "activity", unit: "", exp10: 0, required: true, description: "transitions per clock cycle, 0 … 1", rule: { min: 0, max: 1 } },
  {
    name: "vias_per_net",
    unit: "",
    exp10: 0,
    required: false,
    description: "vias in series with each net, whole number ≥ 0 (empty = 0)",
    rule: { min: 0, integer: true, max: 1e6 },
  },
  {
    name: "via_ohm",
    unit: "Ω",
    exp10: 0,
    required: false,
    description: "measured resistance of one via at the baseline (scaled as height/width²); empty = from the via geometry",
    rule: { min: 0 },
  },
  {
    name: "via_width_nm",
    unit: "nm",
    exp10: NM,
    required: false,
    description: "via width (square via); empty = the line's width",
    rule: { min: 0, minExclusive: true },
  },
  { name: "via_height_nm", unit: "nm", exp10: NM, required: false, description: "via height; empty = the ILD below", rule: { min: 0, minExclusive: true } },
  {
    name: "k_gap",
    unit: "",
    exp10: 0,
    required: false,
    description: "permittivity of the air gap between neighbouring lines, ≥ 1 and ≤ k (air = 1); empty = no gap, or air when gap_fraction is given",
    rule: { min: 1 },
  },
  {
    name: "gap_fraction",
    unit: "",
    exp10: 0,
    required: false,
    description: "share of the line thickness the air gap covers from the bottom of the lines, 0 … 1; empty = no gap, or 1 when k_gap is given",
    rule: { min: 0, max: 1 },
  },
];

/**
 * Columns of the measured-resistance CSV read by `npm run scaling -- fit` (one row per measurement of a class of the
 * baseline): fitSizeEffect's input.
 */
export const MEASURED_RESISTANCE_COLUMNS: readonly ColumnSpec[] = [
  { name: "class", unit: "", exp10: null, required: true, description: "name of a wire class of the baseline" },
  { name: "r_ohm_per_um", unit: "Ω/µm", exp10: 6, required: true, description: "measured resistance per length", rule: { min: 0, minExclusive: true } },
  {
    name: "temperature_c",
    unit: "°C",
    exp10: 0,
    required: false,
    description: "temperature of the measurement, −273.15 … 400 (empty = the technology's)",
    rule: { min: -273.15, max: 400 },
  },
];
export const MEASURED_RESISTANCE_FORMAT: CsvFormat = { title: "measured resistances", columns: MEASURED_RESISTANCE_COLUMNS };

const MR = new Map(MEASURED_RESISTANCE_COLUMNS.map((c) => [c.name, c]));

/** Validates one measured-resistance row (cells by column name): the measurement in SI units, or every problem. */
export function validateMeasuredRow(
  record: Readonly<Record<string, string>>,
  line: number,
): {
  measured: { className: string; rOhmPerM: number; temperatureC?: number } | null;
  errors: FormatIssue[];
} {
  const errors: FormatIssue[] = [];
  const className = (record.class ?? "").trim();
  if (className === "") errors.push({ line, column: "class", value: record.class ?? "", message: "is required" });
  const r = parseCell(MR.get("r_ohm_per_um")!, record.r_ohm_per_um ?? "");
  if (!r.ok) errors.push({ line, column: "r_ohm_per_um", value: record.r_ohm_per_um ?? "", message: r.reason });
  const tText = record.temperature_c ?? "";
  let temperatureC: number | undefined;
  if (tText.trim() !== "") {
    const t = parseCell(MR.get("temperature_c")!, tText);
    if (!t.ok) errors.push({ line, column: "temperature_c", value: tText, message: t.reason });
    else temperatureC = t.value;
  }
  if (errors.length > 0 || !r.ok) return { measured: null, errors };
  return { measured: temperatureC === undefined ? { className, rOhmPerM: r.value } : { className, rOhmPerM: r.value, temperatureC }, errors };
}

/** Columns of the length-histogram CSV: one row per (class, length bin). */
export const HISTOGRAM_COLUMNS: readonly ColumnSpec[] = [
  { name: "class", unit: "", exp10: null, required: true, description: "name of a wire class of the baseline (exactly as in the class table)" },
  { name: "length_um", unit: "µm", exp10: UM, required: true, description: "wire length of the bin", rule: { min: 0, minExclusive: true } },
  {
    name: "count",
    unit: "",
    exp10: 0,
    required: true,
    description: "number of nets in the bin, whole number ≥ 0",
    rule: { min: 0, integer: true, max: Number.MAX_SAFE_INTEGER, maxMessage: "is too large" },
  },
];

export const WIRE_CLASS_FORMAT: CsvFormat = { title: "wire classes", columns: WIRE_CLASS_COLUMNS };
export const HISTOGRAM_FORMAT: CsvFormat = { title: "length histograms", columns: HISTOGRAM_COLUMNS };

function column(columns: readonly ColumnSpec[], name: string): ColumnSpec {
  const c = columns.find((x) => x.name === name);
  if (!c) throw new Error(`no column ${name}`);
  return c;
}

/** The histogram's numeric columns (for readers that check cells one by one). */
export const HISTOGRAM_LENGTH_COLUMN = column(HISTOGRAM_COLUMNS, "length_um");
export const HISTOGRAM_COUNT_COLUMN = column(HISTOGRAM_COLUMNS, "count");

/**
 * Normalised header cell: trimmed, lower case, inner spaces as underscores ("Length um" → "length_um"); a unit in
 * parentheses or brackets is the same unit as a suffix ("width (nm)", "Width [nm]" → "width_nm"; issue 13 item 9).
 */
export function normaliseHeader(cell: string): string {
  return cell
    .trim()
    .toLowerCase()
    .replace(/\s*[([]\s*([^()[\]]*?)\s*[)\]]\s*$/, "_$1")
    .replace(/\s+/g, "_")
    .replace(/_+/g, "_");
}

/**
 * Units a header may give instead of the column's own (issue 13 item 9), by the column's unit family, each with its
 * power of ten: the cells are then read in that unit and converted to SI exactly — parseScaled shifts the decimal
 * exponent in the text, so 0.018 in a µm column and 18 in an nm column give the same double. Only prefixes of the
 * same unit (a power of ten) are accepted; "mohm" is left out (milli or mega? header case is ignored).
 */
const UNIT_FAMILIES: Readonly<Record<string, Readonly<Record<string, number>>>> = {
  length: { pm: -12, "\u00e5": -10, angstrom: -10, nm: -9, um: -6, "\u00b5m": -6, "\u03bcm": -6, micron: -6, microns: -6, mm: -3, cm: -2, m: 0 },
  resistance: { ohm: 0, ohms: 0, "\u03c9": 0, kohm: 3, kohms: 3, "k\u03c9": 3 },
  capacitance: { af: -18, ff: -15, pf: -12, nf: -9, f: 0 },
};
const FAMILY_OF_UNIT: Readonly<Record<string, string>> = { nm: "length", µm: "length", Ω: "resistance", fF: "capacitance" };
const SUFFIX_OF_UNIT: Readonly<Record<string, string>> = { nm: "nm", µm: "um", Ω: "ohm", fF: "ff" };

/** The unit spellings a column's header may use, with the power of ten of each (empty for text and unit-less columns). */
export function headerUnits(col: ColumnSpec): Readonly<Record<string, number>> {
  const family = FAMILY_OF_UNIT[col.unit];
  return family && col.exp10 !== null && col.name.endsWith(`_${SUFFIX_OF_UNIT[col.unit]}`) ? UNIT_FAMILIES[family]! : {};
}

/** The column name without its unit suffix ("width_nm" → "width"); the whole name for a column without a unit family. */
function baseName(col: ColumnSpec): string {
  const suffix = SUFFIX_OF_UNIT[col.unit];
  return suffix && col.name.endsWith(`_${suffix}`) ? col.name.slice(0, -suffix.length - 1) : col.name;
}

/**
 * A normalised header cell that names `col` in another unit of its family ("width_um", "width_µm", "driver_kohm",
 * "load_af"): the power of ten of that unit, or null.
 */
function unitVariant(name: string, col: ColumnSpec): number | null {
  const units = headerUnits(col);
  const base = baseName(col);
  if (!name.startsWith(`${base}_`)) return null;
  const exp = units[name.slice(base.length + 1)];
  return exp === undefined ? null : exp;
}

/** The name without its unit suffix and separators, to match a header that names a column with another unit. */
const stem = (name: string) =>
  name.replace(/_(nm|um|µm|μm|mm|cm|m|mil|mils|in|inch|ohm|ohms|mohm|kohm|ω|kω|mω|ff|pf|af|nf|f|ps|ns|s|v|pct)$/, "").replace(/[^a-z0-9]/g, "");

/** "did you mean width_nm?" for an unknown header cell that names a column with another unit or spelling. */
export function suggestColumn(raw: string, columns: readonly ColumnSpec[]): string | null {
  const n = normaliseHeader(raw);
  const st = stem(n);
  if (st === "") return null;
  const hit = columns.find((c) => stem(c.name) === st) ?? columns.find((c) => c.name.replace(/[^a-z0-9]/g, "") === n.replace(/[^a-z0-9]/g, ""));
  return hit ? hit.name : null;
}

/** A header accepted by resolveHeader: where each column is, and the power of ten its cells are written in. */
export interface ResolvedHeader {
  ok: true;
  /** Index of each column present in the file's rows (absent optional columns are missing). */
  index: Map<string, number>;
  /**
   * Power of ten of the unit each numeric column present is written in: the column's own (exp10), or the one its
   * header names ("width_um" → -6 for width_nm). Every reader converts with this (parseCell's third argument).
   */
  exp10: Map<string, number>;
}

/**
 * The header rules of both formats: columns by name in any order, in the column's unit or another unit of its family
 * (headerUnits: converted exactly); an unknown, repeated or missing required column rejects the file with a message
 * listing the expected columns, and a column named with a unit that cannot be converted exactly gets "did you mean
 * …?". One empty cell after the last column (a trailing delimiter) is allowed.
 * @param fields header cells as read (BOM removed)
 * @returns the index and unit of each column present in the file's rows, or the issue that rejects the file
 */
export function resolveHeader(fields: readonly string[], format: CsvFormat): ResolvedHeader | { ok: false; issue: FormatIssue } {
  const columns = format.columns;
  const expected = columns.map((c) => (c.required ? c.name : `${c.name} (optional)`)).join(", ");
  const tail = `Expected columns for ${format.title}: ${expected}.`;
  const byName = new Map(columns.map((c) => [c.name, c]));
  const index = new Map<string, number>();
  const exp10 = new Map<string, number>();
  const unknown: string[] = [];
  for (let i = 0; i < fields.length; i++) {
    const raw = fields[i]!;
    const norm = normaliseHeader(raw);
    if (norm === "" && i === fields.length - 1 && fields.length > 1) continue; // trailing delimiter
    let col = byName.get(norm);
    let exp = col?.exp10 ?? null;
    if (!col) {
      for (const c of columns) {
        const e = unitVariant(norm, c);
        if (e !== null) {
          col = c;
          exp = e;
          break;
        }
      }
    }
    if (!col) {
      const hint = raw === "" ? null : suggestColumn(raw, columns);
      const unit = hint ? byName.get(hint)!.unit : "";
      unknown.push(
        raw === "" ? `(empty, column ${i + 1})` : hint ? `"${raw}" (did you mean ${hint}?${unit ? ` Give the values in ${unit}.` : ""})` : `"${raw}"`,
      );
      continue;
    }
    const name = col.name;
    if (index.has(name)) return { ok: false, issue: { line: 1, column: name, value: raw, message: `Column "${name}" appears twice in the header. ${tail}` } };
    index.set(name, i);
    if (exp !== null) exp10.set(name, exp);
  }
  if (unknown.length > 0) {
    const tabHint = fields.length === 1 && fields[0]!.includes("\t") ? " Columns must be separated by commas (or semicolons), not tabs." : "";
    const list = unknown.join(", ");
    return { ok: false, issue: { line: 1, column: null, value: list, message: `Unknown column${unknown.length > 1 ? "s" : ""} ${list}.${tabHint} ${tail}` } };
  }
  const missing = columns.filter((c) => c.required && !index.has(c.name)).map((c) => c.name);
  if (missing.length > 0) {
    return {
      ok: false,
      issue: { line: 1, column: null, value: null, message: `Missing required column${missing.length > 1 ? "s" : ""} ${missing.join(", ")}. ${tail}` },
    };
  }
  return { ok: true, index, exp10 };
}

/**
 * A numeric cell of `col`, written in the unit of power of ten `exp10` (the column's own unless the header named
 * another: ResolvedHeader.exp10): exact SI value (parseScaled), then the column's rule. Reasons are phrases that follow the
 * column name ("must be > 0", "is not a number: use a decimal point, not a comma").
 */
export function parseCell(col: ColumnSpec, text: string, exp10: number = col.exp10 ?? 0): NumberCheck {
  const r = parseScaled(text, exp10);
  const rule = col.rule;
  if (!r.ok || !rule) return r;
  const v = r.value;
  if (rule.integer && !Number.isInteger(v)) return { ok: false, reason: "must be a whole number" };
  if (rule.minExclusive ? !(v > rule.min) : !(v >= rule.min)) return { ok: false, reason: `must be ${rule.minExclusive ? ">" : "≥"} ${rule.min}` };
  if (rule.max !== undefined && v > rule.max) return { ok: false, reason: rule.maxMessage ?? `must be ≤ ${rule.max}` };
  return r;
}

const WC = new Map(WIRE_CLASS_COLUMNS.map((c) => [c.name, c]));

/**
 * Validates one wire-class record (keys = column names, values = cell text) and converts it to SI units exactly.
 * Text cells are trimmed; tier and metal are matched ignoring case. Returns the class when the row is valid, and
 * every problem found, each naming line, column, cell text and reason. `exp10`: the unit of each numeric column as the
 * header gave it (ResolvedHeader.exp10; the column's own unit when missing).
 */
export function validateWireClassRow(
  record: Readonly<Record<string, string>>,
  line: number,
  exp10: ReadonlyMap<string, number> = new Map(),
): { wireClass: WireClass | null; errors: FormatIssue[] } {
  const errors: FormatIssue[] = [];
  const cell = (name: string) => record[name] ?? "";
  const num = (name: string): number | null => {
    const text = cell(name);
    const col = WC.get(name)!;
    if (!col.required && text.trim() === "") return null;
    const r = parseCell(col, text, exp10.get(name) ?? col.exp10 ?? 0);
    if (r.ok) return r.value;
    errors.push({ line, column: name, value: text, message: r.reason });
    return null;
  };
  const name = cell("class").trim();
  if (name === "") errors.push({ line, column: "class", value: cell("class"), message: "is required" });
  const tierText = cell("tier").trim();
  const tierLower = tierText.toLowerCase();
  const tier = (TIERS as readonly string[]).includes(tierLower) ? (tierLower as Tier) : null;
  if (!tier) errors.push({ line, column: "tier", value: cell("tier"), message: tierText === "" ? "is required" : `must be one of ${TIERS.join(", ")}` });
  const width = num("width_nm");
  const thickness = num("thickness_nm");
  const spacing = num("spacing_nm");
  const below = num("ild_below_nm");
  const above = num("ild_above_nm");
  if (cell("ild_below_nm").trim() === "" && cell("ild_above_nm").trim() === "") {
    errors.push({ line, column: "ild_below_nm", value: "", message: "is empty and so is ild_above_nm: a line needs at least one plane (below or above)" });
  }
  const barrier = num("barrier_nm");
  const metalText = cell("metal").trim();
  let metal: string | null = null;
  if (metalText === "") errors.push({ line, column: "metal", value: cell("metal"), message: "is required" });
  else {
    try {
      metal = getMetal(metalText).id;
    } catch {
      errors.push({ line, column: "metal", value: metalText, message: `must be one of ${Object.keys(METALS).join(", ")} (got "${metalText}")` });
    }
  }
  const k = num("k");
  const nets = num("net_count");
  const mean = num("mean_length_um");
  const driver = num("driver_ohm");
  const load = num("load_ff");
  const activity = num("activity");
  if (width !== null && barrier !== null && thickness !== null && !(width - 2 * barrier > 0 && thickness - barrier > 0)) {
    errors.push({ line, column: "barrier_nm", value: cell("barrier_nm"), message: "must be < width_nm/2 and < thickness_nm" });
  }
  const vias = num("vias_per_net");
  const viaOhm = num("via_ohm");
  const viaWidth = num("via_width_nm");
  const viaHeight = num("via_height_nm");
  const kGap = num("k_gap");
  const gapFraction = num("gap_fraction");
  if (k !== null && kGap !== null && kGap > k) {
    errors.push({ line, column: "k_gap", value: cell("k_gap"), message: `must not exceed k (${cell("k").trim()})` });
  }
  if (
    errors.length > 0 ||
    tier === null ||
    metal === null ||
    width === null ||
    thickness === null ||
    spacing === null ||
    barrier === null ||
    k === null ||
    nets === null ||
    mean === null ||
    driver === null ||
    load === null ||
    activity === null
  ) {
    return { wireClass: null, errors };
  }
  const wireClass: WireClass = {
    name,
    tier,
    widthM: width,
    thicknessM: thickness,
    spacingM: spacing,
    ildBelowM: below,
    ildAboveM: above,
    barrierM: barrier,
    metal,
    k,
    netCount: nets,
    meanLengthM: mean,
    driverOhm: driver,
    loadF: load,
    activity,
  };
  // optional via columns: only present fields are set, so files without them give exactly the classes they gave before
  if (vias !== null) wireClass.viasPerNet = vias;
  if (viaOhm !== null) wireClass.viaOhm = viaOhm;
  if (viaWidth !== null) wireClass.viaWidthM = viaWidth;
  if (viaHeight !== null) wireClass.viaHeightM = viaHeight;
  // optional air-gap columns, the same way
  if (kGap !== null) wireClass.kGap = kGap;
  if (gapFraction !== null) wireClass.gapFraction = gapFraction;
  return { wireClass, errors };
}

/**
 * Validates one histogram row (class name as written, length and count cells): the bin in SI units, or every problem.
 * `lengthExp10`: the power of ten of the length unit the header gave (length_um: -6; length_nm: -9; length_mm: -3).
 */
export function validateHistogramRow(
  cells: { class: string; length_um: string; count: string },
  line: number,
  lengthExp10: number = HISTOGRAM_LENGTH_COLUMN.exp10 ?? -6,
): { className: string; bin: LengthBin | null; errors: FormatIssue[] } {
  const errors: FormatIssue[] = [];
  const className = cells.class.trim();
  if (className === "") errors.push({ line, column: "class", value: cells.class, message: "is required" });
  const len = parseCell(HISTOGRAM_LENGTH_COLUMN, cells.length_um, lengthExp10);
  if (!len.ok) errors.push({ line, column: "length_um", value: cells.length_um, message: len.reason });
  const cnt = parseCell(HISTOGRAM_COUNT_COLUMN, cells.count);
  if (!cnt.ok) errors.push({ line, column: "count", value: cells.count, message: cnt.reason });
  return { className, bin: len.ok && cnt.ok && errors.length === 0 ? { lengthM: len.value, count: cnt.value } : null, errors };
}

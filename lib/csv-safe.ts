/**
 * CSV export helpers. Cells are quoted when needed (RFC 4180) and neutralised against spreadsheet
 * formula injection: a text cell starting with = + - @, a tab or a carriage return gets a leading
 * apostrophe, so a spreadsheet shows it as text instead of evaluating it. Numbers are written as
 * plain numbers (a negative number stays a number: only strings are neutralised).
 */

const FORMULA_START = /^[=+\-@\t\r]/;

/** A text cell made safe to open in a spreadsheet: `=SUM(A1)` → `'=SUM(A1)`. */
export function neutraliseFormula(text: string): string {
  return FORMULA_START.test(text) ? `'${text}` : text;
}

/** One CSV cell: numbers as their shortest exact form, null/undefined as empty, text neutralised and quoted when needed. */
export function csvCell(value: string | number | boolean | null | undefined): string {
  if (value === null || value === undefined) return "";
  if (typeof value === "number") return Number.isFinite(value) ? String(value) : "";
  if (typeof value === "boolean") return value ? "true" : "false";
  const safe = neutraliseFormula(value);
  return /[",\r\n;]/.test(safe) ? `"${safe.replace(/"/g, '""')}"` : safe;
}

/** One CSV line (CRLF-terminated, as RFC 4180 asks). */
export function csvLine(cells: readonly (string | number | boolean | null | undefined)[]): string {
  return cells.map(csvCell).join(",") + "\r\n";
}

/** A header cell with its unit: header("width", "nm") → "width_nm". The unit goes in the name so re-import needs no parsing of it. */
export function header(name: string, unit?: string): string {
  return unit ? `${name}_${unit}` : name;
}

/** Content-Disposition for a download, with an ASCII fallback and the UTF-8 name (RFC 6266). */
export function attachment(filename: string): string {
  const ascii = filename.replace(/[^\x20-\x7e]/g, "_").replace(/["\\]/g, "_");
  return `attachment; filename="${ascii}"; filename*=UTF-8''${encodeURIComponent(filename)}`;
}

/** Headers of a CSV download response. */
export function csvHeaders(filename: string): HeadersInit {
  return {
    "content-type": "text/csv; charset=utf-8",
    "content-disposition": attachment(filename),
    "cache-control": "no-store",
    "x-content-type-options": "nosniff",
  };
}

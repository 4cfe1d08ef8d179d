import { ImportFatalError } from "./types";

export interface ColumnSpec {
  name: string;
  required: boolean;
}

/** Normalised header cell: trimmed, lower case, inner spaces as underscores ("Length um" → "length_um"). */
export function normaliseHeader(cell: string): string {
  return cell.trim().toLowerCase().replace(/\s+/g, "_");
}

/**
 * Map header cells to known columns, in any order. Unknown, repeated or missing required columns
 * stop the import with a message that lists the expected columns.
 * @returns index of each known column in the file's rows (absent optional columns are missing)
 */
export function resolveHeader(fields: string[], columns: readonly ColumnSpec[], what: string): Map<string, number> {
  const expected = columns.map((c) => (c.required ? c.name : `${c.name} (optional)`)).join(", ");
  const known = new Set(columns.map((c) => c.name));
  const index = new Map<string, number>();
  const unknown: string[] = [];
  fields.forEach((raw, i) => {
    const name = normaliseHeader(raw);
    if (name === "" && i === fields.length - 1 && fields.length > 1) return; // trailing delimiter
    if (!known.has(name)) {
      unknown.push(raw === "" ? `(empty, column ${i + 1})` : `"${raw}"`);
      return;
    }
    if (index.has(name)) {
      throw new ImportFatalError({ line: 1, column: name, value: raw, message: `Column "${name}" appears twice in the header. Expected columns for ${what}: ${expected}.` });
    }
    index.set(name, i);
  });
  if (unknown.length > 0) {
    const tabHint = fields.length === 1 && fields[0]!.includes("\t") ? " Columns must be separated by commas (or semicolons), not tabs." : "";
    throw new ImportFatalError({
      line: 1,
      column: null,
      value: unknown.join(", "),
      message: `Unknown column${unknown.length > 1 ? "s" : ""} ${unknown.join(", ")}.${tabHint} Expected columns for ${what}: ${expected}.`,
    });
  }
  const missing = columns.filter((c) => c.required && !index.has(c.name)).map((c) => c.name);
  if (missing.length > 0) {
    throw new ImportFatalError({
      line: 1,
      column: null,
      value: null,
      message: `Missing required column${missing.length > 1 ? "s" : ""} ${missing.join(", ")}. Expected columns for ${what}: ${expected}.`,
    });
  }
  return index;
}

/** Undo the export's formula neutralising: "'=x" → "=x" (only before = + - @ tab CR). */
export function unneutralise(text: string): string {
  return /^'[=+\-@\t\r]/.test(text) ? text.slice(1) : text;
}

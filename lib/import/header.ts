import { resolveHeader as resolveFormatHeader, type CsvFormat, type ResolvedHeader } from "@/lib/scaling/formats";
import { ImportFatalError } from "./types";

/**
 * The format's header rules (lib/scaling/formats.ts resolveHeader: columns by name in any order; unknown, repeated
 * or missing required columns rejected with the list of expected columns), as the reader's fatal error.
 * @returns index of each known column in the file's rows (absent optional columns are missing), and the power of ten
 *   of the unit each numeric column is written in (a header may name another unit of the column's family: width_um)
 */
export function resolveHeader(fields: readonly string[], format: CsvFormat): Omit<ResolvedHeader, "ok"> {
  const r = resolveFormatHeader(fields, format);
  if (!r.ok) throw new ImportFatalError(r.issue);
  return { index: r.index, exp10: r.exp10 };
}

/** Undo the export's formula neutralising: "'=x" → "=x" (only before = + - @ tab CR). */
export function unneutralise(text: string): string {
  return /^'[=+\-@\t\r]/.test(text) ? text.slice(1) : text;
}

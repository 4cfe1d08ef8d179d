import Papa from "papaparse";
import { isDecimalComma, resolveHeader, type CsvFormat } from "@/lib/scaling/client";
import { detectDelimiter, type Delimiter } from "./csv-stream";
import type { ImportIssue } from "./types";

/**
 * Decimal commas in a CSV (issue 13 item 8). A spreadsheet in a locale that writes 1,55 saves either a
 * semicolon-separated file whose number cells read "1,55", or — typed into a comma-separated file — a row split in
 * two at the comma ("has 16 fields, the header has 15"). Both would give one error per cell or row; the reader's
 * pipelines hand those to this collector instead, and the file gets ONE issue that names the cause and the fix.
 */

/** What the reader found: cells written with a decimal comma, and rows split by one (comma-separated files). */
export interface DecimalCommaFinding {
  /** Number cells written with a decimal comma ("1,55" in a semicolon-separated or quoted cell). */
  cells: number;
  /** Rows of a comma-separated file with more fields than the header, explained by decimal commas. */
  splitRows: number;
  /** The first cell or split row found. */
  first: { line: number; column: string | null; value: string };
  /** The file can be rewritten exactly (convertDecimalCommas): every decimal comma is inside a cell, none split a row. */
  convertible: boolean;
}

const INTEGER_PART = /^\s*[+-]?\d+$/;
const FRACTION_PART = /^\d+(?:[eE][+-]?\d+)?\s*$/;

export class DecimalCommas {
  private cells = 0;
  private splitRows = 0;
  private first: DecimalCommaFinding["first"] | null = null;

  /** An issue of a number cell: true (and counted) when its value is written with a decimal comma. */
  cell(issue: ImportIssue): boolean {
    if (issue.value === null || issue.line === null || !isDecimalComma(issue.value)) return false;
    this.cells += 1;
    if (!this.first || issue.line < this.first.line) this.first = { line: issue.line, column: issue.column, value: issue.value.trim() };
    return true;
  }

  /**
   * A row with more fields than the header (`width` cells): true (and counted) when decimal commas explain the extra
   * fields — when joining as many places as there are extra fields, each an integer followed by a field of digits
   * ("1" "55" → "1.55"), gives a row that `valid` accepts (the format's row rules). Rows split for any other reason
   * (an unquoted text comma, a stray column) are left to the caller's "has N fields" error.
   */
  splitRow(fields: readonly string[], width: number, line: number, valid: (fields: string[]) => boolean): boolean {
    let n = fields.length;
    if (n > width + 1 && fields[n - 1] === "") n -= 1; // a trailing delimiter
    const extra = n - width;
    if (extra <= 0 || extra > 3) return false;
    const cells = fields.slice(0, n);
    const pairs: number[] = [];
    for (let i = 0; i + 1 < n; i++) if (INTEGER_PART.test(cells[i]!) && FRACTION_PART.test(cells[i + 1]!)) pairs.push(i);
    if (pairs.length < extra) return false;
    let tries = 0;
    // choose `extra` non-overlapping pairs (ascending), join them, and ask the format whether the row is then valid
    const pick = (from: number, chosen: number[]): number[] | null => {
      if (chosen.length === extra) {
        tries += 1;
        const set = new Set(chosen);
        const joined: string[] = [];
        for (let i = 0; i < n; i++) {
          if (set.has(i)) {
            joined.push(`${cells[i]!.trim()}.${cells[i + 1]!.trim()}`);
            i += 1;
          } else joined.push(cells[i]!);
        }
        return valid(joined) ? chosen : null;
      }
      for (let k = from; k < pairs.length && tries < 500; k++) {
        const last = chosen[chosen.length - 1];
        if (last !== undefined && pairs[k]! <= last + 1) continue;
        const hit = pick(k + 1, [...chosen, pairs[k]!]);
        if (hit) return hit;
      }
      return null;
    };
    const hit = pick(0, []);
    if (!hit) return false;
    this.splitRows += 1;
    if (!this.first || line < this.first.line) {
      const i = hit[0]!;
      this.first = { line, column: null, value: `${cells[i]!.trim()},${cells[i + 1]!.trim()}` };
    }
    return true;
  }

  finding(): DecimalCommaFinding | null {
    if (!this.first) return null;
    return { cells: this.cells, splitRows: this.splitRows, first: this.first, convertible: this.splitRows === 0 };
  }

  /** The one issue for the file (line null: it is about the whole file), or null when no decimal comma was found. */
  issue(delimiter: Delimiter): ImportIssue | null {
    const f = this.finding();
    return f ? decimalCommaIssue(f, delimiter) : null;
  }
}

const plural = (n: number, one: string, many: string) => `${n.toLocaleString("en-US")} ${n === 1 ? one : many}`;

/** The one message for a file with decimal commas: what was found, where first, and how to fix it. */
export function decimalCommaIssue(f: DecimalCommaFinding, delimiter: Delimiter): ImportIssue {
  const where = `line ${f.first.line}${f.first.column ? `, ${f.first.column}` : ""}`;
  const dot = f.first.value.replace(",", ".");
  const parts: string[] = [];
  if (f.cells > 0) {
    parts.push(
      `The file writes numbers with a decimal comma: ${plural(f.cells, "cell", "cells")} such as "${f.splitRows === 0 ? f.first.value : "1,55"}"${f.splitRows === 0 ? ` (${where})` : ""}.`,
    );
  }
  if (f.splitRows > 0) {
    parts.push(
      `${plural(f.splitRows, "row has", "rows have")} more fields than the header because a number written with a decimal comma (such as "${f.first.value}" on line ${f.first.line}) splits into two fields in a comma-separated file.`,
    );
  }
  const fix = f.convertible
    ? `Plateau reads numbers with a decimal point (${dot}, not ${f.first.value}). Convert the file in the import preview ("Convert to decimal points" rewrites it comma-separated with decimal points, exactly), or save it from your spreadsheet with "." as the decimal separator.`
    : `Plateau reads numbers with a decimal point (${dot}, not ${f.first.value}): save the file from your spreadsheet with "." as the decimal separator${delimiter === "," ? "" : " and upload it again"}, or write the numbers with a decimal point.`;
  return { line: null, column: f.first.column, value: f.first.value, message: `${parts.join(" ")} ${fix}` };
}

/**
 * Rewrite a CSV whose number cells use decimal commas as comma-separated with decimal points, exactly: string
 * rewriting of the cells ("1,550" → "1.550"; no number is parsed, so nothing is rounded). Only cells of the format's
 * numeric columns that are written with a decimal comma change; text cells keep their commas and are quoted when they
 * hold a comma, a quote or a line end. Line ends are kept (those of the header line); a byte-order mark is dropped.
 * @throws Error when the header is not the format's (the preview offers the conversion only after a good header)
 */
export function convertDecimalCommas(text: string, format: CsvFormat): string {
  const body = text.replace(/^\uFEFF/, "");
  const lf = body.indexOf("\n");
  const nl = lf > 0 && body[lf - 1] === "\r" ? "\r\n" : lf >= 0 ? "\n" : body.includes("\r") ? "\r" : "\n";
  const end = body.search(/[\r\n]/);
  // the reader's own delimiter rule (csv-stream.ts), on the header line
  const delimiter = detectDelimiter(end === -1 ? body : body.slice(0, end));
  const parsed = Papa.parse<string[]>(body, { delimiter, newline: nl, quoteChar: '"' });
  const rows = parsed.data;
  const header = rows[0];
  if (!header) return body;
  const resolved = resolveHeader(
    header.map((h) => h.trim()),
    format,
  );
  if (!resolved.ok) throw new Error(resolved.issue.message);
  const numeric = new Set<number>();
  for (const [name, i] of resolved.index) if (format.columns.find((c) => c.name === name)?.exp10 !== null) numeric.add(i);
  const quote = (cell: string) => (/[",\r\n]/.test(cell) ? `"${cell.replace(/"/g, '""')}"` : cell);
  return rows.map((row, r) => row.map((cell, i) => quote(r > 0 && numeric.has(i) && isDecimalComma(cell) ? cell.replace(",", ".") : cell)).join(",")).join(nl);
}

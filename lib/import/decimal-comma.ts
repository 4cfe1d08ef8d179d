import Papa from "papaparse";
import { isDecimalComma } from "@/lib/scaling/client";
import { resolveHeader, type CsvFormat } from "@/lib/scaling/formats";
import { detectDelimiter } from "./csv-stream";
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
  /** The first cell written with a decimal comma (else the first split row's first reading). */
  first: { line: number; column: string | null; value: string };
  /** The file can be rewritten exactly (convertDecimalCommas): every decimal comma is inside a cell, none split a row. */
  convertible: boolean;
  /**
   * The first split row: its line, its field count, the header's, up to three readings ("4,8000", "0,4"), and whether
   * the row without its extra last fields is valid as well (a field too many at the end is then as likely).
   */
  firstSplit?: { line: number; fields: number; width: number; values: string[]; orExtra: boolean };
}

const INTEGER_PART = /^\s*[+-]?\d+$/;
const FRACTION_PART = /^\d+(?:[eE][+-]?\d+)?\s*$/;

export class DecimalCommas {
  private cells = 0;
  private splitRows = 0;
  private firstCell: DecimalCommaFinding["first"] | null = null;
  private firstSplit: NonNullable<DecimalCommaFinding["firstSplit"]> | null = null;

  /** An issue of a number cell: true (and counted) when its value is written with a decimal comma. */
  cell(issue: ImportIssue): boolean {
    if (issue.value === null || issue.line === null || !isDecimalComma(issue.value)) return false;
    this.cells += 1;
    if (!this.firstCell || issue.line < this.firstCell.line) this.firstCell = { line: issue.line, column: issue.column, value: issue.value.trim() };
    return true;
  }

  /**
   * A row with more fields than the header (`width` cells): true (and counted) when decimal commas can explain the
   * extra fields — when joining as many places as there are extra fields, each an integer followed by a field of
   * digits ("1" "55" → "1.55"), gives a row that `valid` accepts (the format's row rules). Which places is not always
   * certain: up to three readings are kept for the message ("4,8000" or "0,4"). Rows that no join makes valid (an
   * unquoted text comma, a stray column of text) are left to the caller's "has N fields" error.
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
    const readings: string[] = [];
    let tries = 0;
    // choose `extra` non-overlapping pairs (ascending), join them, and ask the format whether the row is then valid
    const pick = (from: number, chosen: number[]): void => {
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
        if (valid(joined)) readings.push(chosen.map((i) => `${cells[i]!.trim()},${cells[i + 1]!.trim()}`).join(" and "));
        return;
      }
      for (let k = from; k < pairs.length && tries < 500 && readings.length < 3; k++) {
        const last = chosen[chosen.length - 1];
        if (last !== undefined && pairs[k]! <= last + 1) continue;
        pick(k + 1, [...chosen, pairs[k]!]);
      }
    };
    pick(0, []);
    if (readings.length === 0) return false;
    this.splitRows += 1;
    if (!this.firstSplit || line < this.firstSplit.line) {
      // the row without its last fields may be valid too: then the file may simply have a field too many
      this.firstSplit = { line, fields: fields.length, width, values: readings, orExtra: valid(cells.slice(0, width)) };
    }
    return true;
  }

  finding(): DecimalCommaFinding | null {
    const first = this.firstCell ?? (this.firstSplit && { line: this.firstSplit.line, column: null, value: this.firstSplit.values[0]!.split(" and ")[0]! });
    if (!first) return null;
    return {
      cells: this.cells,
      splitRows: this.splitRows,
      first,
      convertible: this.splitRows === 0,
      ...(this.firstSplit ? { firstSplit: this.firstSplit } : {}),
    };
  }

  /** The one issue for the file (line null: it is about the whole file), or null when no decimal comma was found. */
  issue(): ImportIssue | null {
    const f = this.finding();
    return f ? decimalCommaIssue(f) : null;
  }
}

const plural = (n: number, one: string, many: string) => `${n.toLocaleString("en-US")} ${n === 1 ? one : many}`;
const quoted = (values: readonly string[]) => values.map((v) => `"${v}"`).join(" or ");

/** The one message for a file with decimal commas: what was found, where first, and how to fix it. */
export function decimalCommaIssue(f: DecimalCommaFinding): ImportIssue {
  const parts: string[] = [];
  if (f.cells > 0) {
    const c = f.first;
    parts.push(
      `The file writes numbers with a decimal comma: ${plural(f.cells, "cell", "cells")} such as "${c.value}" (line ${c.line}${c.column ? `, ${c.column}` : ""}).`,
    );
  }
  const s = f.firstSplit;
  if (s) {
    const row = `line ${s.line} has ${s.fields} fields, the header has ${s.width}`;
    parts.push(
      f.splitRows === 1
        ? `Line ${s.line} has ${s.fields} fields, the header has ${s.width}: probably a number written with a decimal comma (${quoted(s.values)}), split into two fields in a comma-separated file${s.orExtra ? `, or ${s.fields - s.width === 1 ? "a field" : "fields"} too many at the end` : ""}.`
        : `${plural(f.splitRows, "row has", "rows have")} more fields than the header: probably numbers written with a decimal comma, split into two fields in a comma-separated file (the first: ${row}; ${quoted(s.values)}).`,
    );
  }
  // the example of the fix: the cell or the one reading found; a generic one when a row can be read several ways
  const v = f.cells > 0 || (s && s.values.length === 1) ? f.first.value : "1,55";
  const dot = v.replace(",", ".");
  const fix = f.convertible
    ? `Plateau reads numbers with a decimal point (${dot}, not ${v}). Convert the file in the import preview ("Convert to decimal points" rewrites it comma-separated with decimal points, exactly), or save it from your spreadsheet with "." as the decimal separator.`
    : `Plateau reads numbers with a decimal point (${dot}, not ${v}): write them so, or save the file from your spreadsheet with "." as the decimal separator.`;
  return { line: null, column: f.cells > 0 ? f.first.column : null, value: v, message: `${parts.join(" ")} ${fix}` };
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

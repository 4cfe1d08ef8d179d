import Papa from "papaparse";
import { ImportFatalError } from "./types";

/**
 * THE CSV reader of Plateau (web uploads, the browser preview, the command line, the demo seeder and
 * the tests): streaming over raw bytes — UTF-8 decoding (fatal on invalid sequences), NUL-byte
 * (binary) detection, BOM removal, delimiter and line-ending detection from the header line, then
 * papaparse's incremental parser, one chunk at a time. Nothing but the current chunk and the
 * partial last line is held in memory; the caller consumes rows synchronously, and the next chunk
 * is only read after that (back-pressure all the way to the socket). readCsvSync feeds text or
 * bytes already in memory through the same state machine.
 */

export type Delimiter = "," | ";";

export interface CsvHeaderInfo {
  /** Header cells, trimmed, BOM removed, as written (case kept). */
  fields: string[];
  delimiter: Delimiter;
  newline: "\n" | "\r\n" | "\r";
}

export interface CsvConsumer {
  /** Called once with the header; throw ImportFatalError to stop. */
  header(info: CsvHeaderInfo): void;
  /** Called for every non-blank data row, with its 1-based physical line number. */
  row(fields: string[], line: number): void;
  /** A row papaparse could not split cleanly (bad quotes). */
  malformed(line: number, message: string): void;
  /**
   * Optional fast lane for text without any quote character — where papaparse itself only splits
   * records at the newline and fields at the delimiter (its "fast mode"). Called with the chunk's
   * text and the bounds [start, end) of one non-empty record (newline excluded), so the consumer can
   * read the cells in place without allocating them. Return true when the record was taken as a
   * data row; false to receive it through `row` as papaparse would give it
   * (`text.slice(start, end).split(delimiter)`), blank-line check included.
   */
  plainRecord?(text: string, start: number, end: number, line: number): boolean;
}

export interface CsvReadResult {
  bytes: number;
  rows: number;
  lines: number;
  delimiter: Delimiter;
}

/** Streaming strict UTF-8 decoding: throws on an invalid sequence (decode) or an unfinished one at the end (end). */
export interface Utf8Decoder {
  decode(chunk: Uint8Array): string;
  end(): string;
}

/** The standard decoder (browser and server): TextDecoder, fatal, streaming; a leading BOM is dropped. */
export function textUtf8Decoder(): Utf8Decoder {
  const d = new TextDecoder("utf-8", { fatal: true });
  return { decode: (chunk) => d.decode(chunk, { stream: true }), end: () => d.decode() };
}

export interface CsvReadOptions {
  maxBytes: number;
  /** UTF-8 decoder factory (default textUtf8Decoder; the server passes a faster one with the same results). */
  utf8?: () => Utf8Decoder;
  /** Called after each chunk with the bytes read so far. */
  onProgress?: (bytes: number) => void;
  /** Sees every header and data row before the consumer (the browser preview keeps the first rows). */
  tap?: { header?(info: CsvHeaderInfo): void; row?(fields: string[], line: number): void };
}

const HEADER_SCAN_LIMIT = 64 * 1024;
/** Longest record: beyond it the file is not a CSV of ours (or a quote is never closed). Keeps re-parsing linear. */
export const MAX_RECORD_CHARS = 1024 * 1024;

/** Pick the delimiter from the header line: semicolons only when the line clearly uses them. */
export function detectDelimiter(headerLine: string): Delimiter {
  const outside = headerLine.replace(/"[^"]*"/g, "");
  const commas = (outside.match(/,/g) ?? []).length;
  const semis = (outside.match(/;/g) ?? []).length;
  return semis > 0 && semis > commas ? ";" : ",";
}

function detectNewline(text: string): "\n" | "\r\n" | "\r" {
  const lf = text.indexOf("\n");
  if (lf > 0 && text[lf - 1] === "\r") return "\r\n";
  if (lf >= 0) return "\n";
  return text.includes("\r") ? "\r" : "\n";
}

function countOccurrences(s: string, needle: string): number {
  let n = 0;
  let i = s.indexOf(needle);
  while (i !== -1) {
    n += 1;
    i = s.indexOf(needle, i + needle.length);
  }
  return n;
}

export const tooLargeIssue = (maxBytes: number) =>
  new ImportFatalError(
    { line: null, column: null, value: null, message: `The file is larger than the limit of ${Math.round(maxBytes / (1024 * 1024))} MiB.` },
    413,
    "payload_too_large",
  );

/**
 * Read a CSV from a byte stream and hand header and rows to `consumer`.
 * Throws ImportFatalError for an empty, binary, non-UTF-8 or oversized file.
 */
export async function readCsv(source: AsyncIterable<Uint8Array>, consumer: CsvConsumer, opts: CsvReadOptions): Promise<CsvReadResult> {
  const reader = csvReader(consumer, opts);
  for await (const chunk of source) reader.push(chunk);
  return reader.end();
}

/**
 * readCsv over bytes or text already in memory (the command line, the demo seeder, tests): the same reader, fed
 * synchronously in one chunk (text is UTF-8-encoded first, so a BOM, NUL bytes and line ends are treated alike).
 */
export function readCsvSync(input: string | Uint8Array, consumer: CsvConsumer, opts: CsvReadOptions): CsvReadResult {
  const reader = csvReader(consumer, opts);
  const bytes = typeof input === "string" ? new TextEncoder().encode(input) : input;
  if (bytes.byteLength > 0) reader.push(bytes);
  return reader.end();
}

/** The reader's state machine: push chunks in order, then end(). Shared by readCsv and readCsvSync. */
function csvReader(consumer: CsvConsumer, opts: CsvReadOptions): { push(chunk: Uint8Array): void; end(): CsvReadResult } {
  const decoder = (opts.utf8 ?? textUtf8Decoder)();
  let bytes = 0;
  let pending = ""; // text before the header is known
  let partial = ""; // unfinished last record
  let parser: InstanceType<typeof Papa.Parser> | null = null;
  let newline: "\n" | "\r\n" | "\r" = "\n";
  let delimiter: Delimiter = ",";
  let line = 1; // physical line of the next record
  let rows = 0;
  let headerSeen = false;

  const fatal = (message: string, lineNo: number | null = null) => new ImportFatalError({ line: lineNo, column: null, value: null, message });

  const consume = (records: string[][], errors: { row?: number; message: string }[], hasQuotes: boolean) => {
    const badRows = new Map<number, string>();
    for (const e of errors) if (typeof e.row === "number" && !badRows.has(e.row)) badRows.set(e.row, e.message);
    for (let i = 0; i < records.length; i++) {
      const rec = records[i]!;
      const startLine = line;
      if (hasQuotes) {
        let extra = 0;
        for (const f of rec) if (f.includes(newline)) extra += countOccurrences(f, newline);
        line += 1 + extra;
      } else line += 1;
      if (!headerSeen) {
        headerSeen = true;
        const fields = rec.map((f, idx) => (idx === 0 ? f.replace(/^\uFEFF/, "") : f).trim());
        opts.tap?.header?.({ fields, delimiter, newline });
        consumer.header({ fields, delimiter, newline });
        continue;
      }
      const bad = badRows.get(i);
      if (bad !== undefined) {
        consumer.malformed(
          startLine,
          bad === "Quoted field unterminated" ? "a quoted field is not closed" : 'a quote inside a field is not doubled (write "" for a quote character)',
        );
        continue;
      }
      if (rec.length === 1 && rec[0]!.trim() === "") continue; // blank line
      rows += 1;
      opts.tap?.row?.(rec, startLine);
      consumer.row(rec, startLine);
    }
  };

  // the fast lane, unless a tap wants every row's fields (the browser preview)
  const plain = consumer.plainRecord && !opts.tap?.row ? consumer.plainRecord.bind(consumer) : null;
  /** One record of the fast lane: [start, end) of text, newline excluded. */
  const plainRecord = (text: string, start: number, end: number) => {
    const startLine = line;
    line += 1;
    if (end === start) return; // empty line
    if (plain!(text, start, end, startLine)) {
      rows += 1;
      return;
    }
    const rec = text.slice(start, end).split(delimiter);
    if (rec.length === 1 && rec[0]!.trim() === "") return; // blank line
    rows += 1;
    consumer.row(rec, startLine);
  };
  /**
   * Records of quote-free text, exactly as papaparse's fast mode splits `partial + text` (the last
   * one stays partial unless `last`). The chunk is read where it is — concatenating it to the
   * partial record would give a rope string, much slower to read character by character.
   */
  const plainRecords = (text: string, last: boolean) => {
    const nl = newline.length;
    let pos = 0;
    if (partial !== "") {
      // the record begun in the previous chunk ends at the first newline (a CRLF may straddle the edge)
      let head: string;
      if (nl === 2 && partial.charCodeAt(partial.length - 1) === 13 && text.charCodeAt(0) === 10) {
        head = partial.slice(0, -1);
        pos = 1;
      } else {
        const end = text.indexOf(newline);
        if (end === -1 && !last) {
          partial += text;
          if (partial.length > MAX_RECORD_CHARS) {
            throw fatal(`Line ${line} starts a record longer than 1 MiB: a quote is probably not closed, or this is not a CSV file.`, line);
          }
          return;
        }
        head = end === -1 ? partial + text : partial + text.slice(0, end);
        pos = end === -1 ? text.length : end + nl;
      }
      partial = "";
      plainRecord(head, 0, head.length);
    }
    while (pos < text.length) {
      let end = text.indexOf(newline, pos);
      if (end === -1) {
        if (!last) break;
        end = text.length;
      }
      plainRecord(text, pos, end);
      pos = end + nl;
    }
    partial = last || pos >= text.length ? "" : text.substring(pos);
    if (partial.length > MAX_RECORD_CHARS) {
      throw fatal(`Line ${line} starts a record longer than 1 MiB: a quote is probably not closed, or this is not a CSV file.`, line);
    }
  };

  const feed = (text: string, last: boolean) => {
    if (!parser) {
      pending += text;
      const lf = pending.search(/[\r\n]/);
      if (lf === -1 && !last && pending.length < HEADER_SCAN_LIMIT) return;
      if (lf === -1 && !last) throw fatal("The first line is longer than 64 KiB: this does not look like a CSV header.", 1);
      if (pending.replace(/^\uFEFF/, "").trim() === "") {
        if (last) throw fatal("The file is empty.");
        if (pending.length < HEADER_SCAN_LIMIT) return;
      }
      const firstLine = lf === -1 ? pending : pending.slice(0, lf);
      delimiter = detectDelimiter(firstLine);
      newline = detectNewline(pending);
      parser = new Papa.Parser({ delimiter, newline, quoteChar: '"' });
      text = pending;
      pending = "";
    }
    if (headerSeen && plain && text.indexOf('"') === -1 && partial.indexOf('"') === -1) {
      if (partial !== "" || text !== "") plainRecords(text, last);
      return;
    }
    const aggregate = partial + text;
    if (aggregate === "") return;
    const res = parser.parse(aggregate, 0, !last);
    const hasQuotes = aggregate.includes('"');
    partial = last ? "" : aggregate.substring(res.meta.cursor);
    consume(res.data as string[][], res.errors as { row?: number; message: string }[], hasQuotes);
    if (partial.length > MAX_RECORD_CHARS) {
      throw fatal(`Line ${line} starts a record longer than 1 MiB: a quote is probably not closed, or this is not a CSV file.`, line);
    }
  };

  return {
    push(chunk: Uint8Array): void {
      bytes += chunk.byteLength;
      if (bytes > opts.maxBytes) throw tooLargeIssue(opts.maxBytes);
      if (chunk.indexOf(0) !== -1) {
        throw fatal(
          "The file contains NUL bytes: it looks like a binary file (a spreadsheet workbook or an archive?), not CSV text. Save it as CSV (UTF-8) and upload that.",
        );
      }
      let text: string;
      try {
        text = decoder.decode(chunk);
      } catch {
        throw fatal(`The file is not valid UTF-8 text (bad byte sequence in the first ${bytes} bytes). Save it as CSV (UTF-8).`);
      }
      feed(text, false);
      opts.onProgress?.(bytes);
    },
    end(): CsvReadResult {
      let tail: string;
      try {
        tail = decoder.end();
      } catch {
        throw fatal("The file is not valid UTF-8 text (it ends inside a multi-byte character). Save it as CSV (UTF-8).");
      }
      if (bytes === 0) throw fatal("The file is empty.");
      feed(tail, true);
      if (!headerSeen) throw fatal("The file is empty.");
      return { bytes, rows, lines: line - 1, delimiter };
    },
  };
}

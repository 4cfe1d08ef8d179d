import { ApiError } from "@/lib/api";
import { tooLargeIssue } from "./csv-stream";
import { UploadInterruptedError } from "./errors";
import { MAX_IMPORT_BYTES } from "./limits";
import { ImportFatalError } from "./types";

/**
 * Bytes of a web ReadableStream as an async iterable; cancels the stream when the consumer stops early.
 * A failing read (the client went away mid-upload) is an UploadInterruptedError.
 */
export async function* streamBytes(stream: ReadableStream<Uint8Array>): AsyncGenerator<Uint8Array> {
  const reader = stream.getReader();
  let done = false;
  try {
    for (;;) {
      let r: ReadableStreamReadResult<Uint8Array>;
      try {
        r = await reader.read();
      } catch (e) {
        done = true; // the stream is errored: nothing left to cancel
        throw new UploadInterruptedError(e);
      }
      if (r.done) {
        done = true;
        return;
      }
      if (r.value && r.value.byteLength > 0) yield r.value;
    }
  } finally {
    // Not awaited: the platform's request stream may only settle a cancel once the client stops sending.
    if (!done) reader.cancel().catch(() => undefined);
  }
}

async function* limited(source: AsyncIterable<Uint8Array>, maxBytes: number): AsyncGenerator<Uint8Array> {
  let n = 0;
  for await (const c of source) {
    n += c.byteLength;
    if (n > maxBytes) throw tooLargeIssue(maxBytes);
    yield c;
  }
}

const CSV_TYPES = /^(text\/csv|text\/plain|application\/csv|application\/vnd\.ms-excel|application\/octet-stream)\b/i;
/** Room for the multipart framing around the file. */
const MULTIPART_OVERHEAD = 64 * 1024;

/**
 * The CSV bytes of an upload: the raw body (text/csv, text/plain, application/octet-stream) or the
 * `file` field of a multipart/form-data body, streamed. 415 for other types, 413 above the limit
 * (from Content-Length at once, or while streaming when the length is not declared).
 */
export function csvUploadSource(req: Request, maxBytes = MAX_IMPORT_BYTES): AsyncIterable<Uint8Array> {
  const type = req.headers.get("content-type") ?? "";
  const declared = Number(req.headers.get("content-length") ?? "NaN");
  const multipart = /^multipart\/form-data\b/i.test(type);
  if (!multipart && !CSV_TYPES.test(type)) {
    throw new ApiError(415, "unsupported_media_type", "Send the CSV as text/csv (the raw file as the body) or as multipart/form-data with a `file` field.");
  }
  const overhead = multipart ? MULTIPART_OVERHEAD : 0;
  if (Number.isFinite(declared) && declared > maxBytes + overhead) throw tooLargeIssue(maxBytes);
  if (!req.body) return (async function* () {})();
  const raw = limited(streamBytes(req.body), maxBytes + overhead);
  if (!multipart) return raw;
  const m = /boundary=(?:"([^"]+)"|([^;\s]+))/i.exec(type);
  const boundary = m?.[1] ?? m?.[2];
  if (!boundary) throw new ApiError(400, "invalid_input", "The multipart body has no boundary.");
  return multipartField(raw, boundary, "file");
}

/**
 * Stream the content of one multipart/form-data field (RFC 7578) without buffering it:
 * bytes are emitted as they arrive, except a tail as long as the boundary delimiter.
 */
export async function* multipartField(source: AsyncIterable<Uint8Array>, boundary: string, field: string): AsyncGenerator<Uint8Array> {
  const delim = Buffer.from(`\r\n--${boundary}`);
  let buf: Buffer = Buffer.from("\r\n"); // so the first boundary matches the same delimiter
  let state: "preamble" | "after" | "headers" | "body" = "preamble";
  let emitting = false;
  let found = false;
  const it = source[Symbol.asyncIterator]();
  let ended = false;
  const more = async (): Promise<boolean> => {
    if (ended) return false;
    const r = await it.next();
    if (r.done) {
      ended = true;
      return false;
    }
    buf = buf.length ? Buffer.concat([buf, r.value]) : Buffer.from(r.value);
    return true;
  };
  try {
    for (;;) {
      if (state === "preamble") {
        const i = buf.indexOf(delim);
        if (i === -1) {
          buf = buf.subarray(Math.max(0, buf.length - delim.length));
          if (!(await more())) break;
          continue;
        }
        buf = buf.subarray(i + delim.length);
        state = "after";
      }
      if (state === "after") {
        if (buf.length < 2) {
          if (!(await more())) break;
          continue;
        }
        if (buf[0] === 0x2d && buf[1] === 0x2d) break; // closing "--"
        const eol = buf.indexOf("\r\n");
        if (eol === -1) {
          if (!(await more())) break;
          continue;
        }
        buf = buf.subarray(eol + 2);
        state = "headers";
      }
      if (state === "headers") {
        const end = buf.indexOf("\r\n\r\n");
        if (end === -1) {
          if (buf.length > 16 * 1024) throw new ApiError(400, "invalid_input", "A multipart part header is too long.");
          if (!(await more())) break;
          continue;
        }
        const headers = buf.subarray(0, end).toString("utf8");
        buf = buf.subarray(end + 4);
        const disp = /content-disposition:[^\r\n]*\bname="([^"]*)"/i.exec(headers);
        emitting = disp?.[1] === field && !found;
        if (emitting) found = true;
        state = "body";
      }
      if (state === "body") {
        const i = buf.indexOf(delim);
        if (i !== -1) {
          if (emitting && i > 0) yield buf.subarray(0, i);
          buf = buf.subarray(i + delim.length);
          state = "after";
          if (emitting) return; // the file is complete; the rest of the form is not needed
          continue;
        }
        const keep = delim.length - 1;
        if (buf.length > keep) {
          const out = buf.subarray(0, buf.length - keep);
          buf = Buffer.from(buf.subarray(buf.length - keep));
          if (emitting) yield out;
        }
        if (!(await more())) throw new ImportFatalError({ line: null, column: null, value: null, message: "The upload ended before the file was complete." });
      }
    }
  } finally {
    if (!ended) void it.return?.(undefined);
  }
  if (!found) throw new ApiError(400, "invalid_input", "The form has no `file` field with the CSV.");
}

import { isUtf8 } from "node:buffer";
import type { Utf8Decoder } from "./csv-stream";

/**
 * Server-side strict UTF-8 decoder with the results of the standard one (textUtf8Decoder: TextDecoder,
 * fatal, streaming, leading BOM dropped — the same text, and an error with the same chunk) at a
 * fraction of its cost: each chunk is checked with Node's `isUtf8` (SIMD) and converted with
 * `Buffer#toString`; a sequence cut at the chunk's end is carried over to the next chunk.
 */
export function nodeUtf8Decoder(): Utf8Decoder {
  let carry: Buffer | null = null;
  let start = true;
  return {
    decode(chunk) {
      let buf = Buffer.from(chunk.buffer, chunk.byteOffset, chunk.byteLength);
      if (carry) {
        buf = Buffer.concat([carry, buf]);
        carry = null;
      }
      const cut = completeLength(buf);
      if (cut < buf.length) {
        carry = Buffer.from(buf.subarray(cut)); // a copy: the chunk's memory may be reused
        buf = buf.subarray(0, cut);
      }
      // an error is raised with the chunk holding the first wrong byte, as the standard decoder does
      if (!isUtf8(buf) || (carry && !validPrefix(carry))) throw new TypeError("The encoded data was not valid for encoding utf-8");
      let text = buf.toString("utf8");
      if (start && text.length > 0) {
        start = false;
        if (text.charCodeAt(0) === 0xfeff) text = text.slice(1);
      }
      return text;
    },
    end() {
      if (carry) throw new TypeError("The encoded data was not valid for encoding utf-8");
      return "";
    },
  };
}

/** Bytes of `b` up to the start of an unfinished multi-byte sequence at its end (all of it when none). */
function completeLength(b: Uint8Array): number {
  const n = b.length;
  for (let i = n - 1; i >= 0 && i >= n - 3; i--) {
    const c = b[i]!;
    if ((c & 0xc0) === 0x80) continue; // continuation byte: look further back
    const need = (c & 0xe0) === 0xc0 ? 2 : (c & 0xf0) === 0xe0 ? 3 : (c & 0xf8) === 0xf0 ? 4 : 1;
    return i + need > n ? i : n;
  }
  return n; // no lead byte among the last three: complete, or invalid (isUtf8 says which)
}

/** Whether an unfinished sequence can still become valid UTF-8 (the ranges of the WHATWG decoder). */
function validPrefix(p: Uint8Array): boolean {
  const c = p[0]!;
  let lo = 0x80;
  let hi = 0xbf;
  if (c >= 0xc2 && c <= 0xdf) {
    /* two bytes */
  } else if (c >= 0xe0 && c <= 0xef) {
    if (c === 0xe0) lo = 0xa0;
    if (c === 0xed) hi = 0x9f;
  } else if (c >= 0xf0 && c <= 0xf4) {
    if (c === 0xf0) lo = 0x90;
    if (c === 0xf4) hi = 0x8f;
  } else return false;
  for (let i = 1; i < p.length; i++) {
    const b = p[i]!;
    if (b < lo || b > hi) return false;
    lo = 0x80;
    hi = 0xbf;
  }
  return true;
}

/**
 * Codec of the `class_histograms` row: one row per wire class holding its whole length histogram as
 * two BLOBs of little-endian IEEE-754 doubles — `lengths_m` (SI metres, strictly ascending, each
 * finite and > 0) and `counts` (whole numbers ≥ 0, ≤ 2^53 − 1) — plus `bin_count` and `net_count`
 * (the sum of counts). Every reader and writer of the table goes through this module, which checks
 * the shape both ways: a bad histogram is never written, a damaged row is never served.
 * No server-only import: tests and scripts use it too.
 */

/** A class histogram in memory: parallel arrays, lengths ascending. */
export interface HistogramArrays {
  lengthsM: Float64Array;
  counts: Float64Array;
}

/** The columns of one `class_histograms` row (without class_id). */
export interface HistogramColumns {
  bin_count: number;
  net_count: number;
  lengths_m: Buffer;
  counts: Buffer;
}

export class HistogramBlobError extends Error {}

const LITTLE_ENDIAN = new Uint8Array(new Uint16Array([1]).buffer)[0] === 1;

function check(lengthsM: ArrayLike<number>, counts: ArrayLike<number>): number {
  if (lengthsM.length !== counts.length) throw new HistogramBlobError(`histogram has ${lengthsM.length} lengths but ${counts.length} counts`);
  let nets = 0;
  let prev = 0;
  for (let i = 0; i < lengthsM.length; i++) {
    const l = lengthsM[i]!;
    const c = counts[i]!;
    if (!(l > 0) || !Number.isFinite(l)) throw new HistogramBlobError(`histogram bin ${i}: length ${l} m is not a finite number > 0`);
    if (i > 0 && !(l > prev)) throw new HistogramBlobError(`histogram bin ${i}: length ${l} m does not ascend (previous ${prev} m)`);
    if (!Number.isSafeInteger(c) || c < 0) throw new HistogramBlobError(`histogram bin ${i}: count ${c} is not a whole number ≥ 0`);
    prev = l;
    nets += c;
  }
  if (!Number.isSafeInteger(nets)) throw new HistogramBlobError(`histogram net count ${nets} is too large`);
  return nets;
}

function toBlob(a: ArrayLike<number>): Buffer {
  const f = a instanceof Float64Array ? a : Float64Array.from(a);
  if (LITTLE_ENDIAN) return Buffer.from(f.buffer, f.byteOffset, f.byteLength);
  const b = Buffer.allocUnsafe(f.length * 8);
  for (let i = 0; i < f.length; i++) b.writeDoubleLE(f[i]!, i * 8);
  return b;
}

function fromBlob(b: Uint8Array, n: number, what: string): Float64Array {
  if (b.byteLength !== n * 8) throw new HistogramBlobError(`stored histogram ${what} hold ${b.byteLength} bytes, expected ${n} × 8`);
  const out = new Float64Array(n);
  if (LITTLE_ENDIAN)
    new Uint8Array(out.buffer).set(b); // copy: the blob's offset need not be 8-aligned
  else {
    const v = new DataView(b.buffer, b.byteOffset, b.byteLength);
    for (let i = 0; i < n; i++) out[i] = v.getFloat64(i * 8, true);
  }
  return out;
}

/**
 * Encode a histogram for storage. Lengths must already be strictly ascending (sort first).
 * The returned buffers may share memory with the arrays when they are Float64Arrays (no copy).
 */
export function encodeHistogram(lengthsM: ArrayLike<number>, counts: ArrayLike<number>): HistogramColumns {
  if (lengthsM.length === 0) throw new HistogramBlobError("a stored histogram has at least one bin");
  const nets = check(lengthsM, counts);
  return { bin_count: lengthsM.length, net_count: nets, lengths_m: toBlob(lengthsM), counts: toBlob(counts) };
}

/** The row to insert into `class_histograms` for a class. */
export function histogramRow(classId: string, lengthsM: ArrayLike<number>, counts: ArrayLike<number>): HistogramColumns & { class_id: string } {
  return { class_id: classId, ...encodeHistogram(lengthsM, counts) };
}

/** Decode a stored row, checking sizes, order, counts and the stored totals. */
export function decodeHistogram(row: { bin_count: number; net_count?: number; lengths_m: Uint8Array; counts: Uint8Array }): HistogramArrays {
  const n = Number(row.bin_count);
  if (!Number.isSafeInteger(n) || n < 1) throw new HistogramBlobError(`stored histogram has bin_count ${row.bin_count}`);
  const lengthsM = fromBlob(row.lengths_m, n, "lengths");
  const counts = fromBlob(row.counts, n, "counts");
  const nets = check(lengthsM, counts);
  if (row.net_count !== undefined && Number(row.net_count) !== nets)
    throw new HistogramBlobError(`stored histogram net_count ${row.net_count} differs from the sum of its counts ${nets}`);
  return { lengthsM, counts };
}

/** Decoded histogram as the engine's bins ({ lengthM, count } ascending). */
export function toLengthBins(h: HistogramArrays): { lengthM: number; count: number }[] {
  const out = new Array<{ lengthM: number; count: number }>(h.lengthsM.length);
  for (let i = 0; i < out.length; i++) out[i] = { lengthM: h.lengthsM[i]!, count: h.counts[i]! };
  return out;
}

/**
 * Sort bins given in any order by length (for writers whose source is not sorted, such as seeds and
 * copies of engine data); equal lengths are an error. Returns new arrays.
 */
export function sortedHistogram(bins: readonly { lengthM: number; count: number }[]): HistogramArrays {
  const s = [...bins].sort((a, b) => a.lengthM - b.lengthM);
  return { lengthsM: Float64Array.from(s, (b) => b.lengthM), counts: Float64Array.from(s, (b) => b.count) };
}

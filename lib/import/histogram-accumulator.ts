/**
 * In-memory collector of validated histogram rows, per class, in growable typed arrays:
 * length (f64), count (f64) and source line (u32) — 20 bytes per bin (1,000,000 bins ≈ 20 MB, plus
 * the slack of doubling), never the file's text. Browser-safe (the preview worker uses it too).
 * At the end: repeated lengths of classes whose rows did not ascend are found by sorting an index
 * per such class, and each class's bins are handed out in ascending length order for storage.
 */
import type { LengthBin } from "@/lib/scaling";
import type { HistogramSink } from "./histograms";

const INITIAL_CAPACITY = 1024;
const LITTLE_ENDIAN = new Uint8Array(new Uint16Array([1]).buffer)[0] === 1;

/**
 * Permutation sorting the first `n` keys ascending: a stable LSD radix sort on the keys' bit
 * patterns, 16 bits per pass (positive doubles order like their bits read as unsigned integers),
 * skipping passes where every key has the same digit. Linear time: a million lengths sort in
 * milliseconds, where a comparator sort takes hundreds. Stability keeps equal lengths in push
 * (line) order, so the first of a run of repeats is the earliest line.
 */
export function radixOrder(keys: Float64Array, n: number): Uint32Array {
  const words = new Uint32Array(keys.buffer, keys.byteOffset, n * 2);
  let idx = new Uint32Array(n);
  for (let i = 0; i < n; i++) idx[i] = i;
  let tmp = new Uint32Array(n);
  const count = new Uint32Array(65536);
  for (let pass = 0; pass < 4; pass++) {
    // passes over the low 32-bit word first, then the high word (sign, exponent, top of the mantissa)
    const word = pass < 2 === LITTLE_ENDIAN ? 0 : 1;
    const shift = (pass & 1) * 16;
    count.fill(0);
    for (let i = 0; i < n; i++) count[(words[2 * i + word]! >>> shift) & 0xffff]! += 1;
    if (n === 0 || count[(words[word]! >>> shift) & 0xffff] === n) continue;
    let sum = 0;
    for (let d = 0; d < 65536; d++) {
      const c = count[d]!;
      count[d] = sum;
      sum += c;
    }
    for (let k = 0; k < n; k++) {
      const i = idx[k]!;
      const d = (words[2 * i + word]! >>> shift) & 0xffff;
      tmp[count[d]!] = i;
      count[d]! += 1;
    }
    const t = idx;
    idx = tmp;
    tmp = t;
  }
  return idx;
}

class ClassBins {
  size = 0;
  lengths = new Float64Array(INITIAL_CAPACITY);
  counts = new Float64Array(INITIAL_CAPACITY);
  lines = new Uint32Array(INITIAL_CAPACITY);
  /** Permutation into ascending (length, line) order; null while the rows ascend as pushed. */
  order: Uint32Array | null = null;
  ascending = true;

  grow(): void {
    const cap = this.lengths.length * 2;
    const l = new Float64Array(cap);
    l.set(this.lengths);
    this.lengths = l;
    const c = new Float64Array(cap);
    c.set(this.counts);
    this.counts = c;
    const n = new Uint32Array(cap);
    n.set(this.lines);
    this.lines = n;
  }

  sortOrder(): Uint32Array {
    return (this.order ??= radixOrder(this.lengths, this.size));
  }
}

export class HistogramAccumulator implements HistogramSink {
  private readonly classes: (ClassBins | undefined)[];

  constructor(classCount: number) {
    this.classes = new Array<ClassBins | undefined>(classCount);
  }

  push(classIndex: number, lengthM: number, count: number, line: number): void {
    let c = this.classes[classIndex];
    if (!c) this.classes[classIndex] = c = new ClassBins();
    const i = c.size;
    if (i === c.lengths.length) c.grow();
    if (i > 0 && lengthM <= c.lengths[i - 1]!) c.ascending = false;
    c.lengths[i] = lengthM;
    c.counts[i] = count;
    c.lines[i] = line;
    c.size = i + 1;
  }

  /** Each repeat of a length within the class (rows in any order): its line and the first line with that length. */
  findRepeats(classIndex: number, found: (line: number, firstLine: number, lengthM: number) => void): void {
    const c = this.classes[classIndex];
    if (!c || c.ascending) return;
    const o = c.sortOrder();
    let first = 0;
    for (let k = 1; k < o.length; k++) {
      const i = o[k]!;
      if (c.lengths[i] === c.lengths[o[first]!]) found(c.lines[i]!, c.lines[o[first]!]!, c.lengths[i]!);
      else first = k;
    }
  }

  /** Indices of the classes that received bins, ascending. */
  classIndices(): number[] {
    const out: number[] = [];
    this.classes.forEach((c, i) => c && c.size > 0 && out.push(i));
    return out;
  }

  binCount(classIndex: number): number {
    return this.classes[classIndex]?.size ?? 0;
  }

  /**
   * The class's bins in ascending length order (views without copying when the rows already
   * ascended; sorted copies otherwise). Valid until the accumulator is released.
   */
  sorted(classIndex: number): { lengthsM: Float64Array; counts: Float64Array } {
    const c = this.classes[classIndex];
    if (!c) return { lengthsM: new Float64Array(0), counts: new Float64Array(0) };
    if (c.ascending) return { lengthsM: c.lengths.subarray(0, c.size), counts: c.counts.subarray(0, c.size) };
    const o = c.sortOrder();
    const lengthsM = new Float64Array(o.length);
    const counts = new Float64Array(o.length);
    for (let k = 0; k < o.length; k++) {
      lengthsM[k] = c.lengths[o[k]!]!;
      counts[k] = c.counts[o[k]!]!;
    }
    return { lengthsM, counts };
  }

  /** The class's bins as engine LengthBins, in ascending length order. */
  lengthBins(classIndex: number): LengthBin[] {
    const { lengthsM, counts } = this.sorted(classIndex);
    const out: LengthBin[] = new Array(lengthsM.length);
    for (let k = 0; k < lengthsM.length; k++) out[k] = { lengthM: lengthsM[k]!, count: counts[k]! };
    return out;
  }

  /** Drop the arrays (the caller is done). */
  release(): void {
    this.classes.fill(undefined);
  }
}

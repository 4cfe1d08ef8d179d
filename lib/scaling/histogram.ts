/**
 * The one reduction of long length histograms before evaluation. The engine applies it to every class histogram
 * (evaluateClass, evaluateScenario), so the browser, the API and report freezing evaluate the same bins whether or
 * not a caller merged them first (merging a merged histogram changes nothing).
 */
import type { LengthBin } from "./types";

/** Histograms up to this many bins are evaluated bin for bin; longer ones are merged into this many. */
export const MAX_EVALUATED_BINS = 400;

/**
 * Merge a histogram of more than `maxBins` bins into at most `maxBins` bins (ours; common practice, no source): the
 * longest non-empty length stays a bin of its own (so the worst delay, always that of the longest net, is exact), and
 * the other non-empty bins fall into `maxBins − 1` bins of equal width in log(length) between the shortest and the
 * longest length, each keeping its net count and count-weighted mean length (so total nets and total wire length, hence
 * capacitance and energy, are kept). Empty bins (count 0) are dropped. Histograms of at most `maxBins` bins come back
 * unchanged (the same array); the result is in ascending length order. Its cost on a 2,000-bin set is measured in
 * tests/scaling/histogram.test.ts.
 */
export function coarsenHistogram(bins: LengthBin[], maxBins = MAX_EVALUATED_BINS): LengthBin[] {
  if (bins.length <= maxBins) return bins;
  let lo = Infinity;
  let hi = -Infinity;
  for (const b of bins) {
    if (!(b.lengthM > 0 && b.count > 0)) continue;
    if (b.lengthM < lo) lo = b.lengthM;
    if (b.lengthM > hi) hi = b.lengthM;
  }
  if (lo === Infinity) return [];
  const n = Math.max(1, maxBins - 1);
  const logLo = Math.log(lo);
  const width = (Math.log(hi) - logLo) / n || 1;
  const sum = new Float64Array(n);
  const count = new Float64Array(n);
  let longest = 0;
  for (const b of bins) {
    if (!(b.lengthM > 0 && b.count > 0)) continue;
    if (b.lengthM === hi) {
      longest += b.count;
      continue;
    }
    const i = Math.min(n - 1, Math.floor((Math.log(b.lengthM) - logLo) / width));
    sum[i]! += b.lengthM * b.count;
    count[i]! += b.count;
  }
  const out: LengthBin[] = [];
  for (let i = 0; i < n; i++) if (count[i]! > 0) out.push({ lengthM: sum[i]! / count[i]!, count: count[i]! });
  out.push({ lengthM: hi, count: longest });
  return out;
}

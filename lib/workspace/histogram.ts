import type { LengthBin } from "@/lib/scaling";

/**
 * Merge a long, length-sorted histogram into at most `maxBins` bins of equal width in log(length),
 * keeping the count and the count-weighted mean length of each. Short histograms come back unchanged,
 * so the browser evaluates exactly what the server does for them.
 */
export function coarsenHistogram(bins: LengthBin[], maxBins = 400): LengthBin[] {
  if (bins.length <= maxBins) return bins;
  const positive = bins.filter((b) => b.lengthM > 0 && b.count > 0);
  if (positive.length === 0) return [];
  const lo = Math.log(positive[0]!.lengthM);
  const hi = Math.log(positive[positive.length - 1]!.lengthM);
  const width = (hi - lo) / maxBins || 1;
  const acc = new Map<number, { sum: number; count: number }>();
  for (const b of positive) {
    const i = Math.min(maxBins - 1, Math.floor((Math.log(b.lengthM) - lo) / width));
    const a = acc.get(i) ?? { sum: 0, count: 0 };
    a.sum += b.lengthM * b.count;
    a.count += b.count;
    acc.set(i, a);
  }
  return [...acc.entries()].sort((x, y) => x[0] - y[0]).map(([, a]) => ({ lengthM: a.sum / a.count, count: a.count }));
}

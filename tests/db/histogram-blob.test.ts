import { describe, expect, it } from "vitest";
import { decodeHistogram, encodeHistogram, histogramRow, HistogramBlobError, sortedHistogram, toLengthBins } from "@/db/histogram-blob";

describe("class_histograms codec", () => {
  it("round-trips lengths and counts as little-endian float64 blobs with bin and net counts", () => {
    const lengths = new Float64Array([3e-7, 1e-6, 2.5e-5]);
    const counts = new Float64Array([10, 0, 2 ** 40]);
    const row = histogramRow("c1", lengths, counts);
    expect(row).toMatchObject({ class_id: "c1", bin_count: 3, net_count: 10 + 2 ** 40 });
    expect(row.lengths_m.byteLength).toBe(24);
    expect(row.lengths_m.readDoubleLE(0)).toBe(3e-7);
    expect(row.counts.readDoubleLE(16)).toBe(2 ** 40);
    // stored blobs come back as Buffers at any offset: copy them to an odd offset
    const odd = (b: Buffer) => Buffer.concat([Buffer.from([0]), b]).subarray(1);
    const back = decodeHistogram({ bin_count: 3, net_count: row.net_count, lengths_m: odd(row.lengths_m), counts: odd(row.counts) });
    expect([...back.lengthsM]).toEqual([...lengths]);
    expect([...back.counts]).toEqual([...counts]);
    expect(toLengthBins(back)[1]).toEqual({ lengthM: 1e-6, count: 0 });
  });

  it("refuses to write a histogram that is empty, unsorted, repeated, non-finite, negative or fractional", () => {
    const bad: [number[], number[], RegExp][] = [
      [[], [], /at least one bin/],
      [[1e-6, 2e-6], [1], /2 lengths but 1 counts/],
      [[2e-6, 1e-6], [1, 1], /does not ascend/],
      [[1e-6, 1e-6], [1, 1], /does not ascend/],
      [[0], [1], /finite number > 0/],
      [[Infinity], [1], /finite number > 0/],
      [[NaN], [1], /finite number > 0/],
      [[1e-6], [-1], /whole number ≥ 0/],
      [[1e-6], [1.5], /whole number ≥ 0/],
      [[1e-6, 2e-6], [Number.MAX_SAFE_INTEGER, 1], /too large/],
    ];
    for (const [l, c, m] of bad) {
      expect(() => encodeHistogram(l, c)).toThrow(HistogramBlobError);
      expect(() => encodeHistogram(l, c)).toThrow(m);
    }
  });

  it("refuses to serve a damaged row", () => {
    const row = histogramRow("c1", [1e-6, 2e-6], [1, 2]);
    expect(() => decodeHistogram({ ...row, bin_count: 3 })).toThrow(/expected 3 × 8/);
    expect(() => decodeHistogram({ ...row, bin_count: 0 })).toThrow(/bin_count 0/);
    expect(() => decodeHistogram({ ...row, net_count: 4 })).toThrow(/net_count 4 differs/);
    expect(() => decodeHistogram({ ...row, lengths_m: row.lengths_m.subarray(0, 15) })).toThrow(/15 bytes/);
    const swapped = histogramRow("c1", [1e-6, 2e-6], [1, 2]);
    expect(() => decodeHistogram({ ...swapped, lengths_m: Buffer.concat([swapped.lengths_m.subarray(8), swapped.lengths_m.subarray(0, 8)]) })).toThrow(
      /does not ascend/,
    );
  });

  it("sorts engine bins for writers whose source is not sorted", () => {
    const h = sortedHistogram([
      { lengthM: 3e-6, count: 1 },
      { lengthM: 1e-6, count: 2 },
    ]);
    expect([...h.lengthsM]).toEqual([1e-6, 3e-6]);
    expect([...h.counts]).toEqual([2, 1]);
  });
});

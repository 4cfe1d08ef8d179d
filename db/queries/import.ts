import "server-only";
import type { Knex } from "knex";
import { decodeHistogram, toLengthBins, type HistogramArrays } from "@/db/histogram-blob";

/**
 * Reads of stored length histograms (CSV export, the JSON API). A histogram is one `class_histograms`
 * row per class (two float64 BLOBs, db/histogram-blob.ts). Imports are written by db/writes/baselines.ts.
 */

type Q = Knex | Knex.Transaction;

/** A class's stored histogram (ascending lengths), or null when it has none. */
export async function classHistogram(db: Q, classId: string): Promise<HistogramArrays | null> {
  const row = await db("class_histograms").where({ class_id: classId }).first("bin_count", "net_count", "lengths_m", "counts");
  return row ? decodeHistogram(row) : null;
}

/** Classes of a baseline (id and name) in table order. */
export async function classIdsAndNames(db: Q, baselineId: string): Promise<{ id: string; name: string }[]> {
  return db("wire_classes").where({ baseline_id: baselineId }).orderBy("position").select("id", "name");
}

/** Per-class histogram bins (ascending length) of a baseline, for the JSON API; classes without one have no bins. */
export async function histogramsByClass(db: Q, baselineId: string): Promise<{ name: string; netCount: number; bins: { lengthM: number; count: number }[] }[]> {
  const rows: { name: string; bin_count: number | null; net_count: number | null; lengths_m: Buffer | null; counts: Buffer | null }[] = await db(
    "wire_classes as c",
  )
    .leftJoin("class_histograms as h", "h.class_id", "c.id")
    .where("c.baseline_id", baselineId)
    .orderBy("c.position")
    .select("c.name", "h.bin_count", "h.net_count", "h.lengths_m", "h.counts");
  return rows.map((r) =>
    r.bin_count === null || r.lengths_m === null || r.counts === null
      ? { name: r.name, netCount: 0, bins: [] }
      : {
          name: r.name,
          netCount: Number(r.net_count),
          bins: toLengthBins(decodeHistogram({ bin_count: r.bin_count, net_count: r.net_count ?? undefined, lengths_m: r.lengths_m, counts: r.counts })),
        },
  );
}

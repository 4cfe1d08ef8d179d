import "server-only";
import type { Knex } from "knex";
import type { LengthBin, Tier, WireClass } from "@/lib/scaling";
import { decodeHistogram, toLengthBins } from "@/db/histogram-blob";

// Reads of a baseline's class table. Writes (replace, copy, import): db/writes/baselines.ts.

type Q = Knex | Knex.Transaction;

/** A stored wire class: the engine's WireClass plus its row id, position and histogram size. */
export interface StoredWireClass extends WireClass {
  id: string;
  position: number;
  histogramBins: number;
}

interface ClassRow {
  id: string;
  baseline_id: string;
  position: number;
  name: string;
  tier: string;
  width_m: number;
  thickness_m: number;
  spacing_m: number;
  ild_below_m: number | null;
  ild_above_m: number | null;
  barrier_m: number;
  metal: string;
  k: number;
  net_count: number;
  mean_length_m: number;
  driver_ohm: number;
  load_f: number;
  activity: number;
  /** Engine 2 vias (migration 4); null = not given. */
  vias_per_net?: number | null;
  via_ohm?: number | null;
  via_width_m?: number | null;
  via_height_m?: number | null;
  /** Air gap between the lines (migration 5); null = not given. */
  k_gap?: number | null;
  gap_fraction?: number | null;
  bins?: number;
}

function toWireClass(r: ClassRow): StoredWireClass {
  return {
    id: r.id,
    position: r.position,
    name: r.name,
    tier: r.tier as Tier,
    widthM: r.width_m,
    thicknessM: r.thickness_m,
    spacingM: r.spacing_m,
    ildBelowM: r.ild_below_m,
    ildAboveM: r.ild_above_m,
    barrierM: r.barrier_m,
    metal: r.metal,
    k: r.k,
    netCount: r.net_count,
    meanLengthM: r.mean_length_m,
    driverOhm: r.driver_ohm,
    loadF: r.load_f,
    activity: r.activity,
    // optional via fields only when stored, so classes without vias are exactly what they were
    ...(r.vias_per_net != null && { viasPerNet: r.vias_per_net }),
    ...(r.via_ohm != null && { viaOhm: r.via_ohm }),
    ...(r.via_width_m != null && { viaWidthM: r.via_width_m }),
    ...(r.via_height_m != null && { viaHeightM: r.via_height_m }),
    // the air-gap fields the same way: classes without a gap are exactly what they were
    ...(r.k_gap != null && { kGap: r.k_gap }),
    ...(r.gap_fraction != null && { gapFraction: r.gap_fraction }),
    histogramBins: Number(r.bins ?? 0),
  };
}

/** Classes of a baseline in table order, with the number of histogram bins each carries. */
export async function listClasses(db: Q, baselineId: string): Promise<StoredWireClass[]> {
  const rows: ClassRow[] = await db("wire_classes as c")
    .where("c.baseline_id", baselineId)
    .select("c.*", db.raw("(select h.bin_count from class_histograms h where h.class_id = c.id) as bins"))
    .orderBy("c.position");
  return rows.map(toWireClass);
}

/** Histogram bins of the given classes, sorted by length, keyed by class id (classes without one are absent). */
export async function loadHistograms(db: Q, classIds: string[]): Promise<Map<string, LengthBin[]>> {
  const out = new Map<string, LengthBin[]>();
  for (let i = 0; i < classIds.length; i += 500) {
    const rows: { class_id: string; bin_count: number; net_count: number; lengths_m: Buffer; counts: Buffer }[] = await db("class_histograms")
      .whereIn("class_id", classIds.slice(i, i + 500))
      .select("class_id", "bin_count", "net_count", "lengths_m", "counts");
    for (const r of rows) out.set(r.class_id, toLengthBins(decodeHistogram(r)));
  }
  return out;
}

/** Classes with their histograms attached (for evaluation). */
export async function listClassesWithHistograms(db: Q, baselineId: string): Promise<StoredWireClass[]> {
  const classes = await listClasses(db, baselineId);
  const hist = await loadHistograms(
    db,
    classes.filter((c) => c.histogramBins > 0).map((c) => c.id),
  );
  for (const c of classes) {
    const h = hist.get(c.id);
    if (h && h.length > 0) c.histogram = h;
  }
  return classes;
}

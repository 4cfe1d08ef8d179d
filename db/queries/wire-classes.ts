import "server-only";
import { randomUUID } from "node:crypto";
import type { Knex } from "knex";
import type { LengthBin, Tier, WireClass } from "@/lib/scaling";
import type { WireClassInput } from "@/lib/validation/wire-class";
import { decodeHistogram, toLengthBins } from "@/db/histogram-blob";

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
    histogramBins: Number(r.bins ?? 0),
  };
}

function toRow(baselineId: string, position: number, c: Omit<WireClassInput, "id">) {
  return {
    baseline_id: baselineId,
    position,
    name: c.name,
    tier: c.tier,
    width_m: c.widthM,
    thickness_m: c.thicknessM,
    spacing_m: c.spacingM,
    ild_below_m: c.ildBelowM,
    ild_above_m: c.ildAboveM,
    barrier_m: c.barrierM,
    metal: c.metal,
    k: c.k,
    net_count: c.netCount,
    mean_length_m: c.meanLengthM,
    driver_ohm: c.driverOhm,
    load_f: c.loadF,
    activity: c.activity,
  };
}

/** Classes of a baseline in table order, with the number of histogram bins each carries. */
export async function listClasses(db: Knex, baselineId: string): Promise<StoredWireClass[]> {
  const rows: ClassRow[] = await db("wire_classes as c")
    .where("c.baseline_id", baselineId)
    .select("c.*", db.raw("(select h.bin_count from class_histograms h where h.class_id = c.id) as bins"))
    .orderBy("c.position");
  return rows.map(toWireClass);
}

/** Histogram bins of the given classes, sorted by length, keyed by class id (classes without one are absent). */
export async function loadHistograms(db: Knex, classIds: string[]): Promise<Map<string, LengthBin[]>> {
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
export async function listClassesWithHistograms(db: Knex, baselineId: string): Promise<StoredWireClass[]> {
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

/**
 * Replace a baseline's classes inside the caller's transaction. A row whose `id` (or, without an id,
 * whose name) matches an existing class is updated in place so its histogram survives; other
 * existing classes are deleted (their histograms cascade); the rest are inserted.
 */
export async function replaceClasses(trx: Knex.Transaction, baselineId: string, classes: WireClassInput[]): Promise<void> {
  const existing: { id: string; name: string }[] = await trx("wire_classes").where({ baseline_id: baselineId }).select("id", "name");
  const byId = new Map(existing.map((e) => [e.id, e]));
  const byName = new Map(existing.map((e) => [e.name.toLowerCase(), e]));
  const claimed = new Set<string>();
  const plan = classes.map((c) => {
    let keep = c.id ? byId.get(c.id) : undefined;
    if (!keep && !c.id) {
      const named = byName.get(c.name.toLowerCase());
      if (named && !classes.some((o) => o.id === named.id)) keep = named;
    }
    if (keep && claimed.has(keep.id)) keep = undefined;
    if (keep) claimed.add(keep.id);
    return { input: c, keepId: keep?.id };
  });
  const drop = existing.filter((e) => !claimed.has(e.id)).map((e) => e.id);
  if (drop.length) await trx("wire_classes").whereIn("id", drop).delete();
  // Park kept rows under unique temporary names so renames and swaps never trip unique(baseline_id, name).
  for (const p of plan) if (p.keepId) await trx("wire_classes").where({ id: p.keepId }).update({ name: `\u0000${p.keepId}` });
  let position = 0;
  for (const p of plan) {
    const { id: _ignored, ...c } = p.input;
    const row = toRow(baselineId, position++, c);
    if (p.keepId) await trx("wire_classes").where({ id: p.keepId }).update(row);
    else await trx("wire_classes").insert({ id: randomUUID(), ...row });
  }
}

/** Copy classes and their histograms to another baseline (inside the caller's transaction). */
export async function copyClasses(trx: Knex.Transaction, fromBaselineId: string, toBaselineId: string): Promise<void> {
  const rows: ClassRow[] = await trx("wire_classes").where({ baseline_id: fromBaselineId }).orderBy("position");
  for (const r of rows) {
    const newId = randomUUID();
    const { bins: _b, ...rest } = r;
    await trx("wire_classes").insert({ ...rest, id: newId, baseline_id: toBaselineId });
    await trx.raw("insert into class_histograms (class_id, bin_count, net_count, lengths_m, counts) select ?, bin_count, net_count, lengths_m, counts from class_histograms where class_id = ?", [newId, r.id]);
  }
}

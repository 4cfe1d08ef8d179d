import "server-only";
import { randomUUID } from "node:crypto";
import type { Knex } from "knex";
import type { Technology } from "@/lib/scaling";
import type { WireClassInput } from "@/lib/validation/wire-class";
import type { ImportMode } from "@/lib/validation/import";
import { decodeHistogram, encodeHistogram, toLengthBins, type HistogramArrays, type HistogramColumns } from "@/db/histogram-blob";
import { getBaseline } from "./baselines";
import { listClasses, listClassesWithHistograms, replaceClasses } from "./wire-classes";

/**
 * SQL of CSV import and export. Every import is ONE transaction. A histogram is one
 * `class_histograms` row per class (two float64 BLOBs, db/histogram-blob.ts), so even a
 * 1,000,000-bin import writes only a few rows.
 */

/** Classes with their histograms attached, as the engine reads them (alias of the workspace query). */
export const loadClassesWithHistograms = listClassesWithHistograms;

export class ImportConflictError extends Error {}

/** Class names of a baseline in table order. */
export async function listClassNames(db: Knex, baselineId: string): Promise<string[]> {
  const rows: { name: string }[] = await db("wire_classes").where({ baseline_id: baselineId }).orderBy("position").select("name");
  return rows.map((r) => r.name);
}

/** The revision snapshot, in the same shape as the workspace's baseline revisions. */
async function writeImportRevision(trx: Knex.Transaction, baselineId: string, version: number, userId: string, summary: string): Promise<void> {
  const b = await getBaseline(trx as unknown as Knex, baselineId);
  const classes = await listClasses(trx as unknown as Knex, baselineId);
  const snapshot = JSON.stringify({ name: b?.name, description: b?.description, technology: b?.technology, classes: classes.map(({ histogramBins: _h, ...c }) => c) });
  await trx("baseline_revisions").insert({ baseline_id: baselineId, version, user_id: userId, at: Date.now(), summary, snapshot });
}

async function bump(trx: Knex.Transaction, baselineId: string, userId: string): Promise<number> {
  const row = await trx("baselines").where({ id: baselineId }).first("version");
  if (!row) throw new ImportConflictError("The baseline was deleted during the upload.");
  const v = Number(row.version) + 1;
  await trx("baselines").where({ id: baselineId }).update({ version: v, updated_by: userId, updated_at: Date.now() });
  return v;
}

async function auditIn(trx: Knex.Transaction, e: { teamId: string; userId: string; action: string; entityId: string; detail: unknown }): Promise<void> {
  await trx("audit_log").insert({ team_id: e.teamId, user_id: e.userId, action: e.action, entity_type: "baseline", entity_id: e.entityId, detail: JSON.stringify(e.detail), at: Date.now() });
}

/** One class's validated bins, in ascending length order. */
export interface ClassBinsInput {
  /** Index into `classNames`. */
  classIndex: number;
  lengthsM: Float64Array;
  counts: Float64Array;
}

/**
 * Store imported histograms: one `class_histograms` row per class in the file (encoded and checked
 * before the transaction starts, so the transaction only deletes and inserts a few rows).
 * replace: every class's histogram is replaced by the file's (classes absent from the file end with
 * none); merge: only the classes in the file get new histograms.
 */
export async function storeHistograms(
  db: Knex,
  p: { baselineId: string; teamId: string; userId: string; mode: ImportMode; classNames: readonly string[]; histograms: readonly ClassBinsInput[]; summary: string; detail: unknown },
): Promise<{ version: number; inserted: number }> {
  const encoded = p.histograms.map((h) => ({ classIndex: h.classIndex, columns: encodeHistogram(h.lengthsM, h.counts) }));
  const bytes = encoded.reduce((n, e) => n + e.columns.lengths_m.byteLength + e.columns.counts.byteLength, 0);
  return bytes < LARGE_WRITE_BYTES ? writeHistograms(db, p, encoded) : withDeferredCheckpoint(db, () => writeHistograms(db, p, encoded));
}

/** Above this many bytes of blobs, the WAL checkpoint runs after the answer rather than inside the commit. */
const LARGE_WRITE_BYTES = 1 << 20;

/**
 * Run a large write with SQLite's automatic WAL checkpoint suspended, then checkpoint right after.
 * A commit in WAL mode is complete once its frames are in the WAL (with synchronous=NORMAL, as set in
 * db/connect.ts, that is the durability the app has for every write); the automatic checkpoint that
 * a big commit triggers copies the pages into the main file and syncs both files to disk — for a
 * 1,000,000-bin import (16 MB of blobs) that is the larger part of the storing time on a slow disk.
 * It is the same work either way; here it is done just after the request is answered (PASSIVE:
 * never waits for readers; through the pool, so never inside another transaction).
 */
/** Large writes in flight per database, and the auto-checkpoint setting to restore after the last. */
const suspended = new WeakMap<Knex, { inFlight: number; every: number }>();

async function withDeferredCheckpoint<T>(db: Knex, write: () => Promise<T>): Promise<T> {
  // concurrent large imports share one suspension: the first reads the setting, the last restores it
  let s = suspended.get(db);
  const first = !s;
  if (!s) suspended.set(db, (s = { inFlight: 0, every: 1000 }));
  s.inFlight += 1;
  try {
    if (first) {
      const rows = (await db.raw("pragma wal_autocheckpoint")) as { wal_autocheckpoint: number }[];
      const every = Number(rows[0]?.wal_autocheckpoint);
      if (Number.isSafeInteger(every) && every > 0) s.every = every;
      await db.raw("pragma wal_autocheckpoint = 0");
    }
    return await write();
  } finally {
    s.inFlight -= 1;
    if (s.inFlight === 0) {
      suspended.delete(db);
      await db.raw(`pragma wal_autocheckpoint = ${s.every}`);
      setTimeout(() => void db.raw("pragma wal_checkpoint(PASSIVE)").catch(() => undefined), 20).unref();
    }
  }
}

async function writeHistograms(
  db: Knex,
  p: { baselineId: string; teamId: string; userId: string; mode: ImportMode; classNames: readonly string[]; summary: string; detail: unknown },
  encoded: { classIndex: number; columns: HistogramColumns }[],
): Promise<{ version: number; inserted: number }> {
  return db.transaction(async (trx) => {
    const current: { id: string; name: string }[] = await trx("wire_classes").where({ baseline_id: p.baselineId }).select("id", "name");
    const idByName = new Map(current.map((c) => [c.name, c.id]));
    const ids = p.classNames.map((n) => idByName.get(n));
    const missing = encoded.filter((e) => !ids[e.classIndex]).map((e) => p.classNames[e.classIndex]);
    if (missing.length) throw new ImportConflictError(`Classes ${missing.join(", ")} were removed from the baseline during the upload; upload again.`);
    if (p.mode === "replace") {
      await trx("class_histograms").whereIn("class_id", trx("wire_classes").where({ baseline_id: p.baselineId }).select("id")).delete();
    } else {
      const touched = encoded.map((e) => ids[e.classIndex]!);
      for (let i = 0; i < touched.length; i += 500) await trx("class_histograms").whereIn("class_id", touched.slice(i, i + 500)).delete();
    }
    let inserted = 0;
    for (const e of encoded) {
      await trx("class_histograms").insert({ class_id: ids[e.classIndex]!, ...e.columns });
      inserted += e.columns.bin_count;
    }
    const version = await bump(trx, p.baselineId, p.userId);
    await writeImportRevision(trx, p.baselineId, version, p.userId, p.summary);
    await auditIn(trx, { teamId: p.teamId, userId: p.userId, action: "baseline.histograms_imported", entityId: p.baselineId, detail: p.detail });
    return { version, inserted };
  });
}

/**
 * Store imported classes. replace: the file becomes the class table (classes of the same name keep
 * their id and histogram; others are deleted); merge: file rows update classes of the same name
 * (case-insensitive) and new ones are appended; classes absent from the file stay.
 */
export async function storeWireClasses(
  db: Knex,
  p: { baselineId: string; teamId: string; userId: string; mode: ImportMode; classes: Omit<WireClassInput, "id">[]; summary: string; detail: unknown; maxClasses: number },
): Promise<{ version: number; classCount: number }> {
  return db.transaction(async (trx) => {
    let list: WireClassInput[];
    if (p.mode === "replace") list = p.classes.map((c) => ({ ...c }));
    else {
      const existing = await listClasses(trx as unknown as Knex, p.baselineId);
      const incoming = new Map(p.classes.map((c) => [c.name.toLowerCase(), c]));
      list = existing.map(({ histogramBins: _h, position: _p, histogram: _g, id, ...c }) => {
        const repl = incoming.get(c.name.toLowerCase());
        if (repl) incoming.delete(c.name.toLowerCase());
        return { ...(repl ?? c), id } as WireClassInput;
      });
      for (const c of p.classes) if (incoming.has(c.name.toLowerCase())) list.push({ ...c });
    }
    if (list.length > p.maxClasses) throw new ImportConflictError(`A baseline holds at most ${p.maxClasses} classes; this import would make ${list.length}.`);
    await replaceClasses(trx, p.baselineId, list);
    const version = await bump(trx, p.baselineId, p.userId);
    await writeImportRevision(trx, p.baselineId, version, p.userId, p.summary);
    await auditIn(trx, { teamId: p.teamId, userId: p.userId, action: "baseline.classes_imported", entityId: p.baselineId, detail: p.detail });
    return { version, classCount: list.length };
  });
}

/** A new baseline holding the imported classes, in one transaction. */
export async function createBaselineFromImport(
  db: Knex,
  p: { teamId: string; userId: string; name: string; technology: Technology; classes: Omit<WireClassInput, "id">[]; summary: string; detail: unknown },
): Promise<string> {
  const id = randomUUID();
  const now = Date.now();
  await db.transaction(async (trx) => {
    const taken = await trx("baselines").where({ team_id: p.teamId }).whereRaw("lower(name) = lower(?)", [p.name]).first("id");
    if (taken) throw new ImportConflictError(`A baseline named "${p.name}" already exists in this team.`);
    await trx("baselines").insert({
      id,
      team_id: p.teamId,
      name: p.name,
      description: "",
      technology: JSON.stringify(p.technology),
      is_demo: 0,
      version: 1,
      created_by: p.userId,
      created_at: now,
      updated_by: p.userId,
      updated_at: now,
    });
    await replaceClasses(trx, id, p.classes.map((c) => ({ ...c })));
    await writeImportRevision(trx, id, 1, p.userId, p.summary);
    await auditIn(trx, { teamId: p.teamId, userId: p.userId, action: "baseline.created_from_import", entityId: id, detail: p.detail });
  });
  return id;
}

/** A class's stored histogram (ascending lengths), or null when it has none. */
export async function classHistogram(db: Knex, classId: string): Promise<HistogramArrays | null> {
  const row = await db("class_histograms").where({ class_id: classId }).first("bin_count", "net_count", "lengths_m", "counts");
  return row ? decodeHistogram(row) : null;
}

/** Classes of a baseline (id and name) in table order. */
export async function classIdsAndNames(db: Knex, baselineId: string): Promise<{ id: string; name: string }[]> {
  return db("wire_classes").where({ baseline_id: baselineId }).orderBy("position").select("id", "name");
}

/** Per-class histogram bins (ascending length) of a baseline, for the JSON API; classes without one have no bins. */
export async function histogramsByClass(db: Knex, baselineId: string): Promise<{ name: string; netCount: number; bins: { lengthM: number; count: number }[] }[]> {
  const rows: { name: string; bin_count: number | null; net_count: number | null; lengths_m: Buffer | null; counts: Buffer | null }[] = await db("wire_classes as c")
    .leftJoin("class_histograms as h", "h.class_id", "c.id")
    .where("c.baseline_id", baselineId)
    .orderBy("c.position")
    .select("c.name", "h.bin_count", "h.net_count", "h.lengths_m", "h.counts");
  return rows.map((r) =>
    r.bin_count === null || r.lengths_m === null || r.counts === null
      ? { name: r.name, netCount: 0, bins: [] }
      : { name: r.name, netCount: Number(r.net_count), bins: toLengthBins(decodeHistogram({ bin_count: r.bin_count, net_count: r.net_count ?? undefined, lengths_m: r.lengths_m, counts: r.counts })) },
  );
}

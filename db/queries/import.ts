import "server-only";
import { randomUUID } from "node:crypto";
import type Database from "better-sqlite3";
import type { Knex } from "knex";
import type { Technology } from "@/lib/scaling";
import type { WireClassInput } from "@/lib/validation/wire-class";
import type { ImportMode } from "@/lib/validation/import";
import type { Spool } from "@/lib/import/spool";
import { getBaseline } from "./baselines";
import { listClasses, listClassesWithHistograms, replaceClasses } from "./wire-classes";

/**
 * SQL of CSV import and export. Every import is ONE transaction; histogram rows are inserted with
 * better-sqlite3 prepared multi-row statements on the transaction's own connection (knex would
 * build and bind 1,000,000 rows far more slowly), yielding to the event loop between batches.
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

const ROWS_PER_STATEMENT = 200;
const ROWS_PER_YIELD = 50_000;

/**
 * Store spooled histogram bins. replace: every class's bins are replaced by the file's (classes
 * absent from the file end with none); merge: only the classes in the file get new bins.
 */
export async function storeHistograms(
  db: Knex,
  p: { baselineId: string; teamId: string; userId: string; mode: ImportMode; classNames: readonly string[]; spool: Spool; summary: string; detail: unknown },
): Promise<{ version: number; inserted: number }> {
  return db.transaction(async (trx) => {
    const current: { id: string; name: string }[] = await trx("wire_classes").where({ baseline_id: p.baselineId }).select("id", "name");
    const idByName = new Map(current.map((c) => [c.name, c.id]));
    const ids = p.classNames.map((n) => idByName.get(n));
    const usedIdx = new Set<number>();
    for (const batch of p.spool.batches(4096)) {
      for (const r of batch) usedIdx.add(r.classIndex);
      if (usedIdx.size === p.classNames.length) break;
    }
    const missing = [...usedIdx].filter((i) => !ids[i]).map((i) => p.classNames[i]);
    if (missing.length) throw new ImportConflictError(`Classes ${missing.join(", ")} were removed from the baseline during the upload; upload again.`);
    if (p.mode === "replace") {
      await trx("histogram_bins").whereIn("class_id", trx("wire_classes").where({ baseline_id: p.baselineId }).select("id")).delete();
    } else {
      const touched = [...usedIdx].map((i) => ids[i]!);
      for (let i = 0; i < touched.length; i += 500) await trx("histogram_bins").whereIn("class_id", touched.slice(i, i + 500)).delete();
    }
    const conn = (await trx.client.acquireConnection()) as Database.Database;
    const many = conn.prepare(`INSERT INTO histogram_bins (class_id, length_m, count) VALUES ${Array(ROWS_PER_STATEMENT).fill("(?, ?, ?)").join(", ")}`);
    const one = conn.prepare("INSERT INTO histogram_bins (class_id, length_m, count) VALUES (?, ?, ?)");
    const params: (string | number)[] = new Array(ROWS_PER_STATEMENT * 3);
    let inserted = 0;
    let sinceYield = 0;
    for (const batch of p.spool.batches()) {
      let i = 0;
      for (; i + ROWS_PER_STATEMENT <= batch.length; i += ROWS_PER_STATEMENT) {
        for (let j = 0; j < ROWS_PER_STATEMENT; j++) {
          const r = batch[i + j]!;
          params[3 * j] = ids[r.classIndex]!;
          params[3 * j + 1] = r.lengthM;
          params[3 * j + 2] = r.count;
        }
        many.run(params);
      }
      for (; i < batch.length; i++) {
        const r = batch[i]!;
        one.run(ids[r.classIndex]!, r.lengthM, r.count);
      }
      inserted += batch.length;
      sinceYield += batch.length;
      if (sinceYield >= ROWS_PER_YIELD) {
        sinceYield = 0;
        await new Promise<void>((resolve) => setImmediate(resolve));
      }
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

/** One page of a class's histogram bins in stored (import) order; keyset on the bin id, served by the class_id index. */
export async function histogramPage(db: Knex, classId: string, afterId: number, limit: number): Promise<{ id: number; lengthM: number; count: number }[]> {
  const rows: { id: number; length_m: number; count: number }[] = await db("histogram_bins")
    .where("class_id", classId)
    .andWhere("id", ">", afterId)
    .orderBy("id")
    .limit(limit)
    .select("id", "length_m", "count");
  return rows.map((r) => ({ id: r.id, lengthM: r.length_m, count: r.count }));
}

/** Classes of a baseline (id and name) in table order. */
export async function classIdsAndNames(db: Knex, baselineId: string): Promise<{ id: string; name: string }[]> {
  return db("wire_classes").where({ baseline_id: baselineId }).orderBy("position").select("id", "name");
}

/** Per-class histogram bins (in stored order) of a baseline, for the JSON API. */
export async function histogramsByClass(db: Knex, baselineId: string): Promise<{ name: string; bins: { lengthM: number; count: number }[] }[]> {
  const classes: { id: string; name: string }[] = await db("wire_classes").where({ baseline_id: baselineId }).orderBy("position").select("id", "name");
  const out: { name: string; bins: { lengthM: number; count: number }[] }[] = [];
  for (const c of classes) {
    const bins: { length_m: number; count: number }[] = await db("histogram_bins").where({ class_id: c.id }).orderBy("id").select("length_m", "count");
    out.push({ name: c.name, bins: bins.map((b) => ({ lengthM: b.length_m, count: b.count })) });
  }
  return out;
}

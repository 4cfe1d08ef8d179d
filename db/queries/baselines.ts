import "server-only";
import { randomUUID } from "node:crypto";
import type { Knex } from "knex";
import type { Technology } from "@/lib/scaling";
import type { BaselineCreate, BaselinePatch, TechnologyInput } from "@/lib/validation/baseline";
import type { WireClassInput } from "@/lib/validation/wire-class";
import { StaleVersionError } from "@/lib/workspace/stale";
import { copyClasses, listClasses, replaceClasses, type StoredWireClass } from "./wire-classes";

export interface Baseline {
  id: string;
  teamId: string;
  name: string;
  description: string;
  technology: Technology;
  isDemo: boolean;
  version: number;
  createdBy: string | null;
  createdAt: number;
  updatedBy: string | null;
  updatedAt: number;
}

export interface BaselineSummary extends Baseline {
  classCount: number;
  scenarioCount: number;
  updatedByName: string | null;
}

export interface BaselineRevision {
  id: number;
  version: number;
  userId: string | null;
  userName: string | null;
  at: number;
  summary: string;
}

/** Invented defaults of a new baseline's technology (same figures as the demo's, documented there). */
export const DEFAULT_TECHNOLOGY: Technology = {
  supplyV: 0.75,
  clockHz: 2e9,
  repeaterR0Ohm: 8000,
  repeaterC0F: 0.6e-15,
  delayBudgetS: 100e-12,
};

interface BaselineRow {
  id: string;
  team_id: string;
  name: string;
  description: string;
  technology: string;
  is_demo: number;
  version: number;
  created_by: string | null;
  created_at: number;
  updated_by: string | null;
  updated_at: number;
  class_count?: number;
  scenario_count?: number;
  updated_by_name?: string | null;
}

function toBaseline(r: BaselineRow): Baseline {
  return {
    id: r.id,
    teamId: r.team_id,
    name: r.name,
    description: r.description,
    technology: JSON.parse(r.technology) as Technology,
    isDemo: r.is_demo === 1,
    version: r.version,
    createdBy: r.created_by,
    createdAt: r.created_at,
    updatedBy: r.updated_by,
    updatedAt: r.updated_at,
  };
}

export async function listBaselines(db: Knex, teamId: string): Promise<BaselineSummary[]> {
  const rows: BaselineRow[] = await db("baselines as b")
    .leftJoin("users as u", "u.id", "b.updated_by")
    .where("b.team_id", teamId)
    .select(
      "b.*",
      "u.name as updated_by_name",
      db.raw("(select count(*) from wire_classes c where c.baseline_id = b.id) as class_count"),
      db.raw("(select count(*) from scenarios s where s.baseline_id = b.id) as scenario_count"),
    )
    .orderBy("b.name");
  return rows.map((r) => ({ ...toBaseline(r), classCount: Number(r.class_count ?? 0), scenarioCount: Number(r.scenario_count ?? 0), updatedByName: r.updated_by_name ?? null }));
}

export async function getBaseline(db: Knex, id: string): Promise<Baseline | undefined> {
  const row: BaselineRow | undefined = await db("baselines").where({ id }).first();
  return row ? toBaseline(row) : undefined;
}

export async function getBaselineWithClasses(db: Knex, id: string): Promise<(Baseline & { classes: StoredWireClass[] }) | undefined> {
  const b = await getBaseline(db, id);
  if (!b) return undefined;
  return { ...b, classes: await listClasses(db, id) };
}

/** Team of a baseline (undefined when it does not exist): the input of requireResourceRole. */
export async function baselineTeamId(db: Knex, id: string): Promise<string | undefined> {
  const row = await db("baselines").where({ id }).first("team_id");
  return row?.team_id;
}

export async function baselineNameTaken(db: Knex, teamId: string, name: string, exceptId?: string): Promise<boolean> {
  const q = db("baselines").where({ team_id: teamId }).whereRaw("lower(name) = lower(?)", [name]);
  if (exceptId) q.whereNot({ id: exceptId });
  return !!(await q.first("id"));
}

async function snapshot(trx: Knex | Knex.Transaction, id: string): Promise<string> {
  const b = await getBaseline(trx as Knex, id);
  const classes = await listClasses(trx as Knex, id);
  return JSON.stringify({ name: b?.name, description: b?.description, technology: b?.technology, classes: classes.map(({ histogramBins: _h, ...c }) => c) });
}

async function writeRevision(trx: Knex.Transaction, baselineId: string, version: number, userId: string, summary: string): Promise<void> {
  await trx("baseline_revisions").insert({ baseline_id: baselineId, version, user_id: userId, at: Date.now(), summary, snapshot: await snapshot(trx, baselineId) });
}

/** Bump the version if it still equals `expected`; otherwise throw StaleVersionError (or return false when the row is gone). */
async function bumpVersion(trx: Knex.Transaction, id: string, expected: number, userId: string, extra: Record<string, unknown> = {}): Promise<number> {
  const n = await trx("baselines")
    .where({ id, version: expected })
    .update({ ...extra, version: expected + 1, updated_by: userId, updated_at: Date.now() });
  if (n === 0) {
    const row = await trx("baselines").where({ id }).first("version");
    throw new StaleVersionError("This baseline", row?.version ?? 0, expected);
  }
  return expected + 1;
}

export async function createBaseline(
  db: Knex,
  p: { teamId: string; userId: string; input: BaselineCreate; isDemo?: boolean; summary?: string },
): Promise<string> {
  const id = randomUUID();
  const now = Date.now();
  await db.transaction(async (trx) => {
    await trx("baselines").insert({
      id,
      team_id: p.teamId,
      name: p.input.name,
      description: p.input.description ?? "",
      technology: JSON.stringify(p.input.technology ?? DEFAULT_TECHNOLOGY),
      is_demo: p.isDemo ? 1 : 0,
      version: 1,
      created_by: p.userId,
      created_at: now,
      updated_by: p.userId,
      updated_at: now,
    });
    await replaceClasses(trx, id, (p.input.classes ?? []).map(({ id: _i, ...c }) => c));
    await writeRevision(trx, id, 1, p.userId, p.summary ?? `Created with ${p.input.classes?.length ?? 0} classes`);
  });
  return id;
}

function describeTechnologyChange(before: Technology, after: TechnologyInput): string[] {
  const labels: Record<keyof Technology, string> = { supplyV: "supply", clockHz: "clock", repeaterR0Ohm: "repeater R0", repeaterC0F: "repeater C0", delayBudgetS: "delay budget" };
  return (Object.keys(labels) as (keyof Technology)[]).filter((k) => before[k] !== after[k]).map((k) => labels[k]);
}

export async function patchBaseline(db: Knex, p: { id: string; userId: string; patch: BaselinePatch }): Promise<number> {
  return db.transaction(async (trx) => {
    const before = await getBaseline(trx as unknown as Knex, p.id);
    if (!before) throw new StaleVersionError("This baseline", 0, p.patch.version);
    const extra: Record<string, unknown> = {};
    const changes: string[] = [];
    if (p.patch.name !== undefined && p.patch.name !== before.name) {
      extra.name = p.patch.name;
      changes.push(`renamed to "${p.patch.name}"`);
    }
    if (p.patch.description !== undefined && p.patch.description !== before.description) {
      extra.description = p.patch.description;
      changes.push("description");
    }
    if (p.patch.technology) {
      extra.technology = JSON.stringify(p.patch.technology);
      const t = describeTechnologyChange(before.technology, p.patch.technology);
      if (t.length) changes.push(`technology: ${t.join(", ")}`);
    }
    const v = await bumpVersion(trx, p.id, p.patch.version, p.userId, extra);
    await writeRevision(trx, p.id, v, p.userId, changes.length ? `Changed ${changes.join("; ")}` : "Saved without changes");
    return v;
  });
}

export async function putBaselineClasses(db: Knex, p: { id: string; userId: string; version: number; classes: WireClassInput[] }): Promise<number> {
  return db.transaction(async (trx) => {
    const before = await listClasses(trx as unknown as Knex, p.id);
    const v = await bumpVersion(trx, p.id, p.version, p.userId);
    await replaceClasses(trx, p.id, p.classes);
    const beforeNames = new Set(before.map((c) => c.name));
    const afterNames = new Set(p.classes.map((c) => c.name));
    const added = p.classes.filter((c) => !beforeNames.has(c.name)).map((c) => c.name);
    const removed = before.filter((c) => !afterNames.has(c.name)).map((c) => c.name);
    const parts = [`${p.classes.length} classes`];
    if (added.length) parts.push(`added ${added.join(", ")}`);
    if (removed.length) parts.push(`removed ${removed.join(", ")}`);
    await writeRevision(trx, p.id, v, p.userId, `Edited class table (${parts.join("; ")})`);
    return v;
  });
}

/** Copy a baseline with its classes and histograms (not its scenarios). */
export async function duplicateBaseline(db: Knex, p: { id: string; userId: string; name: string }): Promise<string> {
  const src = await getBaseline(db, p.id);
  if (!src) throw new Error("baseline vanished");
  const id = randomUUID();
  const now = Date.now();
  await db.transaction(async (trx) => {
    await trx("baselines").insert({
      id,
      team_id: src.teamId,
      name: p.name,
      description: src.description,
      technology: JSON.stringify(src.technology),
      is_demo: 0,
      version: 1,
      created_by: p.userId,
      created_at: now,
      updated_by: p.userId,
      updated_at: now,
    });
    await copyClasses(trx, p.id, id);
    await writeRevision(trx, id, 1, p.userId, `Duplicated from "${src.name}"`);
  });
  return id;
}

/** A free name "X (copy)", "X (copy 2)", … in the team. */
export async function freeBaselineName(db: Knex, teamId: string, base: string): Promise<string> {
  for (let i = 1; i < 1000; i++) {
    const name = `${base} (copy${i === 1 ? "" : ` ${i}`})`.slice(0, 100);
    if (!(await baselineNameTaken(db, teamId, name))) return name;
  }
  return `${base} (${randomUUID().slice(0, 8)})`;
}

export async function deleteBaseline(db: Knex, id: string): Promise<void> {
  await db.transaction(async (trx) => {
    await trx("baselines").where({ id }).delete();
  });
}

export async function listBaselineRevisions(db: Knex, id: string): Promise<BaselineRevision[]> {
  const rows = await db("baseline_revisions as r")
    .leftJoin("users as u", "u.id", "r.user_id")
    .where("r.baseline_id", id)
    .select("r.id", "r.version", "r.user_id", "u.name as user_name", "r.at", "r.summary")
    .orderBy("r.version", "desc");
  return rows.map((r: { id: number; version: number; user_id: string | null; user_name: string | null; at: number; summary: string }) => ({
    id: r.id,
    version: r.version,
    userId: r.user_id,
    userName: r.user_name,
    at: r.at,
    summary: r.summary,
  }));
}

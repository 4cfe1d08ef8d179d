import "server-only";
import { randomUUID } from "node:crypto";
import type { Knex } from "knex";
import type { Technology } from "@/lib/scaling";
import { listClasses, type StoredWireClass } from "./wire-classes";

// Reads of baselines and the DTOs they produce (components `import type` them). Writes: db/writes/baselines.ts.

type Q = Knex | Knex.Transaction;

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

/** A baseline with its class table (GET /api/baselines/[id], the baseline editor). */
export interface BaselineWithClasses extends Baseline {
  classes: StoredWireClass[];
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

export async function listBaselines(db: Q, teamId: string): Promise<BaselineSummary[]> {
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
  return rows.map((r) => ({
    ...toBaseline(r),
    classCount: Number(r.class_count ?? 0),
    scenarioCount: Number(r.scenario_count ?? 0),
    updatedByName: r.updated_by_name ?? null,
  }));
}

export async function getBaseline(db: Q, id: string): Promise<Baseline | undefined> {
  const row: BaselineRow | undefined = await db("baselines").where({ id }).first();
  return row ? toBaseline(row) : undefined;
}

export async function getBaselineWithClasses(db: Q, id: string): Promise<BaselineWithClasses | undefined> {
  const b = await getBaseline(db, id);
  if (!b) return undefined;
  return { ...b, classes: await listClasses(db, id) };
}

/** Team of a baseline (undefined when it does not exist): the input of requireResourceRole. */
export async function baselineTeamId(db: Q, id: string): Promise<string | undefined> {
  const row = await db("baselines").where({ id }).first("team_id");
  return row?.team_id;
}

export async function baselineNameTaken(db: Q, teamId: string, name: string, exceptId?: string): Promise<boolean> {
  const q = db("baselines").where({ team_id: teamId }).whereRaw("lower(name) = lower(?)", [name]);
  if (exceptId) q.whereNot({ id: exceptId });
  return !!(await q.first("id"));
}

/** A free name "X (copy)", "X (copy 2)", … in the team. */
export async function freeBaselineName(db: Q, teamId: string, base: string): Promise<string> {
  for (let i = 1; i < 1000; i++) {
    const name = `${base} (copy${i === 1 ? "" : ` ${i}`})`.slice(0, 100);
    if (!(await baselineNameTaken(db, teamId, name))) return name;
  }
  return `${base} (${randomUUID().slice(0, 8)})`;
}

export async function listBaselineRevisions(db: Q, id: string): Promise<BaselineRevision[]> {
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

/** A warning an import answered, kept on the baseline until dismissed (`baseline_warnings`). */
export interface BaselineWarning {
  id: string;
  source: string;
  className: string | null;
  message: string;
  createdAt: number;
}

/** The baseline's open (not dismissed) warnings, oldest first. */
export async function listOpenWarnings(db: Q, baselineId: string): Promise<BaselineWarning[]> {
  const rows: { id: string; source: string; class_name: string | null; message: string; created_at: number }[] = await db("baseline_warnings")
    .where({ baseline_id: baselineId })
    .whereNull("dismissed_at")
    .orderBy([{ column: "created_at" }, { column: "rowid" }])
    .select("id", "source", "class_name", "message", "created_at");
  return rows.map((r) => ({ id: r.id, source: r.source, className: r.class_name, message: r.message, createdAt: r.created_at }));
}

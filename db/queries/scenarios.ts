import "server-only";
import { randomUUID } from "node:crypto";
import type { Knex } from "knex";
import type { ScenarioSettings, Technology } from "@/lib/scaling";

// Reads of scenarios and the DTOs they produce (components `import type` them). Writes: db/writes/scenarios.ts.

type Q = Knex | Knex.Transaction;

export interface Scenario {
  id: string;
  teamId: string;
  baselineId: string;
  name: string;
  notes: string;
  settings: ScenarioSettings;
  version: number;
  isDemo: boolean;
  createdBy: string | null;
  createdAt: number;
  updatedBy: string | null;
  updatedAt: number;
}

export interface ScenarioSummary extends Scenario {
  baselineName: string;
  updatedByName: string | null;
}

export interface ScenarioRevision {
  id: number;
  version: number;
  userId: string | null;
  userName: string | null;
  at: number;
  summary: string;
  name: string;
  notes: string;
  settings: ScenarioSettings;
}

interface ScenarioRow {
  id: string;
  team_id: string;
  baseline_id: string;
  name: string;
  notes: string;
  settings: string;
  version: number;
  is_demo: number;
  created_by: string | null;
  created_at: number;
  updated_by: string | null;
  updated_at: number;
  baseline_name?: string;
  updated_by_name?: string | null;
}

function toScenario(r: ScenarioRow): Scenario {
  return {
    id: r.id,
    teamId: r.team_id,
    baselineId: r.baseline_id,
    name: r.name,
    notes: r.notes,
    settings: JSON.parse(r.settings) as ScenarioSettings,
    version: r.version,
    isDemo: r.is_demo === 1,
    createdBy: r.created_by,
    createdAt: r.created_at,
    updatedBy: r.updated_by,
    updatedAt: r.updated_at,
  };
}

export async function listScenarios(db: Q, teamId: string, baselineId?: string): Promise<ScenarioSummary[]> {
  const q = db("scenarios as s")
    .join("baselines as b", "b.id", "s.baseline_id")
    .leftJoin("users as u", "u.id", "s.updated_by")
    .where("s.team_id", teamId)
    .select("s.*", "b.name as baseline_name", "u.name as updated_by_name")
    .orderBy([{ column: "b.name" }, { column: "s.name" }]);
  if (baselineId) q.where("s.baseline_id", baselineId);
  const rows: ScenarioRow[] = await q;
  return rows.map((r) => ({ ...toScenario(r), baselineName: r.baseline_name ?? "", updatedByName: r.updated_by_name ?? null }));
}

export async function getScenario(db: Q, id: string): Promise<Scenario | undefined> {
  const row: ScenarioRow | undefined = await db("scenarios").where({ id }).first();
  return row ? toScenario(row) : undefined;
}

export async function scenarioTeamId(db: Q, id: string): Promise<string | undefined> {
  const row = await db("scenarios").where({ id }).first("team_id");
  return row?.team_id;
}

/**
 * What a scenario edit needs before it starts, in one query: the team (for the access check) and the
 * technology of the scenario's baseline (the supply a settings input without one defaults to).
 */
export async function scenarioEditTarget(db: Q, id: string): Promise<{ teamId: string; baselineId: string; technology: Technology } | undefined> {
  const row: { team_id: string; baseline_id: string; technology: string } | undefined = await db("scenarios as s")
    .join("baselines as b", "b.id", "s.baseline_id")
    .where("s.id", id)
    .first("s.team_id", "s.baseline_id", "b.technology");
  return row ? { teamId: row.team_id, baselineId: row.baseline_id, technology: JSON.parse(row.technology) as Technology } : undefined;
}

export async function scenarioNameTaken(db: Q, baselineId: string, name: string, exceptId?: string): Promise<boolean> {
  const q = db("scenarios").where({ baseline_id: baselineId }).whereRaw("lower(name) = lower(?)", [name]);
  if (exceptId) q.whereNot({ id: exceptId });
  return !!(await q.first("id"));
}

/** A free name "X (copy)", "X (copy 2)", … on the baseline (the names a duplicate gets, like baselines'). */
export async function freeScenarioName(db: Q, baselineId: string, base: string): Promise<string> {
  for (let i = 1; i < 1000; i++) {
    const name = `${base} (copy${i === 1 ? "" : ` ${i}`})`.slice(0, 100);
    if (!(await scenarioNameTaken(db, baselineId, name))) return name;
  }
  return `${base.slice(0, 80)} (${randomUUID().slice(0, 8)})`;
}

export async function listScenarioRevisions(db: Q, scenarioId: string): Promise<ScenarioRevision[]> {
  const rows = await db("scenario_revisions as r")
    .leftJoin("users as u", "u.id", "r.user_id")
    .where("r.scenario_id", scenarioId)
    .select("r.*", "u.name as user_name")
    .orderBy("r.id", "desc");
  return rows.map(
    (r: {
      id: number;
      version: number;
      user_id: string | null;
      user_name: string | null;
      at: number;
      summary: string;
      name: string;
      notes: string;
      settings: string;
    }) => ({
      id: r.id,
      version: r.version,
      userId: r.user_id,
      userName: r.user_name,
      at: r.at,
      summary: r.summary,
      name: r.name,
      notes: r.notes,
      settings: JSON.parse(r.settings) as ScenarioSettings,
    }),
  );
}

export async function getScenarioRevision(db: Q, scenarioId: string, revisionId: number): Promise<ScenarioRevision | undefined> {
  const all = await db("scenario_revisions").where({ scenario_id: scenarioId, id: revisionId }).first();
  if (!all) return undefined;
  return {
    id: all.id,
    version: all.version,
    userId: all.user_id,
    userName: null,
    at: all.at,
    summary: all.summary,
    name: all.name,
    notes: all.notes,
    settings: JSON.parse(all.settings),
  };
}

import "server-only";
import { randomUUID } from "node:crypto";
import type { Knex } from "knex";
import type { ScenarioSettings } from "@/lib/scaling";
import { StaleVersionError } from "@/lib/workspace/stale";
import { describeSettingsChange } from "@/lib/workspace/settings";

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

export async function listScenarios(db: Knex, teamId: string, baselineId?: string): Promise<ScenarioSummary[]> {
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

export async function getScenario(db: Knex, id: string): Promise<Scenario | undefined> {
  const row: ScenarioRow | undefined = await db("scenarios").where({ id }).first();
  return row ? toScenario(row) : undefined;
}

export async function scenarioTeamId(db: Knex, id: string): Promise<string | undefined> {
  const row = await db("scenarios").where({ id }).first("team_id");
  return row?.team_id;
}

export async function scenarioNameTaken(db: Knex, baselineId: string, name: string, exceptId?: string): Promise<boolean> {
  const q = db("scenarios").where({ baseline_id: baselineId }).whereRaw("lower(name) = lower(?)", [name]);
  if (exceptId) q.whereNot({ id: exceptId });
  return !!(await q.first("id"));
}

export async function freeScenarioName(db: Knex, baselineId: string, base: string): Promise<string> {
  for (let i = 1; i < 1000; i++) {
    const name = `${base} (copy${i === 1 ? "" : ` ${i}`})`.slice(0, 100);
    if (!(await scenarioNameTaken(db, baselineId, name))) return name;
  }
  return `${base} (${randomUUID().slice(0, 8)})`;
}

async function writeRevision(
  trx: Knex.Transaction,
  p: { scenarioId: string; version: number; userId: string; summary: string; name: string; notes: string; settings: ScenarioSettings },
): Promise<void> {
  await trx("scenario_revisions").insert({
    scenario_id: p.scenarioId,
    version: p.version,
    user_id: p.userId,
    at: Date.now(),
    summary: p.summary.slice(0, 500),
    name: p.name,
    notes: p.notes,
    settings: JSON.stringify(p.settings),
  });
}

export async function createScenario(
  db: Knex,
  p: { teamId: string; baselineId: string; userId: string; name: string; notes: string; settings: ScenarioSettings; isDemo?: boolean; summary?: string },
): Promise<string> {
  const id = randomUUID();
  const now = Date.now();
  await db.transaction(async (trx) => {
    await trx("scenarios").insert({
      id,
      team_id: p.teamId,
      baseline_id: p.baselineId,
      name: p.name,
      notes: p.notes,
      settings: JSON.stringify(p.settings),
      version: 1,
      is_demo: p.isDemo ? 1 : 0,
      created_by: p.userId,
      created_at: now,
      updated_by: p.userId,
      updated_at: now,
    });
    await writeRevision(trx, { scenarioId: id, version: 1, userId: p.userId, summary: p.summary ?? "Created", name: p.name, notes: p.notes, settings: p.settings });
  });
  return id;
}

/** Versioned update: throws StaleVersionError unless the stored version is `version`. Returns the new version. */
export async function updateScenario(
  db: Knex,
  p: { id: string; userId: string; version: number; name?: string; notes?: string; settings?: ScenarioSettings; summary?: string },
): Promise<Scenario> {
  return db.transaction(async (trx) => {
    const before = await getScenario(trx as unknown as Knex, p.id);
    if (!before) throw new StaleVersionError("This scenario", 0, p.version);
    const next = { name: p.name ?? before.name, notes: p.notes ?? before.notes, settings: p.settings ?? before.settings };
    const n = await trx("scenarios")
      .where({ id: p.id, version: p.version })
      .update({ name: next.name, notes: next.notes, settings: JSON.stringify(next.settings), version: p.version + 1, updated_by: p.userId, updated_at: Date.now() });
    if (n === 0) throw new StaleVersionError("This scenario", before.version, p.version);
    const changes: string[] = [];
    if (next.name !== before.name) changes.push(`renamed to "${next.name}"`);
    if (next.notes !== before.notes) changes.push("notes");
    changes.push(...describeSettingsChange(before.settings, next.settings));
    const summary = p.summary ?? (changes.length ? `Changed ${changes.join("; ")}` : "Saved without changes");
    await writeRevision(trx, { scenarioId: p.id, version: p.version + 1, userId: p.userId, summary, ...next });
    return { ...before, ...next, version: p.version + 1, updatedBy: p.userId };
  });
}

export async function listScenarioRevisions(db: Knex, scenarioId: string): Promise<ScenarioRevision[]> {
  const rows = await db("scenario_revisions as r")
    .leftJoin("users as u", "u.id", "r.user_id")
    .where("r.scenario_id", scenarioId)
    .select("r.*", "u.name as user_name")
    .orderBy("r.id", "desc");
  return rows.map((r: { id: number; version: number; user_id: string | null; user_name: string | null; at: number; summary: string; name: string; notes: string; settings: string }) => ({
    id: r.id,
    version: r.version,
    userId: r.user_id,
    userName: r.user_name,
    at: r.at,
    summary: r.summary,
    name: r.name,
    notes: r.notes,
    settings: JSON.parse(r.settings) as ScenarioSettings,
  }));
}

export async function getScenarioRevision(db: Knex, scenarioId: string, revisionId: number): Promise<ScenarioRevision | undefined> {
  const all = await db("scenario_revisions").where({ scenario_id: scenarioId, id: revisionId }).first();
  if (!all) return undefined;
  return { id: all.id, version: all.version, userId: all.user_id, userName: null, at: all.at, summary: all.summary, name: all.name, notes: all.notes, settings: JSON.parse(all.settings) };
}

export async function deleteScenario(db: Knex, id: string): Promise<void> {
  await db.transaction(async (trx) => {
    await trx("scenarios").where({ id }).delete();
  });
}

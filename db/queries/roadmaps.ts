import "server-only";
import type { Knex } from "knex";
import type { RoadmapStep } from "@/lib/scaling";

// Reads of roadmaps (issue 14) and the DTOs they produce (components `import type` them). Writes: db/writes/roadmaps.ts.

type Q = Knex | Knex.Transaction;

export interface Roadmap {
  id: string;
  teamId: string;
  baselineId: string;
  name: string;
  /** N1 … N8, each relative to the one before (N0 = the baseline); lib/scaling/roadmap.ts composes them. */
  steps: RoadmapStep[];
  version: number;
  isDemo: boolean;
  createdBy: string | null;
  createdAt: number;
  updatedBy: string | null;
  updatedAt: number;
}

export interface RoadmapSummary extends Roadmap {
  baselineName: string;
  updatedByName: string | null;
}

export interface RoadmapRevision {
  id: number;
  version: number;
  userId: string | null;
  userName: string | null;
  at: number;
  summary: string;
  name: string;
  steps: RoadmapStep[];
}

interface RoadmapRow {
  id: string;
  team_id: string;
  baseline_id: string;
  name: string;
  steps: string;
  version: number;
  is_demo: number;
  created_by: string | null;
  created_at: number;
  updated_by: string | null;
  updated_at: number;
  baseline_name?: string;
  updated_by_name?: string | null;
}

function toRoadmap(r: RoadmapRow): Roadmap {
  return {
    id: r.id,
    teamId: r.team_id,
    baselineId: r.baseline_id,
    name: r.name,
    steps: JSON.parse(r.steps) as RoadmapStep[],
    version: r.version,
    isDemo: r.is_demo === 1,
    createdBy: r.created_by,
    createdAt: r.created_at,
    updatedBy: r.updated_by,
    updatedAt: r.updated_at,
  };
}

/** The team's roadmaps (optionally of one baseline), by baseline name then roadmap name. */
export async function listRoadmaps(db: Q, teamId: string, baselineId?: string): Promise<RoadmapSummary[]> {
  const q = db("roadmaps as r")
    .join("baselines as b", "b.id", "r.baseline_id")
    .leftJoin("users as u", "u.id", "r.updated_by")
    .where("r.team_id", teamId)
    .select("r.*", "b.name as baseline_name", "u.name as updated_by_name")
    .orderBy([{ column: "b.name" }, { column: "r.name" }]);
  if (baselineId) q.where("r.baseline_id", baselineId);
  const rows: RoadmapRow[] = await q;
  return rows.map((r) => ({ ...toRoadmap(r), baselineName: r.baseline_name ?? "", updatedByName: r.updated_by_name ?? null }));
}

export async function getRoadmap(db: Q, id: string): Promise<Roadmap | undefined> {
  const row: RoadmapRow | undefined = await db("roadmaps").where({ id }).first();
  return row ? toRoadmap(row) : undefined;
}

/** Several roadmaps of one team by id, in the order asked (ids of other teams or of nothing are left out). */
export async function getTeamRoadmaps(db: Q, teamId: string, ids: readonly string[]): Promise<Roadmap[]> {
  if (ids.length === 0) return [];
  const rows: RoadmapRow[] = await db("roadmaps").where({ team_id: teamId }).whereIn("id", ids);
  const byId = new Map(rows.map((r) => [r.id, toRoadmap(r)]));
  return ids.flatMap((id) => byId.get(id) ?? []);
}

export async function roadmapNameTaken(db: Q, baselineId: string, name: string, exceptId?: string): Promise<boolean> {
  const q = db("roadmaps").where({ baseline_id: baselineId }).whereRaw("lower(name) = lower(?)", [name]);
  if (exceptId) q.whereNot({ id: exceptId });
  return !!(await q.first("id"));
}

export async function listRoadmapRevisions(db: Q, roadmapId: string): Promise<RoadmapRevision[]> {
  const rows: {
    id: number;
    version: number;
    user_id: string | null;
    user_name: string | null;
    at: number;
    summary: string;
    name: string;
    steps: string;
  }[] = await db("roadmap_revisions as r")
    .leftJoin("users as u", "u.id", "r.user_id")
    .where("r.roadmap_id", roadmapId)
    .select("r.*", "u.name as user_name")
    .orderBy("r.id", "desc");
  return rows.map((r) => ({
    id: r.id,
    version: r.version,
    userId: r.user_id,
    userName: r.user_name,
    at: r.at,
    summary: r.summary,
    name: r.name,
    steps: JSON.parse(r.steps) as RoadmapStep[],
  }));
}

export async function roadmapTeamId(db: Q, id: string): Promise<string | undefined> {
  const row = await db("roadmaps").where({ id }).first("team_id");
  return row?.team_id;
}

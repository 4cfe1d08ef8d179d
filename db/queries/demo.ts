import "server-only";
import type { Knex } from "knex";

// The lookups behind the idempotent demo seeder (lib/demo): find what an earlier run already created, by name.

type Q = Knex | Knex.Transaction;

/** The oldest demo team with this name, if any. */
export async function findDemoTeamId(q: Q, name: string): Promise<string | undefined> {
  const row = (await q("teams").where({ name, is_demo: 1 }).orderBy("created_at").first("id")) as { id: string } | undefined;
  return row?.id;
}

export async function findBaselineIdByName(q: Q, teamId: string, name: string): Promise<string | undefined> {
  const row = (await q("baselines").where({ team_id: teamId, name }).first("id")) as { id: string } | undefined;
  return row?.id;
}

export async function findScenarioIdByName(q: Q, baselineId: string, name: string): Promise<string | undefined> {
  const row = (await q("scenarios").where({ baseline_id: baselineId, name }).first("id")) as { id: string } | undefined;
  return row?.id;
}

export async function findRoadmapIdByName(q: Q, baselineId: string, name: string): Promise<string | undefined> {
  const row = (await q("roadmaps").where({ baseline_id: baselineId, name }).first("id")) as { id: string } | undefined;
  return row?.id;
}

/** The team's oldest demo report, if any. */
export async function findDemoReportId(q: Q, teamId: string): Promise<string | undefined> {
  const row = (await q("reports").where({ team_id: teamId, is_demo: 1 }).orderBy("created_at").first("id")) as { id: string } | undefined;
  return row?.id;
}

import "server-only";
import type { Knex } from "knex";

type Q = Knex | Knex.Transaction;

export interface HomeBaseline {
  id: string;
  name: string;
  classCount: number;
  isDemo: boolean;
  updatedAt: number;
}
export interface HomeScenario {
  id: string;
  name: string;
  baselineName: string;
  isDemo: boolean;
  updatedAt: number;
}
export interface HomeReport {
  id: string;
  title: string;
  version: number;
  isDemo: boolean;
  createdAt: number;
}
export interface TeamHome {
  counts: { baselines: number; scenarios: number; reports: number; members: number };
  baselines: HomeBaseline[];
  scenarios: HomeScenario[];
  reports: HomeReport[];
}

const LIMIT = 8;

/**
 * What the team home shows: counts and the most recently changed items of each kind, in ONE statement
 * (the lists come back as JSON arrays of rows; newest first, ties by id).
 */
export async function getTeamHome(q: Q, teamId: string): Promise<TeamHome> {
  const rows = (await q.raw(
    `select
       (select count(*) from baselines where team_id = :teamId) as baselines,
       (select count(*) from scenarios where team_id = :teamId) as scenarios,
       (select count(distinct series_id) from reports where team_id = :teamId) as reports,
       (select count(*) from memberships where team_id = :teamId) as members,
       (select json_group_array(json_array(id, name, is_demo, updated_at, class_count) order by updated_at desc, id)
          from (select b.id, b.name, b.is_demo, b.updated_at, (select count(*) from wire_classes w where w.baseline_id = b.id) as class_count
                  from baselines b where b.team_id = :teamId order by b.updated_at desc, b.id limit :limit)) as recent_baselines,
       (select json_group_array(json_array(id, name, is_demo, updated_at, baseline_name) order by updated_at desc, id)
          from (select s.id, s.name, s.is_demo, s.updated_at, b.name as baseline_name
                  from scenarios s join baselines b on b.id = s.baseline_id
                 where s.team_id = :teamId order by s.updated_at desc, s.id limit :limit)) as recent_scenarios,
       -- the latest version of each report series
       (select json_group_array(json_array(id, title, version, is_demo, created_at) order by created_at desc, id)
          from (select r.id, r.title, r.version, r.is_demo, r.created_at
                  from reports r
                 where r.team_id = :teamId and r.version = (select max(r2.version) from reports r2 where r2.series_id = r.series_id)
                 order by r.created_at desc, r.id limit :limit)) as recent_reports`,
    { teamId, limit: LIMIT },
  )) as {
    baselines: number;
    scenarios: number;
    reports: number;
    members: number;
    recent_baselines: string;
    recent_scenarios: string;
    recent_reports: string;
  }[];
  const r = rows[0];
  if (!r) throw new Error("team home: the query returned no row");
  const baselines = JSON.parse(r.recent_baselines) as [id: string, name: string, isDemo: number, updatedAt: number, classCount: number][];
  const scenarios = JSON.parse(r.recent_scenarios) as [id: string, name: string, isDemo: number, updatedAt: number, baselineName: string][];
  const reports = JSON.parse(r.recent_reports) as [id: string, title: string, version: number, isDemo: number, createdAt: number][];
  return {
    counts: { baselines: Number(r.baselines), scenarios: Number(r.scenarios), reports: Number(r.reports), members: Number(r.members) },
    baselines: baselines.map(([id, name, isDemo, updatedAt, classCount]) => ({
      id,
      name,
      classCount: Number(classCount),
      isDemo: isDemo === 1,
      updatedAt,
    })),
    scenarios: scenarios.map(([id, name, isDemo, updatedAt, baselineName]) => ({
      id,
      name,
      baselineName,
      isDemo: isDemo === 1,
      updatedAt,
    })),
    reports: reports.map(([id, title, version, isDemo, createdAt]) => ({ id, title, version, isDemo: isDemo === 1, createdAt })),
  };
}

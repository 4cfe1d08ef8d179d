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

/** What the team home shows: counts and the most recently changed items of each kind. */
export async function getTeamHome(q: Q, teamId: string): Promise<TeamHome> {
  const countRows = (await q.raw(
    `select
       (select count(*) from baselines where team_id = ?) as baselines,
       (select count(*) from scenarios where team_id = ?) as scenarios,
       (select count(distinct series_id) from reports where team_id = ?) as reports,
       (select count(*) from memberships where team_id = ?) as members`,
    [teamId, teamId, teamId, teamId],
  )) as { baselines: number; scenarios: number; reports: number; members: number }[];
  const c = countRows[0] ?? { baselines: 0, scenarios: 0, reports: 0, members: 0 };

  const baselines = (await q.raw(
    `select b.id, b.name, b.is_demo, b.updated_at, (select count(*) from wire_classes w where w.baseline_id = b.id) as class_count
       from baselines b where b.team_id = ? order by b.updated_at desc limit ?`,
    [teamId, LIMIT],
  )) as { id: string; name: string; is_demo: number; updated_at: number; class_count: number }[];

  const scenarios = (await q.raw(
    `select s.id, s.name, s.is_demo, s.updated_at, b.name as baseline_name
       from scenarios s join baselines b on b.id = s.baseline_id
      where s.team_id = ? order by s.updated_at desc limit ?`,
    [teamId, LIMIT],
  )) as { id: string; name: string; is_demo: number; updated_at: number; baseline_name: string }[];

  // Latest version of each report series.
  const reports = (await q.raw(
    `select r.id, r.title, r.version, r.is_demo, r.created_at
       from reports r
      where r.team_id = ? and r.version = (select max(r2.version) from reports r2 where r2.series_id = r.series_id)
      order by r.created_at desc limit ?`,
    [teamId, LIMIT],
  )) as { id: string; title: string; version: number; is_demo: number; created_at: number }[];

  return {
    counts: { baselines: Number(c.baselines), scenarios: Number(c.scenarios), reports: Number(c.reports), members: Number(c.members) },
    baselines: baselines.map((r) => ({ id: r.id, name: r.name, classCount: Number(r.class_count), isDemo: r.is_demo === 1, updatedAt: r.updated_at })),
    scenarios: scenarios.map((r) => ({ id: r.id, name: r.name, baselineName: r.baseline_name, isDemo: r.is_demo === 1, updatedAt: r.updated_at })),
    reports: reports.map((r) => ({ id: r.id, title: r.title, version: r.version, isDemo: r.is_demo === 1, createdAt: r.created_at })),
  };
}

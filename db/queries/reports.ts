// Server code only. No `import "server-only"` here: the demo seeder (a plain tsx script) uses these queries
// with its own Knex instance; every function takes the connection as its first argument.
import type { Knex } from "knex";
import { InvalidInputError, NotFoundError, fieldError } from "@/db/errors";
import { getTeamRoadmaps } from "@/db/queries/roadmaps";
import { listClassesWithHistograms } from "@/db/queries/wire-classes";
import type { RoadmapStep } from "@/lib/scaling";
import type { WireClass } from "@/lib/scaling/types";
import type { FrozenReport } from "@/lib/validation/report";

// Reads of reports and the DTOs they produce (components `import type` them). Writes: db/writes/reports.ts.

type Q = Knex | Knex.Transaction;

export interface ReportListItem {
  id: string;
  seriesId: string;
  version: number;
  versions: number;
  title: string;
  baselineId: string | null;
  baselineName: string;
  optionNames: string[];
  isDemo: boolean;
  createdBy: string | null;
  createdByName: string | null;
  createdAt: number;
}

export interface StoredReport {
  id: string;
  teamId: string;
  seriesId: string;
  version: number;
  baselineId: string | null;
  title: string;
  audienceNote: string;
  engineVersion: string;
  isDemo: boolean;
  createdBy: string | null;
  createdByName: string | null;
  createdAt: number;
  frozen: FrozenReport;
}

export interface ReportVersion {
  id: string;
  version: number;
  title: string;
  createdAt: number;
  createdByName: string | null;
}

interface ReportRow {
  id: string;
  team_id: string;
  series_id: string;
  version: number;
  baseline_id: string | null;
  title: string;
  audience_note: string;
  frozen: string;
  engine_version: string;
  is_demo: number;
  created_by: string | null;
  created_at: number;
  created_by_name?: string | null;
}

function toStored(row: ReportRow): StoredReport {
  return {
    id: row.id,
    teamId: row.team_id,
    seriesId: row.series_id,
    version: row.version,
    baselineId: row.baseline_id,
    title: row.title,
    audienceNote: row.audience_note,
    engineVersion: row.engine_version,
    isDemo: row.is_demo === 1,
    createdBy: row.created_by,
    createdByName: row.created_by_name ?? null,
    createdAt: row.created_at,
    // Checked against the schema when stored (db/writes/reports.ts takes only a validated document);
    // lib/reports/service.ts `findReport` checks it again against the current schema on every read.
    frozen: JSON.parse(row.frozen) as FrozenReport,
  };
}

/** Team of a report, or undefined when there is no such report (the access check turns both into 404). */
export async function reportTeamId(conn: Q, id: string): Promise<string | undefined> {
  const row = await conn("reports").where({ id }).first("team_id");
  return row?.team_id as string | undefined;
}

export async function getReport(conn: Q, id: string): Promise<StoredReport | undefined> {
  const row = (await conn("reports as r").leftJoin("users as u", "u.id", "r.created_by").where("r.id", id).first("r.*", "u.name as created_by_name")) as
    ReportRow | undefined;
  return row ? toStored(row) : undefined;
}

/** The latest version of each report series of a team, newest first. */
export async function listReports(conn: Q, teamId: string): Promise<ReportListItem[]> {
  const rows = (await conn("reports as r")
    .leftJoin("users as u", "u.id", "r.created_by")
    .where("r.team_id", teamId)
    .orderBy([
      { column: "r.created_at", order: "desc" },
      { column: "r.version", order: "desc" },
    ])
    .select(
      "r.id",
      "r.series_id",
      "r.version",
      "r.title",
      "r.baseline_id",
      "r.frozen",
      "r.is_demo",
      "r.created_by",
      "r.created_at",
      "u.name as created_by_name",
    )) as (ReportRow & { created_by_name: string | null })[];
  const latest = new Map<string, ReportListItem>();
  const counts = new Map<string, number>();
  for (const r of rows) {
    counts.set(r.series_id, (counts.get(r.series_id) ?? 0) + 1);
    const cur = latest.get(r.series_id);
    if (cur && cur.version >= r.version) continue;
    // Only the names are needed here: a plain JSON read, the full schema check runs when a report is opened.
    const doc = JSON.parse(r.frozen) as { baseline?: { name?: string }; options?: { name?: string }[] };
    latest.set(r.series_id, {
      id: r.id,
      seriesId: r.series_id,
      version: r.version,
      versions: 0,
      title: r.title,
      baselineId: r.baseline_id,
      baselineName: doc.baseline?.name ?? "",
      optionNames: (doc.options ?? []).map((o) => o.name ?? ""),
      isDemo: r.is_demo === 1,
      createdBy: r.created_by,
      createdByName: r.created_by_name,
      createdAt: r.created_at,
    });
  }
  return [...latest.values()].map((x) => ({ ...x, versions: counts.get(x.seriesId) ?? 1 })).sort((a, b) => b.createdAt - a.createdAt);
}

export async function listReportVersions(conn: Q, teamId: string, seriesId: string): Promise<ReportVersion[]> {
  const rows = await conn("reports as r")
    .leftJoin("users as u", "u.id", "r.created_by")
    .where({ "r.team_id": teamId, "r.series_id": seriesId })
    .orderBy("r.version", "desc")
    .select("r.id", "r.version", "r.title", "r.created_at", "u.name as created_by_name");
  return rows.map((r) => ({
    id: r.id,
    version: r.version,
    title: r.title,
    createdAt: r.created_at,
    createdByName: r.created_by_name ?? null,
  }));
}

// ---------------------------------------------------------------------------------------------
// Inputs of a report: the team's baseline (technology, classes, histograms) and chosen scenarios.

/** What a report freezes, as stored: technology and settings are the raw JSON (lib/reports/service.ts checks them). */
export interface ReportSources {
  baseline: { id: string; name: string; description: string; version: number; technology: unknown; classes: WireClass[] };
  scenarios: { id: string; name: string; notes: string; version: number; settings: unknown }[];
  /** The chosen roadmaps (issue 14), in the order asked; empty when none. */
  roadmaps: { id: string; name: string; version: number; steps: RoadmapStep[] }[];
}

/**
 * Load what a report freezes. The baseline must belong to the team (else NotFoundError); every scenario must
 * exist in the team (else NotFoundError, the same answer as for another team's id) and belong to that
 * baseline (else InvalidInputError); the baseline must have classes (else InvalidInputError). Roadmaps follow the
 * scenarios' rule: of the team (else NotFoundError on `roadmapIds`) and on the same baseline (else InvalidInputError).
 */
export async function loadReportSources(
  conn: Q,
  p: { teamId: string; baselineId: string; scenarioIds: string[]; roadmapIds?: string[] },
): Promise<ReportSources> {
  const b = await conn("baselines").where({ id: p.baselineId, team_id: p.teamId }).first("id", "name", "description", "technology", "version");
  if (!b) throw new NotFoundError("Baseline", "Baseline not found.", "baselineId");
  const rows = (await conn("scenarios")
    .whereIn("id", p.scenarioIds)
    .andWhere({ team_id: p.teamId })
    .select("id", "baseline_id", "name", "notes", "settings", "version")) as {
    id: string;
    baseline_id: string;
    name: string;
    notes: string;
    settings: string;
    version: number;
  }[];
  const byId = new Map(rows.map((r) => [r.id, r]));
  for (const id of p.scenarioIds) if (!byId.has(id)) throw new NotFoundError("Scenario", "Scenario not found.", "scenarioIds");
  for (const id of p.scenarioIds) {
    const r = byId.get(id)!;
    if (r.baseline_id !== p.baselineId) {
      const message = `Scenario "${r.name}" belongs to another baseline; pick scenarios of the chosen baseline.`;
      throw new InvalidInputError(message, fieldError("scenarioIds", message));
    }
  }
  const roadmapIds = p.roadmapIds ?? [];
  const roadmaps = await getTeamRoadmaps(conn, p.teamId, roadmapIds);
  if (roadmaps.length !== roadmapIds.length) throw new NotFoundError("Roadmap", "Roadmap not found.", "roadmapIds");
  for (const r of roadmaps) {
    if (r.baselineId !== p.baselineId) {
      const message = `Roadmap "${r.name}" belongs to another baseline; pick roadmaps of the chosen baseline.`;
      throw new InvalidInputError(message, fieldError("roadmapIds", message));
    }
  }
  // The same loader the workspace evaluates with; the stored id, position and bin count are not part of a WireClass.
  const classes: WireClass[] = (await listClassesWithHistograms(conn, p.baselineId)).map(({ id: _id, position: _position, histogramBins: _bins, ...wc }) => wc);
  if (classes.length === 0) {
    const message = "The baseline has no wire classes yet; add classes before composing a report.";
    throw new InvalidInputError(message, fieldError("baselineId", message));
  }
  return {
    baseline: {
      id: b.id,
      name: b.name,
      description: b.description ?? "",
      version: b.version,
      technology: JSON.parse(b.technology) as unknown,
      classes,
    },
    scenarios: p.scenarioIds.map((id) => {
      const r = byId.get(id)!;
      return { id: r.id, name: r.name, notes: r.notes ?? "", version: r.version, settings: JSON.parse(r.settings) as unknown };
    }),
    roadmaps: roadmaps.map((r) => ({ id: r.id, name: r.name, version: r.version, steps: r.steps })),
  };
}

/** Baselines and their scenarios and class names, for the compose form. */
export async function listComposeChoices(conn: Q, teamId: string) {
  const baselines = await conn("baselines").where({ team_id: teamId }).orderBy("name").select("id", "name", "is_demo");
  const ids = baselines.map((b) => b.id as string);
  const scenarios = ids.length ? await conn("scenarios").whereIn("baseline_id", ids).orderBy("name").select("id", "baseline_id", "name") : [];
  const classes = ids.length ? await conn("wire_classes").whereIn("baseline_id", ids).orderBy("position").select("baseline_id", "name", "tier") : [];
  return baselines.map((b) => ({
    id: b.id as string,
    name: b.name as string,
    isDemo: b.is_demo === 1,
    scenarios: scenarios.filter((s) => s.baseline_id === b.id).map((s) => ({ id: s.id as string, name: s.name as string })),
    classes: classes.filter((c) => c.baseline_id === b.id).map((c) => ({ name: c.name as string, tier: c.tier as string })),
  }));
}
export type ComposeChoices = Awaited<ReturnType<typeof listComposeChoices>>;
/** One baseline of the compose form: its scenarios and classes. */
export type ComposeBaseline = ComposeChoices[number];

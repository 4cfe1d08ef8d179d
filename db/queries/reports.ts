// Server code only. No `import "server-only"` here: the demo seeder (a plain tsx script) uses these queries
// with its own Knex instance; every function takes the connection as its first argument.
import { randomUUID } from "node:crypto";
import type { Knex } from "knex";
import { newId } from "@/lib/ids";
import { listClassesWithHistograms } from "@/db/queries/wire-classes";
import type { FreezeInput } from "@/lib/reports/freeze";
import type { ScenarioSettings, Technology, WireClass } from "@/lib/scaling/types";
import {
  frozenReportSchema,
  settingsSnapshotSchema,
  technologySnapshotSchema,
  type FrozenReport,
} from "@/lib/validation/report";

/** Why the inputs of a report could not be loaded; routes map it to 404 / 400 / 409. */
export class ReportInputError extends Error {
  constructor(
    readonly status: 400 | 404 | 409,
    message: string,
    readonly field?: string,
  ) {
    super(message);
  }
}

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

/** A stored frozen document that no longer matches the schema is a server fault, never shown half-parsed. */
export function parseFrozen(text: string, id: string): FrozenReport {
  const r = frozenReportSchema.safeParse(JSON.parse(text));
  if (!r.success) throw new Error(`report ${id}: frozen document does not match the schema: ${r.error.message.slice(0, 500)}`);
  return r.data;
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
    frozen: parseFrozen(row.frozen, row.id),
  };
}

/** Team of a report, or undefined when there is no such report (the access check turns both into 404). */
export async function reportTeamId(conn: Knex, id: string): Promise<string | undefined> {
  const row = await conn("reports").where({ id }).first("team_id");
  return row?.team_id as string | undefined;
}

export async function getReport(conn: Knex, id: string): Promise<StoredReport | undefined> {
  const row = (await conn("reports as r")
    .leftJoin("users as u", "u.id", "r.created_by")
    .where("r.id", id)
    .first("r.*", "u.name as created_by_name")) as ReportRow | undefined;
  return row ? toStored(row) : undefined;
}

/** The latest version of each report series of a team, newest first. */
export async function listReports(conn: Knex, teamId: string): Promise<ReportListItem[]> {
  const rows = (await conn("reports as r")
    .leftJoin("users as u", "u.id", "r.created_by")
    .where("r.team_id", teamId)
    .orderBy([{ column: "r.created_at", order: "desc" }, { column: "r.version", order: "desc" }])
    .select("r.id", "r.series_id", "r.version", "r.title", "r.baseline_id", "r.frozen", "r.is_demo", "r.created_by", "r.created_at", "u.name as created_by_name")) as (ReportRow & { created_by_name: string | null })[];
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

export async function listReportVersions(conn: Knex, teamId: string, seriesId: string): Promise<ReportVersion[]> {
  const rows = await conn("reports as r")
    .leftJoin("users as u", "u.id", "r.created_by")
    .where({ "r.team_id": teamId, "r.series_id": seriesId })
    .orderBy("r.version", "desc")
    .select("r.id", "r.version", "r.title", "r.created_at", "u.name as created_by_name");
  return rows.map((r) => ({ id: r.id, version: r.version, title: r.title, createdAt: r.created_at, createdByName: r.created_by_name ?? null }));
}

/**
 * Store a frozen report as a new series (no seriesId) or as the next version of a series, in one
 * transaction with its audit entry.
 */
export async function insertReport(
  conn: Knex,
  p: {
    teamId: string;
    userId: string | null;
    seriesId?: string;
    baselineId: string | null;
    title: string;
    audienceNote: string;
    frozen: FrozenReport;
    isDemo?: boolean;
  },
): Promise<{ id: string; seriesId: string; version: number }> {
  // Validate before writing: the stored document is exactly what every read will accept.
  const frozen = frozenReportSchema.parse(p.frozen);
  return conn.transaction(async (trx) => {
    const seriesId = p.seriesId ?? randomUUID();
    const max = await trx("reports").where({ series_id: seriesId }).max({ v: "version" }).first();
    const version = (Number(max?.v) || 0) + 1;
    const id = newId();
    await trx("reports").insert({
      id,
      team_id: p.teamId,
      series_id: seriesId,
      version,
      baseline_id: p.baselineId,
      title: p.title,
      audience_note: p.audienceNote,
      frozen: JSON.stringify(frozen),
      engine_version: frozen.engineVersion,
      is_demo: p.isDemo ? 1 : 0,
      created_by: p.userId,
      created_at: frozen.createdAt,
    });
    await trx("audit_log").insert({
      team_id: p.teamId,
      user_id: p.userId,
      action: version === 1 ? "report.create" : "report.refresh",
      entity_type: "report",
      entity_id: id,
      detail: JSON.stringify({ title: p.title, seriesId, version, options: frozen.options.map((o) => o.name) }),
      at: Date.now(),
    });
    return { id, seriesId, version };
  });
}

/** Delete one version of a report (its share links go with it). */
export async function deleteReport(conn: Knex, p: { id: string; teamId: string; userId: string }): Promise<boolean> {
  return conn.transaction(async (trx) => {
    const row = await trx("reports").where({ id: p.id, team_id: p.teamId }).first("title", "series_id", "version");
    if (!row) return false;
    await trx("reports").where({ id: p.id }).delete();
    await trx("audit_log").insert({
      team_id: p.teamId,
      user_id: p.userId,
      action: "report.delete",
      entity_type: "report",
      entity_id: p.id,
      detail: JSON.stringify({ title: row.title, seriesId: row.series_id, version: row.version }),
      at: Date.now(),
    });
    return true;
  });
}

// ---------------------------------------------------------------------------------------------
// Inputs of a report: the team's baseline (technology, classes, histograms) and chosen scenarios.


/** Scenario settings as stored, with the workspace's defaults for fields an older row may lack. */
export function settingsFromStored(json: string, technology: Technology): ScenarioSettings {
  const raw = JSON.parse(json) as Record<string, unknown>;
  const merged = {
    s: 1, sL: 1, level: "full", barrierScales: false, miller: 1, deviceRFactor: 1, deviceCFactor: 1,
    supplyV: technology.supplyV, k: null, metal: null, overrides: {},
    ...Object.fromEntries(Object.entries(raw).filter(([, v]) => v !== undefined)),
  };
  return settingsSnapshotSchema.parse(merged) as ScenarioSettings;
}

/**
 * Load what a report freezes. The baseline must belong to the team (else 404); every scenario must exist
 * in the team (else 404, the same answer as for another team's id) and belong to that baseline (else 400).
 */
export async function loadReportInputs(
  conn: Knex,
  p: { teamId: string; baselineId: string; scenarioIds: string[] },
): Promise<Pick<FreezeInput, "baseline" | "scenarios">> {
  const b = await conn("baselines").where({ id: p.baselineId, team_id: p.teamId }).first("id", "name", "description", "technology", "version");
  if (!b) throw new ReportInputError(404, "Baseline not found.", "baselineId");
  const technology = technologySnapshotSchema.parse(JSON.parse(b.technology)) as Technology;
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
  for (const id of p.scenarioIds) if (!byId.has(id)) throw new ReportInputError(404, "Scenario not found.", "scenarioIds");
  for (const id of p.scenarioIds) {
    const r = byId.get(id)!;
    if (r.baseline_id !== p.baselineId) {
      throw new ReportInputError(400, `Scenario "${r.name}" belongs to another baseline; pick scenarios of the chosen baseline.`, "scenarioIds");
    }
  }
  // The same loader the workspace evaluates with; the stored id, position and bin count are not part of a WireClass.
  const classes: WireClass[] = (await listClassesWithHistograms(conn, p.baselineId)).map(
    ({ id: _id, position: _position, histogramBins: _bins, ...wc }) => wc,
  );
  if (classes.length === 0) throw new ReportInputError(400, "The baseline has no wire classes yet; add classes before composing a report.", "baselineId");
  return {
    baseline: { id: b.id, name: b.name, description: b.description ?? "", version: b.version, technology, classes },
    scenarios: p.scenarioIds.map((id) => {
      const r = byId.get(id)!;
      return { id: r.id, name: r.name, notes: r.notes ?? "", version: r.version, settings: settingsFromStored(r.settings, technology) };
    }),
  };
}

/** Baselines and their scenarios and class names, for the compose form. */
export async function listComposeChoices(conn: Knex, teamId: string) {
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

import "server-only";
import { publicBaseUrl } from "@/lib/public-url";
import type { Knex } from "knex";
import { ConflictError, InvalidInputError, NotFoundError, fieldError } from "@/db/errors";
import { getReport, loadReportSources, type StoredReport } from "@/db/queries/reports";
import { storeReport } from "@/db/writes/reports";
import { RoadmapInputError, type RoadmapStep, type ScenarioSettings, type Technology } from "@/lib/scaling";
import { roadmapStepsSchema } from "@/lib/validation/roadmap";
import { frozenReportSchema, settingsSnapshotSchema, technologySnapshotSchema, type ComposeReport, type FrozenReport } from "@/lib/validation/report";
import { defaultScenarioSettings } from "@/lib/workspace/settings";
import { freezeReport, UnknownClassError, type FreezeInput } from "./freeze";
import { scopeToChosenClasses } from "./scope";

/**
 * Reports between the routes (or the demo seeder) and the database: load and check the inputs, freeze,
 * store through db/writes/reports.ts; read and check stored documents. Every function takes the Knex
 * instance first. Errors are the domain errors of db/errors.ts (apiRoute answers them).
 */

/** The chosen roadmaps' steps as stored, checked against the roadmap step schema (lib/validation/roadmap.ts). */
function stepsFromStored(raw: RoadmapStep[]): RoadmapStep[] {
  return roadmapStepsSchema.parse(raw) as RoadmapStep[];
}

/** Scenario settings as stored, with the workspace's defaults for fields an older row may lack. */
export function settingsFromStored(raw: unknown, technology: Technology): ScenarioSettings {
  const stored = (raw ?? {}) as Record<string, unknown>;
  const merged = { ...defaultScenarioSettings(technology), ...Object.fromEntries(Object.entries(stored).filter(([, v]) => v !== undefined)) };
  return settingsSnapshotSchema.parse(merged) as ScenarioSettings;
}

/**
 * What a report freezes: the team's baseline (technology, classes, histograms) and the chosen scenarios
 * (db/queries/reports.ts `loadReportSources`), with technology and settings checked against the snapshot schemas.
 */
export async function loadReportInputs(
  conn: Knex,
  p: { teamId: string; baselineId: string; scenarioIds: string[]; roadmapIds?: string[] },
): Promise<Pick<FreezeInput, "baseline" | "scenarios" | "roadmaps">> {
  const src = await loadReportSources(conn, p);
  const technology = technologySnapshotSchema.parse(src.baseline.technology) as Technology;
  return {
    baseline: { ...src.baseline, technology },
    scenarios: src.scenarios.map((s) => ({ ...s, settings: settingsFromStored(s.settings, technology) })),
    roadmaps: src.roadmaps.map((r) => ({ ...r, steps: stepsFromStored(r.steps) })),
  };
}

/** freezeReport with the user's mistakes as InvalidInputError (an unknown class, geometry the engine refuses). */
function freeze(input: FreezeInput): FrozenReport {
  try {
    return freezeReport(input);
  } catch (e) {
    if (e instanceof UnknownClassError) throw new InvalidInputError(e.message, fieldError("classNames", e.message));
    // A chosen roadmap that no longer fits the baseline (a class removed since it was saved): name the roadmap field.
    if (e instanceof RoadmapInputError) {
      const message = `A chosen roadmap does not fit the baseline: ${e.message}`;
      throw new InvalidInputError(message, fieldError("roadmapIds", message));
    }
    // The engine refuses impossible geometry (e.g. a barrier that fills the scaled line): the user's inputs, not our fault.
    if (e instanceof RangeError) throw new InvalidInputError(`The engine cannot evaluate these inputs: ${e.message}`);
    throw e;
  }
}

/** Load, evaluate and freeze, then store as a new report series (or the next version of `seriesId`). */
export async function composeReport(
  conn: Knex,
  p: { teamId: string; userId: string; input: ComposeReport; seriesId?: string; isDemo?: boolean },
): Promise<{ id: string; seriesId: string; version: number }> {
  const loaded = await loadReportInputs(conn, {
    teamId: p.teamId,
    baselineId: p.input.baselineId,
    scenarioIds: p.input.scenarioIds,
    roadmapIds: p.input.roadmapIds,
  });
  const frozen = freeze({ ...loaded, classNames: p.input.classNames, metrics: p.input.metrics, shaping: p.input.shaping });
  return storeReport(conn, {
    teamId: p.teamId,
    userId: p.userId,
    seriesId: p.seriesId,
    baselineId: p.input.baselineId,
    title: p.input.title,
    audienceNote: p.input.audienceNote,
    frozen,
    isDemo: p.isDemo,
  });
}

/**
 * "Refresh from current scenarios": the same baseline, scenarios, classes and metrics, evaluated now, stored
 * as the next version of the series. The old version stays. A scenario deleted since → ConflictError (409).
 */
export async function refreshReport(conn: Knex, report: StoredReport, userId: string) {
  const scenarioIds = report.frozen.options.map((o) => o.scenarioId).filter((x): x is string => Boolean(x));
  if (!report.baselineId || !report.frozen.baseline.id) throw new ConflictError("The report's baseline was deleted; compose a new report instead.");
  try {
    return await composeReport(conn, {
      teamId: report.teamId,
      userId,
      seriesId: report.seriesId,
      isDemo: report.isDemo,
      input: {
        baselineId: report.baselineId,
        scenarioIds,
        title: report.title,
        audienceNote: report.audienceNote,
        classNames: report.frozen.classNames,
        metrics: report.frozen.metrics,
        ...(report.frozen.roadmaps ? { roadmapIds: report.frozen.roadmaps.map((r) => r.roadmapId).filter((x): x is string => Boolean(x)) } : {}),
        ...(report.frozen.shaping ? { shaping: { objective: report.frozen.shaping.objective } } : {}),
      },
    });
  } catch (e) {
    if (e instanceof NotFoundError)
      throw new ConflictError(`${e.message.replace(/\.$/, "")}: it was deleted since this report was made; compose a new report instead.`);
    if (e instanceof InvalidInputError && e.fields?.roadmapIds) {
      throw new ConflictError("A roadmap of this report no longer fits the baseline; compose a new report instead.");
    }
    if (e instanceof InvalidInputError && e.fields?.classNames) {
      throw new ConflictError("A class of this report is no longer in the baseline; compose a new report instead.");
    }
    throw e;
  }
}

/**
 * A stored report with its frozen document checked against the current schema (undefined when there is
 * none). A document that no longer matches is a server fault, never shown half-parsed.
 */
export async function findReport(conn: Knex, id: string): Promise<StoredReport | undefined> {
  const r = await getReport(conn, id);
  if (!r) return undefined;
  const checked = frozenReportSchema.safeParse(r.frozen);
  if (!checked.success) throw new Error(`report ${id}: frozen document does not match the schema: ${checked.error.message.slice(0, 500)}`);
  // Only the classes the report was composed for (documents frozen before that rule held every class).
  return { ...r, frozen: scopeToChosenClasses(checked.data) };
}

/** findReport, or NotFoundError("Report"). */
export async function loadReport(conn: Knex, id: string): Promise<StoredReport> {
  const r = await findReport(conn, id);
  if (!r) throw new NotFoundError("Report");
  return r;
}

/** What a share link shows: the frozen report without internal ids, author or team. */
export interface PublicReport {
  title: string;
  audienceNote: string;
  version: number;
  createdAt: number;
  frozen: FrozenReport;
}

export function publicReport(r: StoredReport): PublicReport {
  const f = r.frozen;
  const { id: _baselineId, ...baseline } = f.baseline;
  return {
    title: r.title,
    audienceNote: r.audienceNote,
    version: r.version,
    createdAt: r.createdAt,
    frozen: {
      ...f,
      baseline,
      options: f.options.map(({ scenarioId: _sid, ...o }) => o),
      ...(f.roadmaps
        ? { roadmaps: f.roadmaps.map(({ roadmapId: _rid, ...r }) => ({ ...r, steps: r.steps.map(({ fromScenarioId: _fsid, ...st }) => st) })) }
        : {}),
    },
  };
}

/** The share page of a link token, on the public base URL (lib/public-url.ts), as invites build theirs. */
export function shareUrl(token: string): string {
  return `${publicBaseUrl()}/r/${token}`;
}

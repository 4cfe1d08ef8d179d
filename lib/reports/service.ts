import "server-only";
import { db, ready } from "@/db/client";
import { getReport, insertReport, loadReportInputs, ReportInputError, type StoredReport } from "@/db/queries/reports";
import { ApiError, badRequest, conflict, notFound } from "@/lib/api";
import type { ComposeReport, FrozenReport } from "@/lib/validation/report";
import { freezeReport, UnknownClassError } from "./freeze";

function mapInputError(e: unknown): never {
  if (e instanceof ReportInputError) {
    const fields = e.field ? { [e.field]: [e.message] } : undefined;
    if (e.status === 404) throw new ApiError(404, "not_found", e.message, fields);
    if (e.status === 409) throw conflict(e.message, fields);
    throw badRequest(e.message, fields);
  }
  if (e instanceof UnknownClassError) throw badRequest(e.message, { classNames: [e.message] });
  if (e instanceof RangeError) {
    // The engine refuses impossible geometry (e.g. a barrier that fills the scaled line): the user's inputs, not our fault.
    throw badRequest(`The engine cannot evaluate these inputs: ${e.message}`);
  }
  throw e;
}

/** Load, evaluate and freeze, then store as a new report series (or the next version of `seriesId`). */
export async function composeReport(p: {
  teamId: string;
  userId: string;
  input: ComposeReport;
  seriesId?: string;
  isDemo?: boolean;
}): Promise<{ id: string; seriesId: string; version: number }> {
  await ready();
  let frozen: FrozenReport;
  try {
    const loaded = await loadReportInputs(db, { teamId: p.teamId, baselineId: p.input.baselineId, scenarioIds: p.input.scenarioIds });
    frozen = freezeReport({ ...loaded, classNames: p.input.classNames, metrics: p.input.metrics });
  } catch (e) {
    mapInputError(e);
  }
  return insertReport(db, {
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
 * as the next version of the series. The old version stays. A scenario deleted since → 409.
 */
export async function refreshReport(report: StoredReport, userId: string) {
  const scenarioIds = report.frozen.options.map((o) => o.scenarioId).filter((x): x is string => Boolean(x));
  if (!report.baselineId || !report.frozen.baseline.id) throw conflict("The report's baseline was deleted; compose a new report instead.");
  try {
    return await composeReport({
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
      },
    });
  } catch (e) {
    if (e instanceof ApiError && e.status === 404) throw conflict(`${e.message.replace(/\.$/, "")}: it was deleted since this report was made; compose a new report instead.`);
    if (e instanceof ApiError && e.status === 400 && e.fields?.classNames) {
      throw conflict("A class of this report is no longer in the baseline; compose a new report instead.");
    }
    throw e;
  }
}

export async function loadReport(id: string): Promise<StoredReport> {
  await ready();
  const r = await getReport(db, id);
  if (!r) throw notFound("Report");
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
    frozen: { ...f, baseline, options: f.options.map(({ scenarioId: _sid, ...o }) => o) },
  };
}

/** Base URL for links in e-mails and share-link answers: PLATEAU_PUBLIC_URL, else the request's origin. */
export function publicBaseUrl(req: Request): string {
  const env = process.env.PLATEAU_PUBLIC_URL?.trim();
  if (env) return env.replace(/\/+$/, "");
  return new URL(req.url).origin;
}

export function shareUrl(req: Request, token: string): string {
  return `${publicBaseUrl(req)}/r/${token}`;
}

import { db } from "@/db/client";
import { listReports } from "@/db/queries/reports";
import { requireTeamRole } from "@/lib/access";
import { apiRoute, readJson } from "@/lib/api";
import { composeReport, loadReport } from "@/lib/reports/service";
import { summarizeReport } from "@/lib/reports/summary";
import { composeReportSchema } from "@/lib/validation/report";

export const dynamic = "force-dynamic";

/** The team's reports (latest version of each), newest first. Viewer and up. */
export const GET = apiRoute<{ teamId: string }>(async (_req, { teamId }) => {
  await requireTeamRole(teamId, "viewer");
  return Response.json({ reports: await listReports(db, teamId) });
});

/** Compose and freeze a report from a baseline and 2–4 of its scenarios. Editor and up. */
export const POST = apiRoute<{ teamId: string }>(async (req, { teamId }) => {
  const { user } = await requireTeamRole(teamId, "editor");
  const input = await readJson(req, composeReportSchema, 32 * 1024);
  const created = await composeReport(db, { teamId, userId: user.id, input });
  const report = await loadReport(db, created.id);
  return Response.json(
    {
      report: {
        id: report.id,
        seriesId: report.seriesId,
        version: report.version,
        title: report.title,
        audienceNote: report.audienceNote,
        createdAt: report.createdAt,
        engineVersion: report.engineVersion,
        frozen: report.frozen,
        summary: summarizeReport(report.frozen),
      },
    },
    { status: 201, headers: { location: `/api/reports/${report.id}` } },
  );
});

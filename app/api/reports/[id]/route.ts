import { db } from "@/db/client";
import { listReportVersions, reportTeamId } from "@/db/queries/reports";
import { deleteReport } from "@/db/writes/reports";
import { requireResourceRole } from "@/lib/access";
import { apiRoute, forbidden } from "@/lib/api";
import { loadReport } from "@/lib/reports/service";
import { summarizeReport } from "@/lib/reports/summary";

export const dynamic = "force-dynamic";

/** One report version: the frozen document, its computed summary and the versions of its series. Viewer and up. */
export const GET = apiRoute<{ id: string }>(async (_req, { id }) => {
  const { teamId } = await requireResourceRole(() => reportTeamId(db, id), "viewer", "Report");
  const report = await loadReport(db, id);
  return Response.json({
    report: {
      id: report.id,
      teamId,
      seriesId: report.seriesId,
      version: report.version,
      title: report.title,
      audienceNote: report.audienceNote,
      createdAt: report.createdAt,
      createdBy: report.createdBy,
      createdByName: report.createdByName,
      engineVersion: report.engineVersion,
      isDemo: report.isDemo,
      frozen: report.frozen,
      summary: summarizeReport(report.frozen),
    },
    versions: await listReportVersions(db, teamId, report.seriesId),
  });
});

/** Delete this version (and its share links). The team's owners, or the report's author while an editor. */
export const DELETE = apiRoute<{ id: string }>(async (_req, { id }) => {
  const { user, teamId, role } = await requireResourceRole(() => reportTeamId(db, id), "editor", "Report");
  const report = await loadReport(db, id);
  if (role !== "owner" && report.createdBy !== user.id) throw forbidden("Only the report's author or a team owner can delete it.");
  await deleteReport(db, { id, teamId, userId: user.id });
  return new Response(null, { status: 204 });
});

import { db } from "@/db/client";
import { reportTeamId } from "@/db/queries/reports";
import { requireResourceRole } from "@/lib/access";
import { apiRoute } from "@/lib/api";
import { loadReport, refreshReport } from "@/lib/reports/service";

export const dynamic = "force-dynamic";

/** Re-evaluate the report's scenarios as they are now: a new version in the same series; the old one is kept. Editor and up. */
export const POST = apiRoute<{ id: string }>(async (_req, { id }) => {
  const { user } = await requireResourceRole(() => reportTeamId(db, id), "editor", "Report");
  const report = await loadReport(db, id);
  const created = await refreshReport(db, report, user.id);
  return Response.json({ report: created }, { status: 201, headers: { location: `/api/reports/${created.id}` } });
});

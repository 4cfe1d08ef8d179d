import { db } from "@/db/client";
import { reportTeamId } from "@/db/queries/reports";
import { requireResourceRole } from "@/lib/access";
import { apiRoute } from "@/lib/api";
import { csvHeaders } from "@/lib/csv-safe";
import { reportCsv } from "@/lib/reports/export-csv";
import { loadReport } from "@/lib/reports/service";

export const dynamic = "force-dynamic";

/** The report's tables as CSV (units in the headers, formula-injection safe). Viewer and up. */
export const GET = apiRoute<{ id: string }>(async (_req, { id }) => {
  await requireResourceRole(() => reportTeamId(db, id), "viewer", "Report");
  const report = await loadReport(db, id);
  const name = `${report.title.replace(/[^\p{L}\p{N} _-]+/gu, "").trim().slice(0, 80) || "report"} v${report.version}.csv`;
  return new Response(reportCsv(report.title, report.frozen), { headers: csvHeaders(name) });
});

import { db } from "@/db/client";
import { reportTeamId } from "@/db/queries/reports";
import { requireResourceRole } from "@/lib/access";
import { apiRoute } from "@/lib/api";
import { attachment } from "@/lib/csv-safe";
import { renderPdf } from "@/lib/reports/pdf";
import { printToken } from "@/lib/reports/print-token";
import { loadReport } from "@/lib/reports/service";

export const dynamic = "force-dynamic";
export const maxDuration = 60;

/** A server-rendered PDF of the report: headless Chromium prints the report's print view. Viewer and up; limits in lib/reports/pdf.ts. */
export const GET = apiRoute<{ id: string }>(async (req, { id }) => {
  const a = await requireResourceRole(() => reportTeamId(db, id), "viewer", "Report");
  const report = await loadReport(db, id);
  // Chromium fetches the print view from this same server; PLATEAU_INTERNAL_URL overrides the address behind a proxy.
  const origin = process.env.PLATEAU_INTERNAL_URL?.replace(/\/+$/, "") || new URL(req.url).origin;
  const url = `${origin}/print/reports/${encodeURIComponent(id)}?t=${encodeURIComponent(printToken(id))}`;
  // bounded (429 with Retry-After when full or over the user's limit); dropped as soon as the client goes away
  const pdf = await renderPdf(url, `${report.title} · version ${report.version}`, { userId: a.user.id, signal: req.signal });
  const name = `${
    report.title
      .replace(/[^\p{L}\p{N} _-]+/gu, "")
      .trim()
      .slice(0, 80) || "report"
  } v${report.version}.pdf`;
  return new Response(new Uint8Array(pdf), {
    headers: { "content-type": "application/pdf", "content-disposition": attachment(name), "cache-control": "no-store" },
  });
});

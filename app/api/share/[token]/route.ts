import { db, ready } from "@/db/client";
import { resolveShareToken } from "@/db/queries/share-links";
import { ApiError, apiRoute, notFound } from "@/lib/api";
import { findReport, publicReport } from "@/lib/reports/service";
import { summarizeReport } from "@/lib/reports/summary";

export const dynamic = "force-dynamic";

/** The report behind a share link, without sign-in: 410 once expired, 404 when revoked or unknown. */
export const GET = apiRoute<{ token: string }>(async (_req, { token }) => {
  await ready();
  const r = await resolveShareToken(db, token);
  if (r.status === "expired") throw new ApiError(410, "expired", "This share link has expired. Ask the sender for a new one.");
  if (r.status === "missing") throw notFound("Share link");
  const report = await findReport(db, r.reportId);
  if (!report) throw notFound("Share link");
  const view = publicReport(report);
  return Response.json(
    { report: { ...view, summary: summarizeReport(view.frozen) }, expiresAt: r.expiresAt },
    { headers: { "cache-control": "no-store", "referrer-policy": "no-referrer" } },
  );
});

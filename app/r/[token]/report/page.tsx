import type { Metadata } from "next";
import { notFound, redirect } from "next/navigation";
import { db, ready } from "@/db/client";

import { resolveShareToken } from "@/db/queries/share-links";
import { ReportBody } from "@/components/reports/report-body";
import { PrintButton } from "@/components/reports/print-button";
import { date } from "@/lib/reports/format";
import { findReport, publicReport } from "@/lib/reports/service";
import { summarizeReport } from "@/lib/reports/summary";

export const dynamic = "force-dynamic";
export const metadata: Metadata = { title: "Shared report", robots: { index: false, follow: false }, referrer: "no-referrer" };

/** The report behind a share link, read-only and without sign-in: no navigation, nothing else of the team. */
export default async function SharedReportPage({ params }: { params: Promise<{ token: string }> }) {
  const { token } = await params;
  await ready();
  const r = await resolveShareToken(db, token);
  // The link's own address answers 410 for an expired link (a page cannot).
  if (r.status === "expired") redirect(`/r/${encodeURIComponent(token)}`);
  if (r.status !== "ok") notFound();
  const stored = await findReport(db, r.reportId);
  if (!stored) notFound();
  const view = publicReport(stored);
  return (
    <div className="min-h-screen bg-ground print:bg-white">
      <div className="no-print border-b border-rule bg-panel">
        <div className="mx-auto flex max-w-5xl items-center justify-between gap-3 px-4 py-2 text-sm">
          <span className="font-semibold tracking-wide text-copper">Plateau</span>
          <span className="text-muted">Read-only shared report · link valid until {date(r.expiresAt)}</span>
          <PrintButton label="Print or save as PDF" />
        </div>
      </div>
      <main className="mx-auto max-w-5xl px-4 py-6 print:max-w-none print:p-0">
        <div className="rounded-lg border border-rule bg-panel p-6 print:border-0 print:p-0">
          <ReportBody report={view} summary={summarizeReport(view.frozen)} isDemo={stored.isDemo} />
        </div>
      </main>
    </div>
  );
}

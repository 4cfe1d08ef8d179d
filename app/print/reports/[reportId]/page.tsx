import type { Metadata } from "next";
import { notFound } from "next/navigation";
import { cache } from "react";
import { db, ready } from "@/db/client";
import { findReport } from "@/lib/reports/service";
import { ReportBody } from "@/components/reports/report-body";
import { PrintButton } from "@/components/reports/print-button";
import { getMembershipRole } from "@/lib/access";
import { validateRequest } from "@/lib/auth";
import { verifyPrintToken } from "@/lib/reports/print-token";
import { summarizeReport } from "@/lib/reports/summary";

export const dynamic = "force-dynamic";

/**
 * The report if this request may print it: a valid print token, or a signed-in member of its team.
 * Once per request: metadata and page share it.
 */
const printableReport = cache(async (reportId: string, t: string | undefined) => {
  await ready();
  const report = await findReport(db, reportId);
  if (!report) return null;
  if (verifyPrintToken(reportId, t)) return report;
  const { user } = await validateRequest();
  return user && (await getMembershipRole(report.teamId, user.id)) ? report : null;
});

// The title is the browser's default file name when the page is saved as PDF.
export async function generateMetadata({
  params,
  searchParams,
}: {
  params: Promise<{ reportId: string }>;
  searchParams: Promise<{ t?: string }>;
}): Promise<Metadata> {
  const { t } = await searchParams;
  const report = await printableReport((await params).reportId, typeof t === "string" ? t : undefined);
  return { title: report ? `${report.title} (v${report.version})` : "Report (print)", robots: { index: false } };
}

/**
 * The report alone, laid out for paper: no navigation. Opened by a signed-in member of the team, or by the
 * PDF renderer with a short-lived token bound to this report.
 */
export default async function PrintReportPage({ params, searchParams }: { params: Promise<{ reportId: string }>; searchParams: Promise<{ t?: string }> }) {
  const { reportId } = await params;
  const { t } = await searchParams;
  const report = await printableReport(reportId, typeof t === "string" ? t : undefined);
  if (!report) notFound();
  return (
    <div className="min-h-screen bg-white">
      <div className="mx-auto max-w-[190mm] px-6 py-8 print:max-w-none print:p-0">
        <div className="no-print mb-6 flex items-center justify-between gap-3 rounded-md border border-rule bg-ground px-3 py-2 text-sm text-muted">
          <span>Print view: the report as it appears on paper.</span>
          <PrintButton />
        </div>
        <ReportBody report={report} summary={summarizeReport(report.frozen)} isDemo={report.isDemo} />
      </div>
    </div>
  );
}

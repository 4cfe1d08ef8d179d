import type { Metadata } from "next";
import Link from "next/link";
import { notFound } from "next/navigation";
import { cache } from "react";
import { db, ready } from "@/db/client";
import { listReportVersions } from "@/db/queries/reports";
import { findReport } from "@/lib/reports/service";
import { listShareLinks } from "@/db/queries/share-links";
import { ReportActions } from "@/components/reports/report-actions";
import { ReportBody } from "@/components/reports/report-body";
import { roleAtLeast } from "@/lib/access";
import { summarizeReport } from "@/lib/reports/summary";
import { getTeamContext } from "@/lib/team-context";

export const dynamic = "force-dynamic";

// Metadata and page share one read (and one check of the frozen document) per request.
const loadReport = cache(async (id: string) => {
  await ready();
  return findReport(db, id);
});

export async function generateMetadata({ params }: { params: Promise<{ teamId: string; reportId: string }> }): Promise<Metadata> {
  const { teamId, reportId } = await params;
  await getTeamContext(teamId);
  const r = await loadReport(reportId);
  return { title: r && r.teamId === teamId ? r.title : "Report" };
}

export default async function ReportPage({ params }: { params: Promise<{ teamId: string; reportId: string }> }) {
  const { teamId, reportId } = await params;
  const ctx = await getTeamContext(teamId);
  const report = await loadReport(reportId);
  if (!report || report.teamId !== teamId) notFound();
  const canEdit = roleAtLeast(ctx.role, "editor");
  const canDelete = ctx.role === "owner" || (canEdit && report.createdBy === ctx.user.id);
  const [versions, links] = await Promise.all([listReportVersions(db, teamId, report.seriesId), canEdit ? listShareLinks(db, reportId) : Promise.resolve([])]);
  const latest = versions[0];
  return (
    <div className="grid gap-6 xl:grid-cols-[minmax(0,1fr)_22rem]">
      <div className="min-w-0">
        <nav className="no-print mb-3 text-xs text-muted" aria-label="Breadcrumb">
          <Link href={`/teams/${teamId}/reports`} className="hover:underline">
            Reports
          </Link>{" "}
          / {report.title}
        </nav>
        {latest && latest.id !== report.id ? (
          <p className="no-print mb-3 rounded-md border border-warn/30 bg-warn-soft px-3 py-2 text-sm text-warn">
            This is version {report.version}; a newer version exists.{" "}
            <Link href={`/teams/${teamId}/reports/${latest.id}`} className="font-medium underline">
              Open version {latest.version}
            </Link>
          </p>
        ) : null}
        <div className="rounded-lg border border-rule bg-panel p-6 print:border-0 print:p-0">
          <ReportBody report={report} summary={summarizeReport(report.frozen)} isDemo={report.isDemo} />
        </div>
      </div>
      <aside className="no-print xl:sticky xl:top-16 xl:self-start" aria-label="Report actions">
        <div className="rounded-lg border border-rule bg-panel p-4">
          <h2 className="mb-3 text-sm font-semibold text-ink">{canEdit ? "Share, export, refresh" : "Export and print"}</h2>
          <ReportActions
            teamId={teamId}
            reportId={report.id}
            canEdit={canEdit}
            canDelete={canDelete}
            versions={versions}
            currentVersion={report.version}
            initialLinks={links}
          />
        </div>
      </aside>
    </div>
  );
}

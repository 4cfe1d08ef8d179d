import type { Metadata } from "next";
import Link from "next/link";
import { db, ready } from "@/db/client";
import { listComposeChoices, listReports } from "@/db/queries/reports";
import { ComposeForm } from "@/components/reports/compose-form";
import { Badge, Card, EmptyState } from "@/components/ui/card";
import { roleAtLeast } from "@/lib/access";
import { dateTime } from "@/lib/reports/format";
import { getTeamContext } from "@/lib/team-context";
import { PageHeader } from "@/components/ui/page-header";
import { TableHead } from "@/components/ui/table";

export const dynamic = "force-dynamic";
export const metadata: Metadata = { title: "Reports" };

export default async function ReportsPage({ params }: { params: Promise<{ teamId: string }> }) {
  const { teamId } = await params;
  const ctx = await getTeamContext(teamId);
  await ready();
  const [reports, choices] = await Promise.all([
    listReports(db, teamId),
    roleAtLeast(ctx.role, "editor") ? listComposeChoices(db, teamId) : Promise.resolve([]),
  ]);
  const canCompose = roleAtLeast(ctx.role, "editor");
  return (
    <div className="space-y-6">
      <PageHeader title="Reports" className="mt-1 max-w-3xl">
        A report freezes a side-by-side comparison of a baseline and 2 to 4 of its scenarios, for readers who will not open the editor. Share it with a
        read-only link, send it by e-mail, print it or download its PDF and CSV.
      </PageHeader>
      <Card title={`${reports.length} report${reports.length === 1 ? "" : "s"}`}>
        {reports.length === 0 ? (
          <EmptyState title="No reports yet">{canCompose ? "Compose the first one below." : "An editor of this team can compose one."}</EmptyState>
        ) : (
          <div className="overflow-x-auto">
            <table className="w-full border-collapse text-sm">
              <TableHead
                rowClassName="border-b border-rule-strong text-left text-xs text-muted"
                cell="py-1.5 pr-3"
                lastCell="py-1.5"
                columns={["Title", "Baseline", "Options", { label: "Version", className: "text-right" }, "Frozen", "By"]}
              />
              <tbody>
                {reports.map((r) => (
                  <tr key={r.id} className="border-b border-rule/60 align-top">
                    <td className="py-1.5 pr-3">
                      <Link href={`/teams/${teamId}/reports/${r.id}`} className="font-medium text-copper-dark hover:underline">
                        {r.title}
                      </Link>
                      {r.isDemo ? (
                        <span className="ml-2">
                          <Badge tone="copper">demo</Badge>
                        </span>
                      ) : null}
                    </td>
                    <td className="py-1.5 pr-3 text-muted">{r.baselineName}</td>
                    <td className="py-1.5 pr-3 text-muted">{r.optionNames.join(" · ")}</td>
                    <td className="py-1.5 pr-3 text-right tabular">
                      {r.version}
                      {r.versions > 1 ? <span className="text-xs text-muted"> of {r.versions}</span> : null}
                    </td>
                    <td className="py-1.5 pr-3 text-muted tabular">{dateTime(r.createdAt)}</td>
                    <td className="py-1.5 text-muted">{r.createdByName ?? "—"}</td>
                  </tr>
                ))}
              </tbody>
            </table>
          </div>
        )}
      </Card>
      {canCompose ? (
        <Card title="Compose a report">
          <ComposeForm teamId={teamId} baselines={choices} />
        </Card>
      ) : (
        <p className="text-sm text-muted">Your role is viewer: you can read, print and download reports; editors and owners compose and share them.</p>
      )}
    </div>
  );
}

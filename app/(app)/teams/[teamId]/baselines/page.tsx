import type { Metadata } from "next";
import Link from "next/link";
import { db } from "@/db/client";
import { listBaselines } from "@/db/queries/baselines";
import { ButtonLink, buttonClass } from "@/components/ui/button";
import { Badge, Card, EmptyState } from "@/components/ui/card";
import { NewBaselineForm } from "@/components/workspace/new-baseline-form";
import { roleAtLeast } from "@/lib/access";
import { getTeamContext } from "@/lib/team-context";

export const metadata: Metadata = { title: "Baselines" };

export default async function BaselinesPage({ params }: { params: Promise<{ teamId: string }> }) {
  const { teamId } = await params;
  const ctx = await getTeamContext(teamId);
  const baselines = await listBaselines(db, teamId);
  const canEdit = roleAtLeast(ctx.role, "editor");
  return (
    <div className="space-y-5">
      <div>
        <h1 className="text-xl font-semibold text-ink">Baselines</h1>
        <p className="text-sm text-muted">
          Today&apos;s wiring of a design: a named set of wire classes (geometry, material, statistics, driver and load) and the technology they share.
        </p>
      </div>
      {canEdit ? (
        <Card
          title="New baseline"
          actions={
            <span className="flex items-center gap-3 text-xs">
              <Link href={`/teams/${teamId}/baselines/import`} className="font-medium text-copper-dark hover:underline" data-testid="new-baseline-from-csv">
                New baseline from CSV…
              </Link>
              <Link href="/help/csv" className="text-muted hover:underline">
                CSV format
              </Link>
            </span>
          }
        >
          <NewBaselineForm teamId={teamId} baselines={baselines.map((b) => ({ id: b.id, name: b.name }))} />
        </Card>
      ) : null}
      {baselines.length === 0 ? (
        <EmptyState
          title="No baselines yet"
          action={
            canEdit ? (
              <span className="flex flex-wrap justify-center gap-2">
                <ButtonLink href={`/teams/${teamId}/baselines/import`}>New baseline from CSV…</ButtonLink>
                <a className={buttonClass("secondary")} href="/templates/wire-classes-template.csv" download>
                  Download the CSV template
                </a>
              </span>
            ) : undefined
          }
        >
          {canEdit
            ? "Import your design's wire classes from a CSV (the template holds four plausible invented classes to start from), or name an empty baseline above and fill in its class table."
            : "Editors of this team have not created a baseline yet."}
        </EmptyState>
      ) : (
        <div className="overflow-x-auto rounded-lg border border-rule bg-panel">
          <table className="num w-full text-sm">
            <thead className="border-b border-rule text-left text-xs text-muted">
              <tr>
                <th className="px-3 py-2 font-medium">Baseline</th>
                <th className="px-3 py-2 text-right font-medium">Classes</th>
                <th className="px-3 py-2 text-right font-medium">Scenarios</th>
                <th className="px-3 py-2 text-right font-medium">Version</th>
                <th className="px-3 py-2 font-medium">Last change</th>
              </tr>
            </thead>
            <tbody>
              {baselines.map((b) => (
                <tr key={b.id} className="border-b border-rule/60 last:border-0 hover:bg-ground/60">
                  <td className="px-3 py-2">
                    <Link href={`/teams/${teamId}/baselines/${b.id}`} className="font-medium text-copper-dark hover:underline">
                      {b.name}
                    </Link>{" "}
                    {b.isDemo ? <Badge tone="warn">invented</Badge> : null}
                    {b.description ? <p className="line-clamp-1 text-xs text-muted">{b.description}</p> : null}
                  </td>
                  <td className="tabular px-3 py-2 text-right">{b.classCount}</td>
                  <td className="tabular px-3 py-2 text-right">
                    <Link href={`/teams/${teamId}/scenarios?baselineId=${b.id}`} className="hover:underline">
                      {b.scenarioCount}
                    </Link>
                  </td>
                  <td className="tabular px-3 py-2 text-right">{b.version}</td>
                  <td className="px-3 py-2 text-xs text-muted">
                    {new Date(b.updatedAt).toLocaleDateString("en-GB", { day: "numeric", month: "short", year: "numeric" })}
                    {b.updatedByName ? ` · ${b.updatedByName}` : ""}
                  </td>
                </tr>
              ))}
            </tbody>
          </table>
        </div>
      )}
    </div>
  );
}

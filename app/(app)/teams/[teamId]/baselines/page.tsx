import type { Metadata } from "next";
import Link from "next/link";
import { db } from "@/db/client";
import { listBaselines } from "@/db/queries/baselines";
import { ButtonLink, buttonClass } from "@/components/ui/button";
import { Card, EmptyState } from "@/components/ui/card";
import { PanelTable } from "@/components/ui/table";
import { LastChangeCell, NameCell, listRowClass } from "@/components/workspace/list-cells";
import { NewBaselineForm } from "@/components/workspace/new-baseline-form";
import { roleAtLeast } from "@/lib/access";
import { getTeamContext } from "@/lib/team-context";
import { PageHeader } from "@/components/ui/page-header";

export const metadata: Metadata = { title: "Baselines" };

export default async function BaselinesPage({ params }: { params: Promise<{ teamId: string }> }) {
  const { teamId } = await params;
  const ctx = await getTeamContext(teamId);
  const baselines = await listBaselines(db, teamId);
  const canEdit = roleAtLeast(ctx.role, "editor");
  return (
    <div className="space-y-5">
      <PageHeader title="Baselines">
        Today&apos;s wiring of a design: a named set of wire classes (geometry, material, statistics, driver and load) and the technology they share.
      </PageHeader>
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
        <PanelTable
          tableClassName="num w-full text-sm"
          headClassName="border-b border-rule text-left text-xs text-muted"
          columns={[
            "Baseline",
            { label: "Classes", className: "text-right" },
            { label: "Scenarios", className: "text-right" },
            { label: "Version", className: "text-right" },
            "Last change",
          ]}
        >
          <tbody>
            {baselines.map((b) => (
              <tr key={b.id} className={listRowClass}>
                <NameCell href={`/teams/${teamId}/baselines/${b.id}`} name={b.name} isDemo={b.isDemo} note={b.description} />
                <td className="tabular px-3 py-2 text-right">{b.classCount}</td>
                <td className="tabular px-3 py-2 text-right">
                  <Link href={`/teams/${teamId}/scenarios?baselineId=${b.id}`} className="hover:underline">
                    {b.scenarioCount}
                  </Link>
                </td>
                <td className="tabular px-3 py-2 text-right">{b.version}</td>
                <LastChangeCell at={b.updatedAt} by={b.updatedByName} />
              </tr>
            ))}
          </tbody>
        </PanelTable>
      )}
    </div>
  );
}

import type { Metadata } from "next";
import Link from "next/link";
import { db } from "@/db/client";
import { listBaselines } from "@/db/queries/baselines";
import { listRoadmaps } from "@/db/queries/roadmaps";
import { listScenarios } from "@/db/queries/scenarios";
import { Card, EmptyState } from "@/components/ui/card";
import { PanelTable } from "@/components/ui/table";
import { ButtonLink } from "@/components/ui/button";
import { PageHeader } from "@/components/ui/page-header";
import { LastChangeCell, NameCell, listRowClass } from "@/components/workspace/list-cells";
import { NewRoadmapForm } from "@/components/workspace/new-roadmap-form";
import { roleAtLeast } from "@/lib/access";
import { getTeamContext } from "@/lib/team-context";

export const metadata: Metadata = { title: "Roadmaps" };

export default async function RoadmapsPage({ params, searchParams }: { params: Promise<{ teamId: string }>; searchParams: Promise<{ baselineId?: string }> }) {
  const { teamId } = await params;
  const { baselineId } = await searchParams;
  const ctx = await getTeamContext(teamId);
  const [roadmaps, baselines, scenarios] = await Promise.all([listRoadmaps(db, teamId), listBaselines(db, teamId), listScenarios(db, teamId)]);
  const canEdit = roleAtLeast(ctx.role, "editor");
  return (
    <div className="space-y-5">
      <PageHeader title="Roadmaps">
        A chain of node steps on one baseline: N0 (the baseline) → N1 → N2 …, each step relative to the one before (S or a target pitch per class, length rules,
        metal, barrier, dielectric, air gap, device factors). Open one to see, per class, where delay stops improving.
      </PageHeader>
      {canEdit && baselines.length > 0 ? (
        <Card title="New roadmap">
          <NewRoadmapForm
            teamId={teamId}
            baselines={baselines.map((b) => ({ id: b.id, name: b.name }))}
            scenarios={scenarios.map((s) => ({ id: s.id, name: s.name, baselineId: s.baselineId }))}
            defaultBaselineId={baselineId}
          />
        </Card>
      ) : null}
      {roadmaps.length === 0 ? (
        <EmptyState
          title="No roadmaps yet"
          action={baselines.length === 0 && canEdit ? <ButtonLink href={`/teams/${teamId}/baselines`}>Create a baseline first</ButtonLink> : undefined}
        >
          {baselines.length === 0
            ? "A roadmap is a chain of node steps on a baseline; this team has no baseline yet."
            : canEdit
              ? "Name a roadmap above, pick its baseline and how N1 starts."
              : "Editors of this team have not created any roadmaps yet."}
        </EmptyState>
      ) : (
        <PanelTable
          tableClassName="num w-full text-sm"
          headClassName="border-b border-rule text-left text-xs text-muted"
          columns={["Roadmap", "Baseline", "Steps", { label: "Version", className: "text-right" }, "Last change"]}
        >
          <tbody>
            {roadmaps.map((r) => (
              <tr key={r.id} className={listRowClass}>
                <NameCell href={`/teams/${teamId}/roadmaps/${r.id}`} name={r.name} isDemo={r.isDemo} note="" />
                <td className="px-3 py-2">
                  <Link href={`/teams/${teamId}/baselines/${r.baselineId}`} className="hover:underline">
                    {r.baselineName}
                  </Link>
                </td>
                <td className="px-3 py-2 text-xs">N0 → {r.steps.map((s) => s.name).join(" → ")}</td>
                <td className="tabular px-3 py-2 text-right">{r.version}</td>
                <LastChangeCell at={r.updatedAt} by={r.updatedByName} />
              </tr>
            ))}
          </tbody>
        </PanelTable>
      )}
    </div>
  );
}

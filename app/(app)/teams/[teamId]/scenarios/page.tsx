import type { Metadata } from "next";
import Link from "next/link";
import { db } from "@/db/client";
import { listBaselines } from "@/db/queries/baselines";
import { listScenarios } from "@/db/queries/scenarios";
import { Card, EmptyState } from "@/components/ui/card";
import { PanelTable } from "@/components/ui/table";
import { LastChangeCell, NameCell, listRowClass } from "@/components/workspace/list-cells";
import { ButtonLink } from "@/components/ui/button";
import { NewScenarioForm } from "@/components/workspace/new-scenario-form";
import { DuplicateScenario } from "@/components/workspace/duplicate-scenario";
import { roleAtLeast } from "@/lib/access";
import { getTeamContext } from "@/lib/team-context";
import { PageHeader } from "@/components/ui/page-header";

export const metadata: Metadata = { title: "Scenarios" };

export default async function ScenariosPage({ params, searchParams }: { params: Promise<{ teamId: string }>; searchParams: Promise<{ baselineId?: string }> }) {
  const { teamId } = await params;
  const { baselineId } = await searchParams;
  const ctx = await getTeamContext(teamId);
  const [scenarios, baselines] = await Promise.all([listScenarios(db, teamId), listBaselines(db, teamId)]);
  const canEdit = roleAtLeast(ctx.role, "editor");
  return (
    <div className="space-y-5">
      <PageHeader title="Scenarios">
        What-ifs on a baseline: scale factors S and S_L, dielectric, metal, barrier, Miller factor and device options. Open one to see results, the sweep and a
        field check.
      </PageHeader>
      {canEdit && baselines.length > 0 ? (
        <Card title="New scenario">
          <NewScenarioForm teamId={teamId} baselines={baselines.map((b) => ({ id: b.id, name: b.name }))} defaultBaselineId={baselineId} />
        </Card>
      ) : null}
      {scenarios.length === 0 ? (
        <EmptyState
          title="No scenarios yet"
          action={baselines.length === 0 && canEdit ? <ButtonLink href={`/teams/${teamId}/baselines`}>Create a baseline first</ButtonLink> : undefined}
        >
          {baselines.length === 0
            ? "A scenario is a what-if on a baseline; this team has no baseline yet."
            : canEdit
              ? "Name a scenario above and pick its baseline."
              : "Editors of this team have not created any scenarios yet."}
        </EmptyState>
      ) : (
        <PanelTable
          tableClassName="num w-full text-sm"
          headClassName="border-b border-rule text-left text-xs text-muted"
          columns={[
            "Scenario",
            "Baseline",
            { label: "S", className: "text-right" },
            { label: "S_L", className: "text-right" },
            "Model",
            { label: "Version", className: "text-right" },
            "Last change",
            ...(canEdit ? [{ label: "Copy", srOnly: true }] : []),
          ]}
        >
          <tbody>
            {scenarios.map((s) => (
              <tr key={s.id} className={listRowClass}>
                <NameCell href={`/teams/${teamId}/scenarios/${s.id}`} name={s.name} isDemo={s.isDemo} note={s.notes} />
                <td className="px-3 py-2">
                  <Link href={`/teams/${teamId}/baselines/${s.baselineId}`} className="hover:underline">
                    {s.baselineName}
                  </Link>
                </td>
                <td className="tabular px-3 py-2 text-right">{Number(s.settings.s.toPrecision(4))}</td>
                <td className="tabular px-3 py-2 text-right">{Number(s.settings.sL.toPrecision(4))}</td>
                <td className="px-3 py-2">{s.settings.level}</td>
                <td className="tabular px-3 py-2 text-right">{s.version}</td>
                <LastChangeCell at={s.updatedAt} by={s.updatedByName} />
                {canEdit ? (
                  <td className="px-2 py-1.5">
                    <DuplicateScenario teamId={teamId} scenarioId={s.id} name={s.name} compact />
                  </td>
                ) : null}
              </tr>
            ))}
          </tbody>
        </PanelTable>
      )}
    </div>
  );
}

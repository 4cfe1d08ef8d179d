import type { Metadata } from "next";
import Link from "next/link";
import { db } from "@/db/client";
import { listBaselines } from "@/db/queries/baselines";
import { listScenarios } from "@/db/queries/scenarios";
import { Badge, Card, EmptyState } from "@/components/ui/card";
import { ButtonLink } from "@/components/ui/button";
import { NewScenarioForm } from "@/components/workspace/new-scenario-form";
import { roleAtLeast } from "@/lib/access";
import { getTeamContext } from "@/lib/team-context";

export const metadata: Metadata = { title: "Scenarios" };

export default async function ScenariosPage({ params, searchParams }: { params: Promise<{ teamId: string }>; searchParams: Promise<{ baselineId?: string }> }) {
  const { teamId } = await params;
  const { baselineId } = await searchParams;
  const ctx = await getTeamContext(teamId);
  const [scenarios, baselines] = await Promise.all([listScenarios(db, teamId), listBaselines(db, teamId)]);
  const canEdit = roleAtLeast(ctx.role, "editor");
  const fmtDate = (ms: number) => new Date(ms).toLocaleDateString("en-GB", { day: "numeric", month: "short", year: "numeric" });
  return (
    <div className="space-y-5">
      <div>
        <h1 className="text-xl font-semibold text-ink">Scenarios</h1>
        <p className="text-sm text-muted">
          What-ifs on a baseline: scale factors S and S_L, dielectric, metal, barrier, Miller factor and device options. Open one to see results, the sweep and
          a field check.
        </p>
      </div>
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
        <div className="overflow-x-auto rounded-lg border border-rule bg-panel">
          <table className="num w-full text-sm">
            <thead className="border-b border-rule text-left text-xs text-muted">
              <tr>
                <th className="px-3 py-2 font-medium">Scenario</th>
                <th className="px-3 py-2 font-medium">Baseline</th>
                <th className="px-3 py-2 text-right font-medium">S</th>
                <th className="px-3 py-2 text-right font-medium">S_L</th>
                <th className="px-3 py-2 font-medium">Model</th>
                <th className="px-3 py-2 text-right font-medium">Version</th>
                <th className="px-3 py-2 font-medium">Last change</th>
              </tr>
            </thead>
            <tbody>
              {scenarios.map((s) => (
                <tr key={s.id} className="border-b border-rule/60 last:border-0 hover:bg-ground/60">
                  <td className="px-3 py-2">
                    <Link href={`/teams/${teamId}/scenarios/${s.id}`} className="font-medium text-copper-dark hover:underline">
                      {s.name}
                    </Link>{" "}
                    {s.isDemo ? <Badge tone="warn">invented</Badge> : null}
                    {s.notes ? <p className="line-clamp-1 text-xs text-muted">{s.notes}</p> : null}
                  </td>
                  <td className="px-3 py-2">
                    <Link href={`/teams/${teamId}/baselines/${s.baselineId}`} className="hover:underline">
                      {s.baselineName}
                    </Link>
                  </td>
                  <td className="tabular px-3 py-2 text-right">{Number(s.settings.s.toPrecision(4))}</td>
                  <td className="tabular px-3 py-2 text-right">{Number(s.settings.sL.toPrecision(4))}</td>
                  <td className="px-3 py-2">{s.settings.level}</td>
                  <td className="tabular px-3 py-2 text-right">{s.version}</td>
                  <td className="px-3 py-2 text-xs text-muted">
                    {fmtDate(s.updatedAt)}
                    {s.updatedByName ? ` · ${s.updatedByName}` : ""}
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

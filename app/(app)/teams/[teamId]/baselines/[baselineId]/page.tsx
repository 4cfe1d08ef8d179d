import type { Metadata } from "next";
import { notFound } from "next/navigation";
import { cache } from "react";
import { db } from "@/db/client";
import { getBaselineWithClasses, listOpenWarnings } from "@/db/queries/baselines";
import { listScenarios } from "@/db/queries/scenarios";
import { BaselineEditor } from "@/components/workspace/baseline-editor";
import { getTeamContext } from "@/lib/team-context";

// Metadata and page share one read per request.
const loadBaseline = cache((id: string) => getBaselineWithClasses(db, id));

export async function generateMetadata({ params }: { params: Promise<{ teamId: string; baselineId: string }> }): Promise<Metadata> {
  const { teamId, baselineId } = await params;
  await getTeamContext(teamId);
  const b = await loadBaseline(baselineId);
  return { title: b && b.teamId === teamId ? `${b.name} · Baseline` : "Baseline" };
}

export default async function BaselinePage({ params }: { params: Promise<{ teamId: string; baselineId: string }> }) {
  const { teamId, baselineId } = await params;
  const ctx = await getTeamContext(teamId);
  const baseline = await loadBaseline(baselineId);
  if (!baseline || baseline.teamId !== teamId) notFound();
  const [scenarios, warnings] = await Promise.all([listScenarios(db, teamId, baselineId), listOpenWarnings(db, baselineId)]);
  return (
    <BaselineEditor
      initial={baseline}
      role={ctx.role}
      userId={ctx.user.id}
      scenarios={scenarios.map((s) => ({ id: s.id, name: s.name }))}
      warnings={warnings}
    />
  );
}

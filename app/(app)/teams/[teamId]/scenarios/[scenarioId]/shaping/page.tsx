import type { Metadata } from "next";
import { notFound } from "next/navigation";
import { cache } from "react";
import { db } from "@/db/client";
import { getBaseline } from "@/db/queries/baselines";
import { getScenario } from "@/db/queries/scenarios";
import { listClasses } from "@/db/queries/wire-classes";
import type { WireClass } from "@/lib/scaling";
import { getTeamContext } from "@/lib/team-context";
import { ShapingScreen } from "@/components/design/shaping-screen";

// Metadata and page share one read per request.
const loadScenario = cache((id: string) => getScenario(db, id));

export async function generateMetadata({ params }: { params: Promise<{ teamId: string; scenarioId: string }> }): Promise<Metadata> {
  const { teamId, scenarioId } = await params;
  await getTeamContext(teamId);
  const s = await loadScenario(scenarioId);
  return { title: s && s.teamId === teamId ? `Layer shaping · ${s.name}` : "Layer shaping" };
}

/** "Layer shaping": per class, the line fraction and aspect ratio at the scenario's pitch, and what drives the delay. */
export default async function ShapingPage({
  params,
  searchParams,
}: {
  params: Promise<{ teamId: string; scenarioId: string }>;
  searchParams: Promise<Record<string, string | string[] | undefined>>;
}) {
  const { teamId, scenarioId } = await params;
  const ctx = await getTeamContext(teamId);
  const scenario = await loadScenario(scenarioId);
  if (!scenario || scenario.teamId !== teamId) notFound();
  const baseline = (await getBaseline(db, scenario.baselineId))!;
  // the computation uses each class at its mean length (the net the optimiser shapes): no histograms needed
  const classes = (await listClasses(db, baseline.id)).map(({ id: _i, position: _p, histogramBins: _h, histogram: _hh, ...c }): WireClass => c);
  const sp = await searchParams;
  const asked = Array.isArray(sp.class) ? sp.class[0] : sp.class;
  const initialClass = classes.some((c) => c.name === asked) ? asked! : (classes[0]?.name ?? "");
  return (
    <ShapingScreen
      teamId={teamId}
      role={ctx.role}
      initialScenario={scenario}
      baseline={{ id: baseline.id, name: baseline.name, technology: baseline.technology }}
      classes={classes}
      initialClass={initialClass}
    />
  );
}

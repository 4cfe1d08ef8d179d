import type { Metadata } from "next";
import { notFound } from "next/navigation";
import { cache } from "react";
import { db } from "@/db/client";
import { getBaseline } from "@/db/queries/baselines";
import { getScenario } from "@/db/queries/scenarios";
import { listClassesWithHistograms } from "@/db/queries/wire-classes";
import { ScenarioEditor } from "@/components/workspace/scenario-editor";
import { parseSweepChoices } from "@/lib/workspace/sweep-view";
import { coarsenHistogram, evaluateScenario, type SweepMetric, type WireClass } from "@/lib/scaling";
import { keyOf } from "@/components/workspace/settings-key";
import type { EvaluationState } from "@/components/workspace/use-evaluation";
import { getTeamContext } from "@/lib/team-context";

// Metadata and page share one read per request.
const loadScenario = cache((id: string) => getScenario(db, id));

export async function generateMetadata({ params }: { params: Promise<{ teamId: string; scenarioId: string }> }): Promise<Metadata> {
  const { teamId, scenarioId } = await params;
  await getTeamContext(teamId);
  const s = await loadScenario(scenarioId);
  return { title: s && s.teamId === teamId ? `${s.name} · Scenario` : "Scenario" };
}

const METRICS: SweepMetric[] = ["delay", "rc", "r", "c"];

export default async function ScenarioPage({
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
  const classes = (await listClassesWithHistograms(db, baseline.id)).map((c) => (c.histogram ? { ...c, histogram: coarsenHistogram(c.histogram) } : c));
  const sp = await searchParams;
  const one = (k: string) => (Array.isArray(sp[k]) ? sp[k][0] : sp[k]);
  const num = (k: string, d: number) => {
    const v = Number(one(k));
    return v > 0 && v <= 20 ? v : d;
  };
  const metric = METRICS.includes(one("metric") as SweepMetric) ? (one("metric") as SweepMetric) : "delay";
  let from = num("from", 0.5);
  let to = num("to", 4);
  if (!(to > from)) [from, to] = [0.5, 4];
  const view = {
    metric,
    from,
    to,
    classes: (one("classes") ?? "").split(",").filter(Boolean),
    ...parseSweepChoices(one("scale"), one("length")),
  };
  // The first results come with the page (the browser evaluates later changes in a Web Worker).
  const engineClasses = classes.map(({ id: _i, position: _p, histogramBins: _h, ...c }): WireClass => c);
  let initialEvaluation: EvaluationState;
  try {
    initialEvaluation = {
      ok: true,
      e: evaluateScenario({ classes: engineClasses, technology: baseline.technology, settings: scenario.settings }),
      key: keyOf(scenario.settings),
    };
  } catch (e) {
    initialEvaluation = { ok: false, message: e instanceof Error ? e.message : String(e), key: keyOf(scenario.settings) };
  }
  return (
    <ScenarioEditor
      teamId={teamId}
      userId={ctx.user.id}
      role={ctx.role}
      initialScenario={scenario}
      initialBaseline={{ ...baseline, classes }}
      initialView={view}
      initialEvaluation={initialEvaluation}
    />
  );
}

import "server-only";
import type { Knex } from "knex";
import { evaluateRoadmap, evaluateScenario, type Evaluation, type RoadmapStep, type ScenarioSettings, type Technology, type WireClass } from "@/lib/scaling";
import { getBaseline, type Baseline } from "@/db/queries/baselines";
import { listClassesWithHistograms } from "@/db/queries/wire-classes";
import { badRequest } from "@/lib/api";

/** Engine inputs of a stored baseline: classes (with histograms) and technology, with the baseline row they came from. */
export async function loadEngineInputs(db: Knex, baselineId: string): Promise<{ baseline: Baseline; classes: WireClass[]; technology: Technology }> {
  const baseline = await getBaseline(db, baselineId);
  if (!baseline) throw new Error("baseline vanished");
  const stored = await listClassesWithHistograms(db, baselineId);
  const classes: WireClass[] = stored.map(({ id: _i, position: _p, histogramBins: _h, ...c }) => c);
  return { baseline, classes, technology: baseline.technology };
}

/** evaluateScenario, with the engine's RangeError (e.g. a fixed barrier that fills a scaled line) as a 400. */
export function evaluateOrThrow(p: { classes: WireClass[]; technology: Technology; settings: ScenarioSettings }): Evaluation {
  try {
    return evaluateScenario(p);
  } catch (e) {
    if (e instanceof RangeError) throw badRequest(`These settings cannot be evaluated: ${e.message}`, { settings: [e.message] });
    throw e;
  }
}

/**
 * evaluateRoadmap, with the engine's RangeError (e.g. a fixed barrier that fills a scaled line at some step) as a 400;
 * RoadmapInputError (steps that do not fit the baseline) becomes a 400 in lib/api.ts.
 */
export function evaluateRoadmapOrThrow(p: { classes: WireClass[]; technology: Technology; steps: RoadmapStep[] }): ReturnType<typeof evaluateRoadmap> {
  try {
    return evaluateRoadmap(p);
  } catch (e) {
    if (e instanceof RangeError) throw badRequest(`This roadmap cannot be evaluated: ${e.message}`, { steps: [e.message] });
    throw e;
  }
}

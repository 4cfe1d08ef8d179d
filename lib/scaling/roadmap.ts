/**
 * Roadmaps: a chain of node steps N0 (the baseline) → N1 → … (at most MAX_ROADMAP_STEPS), each relative to the
 * previous one. composeRoadmap (roadmap-compose.ts, light) turns the steps into absolute scenario settings against
 * N0; evaluateRoadmap evaluates each of them against N0 like a scenario. Pure, SI units.
 */
import { evaluateScenario } from "./evaluate";
import { composeRoadmap, RoadmapInputError, type RoadmapStep } from "./roadmap-compose";
import type { Evaluation, ScenarioSettings, Technology, WireClass } from "./types";
import { checkTechnology, checkWireClass } from "./validity";

export { composeRoadmap, MAX_ROADMAP_STEPS, RoadmapInputError, type RoadmapClassStep, type RoadmapStep, type RoadmapStepSettings } from "./roadmap-compose";

/** One evaluated step: its name, its absolute settings against N0 (composeRoadmap) and its evaluation against N0. */
export interface RoadmapStepResult {
  name: string;
  settings: ScenarioSettings;
  evaluation: Evaluation;
}

/**
 * Each step of the roadmap evaluated against the baseline N0 (evaluateScenario with the step's absolute settings from
 * composeRoadmap): the same Evaluation a scenario gets, so step n's ratios are ratios to N0. Throws RoadmapInputError
 * on bad steps (composeRoadmap) and when a step's geometry is impossible (e.g. the barrier fills the scaled line),
 * naming that step; RangeError on a bad technology or class.
 */
export function evaluateRoadmap(p: { classes: WireClass[]; technology: Technology; steps: RoadmapStep[] }): { steps: RoadmapStepResult[] } {
  checkTechnology(p.technology);
  for (const wc of p.classes) checkWireClass(wc);
  const settings = composeRoadmap(p);
  const steps: RoadmapStepResult[] = [];
  for (let i = 0; i < settings.length; i++) {
    const name = p.steps[i]!.name;
    let evaluation: Evaluation;
    try {
      evaluation = evaluateScenario({ classes: p.classes, technology: p.technology, settings: settings[i]! });
    } catch (e) {
      if (!(e instanceof RangeError)) throw e;
      throw new RoadmapInputError(["steps", i, "settings"], `step ${i + 1} "${name}": ${e.message}`);
    }
    steps.push({ name, settings: settings[i]!, evaluation });
  }
  return { steps };
}

/**
 * The "Layer shaping" computations of one class at one scenario, over the engine's design-space module
 * (lib/scaling/design-space.ts): the fixed-pitch optimum against the current drawing (each evaluated the ordinary
 * way, through the scenario's per-class override, with its validity flags), the heat map with its Pareto front, the
 * delay's parts and the ±10% tornado. Shared by the screen's Web Worker (components/design/design-worker.ts) and the
 * report freeze (lib/reports/shaping.ts). Uses the full engine: never import it on the browser's main thread.
 */
import {
  delayParts,
  evaluateClass,
  objectiveGrid,
  objectiveOf,
  optimizeClass,
  tornado,
  type ClassResult,
  type DelayParts,
  type DesignObjective,
  type ObjectiveGrid,
  type ScenarioSettings,
  type Technology,
  type TornadoBar,
  type ValidityFlag,
  type WireClass,
} from "@/lib/scaling";
import { applyShaping, type ShapingLimits } from "./shaping-view";

export interface ShapingArgs {
  classes: WireClass[];
  technology: Technology;
  settings: ScenarioSettings;
  className: string;
  objective: DesignObjective;
  limits: ShapingLimits;
  /** Heat-map points per side (default 40); 0 = no heat map (the report). */
  gridSize?: number;
}

/** One drawing of the class at the scenario: geometry after scaling, figures and the models' validity flags. */
export interface ShapingDrawing {
  widthM: number;
  spacingM: number;
  thicknessM: number;
  pitchM: number;
  lineFraction: number;
  aspectRatio: number;
  objectiveValue: number;
  /** Net delay with its repeaters (s), energy per transition (J), inserted repeaters. */
  delayS: number;
  energyJ: number;
  repeaters: number;
  flags: ValidityFlag[];
}

export interface ShapingResult {
  className: string;
  objective: DesignObjective;
  current: ShapingDrawing;
  optimum: ShapingDrawing;
  /** The settings "apply to scenario" saves (the class's override gains lineFraction and aspectRatio). */
  appliedSettings: ScenarioSettings;
  parts: DelayParts;
  tornado: { nominalS: number; step: number; bars: TornadoBar[] };
  grid: ObjectiveGrid | null;
}

export type ShapingStage = "map" | "optimum" | "drivers";

function drawing(r: ClassResult, objective: DesignObjective): ShapingDrawing {
  return {
    widthM: r.widthM,
    spacingM: r.spacingM,
    thicknessM: r.thicknessM,
    pitchM: r.widthM + r.spacingM,
    lineFraction: r.widthM / (r.widthM + r.spacingM),
    aspectRatio: r.thicknessM / r.widthM,
    objectiveValue: objectiveOf(r, objective),
    delayS: r.repeaters.delayS,
    energyJ: r.energyJ,
    repeaters: r.repeaterCount,
    flags: r.validity,
  };
}

/**
 * Everything the screen shows for one class (the heat map only when gridSize > 0). `onStage` is called before each
 * stage (the worker reports progress with it). Throws the engine's RangeError when the limits leave no feasible
 * geometry or the class is unknown.
 */
export function shapeClass(a: ShapingArgs, onStage?: (stage: ShapingStage, fraction: number) => void): ShapingResult {
  const wc = a.classes.find((c) => c.name === a.className);
  if (!wc) throw new RangeError(`className: no class named "${a.className}"`);
  const { histogram: _h, ...mean } = wc;
  // only this class's override matters (and overrides of other classes would name classes not evaluated here)
  const own = Object.prototype.hasOwnProperty.call(a.settings.overrides, a.className) ? a.settings.overrides[a.className] : undefined;
  const settings: ScenarioSettings = { ...a.settings, overrides: own ? { [a.className]: own } : {} };
  const limits = {
    minFraction: a.limits.minFraction,
    maxFraction: a.limits.maxFraction,
    maxAspect: a.limits.maxAspect,
    minWidthM: a.limits.minWidthNm * 1e-9,
    minSpaceM: a.limits.minSpaceNm * 1e-9,
  };
  const base = { wireClass: mean, technology: a.technology, settings, objective: a.objective, ...limits };
  const n = a.gridSize ?? 40;
  let grid: ObjectiveGrid | null = null;
  if (n > 0) {
    onStage?.("map", 0);
    grid = objectiveGrid({ ...base, n, m: n });
  }
  onStage?.("optimum", n > 0 ? 0.3 : 0);
  const opt = optimizeClass(base);
  const current = drawing(evaluateClass({ wireClass: mean, technology: a.technology, settings }), a.objective);
  const appliedSettings = applyShaping(a.settings, a.className, opt.lineFraction, opt.aspectRatio);
  const optimum = {
    ...drawing(
      evaluateClass({ wireClass: mean, technology: a.technology, settings: applyShaping(settings, a.className, opt.lineFraction, opt.aspectRatio) }),
      a.objective,
    ),
    // the optimiser's own numbers (what is saved), not W/pitch recomputed from the scaled geometry
    lineFraction: opt.lineFraction,
    aspectRatio: opt.aspectRatio,
  };
  onStage?.("drivers", 0.85);
  const parts = delayParts({ wireClass: mean, technology: a.technology, settings });
  const t = tornado({ wireClass: mean, technology: a.technology, settings });
  return { className: a.className, objective: a.objective, current, optimum, appliedSettings, parts, tornado: t, grid };
}

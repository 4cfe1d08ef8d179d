import type { ClassResult, Evaluation, LengthRule, ModelLevel } from "@/lib/scaling/client";

/**
 * What the roadmap page shows of the engine's evaluateRoadmap: one metric of one class across the steps N0 … Nn (N0 =
 * the baseline, read from the first step's evaluation), the ratios to N0 and the plain-words reading of where the
 * metric stops improving. Pure: the page and the tests share it.
 */

export type RoadmapMetric = "delay" | "repeatedDelayPerMm" | "r" | "c" | "rc" | "energy" | "repeaters";

export const ROADMAP_METRICS: readonly RoadmapMetric[] = ["delay", "repeatedDelayPerMm", "r", "c", "rc", "energy", "repeaters"];

export const ROADMAP_METRIC: Record<RoadmapMetric, { label: string; noun: string; unit: string; scale: number; of: (r: ClassResult) => number }> = {
  delay: { label: "Delay", noun: "delay", unit: "ps", scale: 1e12, of: (r) => r.delayS },
  repeatedDelayPerMm: { label: "Repeated delay per mm", noun: "repeated delay per mm", unit: "ps/mm", scale: 1e9, of: (r) => r.repeaters.delayPerMS },
  r: { label: "Resistance R", noun: "resistance", unit: "Ω", scale: 1, of: (r) => r.rOhm },
  c: { label: "Capacitance C", noun: "capacitance", unit: "fF", scale: 1e15, of: (r) => r.cF },
  rc: { label: "RC", noun: "RC", unit: "ps", scale: 1e12, of: (r) => r.rcS },
  energy: { label: "Energy per transition", noun: "energy per transition", unit: "fJ", scale: 1e15, of: (r) => r.energyJ },
  repeaters: { label: "Repeaters per net", noun: "repeater count", unit: "", scale: 1, of: (r) => r.repeaterCount },
};

/** A step's evaluation as evaluateRoadmap answers it. */
export interface RoadmapStepResult {
  name: string;
  evaluation: Evaluation;
}

/** The class's results N0 … Nn: N0 from the first step's baseline side, then each step's scenario side. */
export function classResults(steps: readonly RoadmapStepResult[], className: string): ClassResult[] | null {
  const first = steps[0]?.evaluation.classes.find((c) => c.name === className);
  if (!first) return null;
  const out: ClassResult[] = [first.baseline];
  for (const s of steps) {
    const c = s.evaluation.classes.find((x) => x.name === className);
    if (!c) return null;
    out.push(c.scenario);
  }
  return out;
}

/** The metric's values N0 … Nn in display units (ps, fF, …). */
export function metricSeries(steps: readonly RoadmapStepResult[], className: string, metric: RoadmapMetric): number[] | null {
  const rs = classResults(steps, className);
  const m = ROADMAP_METRIC[metric];
  return rs ? rs.map((r) => m.of(r) * m.scale) : null;
}

/** A change below this share counts as "no longer improving" in the reading. */
export const PLATEAU_SHARE = 0.02;

/** A signed percent, "+3%" / "−12%" / "+0.4%" (2 significant digits below 10%). */
export function signedPercent(ratio: number): string {
  const p = (ratio - 1) * 100;
  const a = Math.abs(p);
  const shown = a >= 10 ? Math.round(a).toString() : String(Number(a.toPrecision(2)));
  if (shown === "0") return "±0%";
  return `${p < 0 ? "−" : "+"}${shown}%`;
}

const times = (r: number) => `×${Number(r.toPrecision(3))}`;

/**
 * Plain words on one class's metric across the steps (names N0 … Nn, every metric lower-is-better): the plateau is the
 * first step that no later step improves on by PLATEAU_SHARE or more ("stops improving after N2"), so a step that gets
 * worse before later ones get better (N1 +3%, N2 −8%) does not end the reading early; N0 itself when nothing later
 * beats it; none when the last step still improves.
 */
export function readingOf(className: string, metric: RoadmapMetric, names: readonly string[], values: readonly number[]): string {
  const noun = ROADMAP_METRIC[metric].noun;
  const last = values.length - 1;
  if (last < 1) return `${className}: no step yet.`;
  if (values.every((v) => v === 0)) return `${className} ${noun} is zero at every step.`;
  const overall = values[0]! > 0 ? ` Overall ${times(values[last]! / values[0]!)} from ${names[0]} to ${names[last]}.` : "";
  const change = (i: number) => (values[i]! > 0 ? signedPercent(values[i + 1]! / values[i]!) : `${values[i + 1]} from ${values[i]}`);
  let plateau = last;
  for (let i = 0; i < last; i++) {
    const a = values[i]!;
    const laterBest = Math.min(...values.slice(i + 1));
    const improvedLater = a > 0 ? laterBest < a * (1 - PLATEAU_SHARE) : laterBest < a;
    if (!improvedLater) {
      plateau = i;
      break;
    }
  }
  if (plateau === last) {
    const everyStep = values.every((v, i) => i === 0 || v < values[i - 1]! * (1 - PLATEAU_SHARE));
    if (everyStep) return `${className} ${noun} improves at every step (by ${Math.round(PLATEAU_SHARE * 100)}% or more).${overall}`;
    return `${className} ${noun} still improves at ${names[last]}: ${change(last - 1)} from ${names[last - 1]} to ${names[last]}.${overall}`;
  }
  if (plateau === 0) return `${className} ${noun} does not improve on ${names[0]} at any step: ${change(0)} from ${names[0]} to ${names[1]}.${overall}`;
  return `${className} ${noun} stops improving after ${names[plateau]}: ${change(plateau)} from ${names[plateau]} to ${names[plateau + 1]}.${overall}`;
}

/** The levels drawn, bottom of the legend first. */
export const CHART_LEVELS: readonly ModelLevel[] = ["ideal", "fringe", "coupled", "full"];

/** S_L of a length rule at cross-section factor s (the contract of lib/scaling's LengthRule). */
export function lengthRuleSL(rule: LengthRule, s: number): number {
  switch (rule.kind) {
    case "follows-s":
      return s;
    case "fixed":
      return 1;
    case "factor":
      return rule.sL;
    case "power":
      return s ** rule.exponent;
    default:
      return 1;
  }
}

const n3 = (v: number) => String(Number(v.toPrecision(3)));

/** What a length rule does, in words, with its S_L at `s`: "lengths shrink as S^0.5: S_L = 1.22 at S = 1.5". */
export function describeLengthRule(rule: LengthRule, s: number): string {
  const sl = lengthRuleSL(rule, s);
  const way = sl > 1 ? "shrink" : sl < 1 ? "grow" : "keep their size";
  switch (rule.kind) {
    case "follows-s":
      return `lengths follow the cross-section: S_L = S = ${n3(s)}`;
    case "fixed":
      return "lengths keep their size: S_L = 1 at any S";
    case "factor":
      return `lengths ${way} by a fixed factor: S_L = ${n3(rule.sL)} at any S`;
    case "power":
      return `lengths ${sl === 1 ? "scale" : way} as S^${n3(rule.exponent)}: S_L = ${n3(sl)} at S = ${n3(s)}`;
    default:
      return "";
  }
}

/**
 * Geometry under scaling: a scenario divides W, T, spacing and ILD heights by S and lengths by S_L,
 * globally or per class, with options (aspect ratio, barrier that scales or keeps its thickness, absolute
 * barrier, k, metal, Miller factor). Pure, SI units.
 */
import { ownEntry } from "./own";
import { positive } from "./check";
import type { ClassOverride, LengthRule, ScenarioSettings, WireClass } from "./types";

export interface ScaledClass {
  s: number;
  sL: number;
  widthM: number;
  thicknessM: number;
  spacingM: number;
  ildBelowM: number | null;
  ildAboveM: number | null;
  barrierM: number;
  lengthM: number;
  metal: string;
  k: number;
  /** Permittivity of the gap layer between the lines (= k without an air gap), ≤ k. */
  kGap: number;
  /** Height of the gap layer as a share of T (0 without an air gap). */
  gapFraction: number;
  miller: number;
}

/**
 * Applies the scenario to one class. Precedence: per-class override, then the scenario's global value, then
 * the class's own value. The barrier scales with S when `barrierScales` (always at level `ideal`), keeps its
 * thickness otherwise, and an override `barrierM` replaces it outright. `lineFraction` redraws W and spacing at the
 * scaled pitch; `aspectRatio` sets T = AR·W after scaling.
 */
export function scaleClass(wc: WireClass, settings: ScenarioSettings): ScaledClass {
  return scaleClassInto(wc, settings, newScaledClass());
}

/** A blank ScaledClass (fields in scaleClass's order), to be filled by scaleClassInto. */
export function newScaledClass(): ScaledClass {
  return {
    s: 1,
    sL: 1,
    widthM: 0,
    thicknessM: 0,
    spacingM: 0,
    ildBelowM: null,
    ildAboveM: null,
    barrierM: 0,
    lengthM: 0,
    metal: "",
    k: 1,
    kGap: 1,
    gapFraction: 0,
    miller: 1,
  };
}

/**
 * scaleClass into a caller-owned `out` (no allocation); returns `out`. The one implementation of the scaling
 * rules: scaleClass and the evaluation and sweep hot paths (evaluate.ts) all call it (through scaleClassWith).
 */
export function scaleClassInto(wc: WireClass, settings: ScenarioSettings, out: ScaledClass): ScaledClass {
  return scaleClassWith(wc, settings, ownEntry(settings.overrides, wc.name), out);
}

/**
 * scaleClassInto with the class's override `o` (= settings.overrides[wc.name]) given: the sweep looks it up once per
 * class instead of once per point.
 */
export function scaleClassWith(wc: WireClass, settings: ScenarioSettings, o: ClassOverride | undefined, out: ScaledClass): ScaledClass {
  const s = o?.s ?? settings.s;
  // length factor: the class's rule, else its own S_L, else the scenario's rule, else the scenario's S_L
  const rule = o?.lengthRule;
  const sL = rule !== undefined ? lengthFactor(rule, s) : (o?.sL ?? (settings.lengthRule !== undefined ? lengthFactor(settings.lengthRule, s) : settings.sL));
  const lf = o?.lineFraction;
  const widthM = lf !== undefined ? (lf * (wc.widthM + wc.spacingM)) / s : wc.widthM / s;
  const barrierScales = settings.level === "ideal" ? true : (o?.barrierScales ?? settings.barrierScales);
  out.s = s;
  out.sL = sL;
  out.widthM = widthM;
  out.thicknessM = o?.aspectRatio !== undefined ? o.aspectRatio * widthM : wc.thicknessM / s;
  out.spacingM = lf !== undefined ? ((wc.widthM + wc.spacingM) / s) * (1 - lf) : wc.spacingM / s;
  out.ildBelowM = wc.ildBelowM === null ? null : wc.ildBelowM / s;
  out.ildAboveM = wc.ildAboveM === null ? null : wc.ildAboveM / s;
  out.barrierM = o?.barrierM !== undefined ? o.barrierM : barrierScales ? wc.barrierM / s : wc.barrierM;
  out.lengthM = wc.meanLengthM / sL;
  out.metal = o?.metal ?? settings.metal ?? wc.metal;
  out.k = o?.k ?? settings.k ?? wc.k;
  // air gap: the class's override (null = none), else the scenario's, else the baseline class's own (kGap 1 and
  // fraction 1 where only one of them is given); a gap never holds more than the surrounding k
  const gap = o?.airGap !== undefined ? o.airGap : (settings.airGap ?? undefined);
  if (gap === null) {
    out.kGap = out.k;
    out.gapFraction = 0;
  } else if (gap !== undefined) {
    out.kGap = Math.min(gap.kGap, out.k);
    out.gapFraction = gap.gapFraction;
  } else if (wc.kGap !== undefined || wc.gapFraction !== undefined) {
    out.kGap = Math.min(wc.kGap ?? 1, out.k);
    out.gapFraction = wc.gapFraction ?? 1;
  } else {
    out.kGap = out.k;
    out.gapFraction = 0;
  }
  out.miller = o?.miller ?? settings.miller;
  return out;
}

/**
 * The length factor S_L a length rule gives at cross-section factor S: follows-s S, fixed 1, factor its sL, power
 * S^exponent. No checks (checkSettings and the schemas hold the rule to its range).
 */
export function lengthFactor(rule: LengthRule, s: number): number {
  switch (rule.kind) {
    case "follows-s":
      return s;
    case "fixed":
      return 1;
    case "factor":
      return rule.sL;
    case "power":
      return Math.pow(s, rule.exponent);
  }
}

/**
 * The length rule that stands for a plain length factor: S_L = 1 is `fixed`, any other a `factor`.
 */
export function ruleOfFactor(sL: number): LengthRule {
  return sL === 1 ? { kind: "fixed" } : { kind: "factor", sL };
}

/**
 * Cross-section factor that brings a class's pitch (width + spacing) to a target pitch: S = pitch / target.
 * @returns S (dimensionless, > 1 for a shrink)
 */
export function sFromTargetPitch(p: { wireClass: WireClass; targetPitchM: number }): number {
  positive("targetPitchM", p.targetPitchM);
  return (p.wireClass.widthM + p.wireClass.spacingM) / p.targetPitchM;
}

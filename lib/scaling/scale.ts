/**
 * Geometry under scaling: a scenario divides W, T, spacing and ILD heights by S and lengths by S_L,
 * globally or per class, with options (aspect ratio, barrier that scales or keeps its thickness, absolute
 * barrier, k, metal, Miller factor). Pure, SI units.
 */
import { positive } from "./check";
import type { ScenarioSettings, WireClass } from "./types";

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
  miller: number;
}

/**
 * Applies the scenario to one class. Precedence: per-class override, then the scenario's global value, then
 * the class's own value. The barrier scales with S when `barrierScales` (always at level `ideal`), keeps its
 * thickness otherwise, and an override `barrierM` replaces it outright. `aspectRatio` sets T = AR·W after scaling.
 */
export function scaleClass(wc: WireClass, settings: ScenarioSettings): ScaledClass {
  const o = settings.overrides[wc.name];
  const s = o?.s ?? settings.s;
  const sL = o?.sL ?? settings.sL;
  const widthM = wc.widthM / s;
  const thicknessM = o?.aspectRatio !== undefined ? o.aspectRatio * widthM : wc.thicknessM / s;
  const barrierScales = settings.level === "ideal" ? true : (o?.barrierScales ?? settings.barrierScales);
  const barrierM = o?.barrierM !== undefined ? o.barrierM : barrierScales ? wc.barrierM / s : wc.barrierM;
  return {
    s,
    sL,
    widthM,
    thicknessM,
    spacingM: wc.spacingM / s,
    ildBelowM: wc.ildBelowM === null ? null : wc.ildBelowM / s,
    ildAboveM: wc.ildAboveM === null ? null : wc.ildAboveM / s,
    barrierM,
    lengthM: wc.meanLengthM / sL,
    metal: o?.metal ?? settings.metal ?? wc.metal,
    k: o?.k ?? settings.k ?? wc.k,
    miller: o?.miller ?? settings.miller,
  };
}

/**
 * Cross-section factor that brings a class's pitch (width + spacing) to a target pitch: S = pitch / target.
 * @returns S (dimensionless, > 1 for a shrink)
 */
export function sFromTargetPitch(p: { wireClass: WireClass; targetPitchM: number }): number {
  positive("targetPitchM", p.targetPitchM);
  return (p.wireClass.widthM + p.wireClass.spacingM) / p.targetPitchM;
}

/**
 * The light half of the "Layer shaping" screen (no engine values): objective labels and units, the limits' checks in
 * the user's words, and "apply to scenario" as a pure settings change. Imported by the main thread, the worker and
 * the report freeze alike.
 */
import type { DesignObjective, ScenarioSettings } from "@/lib/scaling";

export const SHAPING_OBJECTIVES: readonly DesignObjective[] = ["delay", "repeated", "energy", "edp"];

/** How each objective is named on screen and in reports, with its display unit (SI size of one unit). */
export const OBJECTIVE_LABEL: Record<DesignObjective, { label: string; short: string; unit: string; unitSI: number }> = {
  delay: { label: "50% delay of the net (with its repeaters)", short: "50% delay", unit: "ps", unitSI: 1e-12 },
  repeated: { label: "Repeated delay per mm", short: "Delay per mm", unit: "ps/mm", unitSI: 1e-12 / 1e-3 },
  energy: { label: "Energy per transition", short: "Energy", unit: "fJ", unitSI: 1e-15 },
  edp: { label: "Energy × delay", short: "Energy × delay", unit: "fJ·ps", unitSI: 1e-27 },
};

/** The user's limits on the shaping screen, in the units typed (nm and plain numbers). */
export interface ShapingLimits {
  minWidthNm: number;
  minSpaceNm: number;
  minFraction: number;
  maxFraction: number;
  maxAspect: number;
}

export const DEFAULT_SHAPING_LIMITS: ShapingLimits = { minWidthNm: 0, minSpaceNm: 0, minFraction: 0.3, maxFraction: 0.7, maxAspect: 3 };

/** Largest aspect ratio the screen accepts (a drawn line taller than 10 × its width is outside every model's range). */
export const MAX_SHAPING_ASPECT = 10;

/** Per-field messages for limits that cannot be searched (empty when they are fine). Keys are ShapingLimits fields. */
export function checkShapingLimits(l: ShapingLimits): Partial<Record<keyof ShapingLimits, string>> {
  const out: Partial<Record<keyof ShapingLimits, string>> = {};
  const num = (v: number) => Number.isFinite(v);
  if (!num(l.minWidthNm) || l.minWidthNm < 0) out.minWidthNm = "Minimum width must be a number of nm, 0 or more.";
  if (!num(l.minSpaceNm) || l.minSpaceNm < 0) out.minSpaceNm = "Minimum space must be a number of nm, 0 or more.";
  if (!num(l.minFraction) || !(l.minFraction > 0 && l.minFraction < 1)) out.minFraction = "Smallest line fraction must be between 0 and 1 (e.g. 0.3).";
  if (!num(l.maxFraction) || !(l.maxFraction > 0 && l.maxFraction < 1)) out.maxFraction = "Largest line fraction must be between 0 and 1 (e.g. 0.7).";
  else if (out.minFraction === undefined && !(l.maxFraction > l.minFraction)) out.maxFraction = "Largest line fraction must be above the smallest.";
  if (!num(l.maxAspect) || !(l.maxAspect > 1 && l.maxAspect <= MAX_SHAPING_ASPECT))
    out.maxAspect = `Largest aspect ratio must be above 1 and at most ${MAX_SHAPING_ASPECT} (the search starts at 1).`;
  return out;
}

/**
 * The engine's "no feasible geometry" RangeErrors in the user's words (the engine names its own fields and SI units).
 * Returns null for any other message.
 */
export function explainShapingError(message: string): string | null {
  if (/no feasible line fraction/.test(message))
    return "No feasible geometry: at this pitch the minimum width, minimum space and line fraction range leave no line to draw (the barrier needs room too). Widen the line fraction range or lower the minimum width or space.";
  if (/no feasible aspect ratio/.test(message))
    return "No feasible geometry: the largest aspect ratio is too low for the barrier to leave a conducting core. Raise the largest aspect ratio.";
  if (/no geometry within the limits gives a finite result/.test(message)) return "No feasible geometry: no drawing within the limits can be evaluated.";
  return null;
}

/**
 * The scenario's settings with the class redrawn: `overrides[className]` keeps what it had and gains the line
 * fraction and aspect ratio (the optimiser's answer; the engine applies the line fraction at the scaled pitch first).
 */
export function applyShaping(settings: ScenarioSettings, className: string, lineFraction: number, aspectRatio: number): ScenarioSettings {
  const existing = Object.prototype.hasOwnProperty.call(settings.overrides, className) ? settings.overrides[className] : undefined;
  return { ...settings, overrides: { ...settings.overrides, [className]: { ...existing, lineFraction, aspectRatio } } };
}

/** Percentage change from `from` to `to` (−12.3 = 12.3% lower); NaN when `from` is 0. */
export function percentChange(from: number, to: number): number {
  return from === 0 ? NaN : ((to - from) / from) * 100;
}

/** Tornado inputs in words. */
export const TORNADO_LABEL: Record<string, string> = {
  width: "Width",
  thickness: "Thickness",
  spacing: "Spacing",
  ildHeight: "ILD height",
  barrier: "Barrier",
  k: "Dielectric k",
  bulkResistivity: "Bulk resistivity",
  meanFreePath: "Mean free path",
  specularity: "Surface specularity",
  grainReflection: "Grain reflection",
  length: "Length",
  driverR: "Driver resistance",
  loadC: "Load capacitance",
};

/** The delay's parts in words, in the order of DelayParts. */
export const DELAY_PART_LABEL = {
  driverWireS: "Driver × wire C",
  driverLoadS: "Driver × load",
  wireWireS: "Wire R × wire C",
  wireLoadS: "Wire R × load",
  repeatersS: "Repeaters",
} as const;
export type DelayPartKey = keyof typeof DELAY_PART_LABEL;

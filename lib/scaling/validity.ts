/**
 * Input checks for whole wire classes, technologies and scenario settings (RangeError naming the field and
 * unit), and helpers for the validity flags every result carries. Model-specific flags are raised where the
 * model is computed (capacitance.ts, resistance.ts).
 */
import { getMetal } from "../../scaling/materials";
import { atLeast, inRange, nonNegative, positive } from "./check";
import type { ClassOverride, ScenarioSettings, Technology, ValidityFlag, WireClass } from "./types";
import { TIERS } from "./types";

/** Throws RangeError on an impossible wire class (non-positive sizes, k < 1, NaN, infinities, unknown metal). */
export function checkWireClass(wc: WireClass): void {
  const n = (f: string) => `${wc.name}.${f}`;
  if (!TIERS.includes(wc.tier)) throw new RangeError(`${n("tier")} must be one of ${TIERS.join(", ")} (got ${wc.tier})`);
  positive(n("widthM"), wc.widthM);
  positive(n("thicknessM"), wc.thicknessM);
  positive(n("spacingM"), wc.spacingM);
  if (wc.ildBelowM !== null) positive(n("ildBelowM"), wc.ildBelowM);
  if (wc.ildAboveM !== null) positive(n("ildAboveM"), wc.ildAboveM);
  if (wc.ildBelowM === null && wc.ildAboveM === null) throw new RangeError(`${n("ildBelowM")} or ${n("ildAboveM")} must be given (got no plane)`);
  nonNegative(n("barrierM"), wc.barrierM);
  getMetal(wc.metal);
  atLeast(n("k"), wc.k, 1);
  nonNegative(n("netCount"), wc.netCount);
  positive(n("meanLengthM"), wc.meanLengthM);
  nonNegative(n("driverOhm"), wc.driverOhm);
  nonNegative(n("loadF"), wc.loadF);
  inRange(n("activity"), wc.activity, 0, 1);
  if (wc.histogram) {
    for (const b of wc.histogram) {
      positive(n("histogram.lengthM"), b.lengthM);
      nonNegative(n("histogram.count"), b.count);
    }
  }
}

export function checkTechnology(t: Technology): void {
  positive("supplyV", t.supplyV);
  positive("clockHz", t.clockHz);
  positive("repeaterR0Ohm", t.repeaterR0Ohm);
  positive("repeaterC0F", t.repeaterC0F);
  positive("delayBudgetS", t.delayBudgetS);
}

function checkOverride(name: string, o: ClassOverride): void {
  const n = (f: string) => `overrides.${name}.${f}`;
  if (o.s !== undefined) positive(n("s"), o.s);
  if (o.sL !== undefined) positive(n("sL"), o.sL);
  if (o.k !== undefined) atLeast(n("k"), o.k, 1);
  if (o.metal !== undefined) getMetal(o.metal);
  if (o.aspectRatio !== undefined) positive(n("aspectRatio"), o.aspectRatio);
  if (o.miller !== undefined) inRange(n("miller"), o.miller, 0, 2);
  if (o.barrierM !== undefined) nonNegative(n("barrierM"), o.barrierM);
}

export function checkSettings(s: ScenarioSettings): void {
  positive("s", s.s);
  positive("sL", s.sL);
  inRange("miller", s.miller, 0, 2);
  positive("deviceRFactor", s.deviceRFactor);
  positive("deviceCFactor", s.deviceCFactor);
  positive("supplyV", s.supplyV);
  if (s.k !== null) atLeast("k", s.k, 1);
  if (s.metal !== null) getMetal(s.metal);
  for (const [name, o] of Object.entries(s.overrides)) checkOverride(name, o);
}

/** Removes repeated flags (same model, quantity and value), keeping the first. */
export function dedupeFlags(flags: ValidityFlag[]): ValidityFlag[] {
  if (flags.length < 2) return flags;
  const seen = new Set<string>();
  return flags.filter((f) => {
    const key = `${f.model}|${f.quantity}|${f.value}`;
    if (seen.has(key)) return false;
    seen.add(key);
    return true;
  });
}

/**
 * Input checks for whole wire classes, technologies and scenario settings (RangeError naming the field and
 * unit), and helpers for the validity flags every result carries. Model-specific flags are raised where the
 * model is computed (capacitance.ts, resistance.ts).
 */
import { getMetal, METALS } from "./materials";
import { checkMetalOverride } from "./resistance";
import { atLeast, inRange, nonNegative, positive } from "./check";
import type { ClassOverride, LengthRule, ScenarioSettings, Technology, ValidityFlag, WireClass, AirGap } from "./types";
import { LENGTH_RULE_KINDS, MAX_LENGTH_RULE_EXPONENT, TIERS } from "./types";

/** Throws RangeError on an impossible wire class (non-positive sizes, k < 1, NaN, infinities, unknown metal). */
export function checkWireClass(wc: WireClass): void {
  // Field names ("<class>.<field>") are built only when a check fails: this runs for every class of every evaluation.
  const c = wc.name;
  if (!TIERS.includes(wc.tier)) throw new RangeError(`${c}.tier must be one of ${TIERS.join(", ")} (got ${wc.tier})`);
  pos(c, "widthM", wc.widthM);
  pos(c, "thicknessM", wc.thicknessM);
  pos(c, "spacingM", wc.spacingM);
  if (wc.ildBelowM !== null) pos(c, "ildBelowM", wc.ildBelowM);
  if (wc.ildAboveM !== null) pos(c, "ildAboveM", wc.ildAboveM);
  if (wc.ildBelowM === null && wc.ildAboveM === null) throw new RangeError(`${c}.ildBelowM or ${c}.ildAboveM must be given (got no plane)`);
  nonNeg(c, "barrierM", wc.barrierM);
  getMetal(wc.metal);
  if (!(wc.k >= 1) || wc.k === Infinity) atLeast(`${c}.k`, wc.k, 1);
  nonNeg(c, "netCount", wc.netCount);
  pos(c, "meanLengthM", wc.meanLengthM);
  nonNeg(c, "driverOhm", wc.driverOhm);
  nonNeg(c, "loadF", wc.loadF);
  if (!(wc.activity >= 0 && wc.activity <= 1)) inRange(`${c}.activity`, wc.activity, 0, 1);
  if (wc.kGap !== undefined && !(wc.kGap >= 1 && wc.kGap <= wc.k)) throw new RangeError(`${c}.kGap must be >= 1 and <= the class's k ${wc.k} (got ${wc.kGap})`);
  if (wc.gapFraction !== undefined && !(wc.gapFraction >= 0 && wc.gapFraction <= 1)) {
    throw new RangeError(`${c}.gapFraction must be from 0 to 1 (got ${wc.gapFraction})`);
  }
  if (wc.viasPerNet !== undefined && !(Number.isInteger(wc.viasPerNet) && wc.viasPerNet >= 0 && wc.viasPerNet <= 1e6)) {
    throw new RangeError(`${c}.viasPerNet must be a whole number from 0 to 1000000 (got ${wc.viasPerNet})`);
  }
  if (wc.viaOhm !== undefined) nonNeg(c, "viaOhm", wc.viaOhm);
  if (wc.viaWidthM !== undefined) pos(c, "viaWidthM", wc.viaWidthM);
  if (wc.viaHeightM !== undefined) pos(c, "viaHeightM", wc.viaHeightM);
  const h = wc.histogram;
  if (h) {
    for (let i = 0; i < h.length; i++) {
      const b = h[i]!;
      const l = b.lengthM;
      const n = b.count;
      if (!(l > 0 && l !== Infinity && n >= 0 && n !== Infinity)) {
        pos(c, "histogram.lengthM", l);
        nonNeg(c, "histogram.count", n);
      }
    }
  }
}

/** positive(`${cls}.${field}`, v) with the name built only on failure. */
function pos(cls: string, field: string, v: number): void {
  if (!(v > 0) || v === Infinity) positive(`${cls}.${field}`, v);
}

/** nonNegative(`${cls}.${field}`, v) with the name built only on failure. */
function nonNeg(cls: string, field: string, v: number): void {
  if (!(v >= 0) || v === Infinity) nonNegative(`${cls}.${field}`, v);
}

export function checkTechnology(t: Technology): void {
  positive("supplyV", t.supplyV);
  positive("clockHz", t.clockHz);
  positive("repeaterR0Ohm", t.repeaterR0Ohm);
  positive("repeaterC0F", t.repeaterC0F);
  positive("delayBudgetS", t.delayBudgetS);
  if (t.delayModel !== undefined && t.delayModel !== "exact" && t.delayModel !== "sakurai") {
    throw new RangeError(`delayModel must be exact or sakurai (got ${String(t.delayModel)})`);
  }
  if (t.capacitanceModel !== undefined && t.capacitanceModel !== "accurate" && t.capacitanceModel !== "published") {
    throw new RangeError(`capacitanceModel must be accurate or published (got ${String(t.capacitanceModel)})`);
  }
  if (t.temperatureC !== undefined) inRange("temperatureC", t.temperatureC, -273.15, 400);
  if (t.minRepeaterGain !== undefined && !(t.minRepeaterGain >= 0 && t.minRepeaterGain < 1)) {
    throw new RangeError(`minRepeaterGain must be >= 0 and < 1 (got ${t.minRepeaterGain})`);
  }
  if (t.repeaterOutputCRatio !== undefined) inRange("repeaterOutputCRatio", t.repeaterOutputCRatio, 0, 10);
  if (t.repeaterAreaM2 !== undefined) nonNegative("repeaterAreaM2", t.repeaterAreaM2);
  if (t.repeaterLeakageW !== undefined) nonNegative("repeaterLeakageW", t.repeaterLeakageW);
  if (t.materials !== undefined) {
    if (t.materials === null || typeof t.materials !== "object")
      throw new RangeError(`materials must be an object keyed by metal id (got ${String(t.materials)})`);
    for (const [id, o] of Object.entries(t.materials)) {
      try {
        getMetal(id);
      } catch {
        throw new RangeError(`materials.${id} must name a metal of the catalogue (one of ${Object.keys(METALS).join(", ")})`);
      }
      if (o === null || typeof o !== "object") throw new RangeError(`materials.${id} must be an object (got ${String(o)})`);
      checkMetalOverride(`materials.${id}`, o);
    }
  }
}

function checkOverride(name: string, o: ClassOverride): void {
  const n = (f: string) => `overrides.${name}.${f}`;
  if (o.s !== undefined) positive(n("s"), o.s);
  if (o.sL !== undefined) positive(n("sL"), o.sL);
  if (o.k !== undefined) atLeast(n("k"), o.k, 1);
  if (o.metal !== undefined) getMetal(o.metal);
  if (o.aspectRatio !== undefined) positive(n("aspectRatio"), o.aspectRatio);
  if (o.lineFraction !== undefined && !(o.lineFraction > 0 && o.lineFraction < 1))
    throw new RangeError(`${n("lineFraction")} must be between 0 and 1, exclusive (got ${o.lineFraction})`);
  if (o.miller !== undefined) inRange(n("miller"), o.miller, 0, 2);
  if (o.barrierM !== undefined) nonNegative(n("barrierM"), o.barrierM);
  if (o.lengthRule !== undefined) checkLengthRule(n("lengthRule"), o.lengthRule);
}

/** A length rule: one of the four kinds; a factor > 0; a power-law exponent from 0 to 2. */
export function checkLengthRule(name: string, r: LengthRule): void {
  if (r === null || typeof r !== "object") throw new RangeError(`${name} must be an object { kind, … } (got ${String(r)})`);
  switch (r.kind) {
    case "follows-s":
    case "fixed":
      return;
    case "factor":
      positive(`${name}.sL`, r.sL);
      return;
    case "power":
      inRange(`${name}.exponent`, r.exponent, 0, MAX_LENGTH_RULE_EXPONENT);
      return;
    default:
      throw new RangeError(`${name}.kind must be one of ${LENGTH_RULE_KINDS.join(", ")} (got ${String((r as { kind: unknown }).kind)})`);
  }
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
  if (s.airGap) checkAirGap("airGap", s.airGap);
  if (s.lengthRule !== undefined) checkLengthRule("lengthRule", s.lengthRule);
  if (s.temperatureC !== undefined) inRange("temperatureC", s.temperatureC, -273.15, 400);
  for (const [name, o] of Object.entries(s.overrides)) {
    checkOverride(name, o);
    if (o.airGap) checkAirGap(`overrides.${name}.airGap`, o.airGap);
  }
}

/** An air gap of a scenario: kGap ≥ 1 (a gap above the class's k is held at k by the scaling), fraction 0..1. */
function checkAirGap(name: string, g: AirGap): void {
  atLeast(`${name}.kGap`, g.kGap, 1);
  inRange(`${name}.gapFraction`, g.gapFraction, 0, 1);
}

/** Removes repeated flags (same model, quantity and value), keeping the first; a new array unless there are fewer than two. */
export function dedupeFlags(flags: ValidityFlag[]): ValidityFlag[] {
  if (flags.length < 2) return flags;
  // a handful of flags at most: compare pairwise (no keys or sets to allocate on the sweep's path). The copy comes from
  // slice rather than a literal: sweeps keep these arrays, and a literal's allocation site would be pretenured (sweep.ts).
  const out = flags.slice();
  let n = 0;
  for (let i = 0; i < flags.length; i++) {
    const f = flags[i]!;
    let dup = false;
    for (let j = 0; j < n; j++) {
      const g = out[j]!;
      if (g.model === f.model && g.quantity === f.quantity && (g.value === f.value || (g.value !== g.value && f.value !== f.value))) {
        dup = true;
        break;
      }
    }
    if (!dup) out[n++] = f;
  }
  out.length = n;
  return out;
}

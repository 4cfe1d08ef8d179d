/**
 * Evaluation of wire classes under a scenario: geometry → capacitance → resistance → delay, repeaters,
 * energy and the length distribution, with validity flags and accuracy statements. SI units.
 */
import { ownEntry } from "./own";
import { getMetal, type Metal } from "./materials";
import { accurateCapacitanceInto } from "./cap-accurate";
import { ACCURATE_ACCURACY_AIR_GAP, ACCURATE_ACCURACY_HOMOGENEOUS, CAPACITANCE_ACCURACY, closedForm, closedFormFlags, type Split } from "./capacitance";
import { DEFAULT_REPEATER_AREA_M2, ENGINE_VERSION, EPSILON_0_F_PER_M, REPEATER_A, REPEATER_B } from "./constants";
import { stageT50 } from "./delay";
import { lineDelayUnchecked } from "./delay";
import { distributionCore } from "./distribution";
import { energyUnchecked, powerUnchecked } from "./energy";
import { coarsenHistogram } from "./histogram";
import {
  DEFAULT_MIN_REPEATER_GAIN as DEFAULT_GAIN_IMPORTED,
  DEFAULT_OUTPUT_C_RATIO as DEFAULT_GAMMA_IMPORTED,
  REPEATED_NET_ACCURACY,
  repeatedNetInto,
} from "./repeaters";
import {
  BARRIER_RESISTIVITY_OHM_M,
  DEFAULT_TEMPERATURE_C as DEFAULT_TEMPERATURE_IMPORTED,
  metalAtInto,
  newMetal,
  RESISTIVITY_ACCURACY,
  sizeEffectFactor,
  sizeEffectFlags,
  temperatureFlags,
  viaOhmUnchecked,
} from "./resistance";
import type {
  CapacitanceModel,
  ClassCapacitance,
  ClassComparison,
  ClassOverride,
  ClassResult,
  DelayModel,
  EffectiveK,
  Evaluation,
  EvaluationTotals,
  LengthBin,
  MetalOverride,
  ModelLevel,
  ScenarioSettings,
  Technology,
  ValidityFlag,
  WireClass,
} from "./types";
import { DELAY_MODELS, MODEL_LEVELS } from "./types";
import { newScaledClass, scaleClassWith, type ScaledClass } from "./scale";
import { checkSettings, checkTechnology, checkWireClass, dedupeFlags } from "./validity";

// Module-local copies of imported constants (imported bindings are getters under some loaders, e.g. tsx).
const DEFAULT_MIN_REPEATER_GAIN = DEFAULT_GAIN_IMPORTED;
const DEFAULT_OUTPUT_C_RATIO = DEFAULT_GAMMA_IMPORTED;
const DEFAULT_TEMPERATURE_C = DEFAULT_TEMPERATURE_IMPORTED;

/** Settings of the baseline itself: S = S_L = 1, no overrides, factors 1, Miller 1, barrier scales except at `full`. */
export function baselineSettings(level: ModelLevel, tech: Technology): ScenarioSettings {
  return {
    s: 1,
    sL: 1,
    level,
    barrierScales: level !== "full",
    miller: 1,
    deviceRFactor: 1,
    deviceCFactor: 1,
    supplyV: tech.supplyV,
    k: null,
    metal: null,
    overrides: {},
  };
}

const CAP_MODEL: Record<ModelLevel, CapacitanceModel> = { ideal: "ideal", fringe: "fringe", coupled: "coupled", full: "coupled" };

const DELAY_ACCURACY = {
  exact: {
    ideal: "exact 50% delay of the open-ended distributed line, 0.3787·RC (tabulated exact solution, within 0.05%); no driver or load",
    other: "exact 50% delay of driver + distributed line + load (tabulated exact two-port solution, within 0.05% of it; within 0.5% of ngspice ladders)",
  },
  sakurai: {
    ideal: "Sakurai 0.377·RC of the open-ended distributed line (exact 0.3787·RC, −0.5%); no driver or load",
    other: "Sakurai form 0.377·RC + 0.693·(Rd·C + Rd·CL + R·CL): 0.02–3.3% low against the exact solution (measured)",
  },
} as const;

/** The capacitance accuracy statement of one capacitance kind, plane count and gap (evaluateClassCore's `accuracy`). */
function capacitanceAccuracy(kind: CapKind, twoPlanes: boolean, airGap: boolean): string {
  const planes = twoPlanes ? "planes below and above" : "one plane";
  if (kind === "accurate")
    return airGap
      ? `accurate tables, ${planes}, air gap between the lines as geometry: ${ACCURATE_ACCURACY_AIR_GAP}`
      : `accurate tables, ${planes}: ${ACCURATE_ACCURACY_HOMOGENEOUS}`;
  const cap = CAPACITANCE_ACCURACY[kind];
  return twoPlanes && kind !== "ideal" ? `${cap}; two planes: Cohn's thick strip with the fitted two-plane split` : cap;
}

const CAP_KINDS: readonly CapKind[] = ["ideal", "fringe", "coupled", "accurate"];

function accuracyFor(level: ModelLevel, kind: CapKind, twoPlanes: boolean, model: DelayModel, airGap: boolean): Record<string, string> {
  return {
    capacitance: capacitanceAccuracy(kind, twoPlanes, airGap),
    resistivity: level === "full" ? RESISTIVITY_ACCURACY.sizeEffect : RESISTIVITY_ACCURACY.bulk,
    delay: `${model}: ${level === "ideal" ? DELAY_ACCURACY[model].ideal : DELAY_ACCURACY[model].other}`,
    repeaters: `${REPEATED_NET_ACCURACY}; stage delays: ${model}`,
  };
}

// Shared, frozen accuracy records (one per level, capacitance kind, plane count, gap and delay model) keep the hot path
// free of allocations.
const ACCURACY: Record<string, Readonly<Record<string, string>>> = {};
const accuracyKey = (level: ModelLevel, kind: CapKind, two: boolean, gap: boolean, m: DelayModel) =>
  `${level}|${kind}|${two ? 2 : 1}|${gap ? "gap" : "-"}|${m}`;
for (const level of MODEL_LEVELS)
  for (const kind of CAP_KINDS)
    for (const two of [false, true])
      for (const gap of [false, true])
        for (const m of DELAY_MODELS) ACCURACY[accuracyKey(level, kind, two, gap, m)] = Object.freeze(accuracyFor(level, kind, two, m, gap));

/**
 * Evaluates one class at one scenario. Level `ideal`: parallel plate, bulk resistivity, barrier scaled with S,
 * delay of the open-ended line with no driver, load or vias (exact 0.3787·RC, or Sakurai 0.377·RC; energy without
 * load). Other levels: driver × deviceRFactor plus the net's vias (lumped at the driver end), load × deviceCFactor,
 * the technology's stage-delay model (exact table by default, or Sakurai), Elmore delay; `full` adds size-effect
 * resistivity. Resistivity at the scenario's temperatureC, else the technology's (default 25 °C), with its materials overrides.
 * Repeaters (repeatedNet: the real driver → k repeaters of size h → the real load, inserted only when they cut the
 * delay by at least minRepeaterGain) use R0 × deviceRFactor and C0 × deviceCFactor; their input and output
 * capacitance count in energy and power, their leakage in power. A histogram over MAX_EVALUATED_BINS bins is merged
 * first (coarsenHistogram). Throws RangeError on impossible input (including a barrier that fills the scaled line)
 * and when a result would not be finite.
 */
export function evaluateClass(p: { wireClass: WireClass; technology: Technology; settings: ScenarioSettings }): ClassResult {
  checkTechnology(p.technology);
  checkSettings(p.settings);
  checkWireClass(p.wireClass);
  return evaluateClassCore(p.wireClass, p.technology, p.settings, true, undefined, evaluatedBins(p.wireClass));
}

/** The bins a class is evaluated over: its histogram, merged when long (coarsenHistogram), or undefined without one. */
function evaluatedBins(wc: WireClass): LengthBin[] | undefined {
  const h = wc.histogram;
  return h === undefined || h.length === 0 ? undefined : coarsenHistogram(h);
}

/** Scratch state of one class's electrical evaluation (reused: the engine is synchronous and never re-entered). */
interface Electrical {
  /** Geometry and options after scaling (scaleClassWith, the one implementation of the scaling rules). */
  g: ScaledClass;
  /** The class's metal at the operating temperature with the technology's overrides (metalAtInto). */
  metal: Metal;
  rho: number;
  rPerM: number;
  cPerM: number;
  rd: number;
  cl: number;
  r0: number;
  c0: number;
  /** All vias of one net, Ω (0 at level ideal or without vias). */
  via: number;
  tempC: number;
  exact: boolean;
  gamma: number;
  minGain: number;
  split: Split;
  /** The capacitance the class takes at this level (capKindOf). */
  capKind: CapKind;
  /** What `metal` was last computed from (metalAtInto is skipped when unchanged; always redone with an override). */
  mBase: Metal | null;
  mOverride: MetalOverride | undefined;
  mTemp: number;
  /**
   * The inputs of the closed forms that `split` holds (capacitanceInto skips closedForm when they repeat: a sweep's
   * levels coupled and full use the same model on the same geometry). cH2 = −1 for no second plane.
   */
  cModel: CapKind | "";
  cEps: number;
  cW: number;
  cT: number;
  cSp: number;
  cH: number;
  cH2: number;
  cK: number;
  cKGap: number;
  cGapF: number;
  /** How many capacitance flags of those inputs cFlags holds (sweep points only, see validityInto); −1 = none recorded. */
  cFlagCount: number;
  cFlags: ValidityFlag[];
}

function newElectrical(): Electrical {
  return {
    g: newScaledClass(),
    metal: newMetal(),
    rho: 0,
    rPerM: 0,
    cPerM: 0,
    rd: 0,
    cl: 0,
    r0: 0,
    c0: 0,
    via: 0,
    tempC: DEFAULT_TEMPERATURE_C,
    exact: true,
    gamma: DEFAULT_OUTPUT_C_RATIO,
    minGain: DEFAULT_MIN_REPEATER_GAIN,
    split: { area: 0, ground: 0, couple: 0 },
    capKind: "ideal",
    mBase: null,
    mOverride: undefined,
    mTemp: Number.NaN,
    cModel: "",
    cEps: Number.NaN,
    cW: Number.NaN,
    cT: Number.NaN,
    cSp: Number.NaN,
    cH: Number.NaN,
    cH2: Number.NaN,
    cK: Number.NaN,
    cKGap: Number.NaN,
    cGapF: Number.NaN,
    cFlagCount: -1,
    cFlags: [],
  };
}

/**
 * closedForm into e.split, skipped when its inputs are those of the previous call on `e` (exact comparison, so the
 * same numbers either way). Any new input of closedForm must join the key here.
 */
function capacitanceInto(
  e: Electrical,
  model: CapKind,
  eps: number,
  w: number,
  t: number,
  sp: number,
  h: number,
  h2: number | null,
  k: number,
  kGap: number,
  gapF: number,
): void {
  const h2Key = h2 === null ? -1 : h2;
  if (
    model === e.cModel &&
    eps === e.cEps &&
    w === e.cW &&
    t === e.cT &&
    sp === e.cSp &&
    h === e.cH &&
    h2Key === e.cH2 &&
    k === e.cK &&
    kGap === e.cKGap &&
    gapF === e.cGapF
  )
    return;
  // the accurate tables (cap-accurate.ts) compute ground and coupling, with an air gap between the lines as geometry
  if (model === "accurate") accurateCapacitanceInto(w, t, sp, h, h2, k, kGap, gapF, e.split, null);
  else closedForm(model, eps, w, t, sp, h, h2, e.split);
  e.cK = k;
  e.cKGap = kGap;
  e.cGapF = gapF;
  e.cModel = model;
  e.cEps = eps;
  e.cW = w;
  e.cT = t;
  e.cSp = sp;
  e.cH = h;
  e.cH2 = h2Key;
  e.cFlagCount = -1;
}

/**
 * Geometry → C, R per length, driver, load and vias of one class at one scenario, into `e` (no allocation, no flags:
 * the same code serves the sweep and the evaluation; validityInto adds the flags where a result needs them).
 * Resistivity at the scenario's temperature (else the technology's) with its per-metal overrides (resistance.ts, metalAtInto).
 */
function electricalInto(wc: WireClass, tech: Technology, settings: ScenarioSettings, e: Electrical, override: ClassOverride | undefined): void {
  const level = settings.level;
  const g = scaleClassWith(wc, settings, override, e.g);
  const w = g.widthM;
  const t = g.thicknessM;
  const bar = g.barrierM;
  const hb = g.ildBelowM;
  const ha = g.ildAboveM;
  const tempC = settings.temperatureC ?? tech.temperatureC ?? DEFAULT_TEMPERATURE_C;
  const base = getMetal(g.metal);
  const mats = tech.materials;
  const metalOverride = mats === undefined ? undefined : (mats[base.id] ?? mats[g.metal]);
  // the metal at temperature is recomputed only when the metal, its override or the temperature changed (sweeps)
  if (base !== e.mBase || metalOverride !== e.mOverride || tempC !== e.mTemp || metalOverride !== undefined) {
    metalAtInto(base, metalOverride, tempC, e.metal);
    e.mBase = base;
    e.mOverride = metalOverride;
    e.mTemp = tempC;
  }
  const metal = e.metal;
  // a lone plane above is treated as the plane (mirror symmetry)
  e.capKind = capKindOf(level, tech, g);
  capacitanceInto(e, e.capKind, EPSILON_0_F_PER_M * g.k, w, t, g.spacingM, hb ?? (ha as number), hb === null ? null : ha, g.k, g.kGap, g.gapFraction);
  const wCond = w - 2 * bar;
  const hCond = t - bar;
  if (!(wCond > 0 && hCond > 0)) {
    throw new RangeError(`barrierM must be < widthM/2 and < thicknessM after scaling (got barrier ${bar}, width ${w}, thickness ${t} in class ${wc.name})`);
  }
  let rho = metal.resistivityOhmM;
  if (level === "full") rho *= sizeEffectFactor(metal, wCond, hCond);
  const ideal = level === "ideal";
  e.rho = rho;
  e.rPerM = rho / (wCond * hCond);
  e.cPerM = e.split.ground + 2 * g.miller * e.split.couple;
  e.rd = ideal ? 0 : wc.driverOhm * settings.deviceRFactor;
  e.cl = ideal ? 0 : wc.loadF * settings.deviceCFactor;
  e.r0 = tech.repeaterR0Ohm * settings.deviceRFactor;
  e.c0 = tech.repeaterC0F * settings.deviceCFactor;
  e.tempC = tempC;
  e.exact = (tech.delayModel ?? "exact") === "exact";
  e.gamma = tech.repeaterOutputCRatio ?? DEFAULT_OUTPUT_C_RATIO;
  e.minGain = tech.minRepeaterGain ?? DEFAULT_MIN_REPEATER_GAIN;
  e.via = ideal ? 0 : viasOhm(wc, g, metal, level === "full");
}

/**
 * All vias of one net (Ω): viasPerNet × one via. A measured viaOhm scales as a square via of the line's width and
 * the ILD-below height, R ∝ height/width² (× S when both shrink by S); otherwise viaResistanceOhm of the via geometry
 * (default the line's width and the ILD below, or above without a plane below; both ÷ S) with the line's barrier.
 */
function viasOhm(wc: WireClass, g: ScaledClass, metal: Metal, sizeEffects: boolean): number {
  const n = wc.viasPerNet ?? 0;
  if (n === 0) return 0;
  const s = g.s;
  if (wc.viaOhm !== undefined) {
    const h0 = wc.ildBelowM ?? (wc.ildAboveM as number);
    const h1 = g.ildBelowM ?? (g.ildAboveM as number);
    const r = wc.widthM / g.widthM;
    return n * wc.viaOhm * (h1 / h0) * r * r;
  }
  const w = (wc.viaWidthM ?? wc.widthM) / s;
  const h = (wc.viaHeightM ?? wc.ildBelowM ?? (wc.ildAboveM as number)) / s;
  const tb = g.barrierM;
  if (!(w - 2 * tb > 0)) throw new RangeError(`${wc.name}.viaWidthM must be > 2·barrierM after scaling (got via width ${w}, barrier ${tb})`);
  return n * viaOhmUnchecked(metal, w, h, tb, sizeEffects, BARRIER_RESISTIVITY_OHM_M);
}

type ClosedFormModel = "ideal" | "fringe" | "coupled";
/** The capacitance a class takes: a closed form, or the accurate tables. */
type CapKind = ClosedFormModel | "accurate";

/**
 * Levels coupled and full take the accurate tables unless the technology chooses the published forms
 * (capacitanceModel "published"); a class with an air gap always takes them (the published forms have no gap layer).
 */
function capKindOf(level: ModelLevel, tech: Technology, g: ScaledClass): CapKind {
  const m = CAP_MODEL[level] as ClosedFormModel;
  if (m !== "coupled") return m;
  return (tech.capacitanceModel ?? "accurate") === "accurate" || hasAirGap(g) ? "accurate" : "coupled";
}

/**
 * The validity flags of the models electricalInto used for `e` (once per class result or sweep point). With `reuse`
 * (sweep points, whose flags the sweep copies), the capacitance flags of closed-form inputs seen in the previous call
 * are pushed again (the same objects) instead of being rebuilt.
 */
function validityInto(level: ModelLevel, e: Electrical, validity: ValidityFlag[], reuse: boolean): void {
  const g = e.g;
  const hb = g.ildBelowM;
  const ha = g.ildAboveM;
  const n = e.cFlagCount;
  if (reuse && n >= 0) {
    for (let i = 0; i < n; i++) validity.push(e.cFlags[i]!);
  } else {
    const start = validity.length;
    if (e.capKind === "accurate")
      accurateCapacitanceInto(
        g.widthM,
        g.thicknessM,
        g.spacingM,
        hb ?? (ha as number),
        hb === null ? null : ha,
        g.k,
        g.kGap,
        g.gapFraction,
        FLAG_SPLIT,
        validity,
      );
    else closedFormFlags(e.capKind, g.widthM, g.thicknessM, g.spacingM, hb ?? (ha as number), hb === null ? null : ha, validity);
    if (reuse) {
      const count = validity.length - start;
      for (let i = 0; i < count; i++) e.cFlags[i] = validity[start + i]!;
      e.cFlagCount = count;
    }
  }
  if (level === "full") sizeEffectFlags(e.metal, g.widthM - 2 * g.barrierM, g.thicknessM - g.barrierM, validity);
  temperatureFlags(e.tempC, validity);
}

/** True when the scaled class has an air gap (a gap layer of lower k over some of the line's thickness). */
function hasAirGap(g: ScaledClass): boolean {
  return g.kGap < g.k && g.gapFraction > 0;
}

/** Scratch output of the flag pass of the accurate tables (the values are e.split's already). */
const FLAG_SPLIT: Split = { area: 0, ground: 0, couple: 0 };

/** Scratch output of the homogeneous solve behind effectiveKOf. */
const HOMOGENEOUS_SPLIT: Split = { area: 0, ground: 0, couple: 0 };

/**
 * The uniform k giving the same total as `e.split` at Miller 0, 1 and 2: k × C(gap) / C(k everywhere), the
 * denominator from the same tables without the gap layer. Exactly k without an air gap (or when the tables do not
 * apply: the published forms ignore the gap).
 */
function effectiveKOf(e: Electrical): EffectiveK {
  const g = e.g;
  const k = g.k;
  if (e.capKind !== "accurate" || !hasAirGap(g)) return { miller0: k, miller1: k, miller2: k };
  const hb = g.ildBelowM;
  const ha = g.ildAboveM;
  const h0 = HOMOGENEOUS_SPLIT;
  accurateCapacitanceInto(g.widthM, g.thicknessM, g.spacingM, hb ?? (ha as number), hb === null ? null : ha, k, k, 0, h0, null);
  const s = e.split;
  const at = (m: number) => (k * (s.ground + 2 * m * s.couple)) / (h0.ground + 2 * m * h0.couple);
  return { miller0: at(0), miller1: at(1), miller2: at(2) };
}

export { DEFAULT_REPEATER_AREA_M2 };

const SWEEP_SCRATCH = newElectrical();
const CLASS_SCRATCH = newElectrical();

/**
 * One sweep metric of a class at its scaled mean length (delay: delayS, rc: rcS, r: rOhm, c: cF), with no result
 * objects: the sweep's hot path. Same numbers as evaluateClassCore. When `flags` is given, the point's validity
 * flags are pushed into it. `override` = settings.overrides[wc.name] (the sweep looks it up once per class). Throws
 * RangeError when the result is not finite.
 */
export function classMetricCore(
  wc: WireClass,
  tech: Technology,
  settings: ScenarioSettings,
  metric: "delay" | "rc" | "r" | "c",
  flags: ValidityFlag[] | undefined,
  override: ClassOverride | undefined,
  idealWithDevices = false,
): number {
  const e = SWEEP_SCRATCH;
  electricalInto(wc, tech, settings, e, override);
  if (idealWithDevices && settings.level === "ideal") {
    // the sweep's decomposition: the ideal line (plate C, bulk ρ) with the same driver, load and (bulk) vias as the
    // other levels, so each curve adds one effect to the previous one
    e.rd = wc.driverOhm * settings.deviceRFactor;
    e.cl = wc.loadF * settings.deviceCFactor;
    e.via = viasOhm(wc, e.g, e.metal, false);
  }
  if (flags !== undefined) validityInto(settings.level, e, flags, true);
  const L = e.g.lengthM;
  const R = e.rPerM * L;
  const C = e.cPerM * L;
  const y = metric === "r" ? R : metric === "c" ? C : metric === "rc" ? R * C : stageT50(R, C, e.rd + e.via, e.cl, e.exact); // rd = cl = 0 at level ideal
  if (!Number.isFinite(y)) throw new RangeError(`${wc.name}: the ${metric} is not finite (check the class's sizes, length and driver)`);
  return y;
}

const NET = new Float64Array(4);

/**
 * evaluateClass without the input checks; `withDistribution` false skips the histogram. `stats`, when given,
 * receives the distribution's worst delay in stats[0] (see distributionCore). `bins`: the histogram to evaluate
 * (evaluatedBins of the class; undefined = all nets at the mean length).
 */
export function evaluateClassCore(
  wc: WireClass,
  tech: Technology,
  settings: ScenarioSettings,
  withDistribution: boolean,
  stats: Float64Array | undefined,
  bins: LengthBin[] | undefined,
): ClassResult {
  const level = settings.level;
  const validity: ValidityFlag[] = [];
  const e = CLASS_SCRATCH;
  electricalInto(wc, tech, settings, e, ownEntry(settings.overrides, wc.name));
  validityInto(level, e, validity, false);
  const g = e.g;
  const sp = e.split;
  const millerC = 2 * g.miller * sp.couple;
  const cap: ClassCapacitance = {
    areaFPerM: sp.area,
    fringeFPerM: sp.ground - sp.area,
    couplingMillerFPerM: millerC,
    couplingEachFPerM: sp.couple,
    totalFPerM: e.cPerM,
    model: e.capKind,
    effectiveK: effectiveKOf(e),
  };
  const L = g.lengthM;
  const rPerM = e.rPerM;
  const cPerM = e.cPerM;
  const R = rPerM * L;
  const C = cPerM * L;
  const rd = e.rd;
  const rdv = rd + e.via;
  const cl = e.cl;
  const exact = e.exact;
  const d = lineDelayUnchecked(R, C, rdv, cl, exact);
  const delayS = level === "ideal" ? (exact ? d.t50S : d.intrinsicS) : d.t50S;
  if (!Number.isFinite(delayS) || !Number.isFinite(d.elmoreS)) {
    throw new RangeError(`${wc.name}: the delay is not finite (check the class's sizes, length, driverOhm and loadF)`);
  }
  const r0 = e.r0;
  const c0 = e.c0;
  const gamma = e.gamma;
  repeatedNetInto(R, C, rdv, cl, r0, c0, gamma, e.minGain, exact, NET);
  const k = NET[0]!;
  const hChosen = NET[1]!;
  const repeatedDelay = NET[2]!;
  const a = REPEATER_A;
  const b = REPEATER_B;
  const rc0 = r0 * c0;
  const hStar = Math.sqrt((r0 * C) / (R * c0));
  const repeaters = {
    inserted: k,
    stageCount: k + 1,
    unrepeatedDelayS: delayS,
    count: k + 1,
    size: k > 0 ? hChosen : hStar,
    delayS: k > 0 ? repeatedDelay : delayS,
    delayPerMS: (2 * (a + Math.sqrt(a * b)) * Math.sqrt(rc0 * R * C)) / L,
    criticalLengthM: L * Math.sqrt((2 * a * rc0) / (b * R * C)),
  };
  const v = settings.supplyV;
  const repCPerSize = c0 * (1 + gamma);
  const repeaterEnergyJ = k * hChosen * repCPerSize * (v * v);
  const energyJ = energyUnchecked(C, cl, v) + repeaterEnergyJ;
  const hasHist = bins !== undefined;
  const distribution = distributionCore(
    !withDistribution ? [] : hasHist ? bins : [{ lengthM: wc.meanLengthM, count: wc.netCount }],
    g.sL,
    hasHist ? "histogram" : "mean",
    rPerM,
    cPerM,
    rdv,
    cl,
    r0,
    c0,
    tech.delayBudgetS,
    stats,
    exact,
    gamma,
    e.minGain,
  );
  const sizeSum = withDistribution ? distribution.totalRepeaterSize : wc.netCount * k * hChosen;
  const repTotalEnergy = sizeSum * repCPerSize * (v * v);
  // Energy over the distribution's nets: (Σ wire C + nets·CL + Σ k·h·C0·(1 + γ))·V²; equals netCount·energyJ at the mean length.
  const totalEnergyJ = withDistribution
    ? energyUnchecked(distribution.totalCapacitanceF, distribution.totalNets * cl, v) + repTotalEnergy
    : wc.netCount * energyJ;
  const leakage = sizeSum * (tech.repeaterLeakageW ?? 0);
  const powerW = powerUnchecked(totalEnergyJ, wc.activity, tech.clockHz) + leakage;
  const repeaterPowerW = powerUnchecked(repTotalEnergy, wc.activity, tech.clockHz) + leakage;
  const areaMin = tech.repeaterAreaM2 ?? DEFAULT_REPEATER_AREA_M2;
  const twoPlanes = g.ildBelowM !== null && g.ildAboveM !== null;
  const model: DelayModel = exact ? "exact" : "sakurai";
  return {
    name: wc.name,
    tier: wc.tier,
    widthM: g.widthM,
    thicknessM: g.thicknessM,
    spacingM: g.spacingM,
    ildBelowM: g.ildBelowM,
    ildAboveM: g.ildAboveM,
    barrierM: g.barrierM,
    pitchM: g.widthM + g.spacingM,
    lengthM: L,
    metal: e.metal.id,
    k: g.k,
    airGap: hasAirGap(g) ? { kGap: g.kGap, gapFraction: g.gapFraction } : null,
    resistivityOhmM: e.rho,
    rOhmPerM: rPerM,
    capacitance: cap,
    cFPerM: cPerM,
    rOhm: R,
    cF: C,
    rcS: R * C,
    intrinsicDelayS: d.intrinsicS,
    delayS,
    elmoreS: d.elmoreS,
    repeaters,
    driverOhm: rd,
    loadF: cl,
    energyJ,
    totalEnergyJ,
    powerW,
    temperatureC: e.tempC,
    delayModel: model,
    viaOhm: e.via,
    repeaterCount: k,
    repeaterSize: repeaters.size,
    repeatedDelayS: repeaters.delayS,
    stageCount: k + 1,
    repeaterAreaM2: k * hChosen * areaMin,
    repeaterEnergyJ,
    totalRepeaterAreaM2: sizeSum * areaMin,
    repeaterPowerW,
    distribution,
    validity: dedupeFlags(validity),
    accuracy: ACCURACY[accuracyKey(level, e.capKind, twoPlanes, e.capKind === "accurate" && hasAirGap(g), model)] as Record<string, string>,
  };
}

function zeroTotals(): EvaluationTotals {
  return { capacitanceF: 0, energyJ: 0, powerW: 0, repeaters: 0, worstDelayS: 0, meanDelayS: 0, repeaterAreaM2: 0, repeaterPowerW: 0, repeaterPowerShare: 0 };
}

/**
 * Evaluates every class at the scenario and at the baseline (baselineSettings at the same level, with the
 * scenario's Miller factor), with scenario/baseline ratios and totals. Totals: capacitanceF = Σ wire capacitance
 * over all nets; energyJ = Σ nets × energy per transition; powerW = Σ class power; repeaters = Σ inserted
 * repeaters; worstDelayS = the longest net's delay; meanDelayS = net-weighted mean delay.
 */
export function evaluateScenario(p: { classes: WireClass[]; technology: Technology; settings: ScenarioSettings }): Evaluation {
  checkTechnology(p.technology);
  checkSettings(p.settings);
  for (const wc of p.classes) checkWireClass(wc);
  const base = baselineSettings(p.settings.level, p.technology);
  base.miller = p.settings.miller;
  const classes: ClassComparison[] = new Array(p.classes.length);
  const tb = zeroTotals();
  const ts = zeroTotals();
  let nb = 0;
  let ns = 0;
  for (let i = 0; i < p.classes.length; i++) {
    const wc = p.classes[i]!;
    const bins = evaluatedBins(wc);
    const b = evaluateClassCore(wc, p.technology, base, true, WORST_B, bins);
    const s = evaluateClassCore(wc, p.technology, p.settings, true, WORST_S, bins);
    classes[i] = {
      name: wc.name,
      baseline: b,
      scenario: s,
      ratio: {
        rOhmPerM: s.rOhmPerM / b.rOhmPerM,
        cFPerM: s.cFPerM / b.cFPerM,
        rOhm: s.rOhm / b.rOhm,
        cF: s.cF / b.cF,
        rcS: s.rcS / b.rcS,
        delayS: s.delayS / b.delayS,
        repeaters: s.repeaters.count / b.repeaters.count,
        energyJ: s.energyJ / b.energyJ,
      },
    };
    nb += addTotals(tb, b, WORST_B[0]!);
    ns += addTotals(ts, s, WORST_S[0]!);
  }
  tb.meanDelayS = nb > 0 ? tb.meanDelayS / nb : 0;
  ts.meanDelayS = ns > 0 ? ts.meanDelayS / ns : 0;
  tb.repeaterPowerShare = tb.powerW > 0 ? tb.repeaterPowerW / tb.powerW : 0;
  ts.repeaterPowerShare = ts.powerW > 0 ? ts.repeaterPowerW / ts.powerW : 0;
  return { engineVersion: ENGINE_VERSION, level: p.settings.level, classes, totals: { baseline: tb, scenario: ts } };
}

const WORST_B = new Float64Array(1);
const WORST_S = new Float64Array(1);

/** Adds one class result to the totals; `worstDelayS` is the class's largest delay over bins with nets. */
function addTotals(t: EvaluationTotals, r: ClassResult, worstDelayS: number): number {
  const d = r.distribution;
  t.repeaterAreaM2 += r.totalRepeaterAreaM2;
  t.repeaterPowerW += r.repeaterPowerW;
  t.capacitanceF += d.totalCapacitanceF;
  t.energyJ += r.totalEnergyJ;
  t.powerW += r.powerW;
  t.repeaters += d.totalRepeaters;
  if (worstDelayS > t.worstDelayS) t.worstDelayS = worstDelayS;
  t.meanDelayS += d.meanDelayS * d.totalNets;
  return d.totalNets;
}

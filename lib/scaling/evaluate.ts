/**
 * Evaluation of wire classes under a scenario: geometry → capacitance → resistance → delay, repeaters,
 * energy and the length distribution, with validity flags and accuracy statements. SI units.
 */
import { getMetal, type Metal } from "./materials";
import { CAPACITANCE_ACCURACY, closedForm, closedFormFlags, type Split } from "./capacitance";
import { ENGINE_VERSION, EPSILON_0_F_PER_M } from "./constants";
import { lineDelayUnchecked, t50Unchecked } from "./delay";
import { distributionCore } from "./distribution";
import { energyUnchecked, powerUnchecked } from "./energy";
import { coarsenHistogram } from "./histogram";
import { REPEATER_ACCURACY, optimalRepeatersUnchecked } from "./repeaters";
import { RESISTIVITY_ACCURACY, sizeEffectFactor, sizeEffectFlags } from "./resistance";
import type {
  CapacitanceModel,
  CapacitanceParts,
  ClassComparison,
  ClassResult,
  Evaluation,
  LengthBin,
  ModelLevel,
  ScenarioSettings,
  Technology,
  ValidityFlag,
  WireClass,
} from "./types";
import { newScaledClass, scaleClassInto, type ScaledClass } from "./scale";
import { checkSettings, checkTechnology, checkWireClass, dedupeFlags } from "./validity";

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
  ideal: "0.377·RC of the open-ended distributed line (exact 0.3787·RC, −0.5%); no driver or load",
  other: "Sakurai form 0.377·RC + 0.693·(Rd·C + Rd·CL + R·CL): 0.5–3.2% low against ngspice on a 200-section RC ladder (measured)",
} as const;

function accuracyFor(level: ModelLevel, twoPlanes: boolean): Record<string, string> {
  const cap = CAPACITANCE_ACCURACY[CAP_MODEL[level]];
  return {
    capacitance: twoPlanes && level !== "ideal" ? `${cap}; two planes: Cohn's thick strip with the fitted two-plane split` : cap,
    resistivity: level === "full" ? RESISTIVITY_ACCURACY.sizeEffect : RESISTIVITY_ACCURACY.bulk,
    delay: level === "ideal" ? DELAY_ACCURACY.ideal : DELAY_ACCURACY.other,
    repeaters: REPEATER_ACCURACY,
  };
}

// Shared, frozen accuracy records (one per level and plane count) keep the hot path free of allocations.
const ACCURACY1: Record<ModelLevel, Readonly<Record<string, string>>> = {
  ideal: Object.freeze(accuracyFor("ideal", false)),
  fringe: Object.freeze(accuracyFor("fringe", false)),
  coupled: Object.freeze(accuracyFor("coupled", false)),
  full: Object.freeze(accuracyFor("full", false)),
};
const ACCURACY2: Record<ModelLevel, Readonly<Record<string, string>>> = {
  ideal: Object.freeze(accuracyFor("ideal", true)),
  fringe: Object.freeze(accuracyFor("fringe", true)),
  coupled: Object.freeze(accuracyFor("coupled", true)),
  full: Object.freeze(accuracyFor("full", true)),
};

/**
 * Evaluates one class at one scenario. Level `ideal`: parallel plate, bulk resistivity, barrier scaled with S,
 * delay 0.377·RC with no driver or load (energy without load). Other levels: driver × deviceRFactor, load ×
 * deviceCFactor, Sakurai delay, Elmore delay; `full` adds size-effect resistivity. Repeaters use R0 × deviceRFactor
 * and C0 × deviceCFactor. A histogram over MAX_EVALUATED_BINS bins is merged first (coarsenHistogram).
 * Throws RangeError on impossible input (including a barrier that fills the scaled line).
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
  /** Geometry and options after scaling (scaleClassInto, the one implementation of the scaling rules). */
  g: ScaledClass;
  metal: Metal;
  rho: number;
  rPerM: number;
  cPerM: number;
  rd: number;
  cl: number;
  r0: number;
  c0: number;
  split: Split;
}

function newElectrical(): Electrical {
  return {
    g: newScaledClass(),
    metal: getMetal("Cu"),
    rho: 0,
    rPerM: 0,
    cPerM: 0,
    rd: 0,
    cl: 0,
    r0: 0,
    c0: 0,
    split: { area: 0, ground: 0, couple: 0 },
  };
}

/**
 * Geometry → C, R per length, driver and load of one class at one scenario, into `e` (no allocation, no flags:
 * the same code serves the sweep and the evaluation; validityInto adds the flags where a result needs them).
 */
function electricalInto(wc: WireClass, tech: Technology, settings: ScenarioSettings, e: Electrical): void {
  const level = settings.level;
  const g = scaleClassInto(wc, settings, e.g);
  const w = g.widthM;
  const t = g.thicknessM;
  const bar = g.barrierM;
  const hb = g.ildBelowM;
  const ha = g.ildAboveM;
  const metal = g.metal === e.metal.id ? e.metal : getMetal(g.metal);
  // a lone plane above is treated as the plane (mirror symmetry)
  closedForm(CAP_MODEL[level] as ClosedFormModel, EPSILON_0_F_PER_M * g.k, w, t, g.spacingM, hb ?? (ha as number), hb === null ? null : ha, e.split);
  const wCond = w - 2 * bar;
  const hCond = t - bar;
  if (!(wCond > 0 && hCond > 0)) {
    throw new RangeError(`barrierM must be < widthM/2 and < thicknessM after scaling (got barrier ${bar}, width ${w}, thickness ${t} in class ${wc.name})`);
  }
  let rho = metal.resistivityOhmM;
  if (level === "full") rho *= sizeEffectFactor(metal, wCond, hCond);
  const ideal = level === "ideal";
  e.metal = metal;
  e.rho = rho;
  e.rPerM = rho / (wCond * hCond);
  e.cPerM = e.split.ground + 2 * g.miller * e.split.couple;
  e.rd = ideal ? 0 : wc.driverOhm * settings.deviceRFactor;
  e.cl = ideal ? 0 : wc.loadF * settings.deviceCFactor;
  e.r0 = tech.repeaterR0Ohm * settings.deviceRFactor;
  e.c0 = tech.repeaterC0F * settings.deviceCFactor;
}

type ClosedFormModel = "ideal" | "fringe" | "coupled";

/** The validity flags of the models electricalInto used for `e` (once per class result). */
function validityInto(level: ModelLevel, e: Electrical, validity: ValidityFlag[]): void {
  const g = e.g;
  const hb = g.ildBelowM;
  const ha = g.ildAboveM;
  closedFormFlags(CAP_MODEL[level] as ClosedFormModel, g.widthM, g.thicknessM, g.spacingM, hb ?? (ha as number), hb === null ? null : ha, validity);
  if (level === "full") sizeEffectFlags(e.metal, g.widthM - 2 * g.barrierM, g.thicknessM - g.barrierM, validity);
}

const SWEEP_SCRATCH = newElectrical();
const CLASS_SCRATCH = newElectrical();

/**
 * One sweep metric of a class at its scaled mean length (delay: delayS, rc: rcS, r: rOhm, c: cF), with no result
 * objects or flags: the sweep's hot path. Same numbers as evaluateClassCore.
 */
export function classMetricCore(wc: WireClass, tech: Technology, settings: ScenarioSettings, metric: "delay" | "rc" | "r" | "c"): number {
  const e = SWEEP_SCRATCH;
  electricalInto(wc, tech, settings, e);
  const L = e.g.lengthM;
  const R = e.rPerM * L;
  const C = e.cPerM * L;
  if (metric === "r") return R;
  if (metric === "c") return C;
  if (metric === "rc") return R * C;
  return t50Unchecked(R, C, e.rd, e.cl); // rd = cl = 0 at level ideal: 0.377·RC
}

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
  electricalInto(wc, tech, settings, e);
  validityInto(level, e, validity);
  const g = e.g;
  const sp = e.split;
  const cap: CapacitanceParts = {
    areaFPerM: sp.area,
    fringeFPerM: sp.ground - sp.area,
    couplingFPerM: 2 * g.miller * sp.couple,
    totalFPerM: e.cPerM,
    couplingPerNeighbourFPerM: sp.couple,
    model: CAP_MODEL[level],
  };
  const L = g.lengthM;
  const rPerM = e.rPerM;
  const cPerM = e.cPerM;
  const R = rPerM * L;
  const C = cPerM * L;
  const rd = e.rd;
  const cl = e.cl;
  const d = lineDelayUnchecked(R, C, rd, cl);
  const delayS = level === "ideal" ? d.intrinsicS : d.t50S;
  const repeaters = optimalRepeatersUnchecked(R, C, L, e.r0, e.c0, delayS);
  const v = settings.supplyV;
  const energyJ = energyUnchecked(C, cl, v);
  const hasHist = bins !== undefined;
  const distribution = distributionCore(
    !withDistribution ? [] : hasHist ? bins : [{ lengthM: wc.meanLengthM, count: wc.netCount }],
    g.sL,
    hasHist ? "histogram" : "mean",
    rPerM,
    cPerM,
    rd,
    cl,
    e.r0,
    e.c0,
    tech.delayBudgetS,
    stats,
  );
  // Energy over the distribution's nets: (Σ wire C + nets·CL)·V²; equals netCount·energyJ at the mean length.
  const totalEnergyJ = withDistribution ? energyUnchecked(distribution.totalCapacitanceF, distribution.totalNets * cl, v) : wc.netCount * energyJ;
  const powerW = powerUnchecked(totalEnergyJ, wc.activity, tech.clockHz);
  const twoPlanes = g.ildBelowM !== null && g.ildAboveM !== null;
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
    distribution,
    validity: dedupeFlags(validity),
    accuracy: (twoPlanes ? ACCURACY2 : ACCURACY1)[level] as Record<string, string>,
  };
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
  const tb = { capacitanceF: 0, energyJ: 0, powerW: 0, repeaters: 0, worstDelayS: 0, meanDelayS: 0 };
  const ts = { capacitanceF: 0, energyJ: 0, powerW: 0, repeaters: 0, worstDelayS: 0, meanDelayS: 0 };
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
  return { engineVersion: ENGINE_VERSION, level: p.settings.level, classes, totals: { baseline: tb, scenario: ts } };
}

const WORST_B = new Float64Array(1);
const WORST_S = new Float64Array(1);

/** Adds one class result to the totals; `worstDelayS` is the class's largest delay over bins with nets. */
function addTotals(t: Evaluation["totals"]["baseline"], r: ClassResult, worstDelayS: number): number {
  const d = r.distribution;
  t.capacitanceF += d.totalCapacitanceF;
  t.energyJ += r.totalEnergyJ;
  t.powerW += r.powerW;
  t.repeaters += d.totalRepeaters;
  if (worstDelayS > t.worstDelayS) t.worstDelayS = worstDelayS;
  t.meanDelayS += d.meanDelayS * d.totalNets;
  return d.totalNets;
}

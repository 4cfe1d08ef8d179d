/**
 * Evaluation of wire classes under a scenario: geometry → capacitance → resistance → delay, repeaters,
 * energy and the length distribution, with validity flags and accuracy statements. SI units.
 */
import { getMetal, type Metal } from "../../scaling/materials";
import { CAPACITANCE_ACCURACY, closedFormInto, type Split } from "./capacitance";
import { ENGINE_VERSION, EPSILON_0_F_PER_M, LN2, SAKURAI_DISTRIBUTED_COEFF } from "./constants";
import { lineDelayUnchecked } from "./delay";
import { classDistribution } from "./distribution";
import { REPEATER_ACCURACY, optimalRepeatersUnchecked } from "./repeaters";
import { RESISTIVITY_ACCURACY, sizeEffectFactor, sizeEffectFlags } from "./resistance";
import type {
  CapacitanceModel, CapacitanceParts, ClassComparison, ClassResult, Evaluation, ModelLevel, ScenarioSettings, Technology, ValidityFlag, WireClass,
} from "./types";
import { checkSettings, checkTechnology, checkWireClass, dedupeFlags } from "./validity";

/**
 * Invented default technology (not from any process): 0.75 V, 2 GHz, minimum repeater R0 = 6 kΩ and
 * C0 = 0.25 fF (R0·C0 = 1.5 ps), delay budget 100 ps.
 */
export function defaultTechnology(): Technology {
  return { supplyV: 0.75, clockHz: 2e9, repeaterR0Ohm: 6000, repeaterC0F: 0.25e-15, delayBudgetS: 100e-12 };
}

/** Settings of the baseline itself: S = S_L = 1, no overrides, factors 1, Miller 1, barrier scales except at `full`. */
export function baselineSettings(level: ModelLevel, tech: Technology): ScenarioSettings {
  return {
    s: 1, sL: 1, level, barrierScales: level !== "full", miller: 1, deviceRFactor: 1, deviceCFactor: 1,
    supplyV: tech.supplyV, k: null, metal: null, overrides: {},
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
  ideal: Object.freeze(accuracyFor("ideal", false)), fringe: Object.freeze(accuracyFor("fringe", false)),
  coupled: Object.freeze(accuracyFor("coupled", false)), full: Object.freeze(accuracyFor("full", false)),
};
const ACCURACY2: Record<ModelLevel, Readonly<Record<string, string>>> = {
  ideal: Object.freeze(accuracyFor("ideal", true)), fringe: Object.freeze(accuracyFor("fringe", true)),
  coupled: Object.freeze(accuracyFor("coupled", true)), full: Object.freeze(accuracyFor("full", true)),
};

/**
 * Evaluates one class at one scenario. Level `ideal`: parallel plate, bulk resistivity, barrier scaled with S,
 * delay 0.377·RC with no driver or load (energy without load). Other levels: driver × deviceRFactor, load ×
 * deviceCFactor, Sakurai delay, Elmore delay; `full` adds size-effect resistivity. Repeaters use R0 × deviceRFactor
 * and C0 × deviceCFactor. Throws RangeError on impossible input (including a barrier that fills the scaled line).
 */
export function evaluateClass(p: { wireClass: WireClass; technology: Technology; settings: ScenarioSettings }): ClassResult {
  checkTechnology(p.technology);
  checkSettings(p.settings);
  checkWireClass(p.wireClass);
  return evaluateClassCore(p.wireClass, p.technology, p.settings, true);
}

/** Scratch state of one class's electrical evaluation (reused on the sweep's hot path). */
interface Electrical {
  w: number; t: number; sp: number; hb: number | null; ha: number | null; bar: number; sL: number; L: number;
  metal: Metal; k: number; miller: number; rho: number; rPerM: number; cPerM: number; rd: number; cl: number; r0: number; c0: number;
  split: Split;
}

function newElectrical(): Electrical {
  return {
    w: 0, t: 0, sp: 0, hb: null, ha: null, bar: 0, sL: 1, L: 0, metal: getMetal("Cu"), k: 1, miller: 1, rho: 0, rPerM: 0, cPerM: 0,
    rd: 0, cl: 0, r0: 0, c0: 0, split: { area: 0, ground: 0, couple: 0 },
  };
}

/** Geometry → C, R per length, driver and load of one class at one scenario, into `e` (no allocation). */
function electricalInto(wc: WireClass, tech: Technology, settings: ScenarioSettings, e: Electrical, validity: ValidityFlag[] | null): void {
  const level = settings.level;
  const o = settings.overrides[wc.name];
  const s = o?.s ?? settings.s;
  const sL = o?.sL ?? settings.sL;
  const w = wc.widthM / s;
  const t = o?.aspectRatio !== undefined ? o.aspectRatio * w : wc.thicknessM / s;
  const barrierScales = level === "ideal" ? true : (o?.barrierScales ?? settings.barrierScales);
  const bar = o?.barrierM !== undefined ? o.barrierM : barrierScales ? wc.barrierM / s : wc.barrierM;
  const hb = wc.ildBelowM === null ? null : wc.ildBelowM / s;
  const ha = wc.ildAboveM === null ? null : wc.ildAboveM / s;
  const sp = wc.spacingM / s;
  const k = o?.k ?? settings.k ?? wc.k;
  const miller = o?.miller ?? settings.miller;
  const metalId = o?.metal ?? settings.metal ?? wc.metal;
  const metal = metalId === e.metal.id ? e.metal : getMetal(metalId);
  // a lone plane above is treated as the plane (mirror symmetry)
  closedFormInto(CAP_MODEL[level] as "ideal" | "fringe" | "coupled", EPSILON_0_F_PER_M * k, w, t, sp, hb ?? (ha as number), hb === null ? null : ha, e.split, validity);
  const wCond = w - 2 * bar;
  const hCond = t - bar;
  if (!(wCond > 0 && hCond > 0)) {
    throw new RangeError(`barrierM must be < widthM/2 and < thicknessM after scaling (got barrier ${bar}, width ${w}, thickness ${t} in class ${wc.name})`);
  }
  let rho = metal.resistivityOhmM;
  if (level === "full") {
    rho *= sizeEffectFactor(metal, wCond, hCond);
    if (validity !== null) sizeEffectFlags(metal, wCond, hCond, validity);
  }
  const ideal = level === "ideal";
  e.w = w; e.t = t; e.sp = sp; e.hb = hb; e.ha = ha; e.bar = bar; e.sL = sL; e.L = wc.meanLengthM / sL;
  e.metal = metal; e.k = k; e.miller = miller; e.rho = rho;
  e.rPerM = rho / (wCond * hCond);
  e.cPerM = e.split.ground + 2 * miller * e.split.couple;
  e.rd = ideal ? 0 : wc.driverOhm * settings.deviceRFactor;
  e.cl = ideal ? 0 : wc.loadF * settings.deviceCFactor;
  e.r0 = tech.repeaterR0Ohm * settings.deviceRFactor;
  e.c0 = tech.repeaterC0F * settings.deviceCFactor;
}

const SWEEP_SCRATCH = newElectrical();

/**
 * One sweep metric of a class at its scaled mean length (delay: delayS, rc: rcS, r: rOhm, c: cF), with no result
 * objects or flags: the sweep's hot path. Same numbers as evaluateClassCore.
 */
export function classMetricCore(wc: WireClass, tech: Technology, settings: ScenarioSettings, metric: "delay" | "rc" | "r" | "c"): number {
  const e = SWEEP_SCRATCH;
  electricalInto(wc, tech, settings, e, null);
  const R = e.rPerM * e.L;
  const C = e.cPerM * e.L;
  if (metric === "r") return R;
  if (metric === "c") return C;
  if (metric === "rc") return R * C;
  return SAKURAI_DISTRIBUTED_COEFF * R * C + (settings.level === "ideal" ? 0 : LN2 * (e.rd * C + e.rd * e.cl + R * e.cl));
}

/** evaluateClass without the input checks; `withDistribution` false skips the histogram. */
export function evaluateClassCore(wc: WireClass, tech: Technology, settings: ScenarioSettings, withDistribution: boolean): ClassResult {
  const level = settings.level;
  const validity: ValidityFlag[] = [];
  const e = newElectrical();
  electricalInto(wc, tech, settings, e, validity);
  const sp = e.split;
  const cap: CapacitanceParts = {
    areaFPerM: sp.area, fringeFPerM: sp.ground - sp.area, couplingFPerM: 2 * e.miller * sp.couple, totalFPerM: e.cPerM,
    couplingPerNeighbourFPerM: sp.couple, model: CAP_MODEL[level],
  };
  const L = e.L;
  const rPerM = e.rPerM;
  const cPerM = e.cPerM;
  const R = rPerM * L;
  const C = cPerM * L;
  const rd = e.rd;
  const cl = e.cl;
  const d = lineDelayUnchecked(R, C, rd, cl);
  const repeaters = optimalRepeatersUnchecked(R, C, L, e.r0, e.c0);
  const v2 = settings.supplyV * settings.supplyV;
  const energyJ = (C + cl) * v2;
  const hasHist = wc.histogram !== undefined && wc.histogram.length > 0;
  const distribution = classDistribution({
    bins: !withDistribution ? [] : hasHist ? wc.histogram! : [{ lengthM: wc.meanLengthM, count: wc.netCount }],
    lengthDivisor: e.sL,
    source: hasHist ? "histogram" : "mean", rOhmPerM: rPerM, cFPerM: cPerM, driverOhm: rd, loadF: cl, r0Ohm: e.r0, c0F: e.c0, delayBudgetS: tech.delayBudgetS,
  });
  // Energy over the distribution's nets: V²·(Σ wire C + nets·CL); equals netCount·energyJ at the mean length.
  const totalEnergyJ = withDistribution ? v2 * (distribution.totalCapacitanceF + distribution.totalNets * cl) : wc.netCount * energyJ;
  const powerW = 0.5 * wc.activity * tech.clockHz * totalEnergyJ;
  const twoPlanes = e.hb !== null && e.ha !== null;
  return {
    name: wc.name,
    tier: wc.tier,
    widthM: e.w,
    thicknessM: e.t,
    spacingM: e.sp,
    ildBelowM: e.hb,
    ildAboveM: e.ha,
    barrierM: e.bar,
    pitchM: e.w + e.sp,
    lengthM: L,
    metal: e.metal.id,
    k: e.k,
    resistivityOhmM: e.rho,
    rOhmPerM: rPerM,
    capacitance: cap,
    cFPerM: cPerM,
    rOhm: R,
    cF: C,
    rcS: R * C,
    intrinsicDelayS: d.intrinsicS,
    delayS: level === "ideal" ? d.intrinsicS : d.t50S,
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
    const b = evaluateClassCore(wc, p.technology, base, true);
    const s = evaluateClassCore(wc, p.technology, p.settings, true);
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
    nb += addTotals(tb, b);
    ns += addTotals(ts, s);
  }
  tb.meanDelayS = nb > 0 ? tb.meanDelayS / nb : 0;
  ts.meanDelayS = ns > 0 ? ts.meanDelayS / ns : 0;
  return { engineVersion: ENGINE_VERSION, level: p.settings.level, classes, totals: { baseline: tb, scenario: ts } };
}

function addTotals(t: Evaluation["totals"]["baseline"], r: ClassResult): number {
  const d = r.distribution;
  t.capacitanceF += d.totalCapacitanceF;
  t.energyJ += r.totalEnergyJ;
  t.powerW += r.powerW;
  t.repeaters += d.totalRepeaters;
  for (const bin of d.bins) if (bin.count > 0 && bin.delayS > t.worstDelayS) t.worstDelayS = bin.delayS;
  t.meanDelayS += d.meanDelayS * d.totalNets;
  return d.totalNets;
}

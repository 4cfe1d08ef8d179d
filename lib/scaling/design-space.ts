/**
 * Design-space exploration of one wire class at a scenario: the fixed-pitch optimiser (line fraction W/pitch ×
 * aspect ratio T/W), the delay split into its parts, a ±10% tornado of the inputs, and Monte Carlo process variation
 * with fast/slow corners. Pure and deterministic; every figure comes from evaluateClassCore (the engine's own model).
 *
 * Every function first "flattens" the class: the scenario's scaling (S, S_L, overrides, k, metal, air gap, Miller) is
 * applied once (scaleClass), giving a class at S = 1 with the same result (tests/scaling/design-space.test.ts checks it).
 * Its vias keep their scaled geometry (explicit via width and height, or the scaled measured resistance): changing
 * the line's width or the ILD in this module does not change the vias.
 */
import { getMetal } from "./materials";
import { evaluateClassCore } from "./evaluate";
import { scaleClass } from "./scale";
import { checkSettings, checkTechnology, checkWireClass } from "./validity";
import { ownEntry } from "./own";
import type { ClassResult, ScenarioSettings, Technology, WireClass } from "./types";

export type DesignObjective = "delay" | "repeated" | "energy" | "edp";
export const DESIGN_OBJECTIVES: readonly DesignObjective[] = ["delay", "repeated", "energy", "edp"];

/** The class of a base input: the scenario applied once (see the module comment). */
interface Flat {
  wc: WireClass;
  tech: Technology;
  settings: ScenarioSettings;
}

function findClass(classes: WireClass[] | WireClass, className?: string): WireClass {
  if (!Array.isArray(classes)) return classes;
  const wc = classes.find((c) => c.name === className);
  if (wc === undefined) throw new RangeError(`className: no class named "${String(className)}" (have ${classes.map((c) => c.name).join(", ")})`);
  return wc;
}

/** The class at S = 1 with the scenario applied (same result as the class at the scenario). */
export function flattenClass(wc: WireClass, tech: Technology, settings: ScenarioSettings): Flat {
  checkTechnology(tech);
  checkSettings(settings);
  checkWireClass(wc);
  const g = scaleClass(wc, settings);
  const s = g.s;
  const flat: WireClass = {
    name: wc.name,
    tier: wc.tier,
    widthM: g.widthM,
    thicknessM: g.thicknessM,
    spacingM: g.spacingM,
    ildBelowM: g.ildBelowM,
    ildAboveM: g.ildAboveM,
    barrierM: g.barrierM,
    metal: g.metal,
    k: g.k,
    netCount: wc.netCount,
    meanLengthM: g.lengthM,
    driverOhm: wc.driverOhm,
    loadF: wc.loadF,
    activity: wc.activity,
  };
  if (g.gapFraction > 0 && g.kGap < g.k) {
    flat.kGap = g.kGap;
    flat.gapFraction = g.gapFraction;
  }
  const n = wc.viasPerNet ?? 0;
  if (n > 0) {
    flat.viasPerNet = n;
    if (wc.viaOhm !== undefined) {
      const h0 = wc.ildBelowM ?? (wc.ildAboveM as number);
      const h1 = g.ildBelowM ?? (g.ildAboveM as number);
      const r = wc.widthM / g.widthM;
      flat.viaOhm = wc.viaOhm * (h1 / h0) * r * r;
    } else {
      flat.viaWidthM = (wc.viaWidthM ?? wc.widthM) / s;
      flat.viaHeightM = (wc.viaHeightM ?? wc.ildBelowM ?? (wc.ildAboveM as number)) / s;
    }
  }
  const st: ScenarioSettings = {
    s: 1,
    sL: 1,
    level: settings.level,
    barrierScales: false,
    miller: g.miller,
    deviceRFactor: settings.deviceRFactor,
    deviceCFactor: settings.deviceCFactor,
    supplyV: settings.supplyV,
    k: null,
    metal: null,
    overrides: {},
  };
  if (settings.temperatureC !== undefined) st.temperatureC = settings.temperatureC;
  return { wc: flat, tech, settings: st };
}

/** One evaluation of a flattened class (no distribution). */
function evalFlat(f: Flat, wc: WireClass = f.wc, tech: Technology = f.tech): ClassResult {
  return evaluateClassCore(wc, tech, f.settings, false, undefined, undefined);
}

/** The objective of a result: delay = the net's 50% delay with its repeaters, repeated = delay per m of the optimally repeated line, energy = energy per transition, edp = energy × delay. */
export function objectiveOf(r: ClassResult, objective: DesignObjective): number {
  switch (objective) {
    case "delay":
      return r.repeaters.delayS;
    case "repeated":
      return r.repeaters.delayPerMS;
    case "energy":
      return r.energyJ;
    case "edp":
      return r.energyJ * r.repeaters.delayS;
  }
}

// ---------------------------------------------------------------- optimiser

export interface OptimizeInput {
  /** The class, or all classes with className naming one. */
  wireClass: WireClass | WireClass[];
  className?: string;
  technology: Technology;
  settings: ScenarioSettings;
  objective: DesignObjective;
  /** Line fraction W/pitch limits, default 0.3 and 0.7. */
  minFraction?: number;
  maxFraction?: number;
  /** Aspect ratio T/W limits, default 1 and 3. */
  minAspect?: number;
  maxAspect?: number;
  /** Smallest drawn width and space (m), at the scenario's pitch. */
  minWidthM?: number;
  minSpaceM?: number;
}

export interface OptimizeResult {
  widthM: number;
  thicknessM: number;
  spacingM: number;
  objectiveValue: number;
  lineFraction: number;
  aspectRatio: number;
  pitchM: number;
  objective: DesignObjective;
  /** The objective at the class's own (scenario) geometry, for comparison. */
  currentValue: number;
  /** Objective evaluations the search took. */
  evaluations: number;
}

interface Box {
  f: Flat;
  pitch: number;
  fMin: number;
  fMax: number;
  aMin: number;
  aMax: number;
  objective: DesignObjective;
}

function boxOf(p: OptimizeInput): Box {
  const wc = findClass(p.wireClass, p.className);
  if (!DESIGN_OBJECTIVES.includes(p.objective)) throw new RangeError(`objective must be delay, repeated, energy or edp (got ${String(p.objective)})`);
  const f = flattenClass(wc, p.technology, p.settings);
  const pitch = f.wc.widthM + f.wc.spacingM;
  const minF = p.minFraction ?? 0.3;
  const maxF = p.maxFraction ?? 0.7;
  const minA = p.minAspect ?? 1;
  const maxA = p.maxAspect ?? 3;
  if (!(minF > 0 && minF < 1)) throw new RangeError(`minFraction must be between 0 and 1 (got ${minF})`);
  if (!(maxF > 0 && maxF < 1)) throw new RangeError(`maxFraction must be between 0 and 1 (got ${maxF})`);
  if (!(minA > 0 && Number.isFinite(minA))) throw new RangeError(`minAspect must be > 0 (got ${minA})`);
  if (!(maxA > 0 && Number.isFinite(maxA))) throw new RangeError(`maxAspect must be > 0 (got ${maxA})`);
  if (p.minWidthM !== undefined && !(p.minWidthM >= 0)) throw new RangeError(`minWidthM must be >= 0 (got ${p.minWidthM})`);
  if (p.minSpaceM !== undefined && !(p.minSpaceM >= 0)) throw new RangeError(`minSpaceM must be >= 0 (got ${p.minSpaceM})`);
  const bar = f.wc.barrierM;
  // feasible: the width and space limits, and a conducting core inside the barrier (W > 2·barrier, T > barrier)
  const fMin = Math.max(minF, (p.minWidthM ?? 0) / pitch, (2 * bar) / pitch + 1e-9);
  const fMax = Math.min(maxF, 1 - (p.minSpaceM ?? 0) / pitch);
  if (!(fMin <= fMax))
    throw new RangeError(
      `minFraction: the limits leave no feasible line fraction at pitch ${pitch} m (from ${fMin.toPrecision(4)} to ${fMax.toPrecision(4)}; check minFraction, maxFraction, minWidthM, minSpaceM and the barrier)`,
    );
  const aMin = Math.max(minA, bar / (fMin * pitch) + 1e-9);
  if (!(aMin <= maxA)) throw new RangeError(`maxAspect: the limits leave no feasible aspect ratio (need at least ${aMin.toPrecision(4)} for the barrier)`);
  return { f, pitch, fMin, fMax, aMin, aMax: maxA, objective: p.objective };
}

/** The class with line fraction x and aspect ratio a at the box's pitch. */
function drawn(b: Box, x: number, a: number): WireClass {
  const w = x * b.pitch;
  return { ...b.f.wc, widthM: w, spacingM: b.pitch - w, thicknessM: a * w };
}

function valueAt(b: Box, x: number, a: number): number {
  const wc = drawn(b, x, a);
  if (!(wc.widthM - 2 * wc.barrierM > 0 && wc.thicknessM - wc.barrierM > 0)) return Infinity;
  const y = objectiveOf(evalFlat(b.f, wc), b.objective);
  return Number.isFinite(y) ? y : Infinity;
}

const GOLDEN = (Math.sqrt(5) - 1) / 2;

/** Golden-section minimum of g on [lo, hi] (bounded, `iters` steps); returns [x, g(x)] of the best point seen. */
function golden(g: (x: number) => number, lo: number, hi: number, iters: number, best: [number, number]): [number, number] {
  let a = lo;
  let b = hi;
  let x1 = b - GOLDEN * (b - a);
  let x2 = a + GOLDEN * (b - a);
  let g1 = g(x1);
  let g2 = g(x2);
  for (let i = 0; i < iters; i++) {
    if (g1 <= g2) {
      b = x2;
      x2 = x1;
      g2 = g1;
      x1 = b - GOLDEN * (b - a);
      g1 = g(x1);
    } else {
      a = x1;
      x1 = x2;
      g1 = g2;
      x2 = a + GOLDEN * (b - a);
      g2 = g(x2);
    }
  }
  if (g1 < best[1]) best = [x1, g1];
  if (g2 < best[1]) best = [x2, g2];
  for (const x of [lo, hi]) {
    const y = g(x);
    if (y < best[1]) best = [x, y];
  }
  return best;
}

/**
 * The line fraction W/pitch and aspect ratio T/W that minimise the objective at the class's (scenario's) pitch,
 * within the limits (line fraction minFraction..maxFraction, default 0.3–0.7; aspect minAspect..maxAspect, default
 * 1–3; width ≥ minWidthM, space ≥ minSpaceM; the barrier must leave a conducting core). ILD heights, barrier, k,
 * length, driver, load and vias stay as the scenario has them. Method: a 41 × 41 grid; around each of its 6 best
 * points, 6 levels of a 9 × 9 grid over ± one step of the level before (the step ÷ 4 each level: the objective jumps
 * where the repeater count changes, so the minimum often lies on such an edge, where a smooth line search stalls);
 * then 2 rounds of bounded golden-section search in each variable from the best point; the best point seen wins.
 * Deterministic. Throws RangeError naming the field when the limits leave no feasible geometry.
 */
export function optimizeClass(p: OptimizeInput): OptimizeResult {
  const b = boxOf(p);
  let evaluations = 0;
  const val = (x: number, a: number) => {
    evaluations++;
    return valueAt(b, x, a);
  };
  const N = 41;
  const dx = (b.fMax - b.fMin) / (N - 1);
  const da = (b.aMax - b.aMin) / (N - 1);
  const coarse: { x: number; a: number; y: number }[] = [];
  for (let i = 0; i < N; i++)
    for (let j = 0; j < N; j++) {
      const x = b.fMin + i * dx;
      const a = b.aMin + j * da;
      coarse.push({ x, a, y: val(x, a) });
    }
  coarse.sort((u, v) => u.y - v.y || u.x - v.x || u.a - v.a);
  if (!Number.isFinite(coarse[0]!.y)) throw new RangeError("minFraction: no geometry within the limits gives a finite result");
  let bx = coarse[0]!.x;
  let ba = coarse[0]!.a;
  let by = coarse[0]!.y;
  for (const start of coarse.slice(0, 6)) {
    if (!Number.isFinite(start.y)) break;
    let cx = start.x;
    let ca = start.a;
    let cy = start.y;
    let sx = dx;
    let sa = da;
    for (let level = 0; level < 6; level++) {
      const x0 = Math.max(b.fMin, cx - sx);
      const x1 = Math.min(b.fMax, cx + sx);
      const a0 = Math.max(b.aMin, ca - sa);
      const a1 = Math.min(b.aMax, ca + sa);
      for (let i = 0; i <= 8; i++)
        for (let j = 0; j <= 8; j++) {
          const x = x0 + ((x1 - x0) * i) / 8;
          const a = a0 + ((a1 - a0) * j) / 8;
          const y = val(x, a);
          if (y < cy) {
            cy = y;
            cx = x;
            ca = a;
          }
        }
      sx /= 4;
      sa /= 4;
    }
    if (cy < by) {
      by = cy;
      bx = cx;
      ba = ca;
    }
  }
  for (let round = 0; round < 2; round++) {
    const a0 = ba;
    let r = golden((x) => val(x, a0), Math.max(b.fMin, bx - dx), Math.min(b.fMax, bx + dx), 25, [bx, by]);
    bx = r[0];
    by = r[1];
    const x0 = bx;
    r = golden((a) => val(x0, a), Math.max(b.aMin, ba - da), Math.min(b.aMax, ba + da), 25, [ba, by]);
    ba = r[0];
    by = r[1];
  }
  const w = bx * b.pitch;
  return {
    widthM: w,
    thicknessM: ba * w,
    spacingM: b.pitch - w,
    objectiveValue: by,
    lineFraction: bx,
    aspectRatio: ba,
    pitchM: b.pitch,
    objective: b.objective,
    currentValue: objectiveOf(evalFlat(b.f), b.objective),
    evaluations,
  };
}

export interface GridPoint {
  lineFraction: number;
  aspectRatio: number;
  /** The net's 50% delay with its repeaters, s. */
  delayS: number;
  /** Energy per transition, J. */
  energyJ: number;
}

export interface ObjectiveGrid {
  objective: DesignObjective;
  pitchM: number;
  /** n line fractions (rows), evenly from the lowest feasible to the highest. */
  lineFractions: number[];
  /** m aspect ratios (columns). */
  aspectRatios: number[];
  /** values[i][j]: the objective at lineFractions[i], aspectRatios[j]; null where the geometry is not feasible. */
  values: (number | null)[][];
  /** The grid's points not dominated in (delay, energy): no other point has both lower or equal and one lower; sorted by delay. */
  pareto: GridPoint[];
  /** The best grid point of the objective. */
  best: GridPoint & { objectiveValue: number };
}

/** The objective over an n × m grid of line fraction × aspect ratio (the heat map), with the delay–energy Pareto front. */
export function objectiveGrid(p: OptimizeInput & { n?: number; m?: number }): ObjectiveGrid {
  const b = boxOf(p);
  const n = p.n ?? 40;
  const m = p.m ?? 40;
  if (!(Number.isInteger(n) && n >= 2 && n <= 400)) throw new RangeError(`n must be a whole number from 2 to 400 (got ${n})`);
  if (!(Number.isInteger(m) && m >= 2 && m <= 400)) throw new RangeError(`m must be a whole number from 2 to 400 (got ${m})`);
  const xs = Array.from({ length: n }, (_, i) => b.fMin + ((b.fMax - b.fMin) * i) / (n - 1));
  const as = Array.from({ length: m }, (_, j) => b.aMin + ((b.aMax - b.aMin) * j) / (m - 1));
  const values: (number | null)[][] = [];
  const pts: GridPoint[] = [];
  let best: (GridPoint & { objectiveValue: number }) | null = null;
  for (const x of xs) {
    const row: (number | null)[] = [];
    for (const a of as) {
      const wc = drawn(b, x, a);
      if (!(wc.widthM - 2 * wc.barrierM > 0 && wc.thicknessM - wc.barrierM > 0)) {
        row.push(null);
        continue;
      }
      const r = evalFlat(b.f, wc);
      const y = objectiveOf(r, b.objective);
      row.push(Number.isFinite(y) ? y : null);
      const pt = { lineFraction: x, aspectRatio: a, delayS: r.repeaters.delayS, energyJ: r.energyJ };
      pts.push(pt);
      if (Number.isFinite(y) && (best === null || y < best.objectiveValue)) best = { ...pt, objectiveValue: y };
    }
    values.push(row);
  }
  if (best === null) throw new RangeError("minFraction: no geometry within the limits gives a finite result");
  const sorted = [...pts].sort((u, v) => u.delayS - v.delayS || u.energyJ - v.energyJ);
  const pareto: GridPoint[] = [];
  let minE = Infinity;
  for (const q of sorted)
    if (q.energyJ < minE) {
      pareto.push(q);
      minE = q.energyJ;
    }
  return { objective: b.objective, pitchM: b.pitch, lineFractions: xs, aspectRatios: as, values, pareto, best };
}

// ---------------------------------------------------------------- what drives delay

export interface DelayParts {
  /** Driver (with the net's vias, lumped at the driver end) × wire capacitance, s. */
  driverWireS: number;
  /** Driver (with vias) × load, s. */
  driverLoadS: number;
  /** Wire resistance × wire capacitance (the Elmore R·C/2 term), s. */
  wireWireS: number;
  /** Wire resistance × load, s. */
  wireLoadS: number;
  /** What the repeaters change: the delay with repeaters minus without (≤ 0; 0 when none are inserted), s. */
  repeatersS: number;
  /** The sum: the engine's delay of the net with its repeaters (ClassResult.repeatedDelayS), s. */
  totalS: number;
  /** The engine's 50% delay of the net without repeaters (ClassResult.delayS), s. */
  unrepeatedS: number;
  /** The factor the Elmore terms are multiplied by: unrepeatedS / Elmore time constant. */
  scale: number;
}

/**
 * The class net's delay split into its parts. Decomposition: the Elmore time constant of driver Rd (+ vias) → line
 * (R, C) → load CL, T_D = Rd·C + Rd·CL + R·C/2 + R·CL (W. C. Elmore, J. Appl. Phys. 19, 1948), each term multiplied
 * by the same factor delayS / T_D so the four sum to the engine's 50% delay of the unrepeated net exactly (the engine's
 * delay is not a sum of terms: exact table or Sakurai's form); the repeaters part is the change repeaters make
 * (repeated − unrepeated). At level ideal there is no driver or load: the whole delay is the wire's. Sum = the engine's
 * repeated delay to rounding.
 */
export function delayParts(p: { wireClass: WireClass | WireClass[]; className?: string; technology: Technology; settings: ScenarioSettings }): DelayParts {
  const wc = findClass(p.wireClass, p.className);
  checkTechnology(p.technology);
  checkSettings(p.settings);
  checkWireClass(wc);
  const r = evaluateClassCore(wc, p.technology, p.settings, false, undefined, undefined);
  const rd = r.driverOhm + r.viaOhm;
  const R = r.rOhm;
  const C = r.cF;
  const cl = r.loadF;
  const terms = [rd * C, rd * cl, (R * C) / 2, R * cl];
  const td = terms[0]! + terms[1]! + terms[2]! + terms[3]!;
  const scale = td > 0 ? r.delayS / td : 0;
  const repeatersS = r.repeatedDelayS - r.delayS;
  return {
    driverWireS: terms[0]! * scale,
    driverLoadS: terms[1]! * scale,
    wireWireS: terms[2]! * scale,
    wireLoadS: terms[3]! * scale,
    repeatersS,
    totalS: r.repeatedDelayS,
    unrepeatedS: r.delayS,
    scale,
  };
}

export type TornadoInput =
  | "width"
  | "thickness"
  | "spacing"
  | "ildHeight"
  | "barrier"
  | "k"
  | "bulkResistivity"
  | "meanFreePath"
  | "specularity"
  | "grainReflection"
  | "length"
  | "driverR"
  | "loadC";
export const TORNADO_INPUTS: readonly TornadoInput[] = [
  "width",
  "thickness",
  "spacing",
  "ildHeight",
  "barrier",
  "k",
  "bulkResistivity",
  "meanFreePath",
  "specularity",
  "grainReflection",
  "length",
  "driverR",
  "loadC",
];

export interface TornadoBar {
  input: TornadoInput;
  /** Delay with the input × (1 − step) and × (1 + step), s. */
  lowS: number;
  highS: number;
  /** Changes against the nominal delay, s. */
  deltaLowS: number;
  deltaHighS: number;
  /** max(|deltaLowS|, |deltaHighS|): the sort key. */
  impactS: number;
  /** R and C per length at the two ends (Ω/m, F/m), for the physics. */
  rLowOhmPerM: number;
  rHighOhmPerM: number;
  cLowFPerM: number;
  cHighFPerM: number;
}

/** The flat class and technology with one input × factor (see tornado). */
function perturbed(f: Flat, input: TornadoInput, factor: number): { wc: WireClass; tech: Technology } {
  const wc: WireClass = { ...f.wc };
  let tech = f.tech;
  switch (input) {
    case "width":
      wc.widthM *= factor;
      break;
    case "thickness":
      wc.thicknessM *= factor;
      break;
    case "spacing":
      wc.spacingM *= factor;
      break;
    case "ildHeight":
      if (wc.ildBelowM !== null) wc.ildBelowM *= factor;
      if (wc.ildAboveM !== null) wc.ildAboveM *= factor;
      break;
    case "barrier":
      wc.barrierM *= factor;
      break;
    case "k":
      wc.k = Math.max(1, wc.k * factor);
      if (wc.kGap !== undefined) wc.kGap = Math.min(wc.kGap, wc.k);
      break;
    case "length":
      wc.meanLengthM *= factor;
      break;
    case "driverR":
      wc.driverOhm *= factor;
      break;
    case "loadC":
      wc.loadF *= factor;
      break;
    default: {
      const key = (
        { bulkResistivity: "resistivityOhmM", meanFreePath: "meanFreePathM", specularity: "specularity", grainReflection: "grainReflection" } as const
      )[input];
      const base = getMetal(wc.metal);
      const mats = tech.materials ?? {};
      const own = ownEntry(mats, base.id) ?? ownEntry(mats, wc.metal) ?? {};
      const v = (own[key] ?? base[key]) * factor;
      // specularity and grain reflection stay below 1
      const capped = key === "specularity" || key === "grainReflection" ? Math.min(v, 0.999) : v;
      tech = { ...tech, materials: { ...mats, [base.id]: { ...own, [key]: capped } } };
    }
  }
  return { wc, tech };
}

/**
 * Change in the class net's 50% delay (ClassResult.delayS, without repeaters: a smooth function of the inputs;
 * `metric` "repeated" takes the delay with repeaters instead) for each input × (1 ± step), step default 0.1, each
 * input alone, sorted by impact (largest first). Width, thickness and spacing change alone (the pitch moves with width
 * and spacing); ILD height changes the planes below and above; size-effect parameters change the class's metal in
 * the technology's materials overrides (they act at level full only).
 */
export function tornado(p: {
  wireClass: WireClass | WireClass[];
  className?: string;
  technology: Technology;
  settings: ScenarioSettings;
  step?: number;
  metric?: "delay" | "repeated";
}): { nominalS: number; step: number; bars: TornadoBar[] } {
  const wc0 = findClass(p.wireClass, p.className);
  const step = p.step ?? 0.1;
  if (!(step > 0 && step < 0.5)) throw new RangeError(`step must be > 0 and < 0.5 (got ${step})`);
  const f = flattenClass(wc0, p.technology, p.settings);
  const pick = (r: ClassResult) => (p.metric === "repeated" ? r.repeatedDelayS : r.delayS);
  const nominal = pick(evalFlat(f));
  const bars: TornadoBar[] = TORNADO_INPUTS.map((input) => {
    const lo = perturbed(f, input, 1 - step);
    const hi = perturbed(f, input, 1 + step);
    const rl = evalFlat(f, lo.wc, lo.tech);
    const rh = evalFlat(f, hi.wc, hi.tech);
    const lowS = pick(rl);
    const highS = pick(rh);
    return {
      input,
      lowS,
      highS,
      deltaLowS: lowS - nominal,
      deltaHighS: highS - nominal,
      impactS: Math.max(Math.abs(lowS - nominal), Math.abs(highS - nominal)),
      rLowOhmPerM: rl.rOhmPerM,
      rHighOhmPerM: rh.rOhmPerM,
      cLowFPerM: rl.cFPerM,
      cHighFPerM: rh.cFPerM,
    };
  });
  bars.sort((a, b) => b.impactS - a.impactS || TORNADO_INPUTS.indexOf(a.input) - TORNADO_INPUTS.indexOf(b.input));
  return { nominalS: nominal, step, bars };
}

// ---------------------------------------------------------------- variation

/** mulberry32: a 32-bit seeded generator of uniform numbers in [0, 1) (public-domain algorithm, from memory). */
export function mulberry32(seed: number): () => number {
  let a = seed >>> 0;
  return () => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = a;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

/** Standard normal numbers from a uniform generator (Box–Muller, both values used). */
function normals(u: () => number): () => number {
  let spare: number | null = null;
  return () => {
    if (spare !== null) {
      const s = spare;
      spare = null;
      return s;
    }
    let u1 = u();
    while (u1 <= 0) u1 = u();
    const r = Math.sqrt(-2 * Math.log(u1));
    const th = 2 * Math.PI * u();
    spare = r * Math.sin(th);
    return r * Math.cos(th);
  };
}

/** A standard deviation: absolute (SI, m or plain for k) or relative (share of the nominal value). */
export type Sigma = { absolute: number } | { relative: number };

export interface VariationSigmas {
  width?: Sigma;
  thickness?: Sigma;
  barrier?: Sigma;
  ildHeight?: Sigma;
  k?: Sigma;
}
export const VARIATION_INPUTS = ["width", "thickness", "barrier", "ildHeight", "k"] as const;
export const MAX_VARIATION_SAMPLES = 100_000;

export interface Stats {
  mean: number;
  std: number;
  p5: number;
  p50: number;
  p95: number;
}

export interface ClassVariation {
  class: string;
  rOhmPerM: Stats;
  cFPerM: Stats;
  /** R·C of the net at its mean length, s. */
  rcS: Stats;
  /** 50% delay of the net with its repeaters (ClassResult.repeatedDelayS), s. */
  delayS: Stats;
  energyJ: Stats;
  samples: number;
  /** Samples drawn again because the geometry was not physical (a non-positive size or no conducting core). */
  redrawn: number;
  /** Corners at ± cornerSigma σ of every input: the combination of signs with the least and the most delay. */
  corners: { fast: Corner; slow: Corner; nominal: Corner };
}

export interface Corner {
  /** Sign of each input's shift (−1, 0 or +1), in σ × cornerSigma. */
  shifts: Record<(typeof VARIATION_INPUTS)[number], number>;
  rOhmPerM: number;
  cFPerM: number;
  delayS: number;
  energyJ: number;
}

function sigmaValue(name: string, s: Sigma | undefined, nominal: number): number {
  if (s === undefined) return 0;
  const v = "absolute" in s ? s.absolute : s.relative * nominal;
  if (!(v >= 0) || !Number.isFinite(v)) throw new RangeError(`sigma.${name} must be >= 0 (got ${"absolute" in s ? s.absolute : s.relative})`);
  if (v > nominal) throw new RangeError(`sigma.${name} must not be larger than the nominal value (σ ${v}, nominal ${nominal})`);
  return v;
}

function nominalOf(wc: WireClass, input: (typeof VARIATION_INPUTS)[number]): number {
  switch (input) {
    case "width":
      return wc.widthM;
    case "thickness":
      return wc.thicknessM;
    case "barrier":
      return wc.barrierM;
    case "ildHeight":
      return (wc.ildBelowM ?? wc.ildAboveM) as number;
    case "k":
      return wc.k;
  }
}

/** The flat class with shifts d (absolute, in each input's unit) applied; null when not physical. */
function shifted(base: WireClass, d: Float64Array, fixedPitch: boolean): WireClass | null {
  const wc: WireClass = { ...base };
  wc.widthM = base.widthM + d[0]!;
  wc.thicknessM = base.thicknessM + d[1]!;
  wc.barrierM = base.barrierM + d[2]!;
  const hs = d[3]!;
  if (wc.ildBelowM !== null) wc.ildBelowM = base.ildBelowM! + hs * (base.ildBelowM! / nominalOf(base, "ildHeight"));
  if (wc.ildAboveM !== null) wc.ildAboveM = base.ildAboveM! + hs * (base.ildAboveM! / nominalOf(base, "ildHeight"));
  wc.k = base.k + d[4]!;
  if (fixedPitch) wc.spacingM = base.spacingM - d[0]!;
  if (wc.kGap !== undefined) wc.kGap = Math.min(wc.kGap, wc.k);
  const ok =
    wc.widthM - 2 * wc.barrierM > 0 &&
    wc.thicknessM - wc.barrierM > 0 &&
    wc.barrierM >= 0 &&
    wc.spacingM > 0 &&
    (wc.ildBelowM === null || wc.ildBelowM > 0) &&
    (wc.ildAboveM === null || wc.ildAboveM > 0) &&
    wc.k >= 1;
  return ok ? wc : null;
}

function stats(xs: Float64Array): Stats {
  const n = xs.length;
  let sum = 0;
  for (let i = 0; i < n; i++) sum += xs[i]!;
  const mean = sum / n;
  let ss = 0;
  for (let i = 0; i < n; i++) ss += (xs[i]! - mean) ** 2;
  const sorted = Float64Array.from(xs).sort();
  // percentile by linear interpolation between order statistics (the common "type 7" rule)
  const pct = (q: number) => {
    const h = (n - 1) * q;
    const lo = Math.floor(h);
    const hi = Math.min(n - 1, lo + 1);
    return sorted[lo]! + (h - lo) * (sorted[hi]! - sorted[lo]!);
  };
  return { mean, std: n > 1 ? Math.sqrt(ss / (n - 1)) : 0, p5: pct(0.05), p50: pct(0.5), p95: pct(0.95) };
}

/**
 * Monte Carlo of process variation per class: each input drawn independently from a normal distribution of its σ
 * around the scenario's value (ILD heights below and above move together by the same share); with `fixedPitch`
 * (default false) the spacing moves against the width (s = pitch − w: correlation −1 at fixed pitch). A draw that is
 * not physical is drawn again (counted in `redrawn`). One mulberry32 stream seeded with `seed` runs through the
 * classes in order: same inputs and seed → identical output. Corners: every combination of −, + of the inputs that
 * have a σ, at ± cornerSigma σ (default 3), the least and the most delay. Throws RangeError naming the field for a
 * negative σ, a σ larger than the nominal value, or samples outside 2..100,000.
 */
export function variation(p: {
  classes: WireClass[];
  technology: Technology;
  settings: ScenarioSettings;
  sigma: VariationSigmas;
  samples: number;
  seed: number;
  fixedPitch?: boolean;
  cornerSigma?: number;
}): ClassVariation[] {
  const n = p.samples;
  if (!(Number.isInteger(n) && n >= 2 && n <= MAX_VARIATION_SAMPLES))
    throw new RangeError(`samples must be a whole number from 2 to ${MAX_VARIATION_SAMPLES} (got ${n})`);
  if (!Number.isInteger(p.seed)) throw new RangeError(`seed must be a whole number (got ${p.seed})`);
  const cs = p.cornerSigma ?? 3;
  if (!(cs > 0 && cs <= 6)) throw new RangeError(`cornerSigma must be > 0 and <= 6 (got ${cs})`);
  const z = normals(mulberry32(p.seed));
  const fixedPitch = p.fixedPitch ?? false;
  return p.classes.map((wc0) => {
    const f = flattenClass(wc0, p.technology, p.settings);
    const base = f.wc;
    const sig = VARIATION_INPUTS.map((k) => sigmaValue(k, p.sigma[k], nominalOf(base, k)));
    const R = new Float64Array(n);
    const Cv = new Float64Array(n);
    const RC = new Float64Array(n);
    const D = new Float64Array(n);
    const E = new Float64Array(n);
    const d = new Float64Array(5);
    let redrawn = 0;
    for (let i = 0; i < n; i++) {
      let wc: WireClass | null = null;
      for (let tries = 0; wc === null; tries++) {
        if (tries > 1000) throw new RangeError(`sigma: the variation of class ${base.name} gives no physical geometry in 1000 draws`);
        for (let j = 0; j < 5; j++) d[j] = sig[j]! * z();
        wc = shifted(base, d, fixedPitch);
        if (wc === null) redrawn++;
      }
      const r = evalFlat(f, wc);
      R[i] = r.rOhmPerM;
      Cv[i] = r.cFPerM;
      RC[i] = r.rcS;
      D[i] = r.repeatedDelayS;
      E[i] = r.energyJ;
    }
    // corners
    const active = VARIATION_INPUTS.map((_, j) => sig[j]! > 0);
    const idx = active.flatMap((a, j) => (a ? [j] : []));
    const corner = (signs: number[]): Corner | null => {
      for (let j = 0; j < 5; j++) d[j] = signs[j]! * cs * sig[j]!;
      const wc = shifted(base, d, fixedPitch);
      if (wc === null) return null;
      const r = evalFlat(f, wc);
      const shifts = Object.fromEntries(VARIATION_INPUTS.map((k, j) => [k, signs[j]!])) as Corner["shifts"];
      return { shifts, rOhmPerM: r.rOhmPerM, cFPerM: r.cFPerM, delayS: r.repeatedDelayS, energyJ: r.energyJ };
    };
    const nominal = corner([0, 0, 0, 0, 0])!;
    let fast = nominal;
    let slow = nominal;
    for (let mask = 0; mask < 1 << idx.length; mask++) {
      const signs = [0, 0, 0, 0, 0];
      idx.forEach((j, b) => (signs[j] = mask & (1 << b) ? 1 : -1));
      const c = corner(signs);
      if (c === null) continue;
      if (c.delayS < fast.delayS) fast = c;
      if (c.delayS > slow.delayS) slow = c;
    }
    return {
      class: base.name,
      rOhmPerM: stats(R),
      cFPerM: stats(Cv),
      rcS: stats(RC),
      delayS: stats(D),
      energyJ: stats(E),
      samples: n,
      redrawn,
      corners: { fast, slow, nominal },
    };
  });
}

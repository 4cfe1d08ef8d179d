/**
 * `npm run bench` (engine part): throughput of the scaling engine against a bare hand-inlined loop of the same
 * formulas that produces the same outputs (checked number for number before timing), then the field check's time and
 * error (scaling/bench-field.ts). Prints a figures table.
 */
import { readFileSync } from "node:fs";
import {
  baselineSettings,
  DEFAULT_TECHNOLOGY,
  evaluateScenario,
  getMetal,
  sweep,
  type Metal,
  type ModelLevel,
  type ScenarioSettings,
  type Technology,
  type WireClass,
  MODEL_LEVELS,
} from "../lib/scaling/index";
import { EPSILON_0_F_PER_M, LN2, SAKURAI_DISTRIBUTED_COEFF, REPEATER_A, REPEATER_B } from "../lib/scaling/constants";
import { SPLIT_FIT } from "../lib/scaling/capacitance";
import { mayadasShatzkesRatio } from "../lib/scaling/resistance";
import { parseHistogramBins } from "../lib/import/histograms";
import { parseWireClassCsv } from "../lib/import/wire-classes";
import { benchField } from "./bench-field";

const here = new URL(".", import.meta.url).pathname;
const base: WireClass[] = parseWireClassCsv(readFileSync(`${here}examples/skua-baseline.csv`)).classes;
const hist = parseHistogramBins(
  readFileSync(`${here}examples/skua-histograms.csv`),
  base.map((c) => c.name),
).bins;
const technology: Technology = { ...DEFAULT_TECHNOLOGY };

// 20 classes: the four Skua classes in five invented variants each, every one with a 64-bin histogram.
const classes: WireClass[] = [];
for (let v = 0; v < 5; v++) {
  for (const c of base) {
    const f = 1 + 0.1 * v;
    const src = hist[c.name]!;
    const bins = Array.from({ length: 64 }, (_, i) => {
      const b = src[Math.floor((i * src.length) / 64)]!;
      return { lengthM: b.lengthM * (1 + (i % 3) * 0.01), count: b.count / 1.33 };
    });
    classes.push({ ...c, name: `${c.name}-${v}`, widthM: c.widthM * f, spacingM: c.spacingM * f, histogram: bins });
  }
}
const settings: ScenarioSettings = { ...baselineSettings("full", technology), s: 1 / 0.7 };

// Timing: CPU time of this process (user + system, all its threads, so the engine's garbage collection counts),
// which a shared, busy machine disturbs far less than wall time.
function cpuMs(): number {
  const u = process.cpuUsage();
  return (u.user + u.system) / 1000;
}
function timeIt(fn: () => void, minMs: number): { perCallMs: number; calls: number } {
  for (let i = 0; i < 3; i++) fn();
  let calls = 0;
  const t0 = cpuMs();
  let t = t0;
  while (t - t0 < minMs) {
    for (let i = 0; i < 10; i++) fn();
    calls += 10;
    t = cpuMs();
  }
  return { perCallMs: (t - t0) / calls, calls };
}

// ---------- bare, hand-inlined loops of the same formulas (no overrides; the bench has none) ----------
// They produce every number the engine's result carries (geometry, capacitance parts, R, delays, repeaters,
// energy, power, per-bin length/count/delay/repeaters, distribution totals, validity flags, ratios, scenario
// totals), written into arrays allocated once; the engine must allocate its result objects on every call.
let sink = 0;
const PI = Math.PI;

/** Capacitance per length into cap[0..3] = area, ground, couple (Maxwell per neighbour), total (Miller applied). */
function bareCap(level: ModelLevel, eps: number, w: number, t: number, sp: number, h: number, h2: number | null, miller: number, cap: Float64Array): void {
  let area: number,
    ground: number,
    couple = 0;
  if (h2 === null) {
    const wh = w / h;
    area = eps * wh;
    if (level === "ideal") ground = area;
    else if (level === "fringe") {
      const u = (2 * h) / t;
      ground = eps * (Math.max(0, (w - t / 2) / h) + (2 * PI) / Math.log(1 + u + Math.sqrt(u * (u + 2))));
    } else {
      const th = t / h;
      const s = sp / h;
      const c1 = 1.15 * wh + 2.8 * Math.pow(th, 0.222);
      const c21 = Math.max(0, (0.03 * wh + 0.83 * th - 0.07 * Math.pow(th, 0.222)) * Math.pow(s, -1.34));
      const fIso = c1 - wh;
      const def = -fIso * Math.expm1(-Math.log1p(Math.pow(fIso / (SPLIT_FIT.onePlane.a * Math.pow(s, SPLIT_FIT.onePlane.b)), SPLIT_FIT.norm)) / SPLIT_FIT.norm);
      ground = eps * (c1 - def);
      couple = eps * (c21 + def / 2);
    }
  } else {
    const plates = w / h + w / h2;
    area = eps * plates;
    if (level === "ideal") ground = area;
    else {
      const b = h + t + h2;
      const g0 = 1 / (1 - t / b);
      const fIso = (4 / PI) * (2 * g0 * Math.log(g0 + 1) - (g0 - 1) * Math.log(g0 * g0 - 1));
      if (level === "fringe") ground = eps * (plates + fIso);
      else {
        const tp = SPLIT_FIT.twoPlane;
        const sb = sp / b;
        const fGap = tp.a * (1 + (tp.thick * t) / b) * (Math.pow(sp / h, tp.b) + Math.pow(sp / h2, tp.b)) * Math.exp(tp.growth * sb);
        const def = -fIso * Math.expm1(-Math.log1p(Math.pow(fIso / fGap, tp.norm)) / tp.norm);
        const q = tp.total;
        const rise = ((q[0] * t) / sp + q[1] + (q[2] * t) / b + (q[3] * w) / b) * Math.exp(-tp.decay * PI * sb);
        ground = eps * (plates + fIso - def);
        couple = eps * (rise + def / 2);
      }
    }
  }
  cap[0] = area;
  cap[1] = ground;
  cap[2] = couple;
  cap[3] = ground + 2 * miller * couple;
}

function sizeEffect(metal: Metal, wc2: number, hc: number): number {
  const lam = metal.meanFreePathM;
  const R = metal.grainReflection;
  return mayadasShatzkesRatio((lam / Math.min(wc2, hc)) * (R / (1 - R))) + 0.375 * metal.steinhoglC * (1 - metal.specularity) * lam * (1 / wc2 + 1 / hc);
}

const capScratch = new Float64Array(4);

/** Sweep point: the class's delay at its scaled mean length (what the engine's sweep computes per point). */
function bareDelay(wc: WireClass, st: ScenarioSettings, level: ModelLevel): number {
  const s = st.s;
  const w = wc.widthM / s;
  const t = wc.thicknessM / s;
  const sp = wc.spacingM / s;
  const hb = wc.ildBelowM === null ? null : wc.ildBelowM / s;
  const ha = wc.ildAboveM === null ? null : wc.ildAboveM / s;
  const bar = level === "ideal" || st.barrierScales ? wc.barrierM / s : wc.barrierM;
  const L = wc.meanLengthM / st.sL;
  bareCap(level, EPSILON_0_F_PER_M * wc.k, w, t, sp, (hb ?? ha)!, hb !== null ? ha : null, st.miller, capScratch);
  const c = capScratch[3]!;
  const wc2 = w - 2 * bar;
  const hc = t - bar;
  if (!(wc2 > 0 && hc > 0)) throw new RangeError("barrier fills the line");
  const metal = getMetal(wc.metal);
  const rho = level === "full" ? metal.resistivityOhmM * sizeEffect(metal, wc2, hc) : metal.resistivityOhmM;
  const Rt = (rho / (wc2 * hc)) * L;
  const Ct = c * L;
  if (level === "ideal") return SAKURAI_DISTRIBUTED_COEFF * Rt * Ct;
  const rd = wc.driverOhm * st.deviceRFactor;
  const cl = wc.loadF * st.deviceCFactor;
  return SAKURAI_DISTRIBUTED_COEFF * Rt * Ct + LN2 * (rd * Ct + rd * cl + Rt * cl);
}

// Per class evaluation: F_* slots of one row of `bareOut`, bins in `bareBins` (4 values per bin).
const F = {
  w: 0,
  t: 1,
  sp: 2,
  hb: 3,
  ha: 4,
  bar: 5,
  pitch: 6,
  L: 7,
  k: 8,
  rho: 9,
  r: 10,
  area: 11,
  fringe: 12,
  coupling: 13,
  c: 14,
  couple: 15,
  R: 16,
  C: 17,
  rc: 18,
  intrinsic: 19,
  delay: 20,
  elmore: 21,
  count: 22,
  size: 23,
  repDelay: 24,
  perM: 25,
  lcrit: 26,
  rd: 27,
  cl: 28,
  energy: 29,
  totalEnergy: 30,
  power: 31,
  nets: 32,
  share: 33,
  reps: 34,
  meanDelay: 35,
  totalC: 36,
  worst: 37,
} as const;
const ROW = 38;
const MAX_BINS = 64;
const bareOut = new Float64Array(2 * classes.length * ROW);
const bareBins = new Float64Array(2 * classes.length * MAX_BINS * 4);
const bareRatios = new Float64Array(classes.length * 8);
const bareTotals = new Float64Array(12);
const bareFlags: { model: string; quantity: string; value: number; min: number | null; max: number | null; message: string }[][] = Array.from(
  { length: 2 * classes.length },
  () => [],
);

function flagIf(out: (typeof bareFlags)[number], model: string, quantity: string, value: number, min: number | null, max: number | null): void {
  if ((min !== null && value < min) || (max !== null && value > max)) {
    out.push({ model, quantity, value, min, max, message: `${quantity} = ${Number(value.toPrecision(3))} is outside ${model}'s range` });
  }
}

/** One class at one settings (level `full`, the bench's level): every output into row `row`. */
function bareEval(wc: WireClass, st: ScenarioSettings, row: number): void {
  const o = row * ROW;
  const flags = bareFlags[row]!;
  flags.length = 0;
  const s = st.s;
  const w = wc.widthM / s;
  const t = wc.thicknessM / s;
  const sp = wc.spacingM / s;
  const hb = wc.ildBelowM === null ? null : wc.ildBelowM / s;
  const ha = wc.ildAboveM === null ? null : wc.ildAboveM / s;
  const bar = st.barrierScales ? wc.barrierM / s : wc.barrierM;
  const L = wc.meanLengthM / st.sL;
  const h = (hb ?? ha)!;
  const h2 = hb !== null ? ha : null;
  const miller = st.miller;
  bareCap("full", EPSILON_0_F_PER_M * wc.k, w, t, sp, h, h2, miller, capScratch);
  if (h2 === null) {
    flagIf(flags, "sakurai-tamaru-c1", "W/H", w / h, 0.3, 30);
    flagIf(flags, "sakurai-tamaru-c1", "T/H", t / h, 0.3, 30);
    flagIf(flags, "sakurai-tamaru-c21", "W/H", w / h, 0.3, 10);
    flagIf(flags, "sakurai-tamaru-c21", "T/H", t / h, 0.3, 10);
    flagIf(flags, "sakurai-tamaru-c21", "S/H", sp / h, 0.5, 10);
    flagIf(flags, "ground-split", "T/H", t / h, 0.3, 4);
    flagIf(flags, "ground-split", "S/H", sp / h, 0.5, 8);
  } else {
    const hMin = Math.min(h, h2);
    const hr = Math.max(h, h2) / hMin;
    flagIf(flags, "cohn-thick-strip", "W/(H+H2)", w / (h + h2), 0.35, null);
    flagIf(flags, "cohn-thick-strip", "Hmax/Hmin", hr, 1, 2);
    flagIf(flags, "two-plane-split", "W/Hmin", w / hMin, 0.3, 8);
    flagIf(flags, "two-plane-split", "T/Hmin", t / hMin, 0.3, 3);
    flagIf(flags, "two-plane-split", "S/Hmin", sp / hMin, 0.5, 4);
    flagIf(flags, "two-plane-split", "Hmax/Hmin", hr, 1, 2);
  }
  const metal = getMetal(wc.metal);
  const wc2 = w - 2 * bar;
  const hc = t - bar;
  if (!(wc2 > 0 && hc > 0)) throw new RangeError("barrier fills the line");
  const rho = metal.resistivityOhmM * sizeEffect(metal, wc2, hc);
  flagIf(flags, "size-effect", "d/λ", Math.min(wc2, hc) / metal.meanFreePathM, 0.5, null);
  const r = rho / (wc2 * hc);
  const c = capScratch[3]!;
  const Rt = r * L;
  const Ct = c * L;
  const rd = wc.driverOhm * st.deviceRFactor;
  const cl = wc.loadF * st.deviceCFactor;
  const intrinsic = SAKURAI_DISTRIBUTED_COEFF * Rt * Ct;
  const delay = intrinsic + LN2 * (rd * Ct + rd * cl + Rt * cl);
  const r0 = technology.repeaterR0Ohm * st.deviceRFactor;
  const c0 = technology.repeaterC0F * st.deviceCFactor;
  const rc0 = r0 * c0;
  const kStar = Math.sqrt((REPEATER_B * Rt * Ct) / (REPEATER_A * rc0));
  const hOpt = Math.sqrt((r0 * Ct) / (Rt * c0));
  let k = 1;
  if (kStar > 1) {
    k = Math.floor(kStar);
    if (REPEATER_A * (k + 1) * rc0 + (REPEATER_B * Rt * Ct) / (k + 1) < REPEATER_A * k * rc0 + (REPEATER_B * Rt * Ct) / k) k++;
  }
  let repDelay = (REPEATER_A * r0 * Ct) / hOpt + REPEATER_A * Rt * hOpt * c0 + REPEATER_A * k * rc0 + (REPEATER_B * Rt * Ct) / k;
  if (k === 1 || !(repDelay < delay)) {
    k = 1;
    repDelay = delay;
  }
  const v2 = st.supplyV * st.supplyV;
  bareOut[o + F.w] = w;
  bareOut[o + F.t] = t;
  bareOut[o + F.sp] = sp;
  bareOut[o + F.hb] = hb ?? NaN;
  bareOut[o + F.ha] = ha ?? NaN;
  bareOut[o + F.bar] = bar;
  bareOut[o + F.pitch] = w + sp;
  bareOut[o + F.L] = L;
  bareOut[o + F.k] = wc.k;
  bareOut[o + F.rho] = rho;
  bareOut[o + F.r] = r;
  bareOut[o + F.area] = capScratch[0]!;
  bareOut[o + F.fringe] = capScratch[1]! - capScratch[0]!;
  bareOut[o + F.coupling] = 2 * miller * capScratch[2]!;
  bareOut[o + F.c] = c;
  bareOut[o + F.couple] = capScratch[2]!;
  bareOut[o + F.R] = Rt;
  bareOut[o + F.C] = Ct;
  bareOut[o + F.rc] = Rt * Ct;
  bareOut[o + F.intrinsic] = intrinsic;
  bareOut[o + F.delay] = delay;
  bareOut[o + F.elmore] = rd * (Ct + cl) + Rt * (Ct / 2 + cl);
  bareOut[o + F.count] = k;
  bareOut[o + F.size] = hOpt;
  bareOut[o + F.repDelay] = repDelay;
  bareOut[o + F.perM] = (2 * (REPEATER_A + Math.sqrt(REPEATER_A * REPEATER_B)) * Math.sqrt(rc0 * Rt * Ct)) / L;
  bareOut[o + F.lcrit] = L * Math.sqrt((2 * REPEATER_A * rc0) / (REPEATER_B * Rt * Ct));
  bareOut[o + F.rd] = rd;
  bareOut[o + F.cl] = cl;
  bareOut[o + F.energy] = (Ct + cl) * v2;
  // distribution over the histogram
  const hist = wc.histogram!;
  const hFixed = 2 * REPEATER_A * Math.sqrt(rc0 * r * c);
  const bo = row * MAX_BINS * 4;
  let over = 0,
    reps = 0,
    sum = 0,
    n = 0,
    cs = 0,
    worst = 0;
  for (let i = 0; i < hist.length; i++) {
    const bin = hist[i]!;
    const count = bin.count;
    const l = bin.lengthM / st.sL;
    const R = r * l,
      C = c * l,
      rc = R * C;
    let d = SAKURAI_DISTRIBUTED_COEFF * rc + LN2 * (rd * C + rd * cl + R * cl);
    const ks = Math.sqrt((REPEATER_B * rc) / (REPEATER_A * rc0));
    let ins = 0;
    if (ks > 1) {
      let kk = Math.floor(ks);
      if (REPEATER_A * (kk + 1) * rc0 + (REPEATER_B * rc) / (kk + 1) < REPEATER_A * kk * rc0 + (REPEATER_B * rc) / kk) kk++;
      const rep = hFixed * l + REPEATER_A * kk * rc0 + (REPEATER_B * rc) / kk;
      if (kk >= 2 && rep < d) {
        d = rep;
        ins = kk - 1;
      }
    }
    const j = bo + 4 * i;
    bareBins[j] = l;
    bareBins[j + 1] = count;
    bareBins[j + 2] = d;
    bareBins[j + 3] = ins;
    if (d > technology.delayBudgetS) over += count;
    if (count > 0 && d > worst) worst = d;
    reps += ins * count;
    sum += d * count;
    n += count;
    cs += C * count;
  }
  const totalEnergy = v2 * (cs + n * cl);
  bareOut[o + F.totalEnergy] = totalEnergy;
  bareOut[o + F.power] = 0.5 * wc.activity * technology.clockHz * totalEnergy;
  bareOut[o + F.nets] = n;
  bareOut[o + F.share] = n > 0 ? over / n : 0;
  bareOut[o + F.reps] = reps;
  bareOut[o + F.meanDelay] = n > 0 ? sum / n : 0;
  bareOut[o + F.totalC] = cs;
  bareOut[o + F.worst] = worst;
}

const baseSt: ScenarioSettings = { ...baselineSettings("full", technology), miller: settings.miller };
const RATIO_FIELDS = Int32Array.from([F.r, F.c, F.R, F.C, F.rc, F.delay, F.count, F.energy]);
/** Adds one class result (row offset o) to the totals at t (0 = baseline, 6 = scenario). */
function addTotals(o: number, t: number): void {
  const T = bareTotals;
  T[t] = T[t]! + bareOut[o + F.totalC]!;
  T[t + 1] = T[t + 1]! + bareOut[o + F.totalEnergy]!;
  T[t + 2] = T[t + 2]! + bareOut[o + F.power]!;
  T[t + 3] = T[t + 3]! + bareOut[o + F.reps]!;
  T[t + 4] = Math.max(T[t + 4]!, bareOut[o + F.worst]!);
  T[t + 5] = T[t + 5]! + bareOut[o + F.meanDelay]! * bareOut[o + F.nets]!;
}
const bareScenario = () => {
  bareTotals.fill(0);
  let nb = 0,
    ns = 0;
  for (let i = 0; i < classes.length; i++) {
    const wc = classes[i]!;
    bareEval(wc, baseSt, 2 * i);
    bareEval(wc, settings, 2 * i + 1);
    const b = 2 * i * ROW,
      s = (2 * i + 1) * ROW;
    for (let j = 0; j < 8; j++) bareRatios[8 * i + j] = bareOut[s + RATIO_FIELDS[j]!]! / bareOut[b + RATIO_FIELDS[j]!]!;
    addTotals(b, 0);
    addTotals(s, 6);
    nb += bareOut[b + F.nets]!;
    ns += bareOut[s + F.nets]!;
  }
  bareTotals[5] = nb > 0 ? bareTotals[5]! / nb : 0;
  bareTotals[11] = ns > 0 ? bareTotals[11]! / ns : 0;
  sink += bareTotals[8]!;
};
const engineScenario = () => {
  sink += evaluateScenario({ classes, technology, settings }).totals.scenario.powerW;
};

// The bare loop must compute what the engine computes: check it once, number for number.
{
  const ev = evaluateScenario({ classes, technology, settings });
  bareScenario();
  const rel = (a: number, b: number) => (a === b ? 0 : Math.abs(a - b) / Math.max(Math.abs(a), Math.abs(b)));
  let worst = 0;
  ev.classes.forEach((cc, i) => {
    for (const [res, row] of [
      [cc.baseline, 2 * i],
      [cc.scenario, 2 * i + 1],
    ] as const) {
      const o = row * ROW;
      const pairs: [number, number][] = [
        [res.cFPerM, bareOut[o + F.c]!],
        [res.rOhmPerM, bareOut[o + F.r]!],
        [res.delayS, bareOut[o + F.delay]!],
        [res.elmoreS, bareOut[o + F.elmore]!],
        [res.repeaters.delayS, bareOut[o + F.repDelay]!],
        [res.repeaters.count, bareOut[o + F.count]!],
        [res.powerW, bareOut[o + F.power]!],
        [res.distribution.meanDelayS, bareOut[o + F.meanDelay]!],
        [res.distribution.totalRepeaters, bareOut[o + F.reps]!],
        [res.capacitance.couplingPerNeighbourFPerM, bareOut[o + F.couple]!],
        [res.validity.length, bareFlags[row]!.length],
      ];
      res.distribution.bins.forEach((bin, j) => pairs.push([bin.delayS, bareBins[row * MAX_BINS * 4 + 4 * j + 2]!]));
      for (const [a, b] of pairs) worst = Math.max(worst, rel(a, b));
    }
  });
  worst = Math.max(worst, rel(ev.totals.scenario.powerW, bareTotals[8]!), rel(ev.totals.baseline.worstDelayS, bareTotals[4]!));
  if (!(worst < 1e-12)) throw new Error(`bench: the bare loop does not reproduce the engine (worst relative difference ${worst})`);
}

const xs = Array.from({ length: 200 }, (_, i) => 1 + (3 * i) / 199);
const sweepYs = new Float64Array(MODEL_LEVELS.length * classes.length * xs.length); // the curves' y values
const bareSweep = () => {
  let n = 0;
  for (const level of MODEL_LEVELS) {
    const st = { ...settings, level, barrierScales: level !== "full" };
    for (const wc of classes)
      for (const x of xs) {
        st.s = x;
        try {
          sweepYs[n++] = bareDelay(wc, st, level);
        } catch {
          sweepYs[n++] = NaN;
        }
      }
  }
  sink += sweepYs[n - 1]!;
};
const engineSweep = () => {
  sink += sweep({ classes, technology, settings, variable: "s", metric: "delay", from: 1, to: 4, points: 200 }).length;
};

// The machine may be shared: alternate engine and bare runs in rounds and keep each one's best round.
function best(a: () => void, b: () => void, rounds: number, msPerRound: number): [{ perCallMs: number }, { perCallMs: number }] {
  let ea = Infinity;
  let eb = Infinity;
  for (let r = 0; r < rounds; r++) {
    ea = Math.min(ea, timeIt(a, msPerRound).perCallMs);
    eb = Math.min(eb, timeIt(b, msPerRound).perCallMs);
  }
  return [{ perCallMs: ea }, { perCallMs: eb }];
}
// warm both paths up first so that the JIT has settled before anything is measured
timeIt(engineScenario, 1500);
timeIt(bareScenario, 1000);
timeIt(engineSweep, 1500);
timeIt(bareSweep, 1000);
const ROUNDS = 8;
const [evE, evB] = best(engineScenario, bareScenario, ROUNDS, 300);
const [swE, swB] = best(engineSweep, bareSweep, ROUNDS, 400);

const rows: [string, string, string, string][] = [
  [
    "full scenario, 20 classes × 64 bins (baseline + scenario)",
    `${(1000 / evE.perCallMs).toFixed(0)} eval/s`,
    `${(1000 / evB.perCallMs).toFixed(0)} eval/s`,
    (evE.perCallMs / evB.perCallMs).toFixed(2),
  ],
  ["sweep, 200 points × 20 classes × 4 levels", `${swE.perCallMs.toFixed(2)} ms`, `${swB.perCallMs.toFixed(2)} ms`, (swE.perCallMs / swB.perCallMs).toFixed(2)],
];
console.log(
  `Plateau scaling engine benchmark (one core; engine vs bare hand-inlined loop of the same formulas and outputs; CPU time, best of ${ROUNDS} alternating rounds)`,
);
console.log("");
const head = ["work", "engine", "bare loop", "engine/bare (aim ≤ 1.5)"];
const widths = head.map((h, i) => Math.max(h.length, ...rows.map((r) => r[i]!.length)));
console.log(head.map((h, i) => h.padEnd(widths[i]!)).join(" | "));
console.log(widths.map((w) => "-".repeat(w)).join("-|-"));
for (const r of rows) console.log(r.map((c, i) => (i === 0 ? c.padEnd(widths[i]!) : c.padStart(widths[i]!))).join(" | "));
console.log("");
const field = await benchField();
for (const line of field.lines) console.log(line);
console.log(
  `field check at the default grid: ${field.ms.toFixed(1)} ms, error ${(field.relErr * 100).toFixed(2)}%, ${field.cells} cells (aim ≤ 250 ms at < 1%)`,
);
if (sink === 42) console.log("");

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
import { exactTau50 } from "../lib/scaling/delay-table";
import { SPLIT_FIT } from "../lib/scaling/capacitance";
import { mayadasShatzkesRatio } from "../lib/scaling/resistance";
import { parseHistogramBins } from "../lib/import/histograms";
import { parseWireClassCsv } from "../lib/import/wire-classes";
import { benchField } from "./bench-field";
import { objectiveGrid, optimizeClass, variation } from "../lib/scaling/design-space";

const here = new URL(".", import.meta.url).pathname;
const base: WireClass[] = parseWireClassCsv(readFileSync(`${here}examples/skua-baseline.csv`)).classes;
const hist = parseHistogramBins(
  readFileSync(`${here}examples/skua-histograms.csv`),
  base.map((c) => c.name),
).bins;
// The bare loop re-codes the published closed forms, so the engine is compared on them (capacitanceModel
// "published"); the default (the accurate tables) is timed against that below and in scaling/bench-cap.ts.
const technology: Technology = { ...DEFAULT_TECHNOLOGY, capacitanceModel: "published" };
const accurateTechnology: Technology = { ...DEFAULT_TECHNOLOGY };

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

// Engine 2 defaults (the bench's technology sets none of them): 25 °C, γ = 0.5, minimum gain 0.1, 0.1 µm², no leakage.
const TEMP_C = 25;
const GAMMA = 0.5;
const MIN_GAIN = 0.1;
const REP_AREA = 0.1e-12;
/** Bulk ρ0 and λ of a metal at TEMP_C: ρ0(T) = ρ0(20)·(1 + α(T − 20)), λ(T) = λ(20)·ρ0(20)/ρ0(T). */
function rhoT(metal: Metal): number {
  return metal.resistivityOhmM * (1 + metal.tempCoeffPerK * (TEMP_C - 20));
}
/** Exact stage t50 (table) of driver rd + line (R, C) + load cl. */
function st50(R: number, C: number, rd: number, cl: number): number {
  return R > 0 && C > 0 ? R * C * exactTau50(rd / R, cl / C) : LN2 * (rd + R) * (C + cl);
}
function chain(R: number, C: number, rd: number, cl: number, r0: number, c0: number, k: number, h: number): number {
  const n = k + 1,
    rs = R / n,
    cs = C / n,
    own = LN2 * GAMMA * r0 * c0;
  const first = st50(rs, cs, rd, h * c0);
  const last = st50(rs, cs, r0 / h, cl) + own;
  return k === 1 ? first + last : first + (k - 1) * (st50(rs, cs, r0 / h, h * c0) + own) + last;
}
const us = new Float64Array(4096);
const hus = new Float64Array(4096);
/** The same repeater search as the engine (real driver and load, whole k, h ≥ 1, minimum gain): out = [k, h, delay, unrepeated]. */
function bareNet(R: number, C: number, rd: number, cl: number, r0: number, c0: number, out: Float64Array): void {
  const t0 = st50(R, C, rd, cl);
  out[0] = 0;
  out[1] = 0;
  out[2] = t0;
  out[3] = t0;
  const thr = (1 - MIN_GAIN) * t0;
  const rc0 = r0 * c0;
  const own = LN2 * (1 + GAMMA) * rc0;
  const f1 = 0.377 * R * C + LN2 * (rd * C + R * cl);
  const kF = Math.sqrt(f1 / own) - 1;
  const ab1 = 2 * LN2 * Math.sqrt(r0 * (C / 2 + cl) * c0 * (rd + R / 2));
  const lbh = (k: number): number => {
    const n = k + 1,
      rs = R / n,
      cs = C / n;
    const A = LN2 * r0 * (k * cs + cl),
      B = LN2 * c0 * (rd + k * rs);
    const hs = Math.sqrt(A / B),
      h = hs >= 1 ? hs : 1;
    lbH = h;
    return 0.377 * rs * cs * n + LN2 * (rd * cs + rs * cl + (k - 1 + k * GAMMA) * rc0) + A / h + B * h;
  };
  let lbH = 1;
  const k0 = Math.max(1, Math.round(kF));
  let bestU = Infinity,
    kU = 0,
    kEnd = 0;
  if (lbh(k0) <= thr) {
    bestU = chain(R, C, rd, cl, r0, c0, k0, lbH);
    kU = k0;
    us[k0] = bestU;
    hus[k0] = lbH;
  }
  for (let k = 1; k < us.length; k++) {
    const cap = bestU < thr ? bestU : thr;
    const lin = LN2 * (k - 1 + k * GAMMA) * rc0;
    if (lin > cap || (k > kF && f1 / (k + 1) + lin + ab1 > cap)) break;
    kEnd = k;
    if (k === k0 && kU === k0) continue;
    if (!(lbh(k) <= cap)) continue;
    const u = chain(R, C, rd, cl, r0, c0, k, lbH);
    us[k] = u;
    hus[k] = lbH;
    if (u < bestU) {
      bestU = u;
      kU = k;
    }
  }
  if (kEnd < k0 && kU === k0) kEnd = k0;
  if (kU === 0) {
    hus.fill(0, 0, kEnd + 1);
    return;
  }
  let best = thr,
    bk = 0,
    bh = 0;
  const near = bestU * (1 + 1e-3);
  for (let pass = 0; pass <= kEnd; pass++) {
    const k = pass === 0 ? kU : pass;
    if (pass !== 0 && k === kU) continue;
    if (hus[k] === 0 || !(us[k]! <= near) || !(us[k]! * (1 - 1e-3) <= best)) continue;
    // two rounds of three-point parabolic interpolation in ln h (as the engine's refineSize)
    let x = Math.log(hus[k]!),
      t = us[k]!;
    for (let round = 0; round < 2; round++) {
      const d = round === 0 ? 0.05 : 0.005;
      const xa = x - d < 0 ? 0 : x - d,
        xb = xa + d,
        xc = xa + 2 * d;
      const fa = xa === x ? t : chain(R, C, rd, cl, r0, c0, k, Math.exp(xa));
      const fb = xb === x ? t : chain(R, C, rd, cl, r0, c0, k, Math.exp(xb));
      const fc = chain(R, C, rd, cl, r0, c0, k, Math.exp(xc));
      let bx = x,
        bt = t;
      if (fa < bt) {
        bt = fa;
        bx = xa;
      }
      if (fb < bt) {
        bt = fb;
        bx = xb;
      }
      if (fc < bt) {
        bt = fc;
        bx = xc;
      }
      const curv = fa - 2 * fb + fc;
      if (curv > 0) {
        let xv = xb - (d * (fc - fa)) / (2 * curv);
        if (xv < 0) xv = 0;
        if (xv > xb + 4 * d) xv = xb + 4 * d;
        if (xv < xb - 4 * d && xb - 4 * d > 0) xv = xb - 4 * d;
        const fv = chain(R, C, rd, cl, r0, c0, k, Math.exp(xv));
        if (fv < bt) {
          bt = fv;
          bx = xv;
        }
      }
      x = bx;
      t = bt;
    }
    if (t <= best && (bk === 0 || t < best)) {
      best = t;
      bk = k;
      bh = Math.exp(x);
    }
  }
  hus.fill(0, 0, kEnd + 1);
  if (bk > 0) {
    out[0] = bk;
    out[1] = bh;
    out[2] = best;
  }
}
const netOut = new Float64Array(4);

function sizeEffect(metal: Metal, wc2: number, hc: number): number {
  const lam = (metal.meanFreePathM * metal.resistivityOhmM) / rhoT(metal);
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
  const rho = level === "full" ? rhoT(metal) * sizeEffect(metal, wc2, hc) : rhoT(metal);
  const Rt = (rho / (wc2 * hc)) * L;
  const Ct = c * L;
  // the point's validity flags, as the engine's sweep now returns them (one array per point)
  const flags: (typeof bareFlags)[number] = [];
  pointFlags(level, w, t, sp, (hb ?? ha)!, hb !== null ? ha : null, flags);
  if (level === "full") flagIf(flags, "size-effect", "d/λ", (Math.min(wc2, hc) * rhoT(metal)) / (metal.meanFreePathM * metal.resistivityOhmM), 0.5, null);
  sweepFlags.push(flags);
  if (level === "ideal") return st50(Rt, Ct, 0, 0);
  const rd = wc.driverOhm * st.deviceRFactor;
  const cl = wc.loadF * st.deviceCFactor;
  return st50(Rt, Ct, rd, cl);
}
const sweepFlags: unknown[] = [];

/** The closed forms' range flags at one geometry (levels fringe/coupled/full: the same checks as bareEval's). */
function pointFlags(level: ModelLevel, w: number, t: number, sp: number, h: number, h2: number | null, flags: (typeof bareFlags)[number]): void {
  if (level === "ideal") {
    flagIf(flags, "parallel-plate", "W/H", w / h, 10, null);
    return;
  }
  if (level === "fringe") {
    flagIf(flags, "yuan-trick", "W/T", w / t, 0.5, null);
    return;
  }
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
  repArea: 38,
  repPower: 39,
  repTotalArea: 40,
} as const;
const ROW = 41;
const MAX_BINS = 64;
const bareOut = new Float64Array(2 * classes.length * ROW);
const bareBins = new Float64Array(2 * classes.length * MAX_BINS * 5);
const bareRatios = new Float64Array(classes.length * 8);
const bareTotals = new Float64Array(18);
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
  const rho = rhoT(metal) * sizeEffect(metal, wc2, hc);
  flagIf(flags, "size-effect", "d/λ", (Math.min(wc2, hc) * rhoT(metal)) / (metal.meanFreePathM * metal.resistivityOhmM), 0.5, null);
  const r = rho / (wc2 * hc);
  const c = capScratch[3]!;
  const Rt = r * L;
  const Ct = c * L;
  const rd = wc.driverOhm * st.deviceRFactor;
  const cl = wc.loadF * st.deviceCFactor;
  const intrinsic = SAKURAI_DISTRIBUTED_COEFF * Rt * Ct;
  const delay = st50(Rt, Ct, rd, cl);
  const r0 = technology.repeaterR0Ohm * st.deviceRFactor;
  const c0 = technology.repeaterC0F * st.deviceCFactor;
  const rc0 = r0 * c0;
  const hStar = Math.sqrt((r0 * Ct) / (Rt * c0));
  bareNet(Rt, Ct, rd, cl, r0, c0, netOut);
  const kIns = netOut[0]!;
  const hOpt = kIns > 0 ? netOut[1]! : hStar;
  const k = kIns + 1;
  const repDelay = netOut[2]!;
  const repSize = kIns * netOut[1]!;
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
  bareOut[o + F.energy] = (Ct + cl) * v2 + repSize * c0 * (1 + GAMMA) * v2;
  bareOut[o + F.repArea] = repSize * REP_AREA;
  // distribution over the histogram
  const hist = wc.histogram!;
  const bo = row * MAX_BINS * 5;
  let over = 0,
    reps = 0,
    sum = 0,
    n = 0,
    cs = 0,
    worst = 0,
    sizeSum = 0;
  for (let i = 0; i < hist.length; i++) {
    const bin = hist[i]!;
    const count = bin.count;
    const l = bin.lengthM / st.sL;
    const R = r * l,
      C = c * l;
    bareNet(R, C, rd, cl, r0, c0, netOut);
    const ins = netOut[0]!,
      d = netOut[2]!;
    const j = bo + 5 * i;
    bareBins[j] = l;
    bareBins[j + 1] = count;
    bareBins[j + 2] = d;
    bareBins[j + 3] = ins;
    bareBins[j + 4] = netOut[1]!;
    if (d > technology.delayBudgetS) over += count;
    if (count > 0 && d > worst) worst = d;
    reps += ins * count;
    sum += d * count;
    n += count;
    cs += C * count;
    sizeSum += ins * netOut[1]! * count;
  }
  const repEnergy = sizeSum * c0 * (1 + GAMMA) * v2;
  const totalEnergy = v2 * (cs + n * cl) + repEnergy;
  bareOut[o + F.totalEnergy] = totalEnergy;
  bareOut[o + F.power] = 0.5 * wc.activity * technology.clockHz * totalEnergy;
  bareOut[o + F.repPower] = 0.5 * wc.activity * technology.clockHz * repEnergy;
  bareOut[o + F.repTotalArea] = sizeSum * REP_AREA;
  bareOut[o + F.nets] = n;
  bareOut[o + F.share] = n > 0 ? over / n : 0;
  bareOut[o + F.reps] = reps;
  bareOut[o + F.meanDelay] = n > 0 ? sum / n : 0;
  bareOut[o + F.totalC] = cs;
  bareOut[o + F.worst] = worst;
}

const baseSt: ScenarioSettings = { ...baselineSettings("full", technology), miller: settings.miller };
const RATIO_FIELDS = Int32Array.from([F.r, F.c, F.R, F.C, F.rc, F.delay, F.count, F.energy]);
/** Adds one class result (row offset o) to the totals at t (0 = baseline, 9 = scenario). */
function addTotals(o: number, t: number): void {
  const T = bareTotals;
  T[t] = T[t]! + bareOut[o + F.totalC]!;
  T[t + 1] = T[t + 1]! + bareOut[o + F.totalEnergy]!;
  T[t + 2] = T[t + 2]! + bareOut[o + F.power]!;
  T[t + 3] = T[t + 3]! + bareOut[o + F.reps]!;
  T[t + 4] = Math.max(T[t + 4]!, bareOut[o + F.worst]!);
  T[t + 5] = T[t + 5]! + bareOut[o + F.meanDelay]! * bareOut[o + F.nets]!;
  T[t + 6] = T[t + 6]! + bareOut[o + F.repTotalArea]!;
  T[t + 7] = T[t + 7]! + bareOut[o + F.repPower]!;
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
    addTotals(s, 9);
    nb += bareOut[b + F.nets]!;
    ns += bareOut[s + F.nets]!;
  }
  bareTotals[5] = nb > 0 ? bareTotals[5]! / nb : 0;
  bareTotals[14] = ns > 0 ? bareTotals[14]! / ns : 0;
  bareTotals[8] = bareTotals[2]! > 0 ? bareTotals[7]! / bareTotals[2]! : 0;
  bareTotals[17] = bareTotals[11]! > 0 ? bareTotals[16]! / bareTotals[11]! : 0;
  sink += bareTotals[11]!;
};
const engineScenario = () => {
  sink += evaluateScenario({ classes, technology, settings }).totals.scenario.powerW;
};
const engineScenarioAccurate = () => {
  sink += evaluateScenario({ classes, technology: accurateTechnology, settings }).totals.scenario.powerW;
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
        [res.capacitance.couplingEachFPerM, bareOut[o + F.couple]!],
        [res.validity.length, bareFlags[row]!.length],
      ];
      pairs.push([res.energyJ, bareOut[o + F.energy]!], [res.repeaterAreaM2, bareOut[o + F.repArea]!], [res.repeaterPowerW, bareOut[o + F.repPower]!]);
      res.distribution.bins.forEach((bin, j) =>
        pairs.push([bin.delayS, bareBins[row * MAX_BINS * 5 + 5 * j + 2]!], [bin.repeaters, bareBins[row * MAX_BINS * 5 + 5 * j + 3]!]),
      );
      for (const [a, b] of pairs) worst = Math.max(worst, rel(a, b));
    }
  });
  worst = Math.max(
    worst,
    rel(ev.totals.scenario.powerW, bareTotals[11]!),
    rel(ev.totals.baseline.worstDelayS, bareTotals[4]!),
    rel(ev.totals.scenario.repeaterPowerShare, bareTotals[17]!),
  );
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
  sweepFlags.length = 0;
  sink += sweepYs[n - 1]!;
};
const engineSweep = () => {
  sink += sweep({ classes, technology, settings, variable: "s", metric: "delay", from: 1, to: 4, points: 200 }).length;
};
const engineSweepAccurate = () => {
  sink += sweep({ classes, technology: accurateTechnology, settings, variable: "s", metric: "delay", from: 1, to: 4, points: 200 }).length;
};

// The sweep's bare loop must compute the engine's points too: same x order (level, class, x), same delays.
{
  const curves = sweep({ classes, technology, settings, variable: "s", metric: "delay", from: 1, to: 4, points: 200 });
  bareSweep();
  let n = 0;
  let worst = 0;
  for (const c of curves) {
    if (c.skipped !== undefined || c.points.length !== xs.length) throw new Error(`bench: the engine's sweep skipped points of ${c.className}`);
    for (const pt of c.points) {
      const b = sweepYs[n++]!;
      worst = Math.max(worst, pt.y === b ? 0 : Math.abs(pt.y - b) / Math.max(Math.abs(pt.y), Math.abs(b)));
    }
  }
  if (!(n === sweepYs.length && worst < 1e-12))
    throw new Error(`bench: the bare sweep does not reproduce the engine's (${n} points, worst relative difference ${worst})`);
}

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
timeIt(engineScenarioAccurate, 1000);
timeIt(engineSweepAccurate, 1000);
const [evA, evP] = best(engineScenarioAccurate, engineScenario, ROUNDS, 300);
const [swA, swP] = best(engineSweepAccurate, engineSweep, ROUNDS, 400);

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
// The default capacitance (the accurate tables at levels coupled and full) against the published forms, same engine.
const accRows: [string, string, string, string][] = [
  [
    "full scenario, 20 classes × 64 bins (baseline + scenario)",
    `${(1000 / evA.perCallMs).toFixed(0)} eval/s`,
    `${(1000 / evP.perCallMs).toFixed(0)} eval/s`,
    (evA.perCallMs / evP.perCallMs).toFixed(2),
  ],
  ["sweep, 200 points × 20 classes × 4 levels", `${swA.perCallMs.toFixed(2)} ms`, `${swP.perCallMs.toFixed(2)} ms`, (swA.perCallMs / swP.perCallMs).toFixed(2)],
];
const accHead = ["work", "accurate tables (default)", "published forms", "accurate/published"];
const accWidths = accHead.map((h, i) => Math.max(h.length, ...accRows.map((r) => r[i]!.length)));
console.log(accHead.map((h, i) => h.padEnd(accWidths[i]!)).join(" | "));
console.log(accWidths.map((w) => "-".repeat(w)).join("-|-"));
for (const r of accRows) console.log(r.map((c, i) => (i === 0 ? c.padEnd(accWidths[i]!) : c.padStart(accWidths[i]!))).join(" | "));
console.log("");
const field = await benchField();
for (const line of field.lines) console.log(line);
console.log(
  `field check at the default grid: ${field.ms.toFixed(1)} ms, error ${(field.relErr * 100).toFixed(2)}%, ${field.cells} cells (aim ≤ 250 ms at < 1%)`,
);

// Design space (issue 15's performance aims: Monte Carlo of 20 classes × 2,000 samples ≤ 1 s, the heat map of 40 × 40
// points of one class ≤ 200 ms; in the app both run in a Web Worker, here on the main thread), default technology
// (accurate tables), level full, the bench's scenario, 2,000 samples, σ width 1 nm, thickness 2 nm, k 2%.
{
  const dsClass = classes[1]!;
  const mc = () => {
    variation({
      classes,
      technology: accurateTechnology,
      settings,
      sigma: { width: { absolute: 1e-9 }, thickness: { absolute: 2e-9 }, k: { relative: 0.02 } },
      samples: 2000,
      seed: 1,
    });
  };
  const grid = () => {
    objectiveGrid({ wireClass: dsClass, technology: accurateTechnology, settings, objective: "delay", n: 40, m: 40 });
  };
  let evals = 0;
  const opt = () => {
    evals = optimizeClass({ wireClass: dsClass, technology: accurateTechnology, settings, objective: "edp" }).evaluations;
  };
  timeIt(grid, 500);
  timeIt(opt, 500);
  let mcMs = Infinity;
  let gridMs = Infinity;
  let optMs = Infinity;
  for (let r = 0; r < 3; r++) {
    mcMs = Math.min(mcMs, timeIt(mc, 1).perCallMs);
    gridMs = Math.min(gridMs, timeIt(grid, 300).perCallMs);
    optMs = Math.min(optMs, timeIt(opt, 300).perCallMs);
  }
  console.log("");
  console.log(`design space (CPU time, best of 3): Monte Carlo 20 classes × 2,000 samples ${mcMs.toFixed(0)} ms (aim ≤ 1,000 ms);`);
  console.log(`  heat map 40 × 40, one class ${gridMs.toFixed(1)} ms (aim ≤ 200 ms); optimiser, one class, edp ${optMs.toFixed(1)} ms (${evals} evaluations)`);
}
if (sink === 42) console.log("");

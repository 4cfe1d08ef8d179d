/**
 * Optimal repeater insertion (Bakoglu–Meindl). SI units: Ω, F, m, s.
 *
 * Stage model: T(k, h) = k·[a·(R0/h)·(C/k + h·C0) + (R/k)·(b·C/k + a·h·C0)]
 *            = a·R0·C/h + a·k·R0·C0 + b·R·C/k + a·R·h·C0,
 * with a = ln 2 and b = 0.377 (Bakoglu rounds to 0.7 and 0.4), so that k = h = 1 is the Sakurai delay of a
 * minimum driver + line + minimum load. Optimum: k* = sqrt(b·R·C/(a·R0·C0)), h* = sqrt(R0·C/(R·C0)),
 * T* = 2·(a + sqrt(a·b))·sqrt(R0·C0·R·C). Repeater self-loading and input slope are ignored.
 * @see H. B. Bakoglu and J. D. Meindl, "Optimal interconnection circuits for VLSI", IEEE TED ED-32(5), 1985 [memory]
 */
import { DEFAULT_MIN_REPEATER_GAIN, DEFAULT_OUTPUT_C_RATIO, LN2 as LN2_IMPORTED, REPEATER_A, REPEATER_B as REPEATER_B_IMPORTED } from "./constants";
import { inRange, nonNegative, positive } from "./check";
import { stageT50 } from "./delay";
import { exactTau50At, tablePosition } from "./delay-table";
import type { DelayModel, RepeaterResult } from "./types";

// Module-local copies: imported bindings are getters under some loaders (tsx), slow in the repeater search's loops.
const LN2 = LN2_IMPORTED;
const REPEATER_B = REPEATER_B_IMPORTED;

/** Delay (s) of a line (totals rOhm, cF) cut into `count` equal stages driven by repeaters of size h. */
export function repeatedDelayS(p: { rOhm: number; cF: number; r0Ohm: number; c0F: number; count: number; size: number }): number {
  const { rOhm: r, cF: c, r0Ohm: r0, c0F: c0, count: k, size: h } = p;
  return (REPEATER_A * r0 * c) / h + REPEATER_A * k * r0 * c0 + (REPEATER_B * r * c) / k + REPEATER_A * r * h * c0;
}

/**
 * Length (m) beyond which two repeated stages beat one at the optimal size h*: from T(2, h*) < T(1, h*),
 * L_crit = sqrt(2·a·R0·C0 / (b·r·c)), r and c per metre.
 */
export function criticalLengthM(p: { rOhmPerM: number; cFPerM: number; r0Ohm: number; c0F: number }): number {
  positive("rOhmPerM", p.rOhmPerM);
  positive("cFPerM", p.cFPerM);
  positive("r0Ohm", p.r0Ohm);
  positive("c0F", p.c0F);
  return Math.sqrt((2 * REPEATER_A * p.r0Ohm * p.c0F) / (REPEATER_B * p.rOhmPerM * p.cFPerM));
}

/**
 * Optimal whole number of stages k ≥ 1 (the better of floor and ceil of k*), optimal size h*, the repeated
 * delay T(k, h*) of the whole line, the optimal delay per metre T* ÷ L and the critical length.
 * count = 1 means no inserted repeater (the first stage is the driver).
 *
 * Which delay count = 1 reports depends on `unrepeatedDelayS`:
 * - given (the engine passes the class's own delayS: its driver as given, line and load): repeaters are inserted
 *   only where they make the line faster, as in the length distribution: count = k only if k ≥ 2 and
 *   T(k, h*) < unrepeatedDelayS, otherwise count = 1 and delayS = unrepeatedDelayS. So delayS < unrepeatedDelayS
 *   exactly when repeaters help, and delayS = unrepeatedDelayS otherwise.
 * - omitted: the bare Bakoglu–Meindl optimum, where count = 1 is T(1, h*), a driver resized to h* (which can be
 *   faster or slower than any real driver).
 */
export function optimalRepeaters(p: { rOhm: number; cF: number; lengthM: number; r0Ohm: number; c0F: number; unrepeatedDelayS?: number }): RepeaterResult {
  positive("rOhm", p.rOhm);
  positive("cF", p.cF);
  positive("lengthM", p.lengthM);
  positive("r0Ohm", p.r0Ohm);
  positive("c0F", p.c0F);
  if (p.unrepeatedDelayS !== undefined) positive("unrepeatedDelayS", p.unrepeatedDelayS);
  return optimalRepeatersUnchecked(p.rOhm, p.cF, p.lengthM, p.r0Ohm, p.c0F, p.unrepeatedDelayS);
}

/** optimalRepeaters without input checks (hot path). */
export function optimalRepeatersUnchecked(r: number, c: number, lengthM: number, r0: number, c0: number, unrepeatedDelayS?: number): RepeaterResult {
  const a = REPEATER_A;
  const b = REPEATER_B;
  const kStar = Math.sqrt((b * r * c) / (a * r0 * c0));
  const h = Math.sqrt((r0 * c) / (r * c0));
  let k = bestWholeStages(kStar, r, c, r0, c0);
  const fixed = (a * r0 * c) / h + a * r * h * c0;
  let delayS = fixed + a * k * r0 * c0 + (b * r * c) / k;
  if (unrepeatedDelayS !== undefined && (k === 1 || !(delayS < unrepeatedDelayS))) {
    k = 1;
    delayS = unrepeatedDelayS;
  }
  const rc0 = r0 * c0;
  return {
    inserted: k - 1,
    stageCount: k,
    unrepeatedDelayS: unrepeatedDelayS ?? (a * r0 * c) / h + a * r0 * c0 + b * r * c + a * r * h * c0,
    count: k,
    size: h,
    delayS,
    delayPerMS: (2 * (a + Math.sqrt(a * b)) * Math.sqrt(rc0 * r * c)) / lengthM,
    criticalLengthM: lengthM * Math.sqrt((2 * a * rc0) / (b * r * c)),
  };
}

function bestWholeStages(kStar: number, r: number, c: number, r0: number, c0: number): number {
  if (kStar <= 1) return 1;
  const lo = Math.floor(kStar);
  const hi = lo + 1;
  // k-dependent part of T: a·k·R0·C0 + b·R·C/k
  const tLo = REPEATER_A * lo * r0 * c0 + (REPEATER_B * r * c) / lo;
  const tHi = REPEATER_A * hi * r0 * c0 + (REPEATER_B * r * c) / hi;
  return tHi < tLo ? hi : lo;
}

export const REPEATER_ACCURACY = "Bakoglu–Meindl optimum (a = ln2, b = 0.377), whole stages; ignores repeater self-loading and input slope";

// ---------------------------------------------------------------------------------------------------------------
// Engine 2: a repeated net with its real driver and load.

/**
 * Delay (s) of a net cut into k + 1 equal segments: the net's driver (rd, Ω) → segment → repeater 1 → … → repeater
 * k → segment → the net's load (cl, F). Each repeater is an ideal-threshold stage of size h: input capacitance h·C0,
 * output resistance R0/h, output (diffusion) capacitance γ·h·C0. Stage delays add (each repeater switches at 50% of its
 * input; docs/models.md "A repeated net with its real driver"):
 *   T = t(Rd; R/(k+1), C/(k+1); h·C0) + (k − 1)·[t(R0/h; R/(k+1), C/(k+1); h·C0) + ln2·γ·R0·C0]
 *       + t(R0/h; R/(k+1), C/(k+1); CL) + ln2·γ·R0·C0,
 * t = the stage delay of the chosen model (delay.ts: exact table or Sakurai), the output capacitance added as its
 * lumped delay ln2·(R0/h)·γ·h·C0 (docs/models.md). k = 0: t(Rd; R, C; CL). Validity: ideal-threshold repeaters (no input
 * slope, no internal delay beyond the output capacitance); checked against ngspice in tests/scaling/repeated-net.test.ts.
 */
export function repeatedNetDelayS(p: {
  rOhm: number;
  cF: number;
  driverOhm: number;
  loadF: number;
  r0Ohm: number;
  c0F: number;
  inserted: number;
  size: number;
  outputCRatio?: number;
  model?: DelayModel;
}): number {
  nonNegative("rOhm", p.rOhm);
  nonNegative("cF", p.cF);
  nonNegative("driverOhm", p.driverOhm);
  nonNegative("loadF", p.loadF);
  positive("r0Ohm", p.r0Ohm);
  positive("c0F", p.c0F);
  if (!(Number.isInteger(p.inserted) && p.inserted >= 0)) throw new RangeError(`inserted must be a whole number >= 0 (got ${p.inserted})`);
  positive("size", p.size);
  const gamma = p.outputCRatio ?? DEFAULT_OUTPUT_C_RATIO;
  nonNegative("outputCRatio", gamma);
  return chainDelay(p.rOhm, p.cF, p.driverOhm, p.loadF, p.r0Ohm, p.c0F, gamma, (p.model ?? "exact") === "exact", p.inserted, p.size);
}

export { DEFAULT_OUTPUT_C_RATIO, DEFAULT_MIN_REPEATER_GAIN };

function chainDelay(r: number, c: number, rd: number, cl: number, r0: number, c0: number, gamma: number, exact: boolean, k: number, h: number): number {
  if (k === 0) return stageT50(r, c, rd, cl, exact);
  const n = k + 1;
  const rs = r / n;
  const cs = c / n;
  const rr = r0 / h;
  const hc0 = h * c0;
  const own = LN2 * gamma * r0 * c0;
  const first = stageT50(rs, cs, rd, hc0, exact);
  const last = stageT50(rs, cs, rr, cl, exact) + own;
  return k === 1 ? first + last : first + (k - 1) * (stageT50(rs, cs, rr, hc0, exact) + own) + last;
}

/**
 * Per-k state of the exact chain (chainDelay with the exact model) in the repeater search: segment rs, cs, their
 * product, the driver's ratio Rd/Rs and the load's CL/Cs with their table positions. These do not depend on the
 * size h, so the search computes them once per k and each delay at a new h needs only the two ratios that move
 * (R0/h over Rs, h·C0 over Cs): same numbers as chainDelay, bit for bit.
 */
const KS = new Float64Array(7);

/** Fills KS for k ≥ 1 stages of the exact model; false when a segment has no R or no C (then chainDelay applies). */
function prepareExact(r: number, c: number, rd: number, cl: number, k: number): boolean {
  const n = k + 1;
  const rs = r / n;
  const cs = c / n;
  if (!(rs > 0 && cs > 0)) return false;
  const x1 = rd / rs;
  const y2 = cl / cs;
  KS[0] = rs;
  KS[1] = cs;
  KS[2] = rs * cs;
  KS[3] = x1;
  KS[4] = tablePosition(x1);
  KS[5] = y2;
  KS[6] = tablePosition(y2);
  return true;
}

/** chainDelay (exact model, k ≥ 1) at size h from the state prepareExact left in KS; `ownOut` = ln2·γ·R0·C0. */
function chainExactPrepared(r0: number, c0: number, ownOut: number, k: number, h: number): number {
  const rc = KS[2]!;
  const x1 = KS[3]!;
  const y2 = KS[5]!;
  const x2 = r0 / h / KS[0]!;
  const y1 = (h * c0) / KS[1]!;
  const px2 = tablePosition(x2);
  const py1 = tablePosition(y1);
  const first = rc * exactTau50At(x1, KS[4]!, y1, py1);
  const last = rc * exactTau50At(x2, px2, y2, KS[6]!) + ownOut;
  return k === 1 ? first + last : first + (k - 1) * (rc * exactTau50At(x2, px2, y1, py1) + ownOut) + last;
}

/** refineSize's delay at size h: the prepared exact chain when `prepared` (KS holds this k), else chainDelay. */
function sizedDelay(
  prepared: boolean,
  r: number,
  c: number,
  rd: number,
  cl: number,
  r0: number,
  c0: number,
  gamma: number,
  exact: boolean,
  ownOut: number,
  k: number,
  h: number,
): number {
  return prepared ? chainExactPrepared(r0, c0, ownOut, k, h) : chainDelay(r, c, rd, cl, r0, c0, gamma, exact, k, h);
}

/** chainDelay through the prepared exact path when it applies (same result either way). */
function chainAt(r: number, c: number, rd: number, cl: number, r0: number, c0: number, gamma: number, exact: boolean, k: number, h: number): number {
  if (exact && prepareExact(r, c, rd, cl, k)) return chainExactPrepared(r0, c0, LN2 * gamma * r0 * c0, k, h);
  return chainDelay(r, c, rd, cl, r0, c0, gamma, exact, k, h);
}

/** The chosen repeated net: inserted k, size h, its delay and the unrepeated delay. */
export interface RepeatedNet {
  /** Inserted repeaters k ≥ 0. */
  inserted: number;
  /** Repeater size h (minimum repeaters) when k ≥ 1; 0 when none is inserted. */
  size: number;
  /** Delay of the chosen net (= unrepeatedDelayS when k = 0). */
  delayS: number;
  /** Delay without repeaters. */
  unrepeatedDelayS: number;
  /** k + 1. */
  stageCount: number;
}

/**
 * The repeated net of least delay (repeatedNetDelayS) over whole k ≥ 0 and sizes h ≥ 1 (a repeater no smaller than a
 * minimum one; common practice, no source), keeping repeaters only when they cut the delay by at least `minGain`:
 * T(k, h) ≤ (1 − minGain)·T(0). Search (deterministic): for each k the Sakurai form of T is A/h + B·h + const, a
 * lower bound of the exact model (the exact stage delay is never below Sakurai's, delay-table.ts), minimised
 * analytically at h = sqrt(A/B) (the Bakoglu–Meindl size when driver and load are repeaters). Every k whose bound is
 * below the threshold and the best delay so far (the k of least bound, Bakoglu–Meindl's k_opt in that limit, first)
 * gets its delay at that size; the best of these, and any within 0.1% of it, get their size refined by parabolic
 * interpolation in ln h (refineSize). The h refinement changes the delay by ~1e-4 at most (the exact optimum is
 * within a few per cent of the bound's), so the 0.1% margin keeps the chosen k the brute-force optimum
 * (tests/scaling/repeated-net.test.ts: same k and delay within 2e-5 of a 4,000-point h grid). k is capped at 100,000.
 * @param p model default "exact", outputCRatio γ default 0.5, minGain default 0.10
 */
export function repeatedNet(p: {
  rOhm: number;
  cF: number;
  driverOhm: number;
  loadF: number;
  r0Ohm: number;
  c0F: number;
  outputCRatio?: number;
  minGain?: number;
  model?: DelayModel;
}): RepeatedNet {
  positive("rOhm", p.rOhm);
  positive("cF", p.cF);
  nonNegative("driverOhm", p.driverOhm);
  nonNegative("loadF", p.loadF);
  positive("r0Ohm", p.r0Ohm);
  positive("c0F", p.c0F);
  const gamma = p.outputCRatio ?? DEFAULT_OUTPUT_C_RATIO;
  nonNegative("outputCRatio", gamma);
  const g = p.minGain ?? DEFAULT_MIN_REPEATER_GAIN;
  inRange("minGain", g, 0, 0.999);
  const o = NET;
  repeatedNetInto(p.rOhm, p.cF, p.driverOhm, p.loadF, p.r0Ohm, p.c0F, gamma, g, (p.model ?? "exact") === "exact", o);
  return { inserted: o[0]!, size: o[1]!, delayS: o[2]!, unrepeatedDelayS: o[3]!, stageCount: o[0]! + 1 };
}

export const REPEATED_NET_ACCURACY =
  "real driver → k repeaters (input h·C0, output R0/h and γ·h·C0) → real load, stage delays added; best whole k and size h ≥ 1 of that model; ideal-threshold repeaters (no input slope)";

const NET = new Float64Array(4);
/** Scratch: the delay at each candidate k's bound-optimal size, and that size (0 = not a candidate). */
let U = new Float64Array(256);
let HU = new Float64Array(256);
const HS = new Float64Array(1);
const K_MAX = 100_000;

/**
 * repeatedNet without input checks, into out = [k, h, delayS, unrepeatedDelayS] (no allocation: the evaluation and
 * the distribution call it for every bin).
 */
export function repeatedNetInto(
  r: number,
  c: number,
  rd: number,
  cl: number,
  r0: number,
  c0: number,
  gamma: number,
  minGain: number,
  exact: boolean,
  out: Float64Array,
): void {
  const t0 = stageT50(r, c, rd, cl, exact);
  out[0] = 0;
  out[1] = 0;
  out[2] = t0;
  out[3] = t0;
  const thr = (1 - minGain) * t0;
  const rc0 = r0 * c0;
  const own = LN2 * (1 + gamma) * rc0;
  // Lower bound LB(k) = F(k) + A/h + B·h at h = max(1, sqrt(A/B)) (lowerBound). F(k) = f1/(k + 1) + ln2·(k − 1 + k·γ)·R0·C0
  // is convex in k with its minimum at kF; sqrt(A·B) rises with k. So past kF, LB(k) ≥ F(k) + ab1 rises and the
  // scan stops once that exceeds the cap (the threshold, or the best delay found if lower).
  const f1 = REPEATER_B * r * c + LN2 * (rd * c + r * cl);
  const kF = Math.sqrt(f1 / own) - 1;
  const ab1 = 2 * LN2 * Math.sqrt(r0 * (c / 2 + cl) * c0 * (rd + r / 2));
  // Start from Bakoglu–Meindl's stage count (with γ): an achievable delay lowers the cap early.
  let k0 = Math.round(kF);
  if (k0 < 1) k0 = 1;
  if (k0 > K_MAX) k0 = K_MAX;
  let bestU = Infinity;
  let kU = 0;
  let kEnd = 0;
  const lb0 = lowerBound(r, c, rd, cl, r0, c0, gamma, k0, HS);
  if (lb0 <= thr) {
    const u = chainAt(r, c, rd, cl, r0, c0, gamma, exact, k0, HS[0]!);
    bestU = u;
    kU = k0;
    ensure(k0);
    U[k0] = u;
    HU[k0] = HS[0]!;
  }
  for (let k = 1; k <= K_MAX; k++) {
    const cap = bestU < thr ? bestU : thr;
    const lin = LN2 * (k - 1 + k * gamma) * rc0;
    if (lin > cap) break;
    if (k > kF && f1 / (k + 1) + lin + ab1 > cap) break;
    ensure(k);
    kEnd = k;
    if (k === k0 && kU === k0) continue;
    const lb = lowerBound(r, c, rd, cl, r0, c0, gamma, k, HS);
    if (!(lb <= cap)) continue;
    const u = chainAt(r, c, rd, cl, r0, c0, gamma, exact, k, HS[0]!);
    U[k] = u;
    HU[k] = HS[0]!;
    if (u < bestU) {
      bestU = u;
      kU = k;
    }
  }
  if (kEnd < k0 && kU === k0) kEnd = k0;
  if (kU === 0) {
    for (let k = 1; k <= kEnd; k++) HU[k] = 0;
    return;
  }
  // refine h (successive parabolic interpolation in ln h, h ≥ 1) for the best k and any k within 0.1% of it
  let best = thr;
  let bestK = 0;
  let bestH = 0;
  const near = bestU * (1 + 1e-3);
  for (let pass = 0; pass <= kEnd; pass++) {
    const k = pass === 0 ? kU : pass;
    if (pass !== 0 && k === kU) continue;
    const hu = HU[k]!;
    if (hu === 0 || !(U[k]! <= near) || !(U[k]! * (1 - 1e-3) <= best)) continue;
    const t = refineSize(r, c, rd, cl, r0, c0, gamma, exact, k, hu, U[k]!, HS);
    if (t <= best && (bestK === 0 || t < best)) {
      best = t;
      bestK = k;
      bestH = HS[0]!;
    }
  }
  for (let k = 1; k <= kEnd; k++) HU[k] = 0;
  if (bestK > 0) {
    out[0] = bestK;
    out[1] = bestH;
    out[2] = best;
  }
}

/** Grows the scratch arrays to hold index k (HU stays all zero outside a call). */
function ensure(k: number): void {
  if (k < U.length) return;
  let n = U.length;
  while (n <= k) n *= 2;
  const u = new Float64Array(n);
  u.set(U);
  U = u;
  const hu = new Float64Array(n);
  hu.set(HU);
  HU = hu;
}

/**
 * Minimises the chain delay over x = ln h ≥ 0 from (h0, t0) by two rounds of three-point parabolic interpolation
 * (steps 0.05 and 0.005 in ln h; the delay is smooth and nearly A/h + B·h there). Returns the least delay found,
 * its size in hOut[0].
 */
function refineSize(
  r: number,
  c: number,
  rd: number,
  cl: number,
  r0: number,
  c0: number,
  gamma: number,
  exact: boolean,
  k: number,
  h0: number,
  t0: number,
  hOut: Float64Array,
): number {
  // the exact model's h-independent part once for this k (chainExactPrepared); otherwise chainDelay
  const prepared = exact && prepareExact(r, c, rd, cl, k);
  const ownOut = LN2 * gamma * r0 * c0;
  let x = Math.log(h0);
  let t = t0;
  for (let round = 0; round < 2; round++) {
    const d = round === 0 ? 0.05 : 0.005;
    const xa = x - d < 0 ? 0 : x - d;
    const xb = xa + d;
    const xc = xa + 2 * d;
    const fa = xa === x ? t : sizedDelay(prepared, r, c, rd, cl, r0, c0, gamma, exact, ownOut, k, Math.exp(xa));
    const fb = xb === x ? t : sizedDelay(prepared, r, c, rd, cl, r0, c0, gamma, exact, ownOut, k, Math.exp(xb));
    const fc = sizedDelay(prepared, r, c, rd, cl, r0, c0, gamma, exact, ownOut, k, Math.exp(xc));
    // best of the three, then the parabola's vertex when it is a minimum
    let bx = x;
    let bt = t;
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
      const fv = sizedDelay(prepared, r, c, rd, cl, r0, c0, gamma, exact, ownOut, k, Math.exp(xv));
      if (fv < bt) {
        bt = fv;
        bx = xv;
      }
    }
    x = bx;
    t = bt;
  }
  hOut[0] = Math.exp(x);
  return t;
}

/**
 * Sakurai-form lower bound of the chain delay with k ≥ 1 repeaters over sizes h ≥ 1: A/h + B·h + const with
 * A = ln2·R0·(k·Cs + CL), B = ln2·C0·(Rd + k·Rs), minimised at h = max(1, sqrt(A/B)) (into hOut[0]).
 */
function lowerBound(r: number, c: number, rd: number, cl: number, r0: number, c0: number, gamma: number, k: number, hOut: Float64Array): number {
  const n = k + 1;
  const rs = r / n;
  const cs = c / n;
  const A = LN2 * r0 * (k * cs + cl);
  const B = LN2 * c0 * (rd + k * rs);
  const hs = Math.sqrt(A / B);
  const h = hs >= 1 ? hs : 1;
  hOut[0] = h;
  const fixed = REPEATER_B * rs * cs * n + LN2 * (rd * cs + rs * cl + (k - 1 + k * gamma) * r0 * c0);
  return fixed + A / h + B * h;
}

/**
 * Wire-length distributions: per-class aggregation over a length histogram (delay per bin, share over a
 * delay budget, repeaters, capacitance) and the Davis–De–Meindl stochastic distribution from Rent's rule.
 */
import { positive, inRange } from "./check";
import { DEFAULT_MIN_REPEATER_GAIN, DEFAULT_OUTPUT_C_RATIO, repeatedNetInto } from "./repeaters";
import type { DelayModel, DistributionResult, LengthBin } from "./types";

/** Electrical parameters of a class after scaling, for aggregation (SI). */
export interface DistributionInput {
  /** Bins at baseline lengths; each length is divided by lengthDivisor (S_L, default 1). */
  bins: readonly LengthBin[];
  lengthDivisor?: number;
  source: "histogram" | "mean";
  rOhmPerM: number;
  cFPerM: number;
  /** Driver resistance, including the net's vias (lumped at the driver end). */
  driverOhm: number;
  loadF: number;
  r0Ohm: number;
  c0F: number;
  delayBudgetS: number;
  /** Stage-delay model (default "exact"). */
  model?: DelayModel;
  /** Repeater output capacitance ratio γ (default 0.5). */
  outputCRatio?: number;
  /** Minimum gain for inserting repeaters (default 0.10). */
  minGain?: number;
}

/**
 * Per-bin delay of the net (driver → line → load, with repeaters where they cut the delay by at least minGain:
 * repeatedNet in repeaters.ts, the same model as the class result); totals weighted by net count.
 * shareOverBudget counts nets with delay strictly above the budget.
 */
export function classDistribution(p: DistributionInput): DistributionResult {
  return distributionCore(
    p.bins,
    p.lengthDivisor ?? 1,
    p.source,
    p.rOhmPerM,
    p.cFPerM,
    p.driverOhm,
    p.loadF,
    p.r0Ohm,
    p.c0F,
    p.delayBudgetS,
    undefined,
    (p.model ?? "exact") === "exact",
    p.outputCRatio ?? DEFAULT_OUTPUT_C_RATIO,
    p.minGain ?? DEFAULT_MIN_REPEATER_GAIN,
  );
}

const NET = new Float64Array(4);

/**
 * classDistribution with positional arguments (the evaluation hot path: no input object). When `stats` is given,
 * stats[0] receives the largest delay over the bins that hold nets (0 if none), for the scenario totals.
 */
export function distributionCore(
  bins: readonly LengthBin[],
  div: number,
  source: "histogram" | "mean",
  r: number,
  c: number,
  rd: number,
  cl: number,
  r0: number,
  c0: number,
  delayBudgetS: number,
  stats: Float64Array | undefined,
  exact: boolean,
  gamma: number,
  minGain: number,
): DistributionResult {
  const n = bins.length;
  const out: DistributionResult["bins"] = new Array(n);
  const net = NET;
  let total = 0;
  let over = 0;
  let reps = 0;
  let sizeSum = 0;
  let sumDelay = 0;
  let sumC = 0;
  let worst = 0;
  for (let i = 0; i < n; i++) {
    const bin = bins[i]!;
    const count = bin.count;
    const L = bin.lengthM / div;
    const R = r * L;
    const C = c * L;
    repeatedNetInto(R, C, rd, cl, r0, c0, gamma, minGain, exact, net);
    const inserted = net[0]!;
    const size = net[1]!;
    const delay = net[2]!;
    out[i] = { lengthM: L, count, delayS: delay, repeaters: inserted, repeaterSize: size };
    total += count;
    if (delay > delayBudgetS) over += count;
    if (count > 0 && delay > worst) worst = delay;
    reps += inserted * count;
    sizeSum += inserted * size * count;
    sumDelay += delay * count;
    sumC += C * count;
  }
  if (stats !== undefined) stats[0] = worst;
  return {
    bins: out,
    totalNets: total,
    shareOverBudget: total > 0 ? over / total : 0,
    totalRepeaters: reps,
    meanDelayS: total > 0 ? sumDelay / total : 0,
    totalCapacitanceF: sumC,
    totalRepeaterSize: sizeSum,
    source,
  };
}

/**
 * Davis–De–Meindl stochastic wire-length distribution from Rent's rule: number of wires per unit length l
 * (l in gate pitches), α = fanout/(fanout + 1):
 *   1 ≤ l < √N:    i(l) = (α·k/2)·Γ·(l³/3 − 2√N·l² + 2N·l)·l^(2p−4)
 *   √N ≤ l < 2√N:  i(l) = (α·k/6)·Γ·(2√N − l)³·l^(2p−4)
 *   Γ = 2N(1 − N^(p−1)) / [ −N^p·(1 + 2p − 2^(2p−1))/(p(2p−1)(p−1)(2p−3)) − 1/(6p) + 2√N/(2p−1) − N/(p−1) ]
 * Returns `bins` log-spaced bins over [1, 2√N] gate pitches; each bin's count is the integral of i(l) over it
 * (Gauss–Legendre, split at √N), its length the geometric centre times gatePitchM. Γ's removable singularity at
 * p = 0.5 is handled by averaging p ± 1e-6.
 * @see J. A. Davis, V. K. De, J. D. Meindl, IEEE TED 45(3), 1998 [memory for the exact Γ]
 */
export function rentWireLengths(p: { gates: number; rentK: number; rentP: number; fanout: number; gatePitchM: number; bins?: number }): LengthBin[] {
  positive("gates", p.gates);
  if (p.gates < 4) throw new RangeError(`gates must be >= 4 (got ${p.gates})`);
  positive("rentK", p.rentK);
  inRange("rentP", p.rentP, 0.05, 0.95);
  positive("fanout", p.fanout);
  positive("gatePitchM", p.gatePitchM);
  const nBins = p.bins ?? 64;
  if (!(Number.isInteger(nBins) && nBins >= 1)) throw new RangeError(`bins must be a whole number >= 1 (got ${nBins})`);
  const N = p.gates;
  const sq = Math.sqrt(N);
  const alpha = p.fanout / (p.fanout + 1);
  const pr = p.rentP;
  const gamma = Math.abs(pr - 0.5) < 1e-6 ? (davisGamma(N, 0.5 - 1e-6) + davisGamma(N, 0.5 + 1e-6)) / 2 : davisGamma(N, pr);
  const e = 2 * pr - 4;
  const density = (l: number): number =>
    l < sq
      ? ((alpha * p.rentK) / 2) * gamma * (l ** 3 / 3 - 2 * sq * l * l + 2 * N * l) * l ** e
      : ((alpha * p.rentK) / 6) * gamma * (2 * sq - l) ** 3 * l ** e;
  const lMax = 2 * sq;
  const logMax = Math.log(lMax);
  const out: LengthBin[] = [];
  for (let i = 0; i < nBins; i++) {
    const lo = Math.exp((logMax * i) / nBins);
    const hi = Math.exp((logMax * (i + 1)) / nBins);
    let count = 0;
    if (lo < sq && hi > sq) count = integrate(density, lo, sq) + integrate(density, sq, hi);
    else count = integrate(density, lo, hi);
    out.push({ lengthM: Math.sqrt(lo * hi) * p.gatePitchM, count });
  }
  return out;
}

/** Γ of Davis–De–Meindl (see rentWireLengths). */
export function davisGamma(N: number, p: number): number {
  const num = 2 * N * (1 - N ** (p - 1));
  const den =
    (-(N ** p) * (1 + 2 * p - 2 ** (2 * p - 1))) / (p * (2 * p - 1) * (p - 1) * (2 * p - 3)) - 1 / (6 * p) + (2 * Math.sqrt(N)) / (2 * p - 1) - N / (p - 1);
  return num / den;
}

// 8-point Gauss–Legendre on sub-intervals (log-spaced for the l^(2p−4) factor).
const GL_X = [
  -0.9602898564975363, -0.7966664774136267, -0.525532409916329, -0.1834346424956498, 0.1834346424956498, 0.525532409916329, 0.7966664774136267,
  0.9602898564975363,
];
const GL_W = [
  0.1012285362903763, 0.2223810344533745, 0.3137066458778873, 0.362683783378362, 0.362683783378362, 0.3137066458778873, 0.2223810344533745, 0.1012285362903763,
];

function integrate(f: (x: number) => number, a: number, b: number): number {
  const parts = 8;
  const la = Math.log(a);
  const lb = Math.log(b);
  let sum = 0;
  for (let j = 0; j < parts; j++) {
    const u0 = la + ((lb - la) * j) / parts;
    const u1 = la + ((lb - la) * (j + 1)) / parts;
    const mid = (u0 + u1) / 2;
    const half = (u1 - u0) / 2;
    for (let q = 0; q < 8; q++) {
      const u = mid + half * GL_X[q]!;
      const x = Math.exp(u);
      sum += GL_W[q]! * half * f(x) * x; // dl = l·du
    }
  }
  return sum;
}

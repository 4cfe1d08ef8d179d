/**
 * Cost of the accurate capacitance model (lib/scaling/cap-accurate.ts) against the published closed form
 * (capacitance.ts closedForm "coupled") and a bare loop over the same inputs, in one run:
 *
 *   nice -n 19 npx tsx scaling/bench-cap.ts
 *
 * - per call (ns): 4,096 random in-range inputs (uniform in the table coordinates; half with no plane above),
 *   homogeneous (kGap = k) and with a gap layer (kGap < k), each looped over many times; the bare loop reads the same
 *   inputs and writes one sum (what any caller pays anyway). "net" = minus the bare loop.
 * - sweep: 20 classes × 200 points (4,000 calls, S/H swept across the range per class) at the accurate level, all
 *   classes homogeneous and all with a gap layer, and the same sweep with the closed form and with the bare loop.
 * Timing: CPU time of the process, best of 9 rounds (the machine is shared), after a warm-up.
 */
import { accurateCapacitanceInto } from "../lib/scaling/cap-accurate";
import { closedForm, type Split } from "../lib/scaling/capacitance";
import { EPSILON_0_F_PER_M } from "../lib/scaling/constants";

const N = 4096;
const ROUNDS = 9;
const NM = 1e-9;

function mulberry32(seed: number): () => number {
  let a = seed >>> 0;
  return () => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = a;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

const rand = mulberry32(7);
const logUni = (lo: number, hi: number): number => Math.exp(Math.log(lo) + (Math.log(hi) - Math.log(lo)) * rand());
const W = new Float64Array(N);
const T = new Float64Array(N);
const S = new Float64Array(N);
const HB = new Float64Array(N);
const HA: (number | null)[] = [];
const K = new Float64Array(N);
const KG = new Float64Array(N);
const F = new Float64Array(N);
for (let i = 0; i < N; i++) {
  const h = logUni(20, 300) * NM;
  HB[i] = h;
  W[i] = logUni(0.2, 20) * h;
  T[i] = logUni(0.3, 4) * h;
  S[i] = logUni(0.3, 10) * h;
  HA.push(i % 2 === 0 ? null : logUni(0.3, 10) * h);
  K[i] = 2 + 2 * rand();
  KG[i] = Math.max(1, K[i]! * logUni(0.25, 1));
  F[i] = rand();
}

const out: Split = { area: 0, ground: 0, couple: 0 };
let sink = 0;

const loops = {
  bare(): void {
    let acc = 0;
    for (let i = 0; i < N; i++) acc += W[i]! / HB[i]! + T[i]! + S[i]! + (HA[i] ?? 0) + K[i]! + KG[i]! + F[i]!;
    sink += acc;
  },
  closed(): void {
    let acc = 0;
    for (let i = 0; i < N; i++) {
      closedForm("coupled", EPSILON_0_F_PER_M * K[i]!, W[i]!, T[i]!, S[i]!, HB[i]!, HA[i]!, out);
      acc += out.ground + out.couple;
    }
    sink += acc;
  },
  accurate(): void {
    let acc = 0;
    for (let i = 0; i < N; i++) {
      accurateCapacitanceInto(W[i]!, T[i]!, S[i]!, HB[i]!, HA[i]!, K[i]!, K[i]!, F[i]!, out, null);
      acc += out.ground + out.couple;
    }
    sink += acc;
  },
  accurateGap(): void {
    let acc = 0;
    for (let i = 0; i < N; i++) {
      accurateCapacitanceInto(W[i]!, T[i]!, S[i]!, HB[i]!, HA[i]!, K[i]!, KG[i]!, F[i]!, out, null);
      acc += out.ground + out.couple;
    }
    sink += acc;
  },
};

function cpuMs(): number {
  const u = process.cpuUsage();
  return (u.user + u.system) / 1000;
}

/** Best (smallest) CPU time of one call of fn over ROUNDS rounds of `reps` calls each, in ms. */
function best(fn: () => void, reps: number): number {
  let min = Infinity;
  for (let r = 0; r < ROUNDS; r++) {
    const t0 = cpuMs();
    for (let k = 0; k < reps; k++) fn();
    min = Math.min(min, (cpuMs() - t0) / reps);
  }
  return min;
}

// Sweep: 20 classes × 200 points, S/H from 0.3 to 10 per class.
const CLASSES = 20;
const POINTS = 200;
const sweepLoops = {
  bare(): void {
    let acc = 0;
    for (let c = 0; c < CLASSES; c++) for (let p = 0; p < POINTS; p++) acc += W[c]! + T[c]! + HB[c]! * (0.3 + (9.7 * p) / (POINTS - 1)) + K[c]!;
    sink += acc;
  },
  closed(): void {
    let acc = 0;
    for (let c = 0; c < CLASSES; c++) {
      for (let p = 0; p < POINTS; p++) {
        closedForm("coupled", EPSILON_0_F_PER_M * K[c]!, W[c]!, T[c]!, HB[c]! * (0.3 + (9.7 * p) / (POINTS - 1)), HB[c]!, HA[c]!, out);
        acc += out.ground + out.couple;
      }
    }
    sink += acc;
  },
  accurate(): void {
    let acc = 0;
    for (let c = 0; c < CLASSES; c++) {
      for (let p = 0; p < POINTS; p++) {
        accurateCapacitanceInto(W[c]!, T[c]!, HB[c]! * (0.3 + (9.7 * p) / (POINTS - 1)), HB[c]!, HA[c]!, K[c]!, K[c]!, F[c]!, out, null);
        acc += out.ground + out.couple;
      }
    }
    sink += acc;
  },
  accurateGap(): void {
    let acc = 0;
    for (let c = 0; c < CLASSES; c++) {
      for (let p = 0; p < POINTS; p++) {
        accurateCapacitanceInto(W[c]!, T[c]!, HB[c]! * (0.3 + (9.7 * p) / (POINTS - 1)), HB[c]!, HA[c]!, K[c]!, KG[c]!, F[c]!, out, null);
        acc += out.ground + out.couple;
      }
    }
    sink += acc;
  },
};

function main(): void {
  for (const fn of [...Object.values(loops), ...Object.values(sweepLoops)]) for (let k = 0; k < 30; k++) fn(); // warm-up
  const perCall = (ms: number): number => (ms * 1e6) / N;
  const bare = perCall(best(loops.bare, 40));
  const closed = perCall(best(loops.closed, 20));
  const accurate = perCall(best(loops.accurate, 10));
  const gap = perCall(best(loops.accurateGap, 5));
  console.log(`per call (ns), ${N} random in-range inputs, best of ${ROUNDS} rounds (CPU time):`);
  console.log(`  bare loop (reads the inputs)        ${bare.toFixed(1)}`);
  console.log(`  published closed form ("coupled")   ${closed.toFixed(1)}   net ${(closed - bare).toFixed(1)}`);
  console.log(`  accurate, kGap = k                  ${accurate.toFixed(1)}   net ${(accurate - bare).toFixed(1)}`);
  console.log(`  accurate, gap layer (kGap < k)      ${gap.toFixed(1)}   net ${(gap - bare).toFixed(1)}`);
  console.log(
    `  ratio accurate / closed form: ${(accurate / closed).toFixed(2)} (net ${((accurate - bare) / (closed - bare)).toFixed(2)}); with a gap ${(gap / closed).toFixed(2)} (net ${((gap - bare) / (closed - bare)).toFixed(2)})`,
  );
  const sb = best(sweepLoops.bare, 200);
  const sc = best(sweepLoops.closed, 50);
  const sa = best(sweepLoops.accurate, 10);
  const sg = best(sweepLoops.accurateGap, 10);
  console.log(`sweep, ${CLASSES} classes × ${POINTS} points (${CLASSES * POINTS} calls, S/H from 0.3 to 10 per class):`);
  console.log(`  bare loop ${sb.toFixed(3)} ms, closed form ${sc.toFixed(3)} ms`);
  console.log(
    `  accurate, kGap = k: ${sa.toFixed(3)} ms (net ${(sa - sb).toFixed(3)} ms); every class with a gap layer: ${sg.toFixed(3)} ms (net ${(sg - sb).toFixed(3)} ms)`,
  );
  if (sink === 42) console.log(""); // keep the results alive
}

main();

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
import { REPEATER_A, REPEATER_B } from "./constants";
import { positive } from "./check";
import type { RepeaterResult } from "./types";

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

/**
 * Delay of a driver + uniform distributed RC line + load. SI units: Ω, F, s.
 */
import { LN2, SAKURAI_DISTRIBUTED_COEFF } from "./constants";
import { nonNegative } from "./check";

export interface LineDelay {
  /** 50% step delay, Sakurai form: 0.377·R·C + 0.693·(Rd·C + Rd·CL + R·CL). */
  t50S: number;
  /** Elmore time constant T_D = Rd·(C + CL) + R·(C/2 + CL) (not multiplied by ln 2). */
  elmoreS: number;
  /** 0.377·R·C, the intrinsic 50% delay of the open-ended line alone. */
  intrinsicS: number;
}

/**
 * 50% delay of a step-driven driver Rd + distributed line (R, C) + load CL:
 * t50 ≈ 0.377·RC + 0.693·(Rd·C + Rd·CL + R·CL) (T. Sakurai, IEEE JSSC SC-18(4), 1983 [memory]; 0.5–3.2% low against
 * ngspice on a 200-section ladder, tests/scaling/delay.test.ts), and the Elmore delay
 * T_D = Rd·(C + CL) + R·(C/2 + CL) (W. C. Elmore, J. Appl. Phys. 19, 1948). Without driver and load,
 * t50 = 0.377·RC (exact: 0.3787·RC).
 * @param p rOhm, cF line totals; driverOhm, loadF default 0
 */
export function lineDelay(p: { rOhm: number; cF: number; driverOhm?: number; loadF?: number }): LineDelay {
  nonNegative("rOhm", p.rOhm);
  nonNegative("cF", p.cF);
  const rd = p.driverOhm ?? 0;
  const cl = p.loadF ?? 0;
  nonNegative("driverOhm", rd);
  nonNegative("loadF", cl);
  return lineDelayUnchecked(p.rOhm, p.cF, rd, cl);
}

/** lineDelay without input checks (hot path). */
export function lineDelayUnchecked(r: number, c: number, rd: number, cl: number): LineDelay {
  const intrinsicS = SAKURAI_DISTRIBUTED_COEFF * r * c;
  return {
    t50S: intrinsicS + LN2 * (rd * c + rd * cl + r * cl),
    elmoreS: rd * (c + cl) + r * (c / 2 + cl),
    intrinsicS,
  };
}

/** lineDelayUnchecked's t50S alone, with no result object (the sweep's hot path); the same arithmetic, bit for bit. */
export function t50Unchecked(r: number, c: number, rd: number, cl: number): number {
  return SAKURAI_DISTRIBUTED_COEFF * r * c + LN2 * (rd * c + rd * cl + r * cl);
}

/** Lumped RC step response 50% point, t50 = ln2·RC (exact). */
export function lumpedT50S(p: { rOhm: number; cF: number }): number {
  return LN2 * p.rOhm * p.cF;
}

/**
 * Interpolation in the generated table of the exact 50% delay (delay-table-data.ts, made by
 * scaling/make-delay-table.ts): bilinear in (log10 x, log10 y), linear in x (or y) between 0 and the first grid
 * ratio, q held at its edge value beyond the last (where a lumped time constant dominates).
 */
import {
  FIRST as FIRST_IMPORTED,
  LAST_INDEX as LAST_IMPORTED,
  LOG_LO as LOG_LO_IMPORTED,
  N as N_IMPORTED,
  PER_DECADE as PER_DECADE_IMPORTED,
  Q,
} from "./delay-table-data";

// Module-local copies: imported bindings are getters under some loaders, slow in the repeater search.
const FIRST = FIRST_IMPORTED;
const LAST_INDEX = LAST_IMPORTED;
const LOG_LO = LOG_LO_IMPORTED;
const N = N_IMPORTED;
const PER_DECADE = PER_DECADE_IMPORTED;

/**
 * Position on the grid axis of a ratio v ≥ 0 as one number, index + fraction: v/FIRST below the first grid ratio,
 * the fractional log index inside the grid, LAST_INDEX beyond it (read back as the last cell at fraction 1).
 * The repeater search computes it once per ratio and reuses it in every stage that shares the ratio.
 */
export function tablePosition(v: number): number {
  if (v < FIRST) return v / FIRST;
  const u = (Math.log10(v) - LOG_LO) * PER_DECADE + 1;
  return u >= LAST_INDEX ? LAST_INDEX : u;
}

/** τ50 (see exactTau50) at x, y ≥ 0 given their grid positions px = tablePosition(x), py = tablePosition(y). */
export function exactTau50At(x: number, px: number, y: number, py: number): number {
  let i = Math.floor(px);
  let fx: number;
  if (i >= LAST_INDEX) {
    i = LAST_INDEX - 1;
    fx = 1;
  } else fx = px - i;
  let j = Math.floor(py);
  let fy: number;
  if (j >= LAST_INDEX) {
    j = LAST_INDEX - 1;
    fy = 1;
  } else fy = py - j;
  const a = i * N + j;
  const q00 = Q[a]!;
  const q01 = Q[a + 1]!;
  const q10 = Q[a + N]!;
  const q11 = Q[a + N + 1]!;
  const q = (1 - fx) * ((1 - fy) * q00 + fy * q01) + fx * ((1 - fy) * q10 + fy * q11);
  return q * (0.377 + 0.693 * (x + x * y + y));
}

/**
 * Exact normalised 50% delay τ50 = t50 / (R·C) of driver x·R + distributed line (R, C) + load y·C, x, y ≥ 0
 * (finite). Within 0.05% of the exact solution everywhere (tests/scaling/delay-table.test.ts).
 */
export function exactTau50(x: number, y: number): number {
  return exactTau50At(x, tablePosition(x), y, tablePosition(y));
}

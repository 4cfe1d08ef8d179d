/**
 * Interpolation in the generated table of the exact 50% delay (delay-table-data.ts, made by
 * scaling/make-delay-table.ts): bilinear in (log10 x, log10 y), linear in x (or y) between 0 and the first grid
 * ratio, q held at its edge value beyond the last (where a lumped time constant dominates).
 */
import { FIRST, LAST_INDEX, LOG_LO, N, PER_DECADE, Q } from "./delay-table-data";

/** Position on the grid axis of ratio v ≥ 0 as index + fraction (into pos[0], pos[1]). */
function axis(v: number, pos: Float64Array, o: number): void {
  if (v < FIRST) {
    pos[o] = 0;
    pos[o + 1] = v / FIRST;
    return;
  }
  const u = (Math.log10(v) - LOG_LO) * PER_DECADE + 1;
  if (u >= LAST_INDEX) {
    pos[o] = LAST_INDEX - 1;
    pos[o + 1] = 1;
    return;
  }
  const i = Math.floor(u);
  pos[o] = i;
  pos[o + 1] = u - i;
}

const POS = new Float64Array(4);

/**
 * Exact normalised 50% delay τ50 = t50 / (R·C) of driver x·R + distributed line (R, C) + load y·C, x, y ≥ 0
 * (finite). Within 0.05% of the exact solution everywhere (tests/scaling/delay-table.test.ts).
 */
export function exactTau50(x: number, y: number): number {
  axis(x, POS, 0);
  axis(y, POS, 2);
  const i = POS[0]!;
  const fx = POS[1]!;
  const j = POS[2]!;
  const fy = POS[3]!;
  const a = i * N + j;
  const q00 = Q[a]!;
  const q01 = Q[a + 1]!;
  const q10 = Q[a + N]!;
  const q11 = Q[a + N + 1]!;
  const q = (1 - fx) * ((1 - fy) * q00 + fy * q01) + fx * ((1 - fy) * q10 + fy * q11);
  return q * (0.377 + 0.693 * (x + x * y + y));
}

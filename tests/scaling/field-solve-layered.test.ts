import { describe, expect, it } from "vitest";
import { fieldSolve, type FieldSolveInput } from "@/lib/scaling/field-solve";
import { expectClose } from "./close";

// Layered dielectrics in the field solver (lib/scaling/field-solve.ts, "Layered dielectrics"):
// kGap between the lines up to gapFraction·T, an optional cap layer (capThicknessM, capK) on top of
// the lines, k elsewhere. Figures quoted as "measured" were measured with this solver on Node 20.

const EPS0 = 8.8541878188e-12; // F/m, CODATA 2022 (written out so the test checks the engine's constant too)
const NM = 1e-9;

/** The intermediate-class geometry of issue 11: W = 40, T = 80, S = 40, H = H2 = 80 nm, k = 2.7. */
const intermediate: FieldSolveInput = {
  widthM: 40 * NM,
  thicknessM: 80 * NM,
  spacingM: 40 * NM,
  heightBelowM: 80 * NM,
  heightAboveM: 80 * NM,
  k: 2.7,
};

/** The same geometry with an air gap to half the line height and a 10 nm cap of k = 4.5. */
const layered: FieldSolveInput = { ...intermediate, kGap: 1, gapFraction: 0.5, capThicknessM: 10 * NM, capK: 4.5 };

const QUANTITIES = ["groundFPerM", "couplingEachFPerM", "totalFPerM"] as const;

describe("fieldSolve layered dielectrics against exact two-layer plates", () => {
  it("side walls with the layers side by side (field along the interface): dC/dT → ε0·(kGap·f + k·(1 − f))/S", () => {
    // Source: parallel-plate capacitor with two dielectric layers side by side, each filling the
    // gap between the plates over part of their height: the two parts are capacitors in parallel,
    // C′ = ε0·(kGap·f·T + k·(1 − f)·T)/S (standard electrostatics, e.g. D. J. Griffiths,
    // Introduction to Electrodynamics, 4th ed., 2017, §4.4 problems on layered capacitors;
    // common practice, no source needed for the formula).
    // Setup: a slot S = 5 nm between the victim and each neighbour, T = 200 and 400 nm (T/S ≥ 40).
    // The uniform field in the slot sees the interface y = f·T parallel to it, so the slot's
    // charge is exactly the parallel form; the fringes at the two ends of the slot do not depend
    // on T and cancel in the difference C(400 nm) − C(200 nm). This exercises the east edges ON
    // the interface row: with a harmonic instead of the arithmetic mean there, the slope comes out
    // −0.8% (f = 0.25) and −1.1% (f = 0.5) off (measured with a modified copy of the solver).
    // Measured at the default resolution: +0.057% (f = 0.25), +0.071% (0.5), +0.117% (1); the
    // same within 0.002% at n = 5 and 20, so what is left is physics (the neighbour's outer wall
    // and top see a little more of the victim as T grows), not the grid.
    const s = 5 * NM;
    const k = 3;
    const kGap = 1;
    for (const f of [0.25, 0.5, 1]) {
      const base = { widthM: 50 * NM, spacingM: s, heightBelowM: 50 * NM, heightAboveM: null, k, kGap, gapFraction: f };
      const c200 = fieldSolve({ ...base, thicknessM: 200 * NM }).couplingEachFPerM;
      const c400 = fieldSolve({ ...base, thicknessM: 400 * NM }).couplingEachFPerM;
      const slope = (c400 - c200) / (200 * NM);
      const exact = (EPS0 * (kGap * f + k * (1 - f))) / s;
      expectClose(slope, exact, 0.005);
      expectClose(slope, exact, 0.002); // what we actually achieve, with margin
    }
  });

  it("wide line under a cap layer (field across the interface): dC/dW → ε0·[k/H + 1/(c/capK + (H2 − c)/k)]", () => {
    // Source: parallel-plate capacitor with two dielectric layers in series between the plates,
    // C′/W = ε0/(c/capK + (H2 − c)/k) (standard electrostatics, e.g. D. J. Griffiths, Introduction
    // to Electrodynamics, 4th ed., 2017, §4.4 problems on layered capacitors; common practice, no
    // source needed for the formula), plus the plain plate ε0·k/H to the plane below (the solver
    // always has it). Very wide lines W = 20·H2 and 40·H2: the edge fringes (which decay as
    // exp(−π·x/b) between two planes) are the same for both and cancel in C(W2) − C(W1).
    // Measured: +7e-7 (c = 20 nm) and +6e-7 (c = H2) relative at the default resolution (the
    // piecewise-linear potential is exact in each layer of the plate region, so only the fringe
    // difference is left).
    const h = 200 * NM;
    const h2 = 50 * NM;
    const k = 2.5;
    const capK = 7;
    for (const c of [20 * NM, h2]) {
      // c = H2: the cap fills the whole ILD above (no interface line; capK throughout).
      const base = { thicknessM: 50 * NM, spacingM: null, heightBelowM: h, heightAboveM: h2, k, capThicknessM: c, capK };
      const w1 = 20 * h2;
      const w2 = 40 * h2;
      const c1 = fieldSolve({ ...base, widthM: w1 }).totalFPerM;
      const c2 = fieldSolve({ ...base, widthM: w2 }).totalFPerM;
      const slope = (c2 - c1) / (w2 - w1);
      const exact = EPS0 * (k / h + 1 / (c / capK + (h2 - c) / k));
      expectClose(slope, exact, 0.005);
      expectClose(slope, exact, 1e-4); // what we actually achieve, with margin
    }
  });
});

describe("fieldSolve layered dielectrics: consistency with the homogeneous solve", () => {
  it("k-linearity: kGap = capK = k = 2 is exactly 2 × the k = 1 result; scaling every k by 3 scales the layered result by 3", () => {
    // Source: Laplace's equation ∇·(ε∇φ) = 0 is unchanged when ε is multiplied by a constant, and
    // Q = ∮ε∂φ/∂n scales with it (common practice, no source).
    const one = fieldSolve({ ...intermediate, k: 1 });
    const two = fieldSolve({ ...intermediate, k: 2, kGap: 2, gapFraction: 0.5, capThicknessM: 10 * NM, capK: 2 });
    for (const q of QUANTITIES) expectClose(two[q], 2 * one[q], 1e-9);
    const base = fieldSolve({ ...layered, resolution: "coarse" });
    const tripled = fieldSolve({ ...layered, k: 3 * 2.7, kGap: 3 * 1, capK: 3 * 4.5, resolution: "coarse" });
    for (const q of QUANTITIES) expectClose(tripled[q], 3 * base[q], 1e-9);
  });

  it("kGap = k and capK = k reproduce the homogeneous solve bit for bit (same grid)", () => {
    // Design (lib/scaling/field-solve.ts): an interface is a grid line only where the permittivity
    // changes, and every relative permittivity is then exactly 1, so the arithmetic is the old one.
    // The brief asks for ≤ 1e-9; we get identity and test for it.
    for (const heightAboveM of [80 * NM, null]) {
      const plain = fieldSolve({ ...intermediate, heightAboveM });
      const same = fieldSolve({ ...intermediate, heightAboveM, kGap: 2.7, gapFraction: 0.5, capThicknessM: 10 * NM, capK: 2.7 });
      for (const q of QUANTITIES) expect(same[q]).toBe(plain[q]);
      expect(same.cells).toBe(plain.cells);
      expect(same.iterations).toBe(plain.iterations);
      // gapFraction 0 or a zero-thickness cap: no layer either.
      const none = fieldSolve({ ...intermediate, heightAboveM, kGap: 1, gapFraction: 0, capThicknessM: 0, capK: 4 });
      for (const q of QUANTITIES) expect(none[q]).toBe(plain[q]);
    }
  });

  it("charges use the same per-edge permittivity as the solve: Gauss-law charges balance, total = ground + 2·coupling", () => {
    // Discrete Gauss law (the sum of the charges of all conductors, planes and the far boundary is
    // zero) holds only if the charges are taken with the conductances of the solved system.
    // Measured: |balance| ≤ 5e-7 (solver tolerance), as in the homogeneous solve.
    for (const input of [layered, { ...layered, heightAboveM: null }, { ...layered, spacingM: null }]) {
      const r = fieldSolve(input);
      expect(r.converged).toBe(true);
      expect(Math.abs(r.chargeBalance!)).toBeLessThan(1e-5);
      expectClose(r.totalFPerM, r.groundFPerM + 2 * r.couplingEachFPerM, 1e-12);
    }
  });
});

describe("fieldSolve layered dielectrics: physics", () => {
  it("air gap (kGap = 1, k = 2.7, gapFraction 1) on the intermediate geometry cuts coupling far more than ground", () => {
    // Physics: the gap holds the side-wall field (coupling) but not the plate under the line
    // (ground). Measured: coupling × 0.509, ground × 0.978, total × 0.637 (plane above; open top:
    // coupling × 0.546, ground × 0.980). Thresholds with margin: coupling < 0.56 (the brief's aim
    // < 0.6 too), ground > 0.95, and coupling drops > 10× more than ground (measured 22×).
    // Rigorous bound (Dirichlet / Thomson principle: the self-capacitance is the minimum field
    // energy, monotone in ε; common practice, no source): 1/k < total ratio < 1.
    const homogeneous = fieldSolve(intermediate);
    const gap = fieldSolve({ ...intermediate, kGap: 1, gapFraction: 1 });
    const coupling = gap.couplingEachFPerM / homogeneous.couplingEachFPerM;
    const ground = gap.groundFPerM / homogeneous.groundFPerM;
    const total = gap.totalFPerM / homogeneous.totalFPerM;
    expect(coupling).toBeLessThan(0.56);
    expect(ground).toBeGreaterThan(0.95);
    expect(1 - coupling).toBeGreaterThan(10 * Math.abs(1 - ground));
    expect(total).toBeGreaterThan(1 / 2.7);
    expect(total).toBeLessThan(1);
  });

  it("coupling falls steadily as the air gap grows (gapFraction 0, 0.25, 0.5, 0.75, 1)", () => {
    // Physics: more of the side wall faces kGap < k. Measured (aF/µm): 61.90, 54.24, 46.70, 39.17,
    // 31.50, steps within 2% of equal (the slot's plate part is linear in f); ground 46.7 … 45.7.
    const c = [0, 0.25, 0.5, 0.75, 1].map((gapFraction) => fieldSolve({ ...intermediate, kGap: 1, gapFraction }));
    const steps = c.slice(1).map((r, i) => c[i]!.couplingEachFPerM - r.couplingEachFPerM);
    const meanStep = steps.reduce((a, b) => a + b, 0) / steps.length;
    for (const step of steps) {
      expect(step).toBeGreaterThan(0);
      expectClose(step, meanStep, 0.1);
    }
    for (const r of c) expectClose(r.groundFPerM, c[0]!.groundFPerM, 0.05);
  });

  // Mirror symmetry (left and right neighbour alike): not testable here. The solver solves the half
  // x ≥ 0 with a Neumann mirror plane and reports one neighbour, so the two are equal by construction.

  it("grid refinement of a layered case: differences fall with an observed order ≈ 1.75, total from above", () => {
    // Method: Richardson extrapolation (L. F. Richardson, Phil. Trans. R. Soc. A 210, 1911
    // [memory]; common practice). Case: `layered` (air gap to T/2, 10 nm cap of k = 4.5).
    // Measured at n = 5, 10, 20 (40): order 1.75 (ground), 1.76 (coupling, total); error vs the
    // extrapolation of 10, 20, 40: total 0.55 / 0.16 / 0.05%, coupling 0.74 / 0.22 / 0.06%,
    // ground 0.15 / 0.04 / 0.01%. The self-capacitance decreases with refinement (discrete
    // Dirichlet principle, as in the homogeneous solve).
    const r = [5, 10, 20].map((resolution) => fieldSolve({ ...layered, resolution }));
    const [coarse, normal, fine] = r as [(typeof r)[0], (typeof r)[0], (typeof r)[0]];
    for (const q of QUANTITIES) {
      const d1 = coarse[q] - normal[q];
      const d2 = normal[q] - fine[q];
      expect(Math.abs(d2)).toBeLessThan(Math.abs(d1) / 2);
      const order = Math.log2(d1 / d2);
      expect(order).toBeGreaterThan(1.4);
      expect(order).toBeLessThan(2.3);
      const extrapolated = fine[q] - d2 / (2 ** order - 1);
      const errors = [coarse, normal, fine].map((x) => Math.abs(x[q] / extrapolated - 1));
      expect(errors[1]!).toBeLessThan(errors[0]!);
      expect(errors[2]!).toBeLessThan(errors[1]!);
      expect(errors[1]!).toBeLessThan(0.004); // default resolution: < 0.4% (measured ≤ 0.22%)
    }
    expect(coarse.totalFPerM).toBeGreaterThan(normal.totalFPerM);
    expect(normal.totalFPerM).toBeGreaterThan(fine.totalFPerM);
  });

  it("an interface thinner than 1e-6 of the smallest feature is snapped onto the nearest grid line", () => {
    // Design (lib/scaling/field-solve.ts, MIN_LAYER): gapFraction 1e-9 is no gap, 1 − 1e-9 the full gap.
    const none = fieldSolve({ ...intermediate, kGap: 1, gapFraction: 0 });
    const thin = fieldSolve({ ...intermediate, kGap: 1, gapFraction: 1e-9 });
    expect(thin.totalFPerM).toBe(none.totalFPerM);
    const full = fieldSolve({ ...intermediate, kGap: 1, gapFraction: 1 });
    const nearlyFull = fieldSolve({ ...intermediate, kGap: 1, gapFraction: 1 - 1e-9 });
    expect(nearlyFull.totalFPerM).toBe(full.totalFPerM);
  });
});

describe("fieldSolve layered dielectrics: bad input", () => {
  it("throws RangeError naming the field", () => {
    const bad = (extra: Partial<FieldSolveInput>) => () => fieldSolve({ ...intermediate, ...extra });
    expect(bad({ kGap: 0.9 })).toThrow(RangeError);
    expect(bad({ kGap: 0.9 })).toThrow(/kGap must be in \[1, k\]/);
    expect(bad({ kGap: 2.8 })).toThrow(/kGap/);
    expect(bad({ kGap: Number.NaN })).toThrow(/kGap/);
    for (const gapFraction of [-0.1, 1.1, Number.NaN]) {
      expect(bad({ kGap: 1, gapFraction })).toThrow(RangeError);
      expect(bad({ kGap: 1, gapFraction })).toThrow(/gapFraction must be in \[0, 1\]/);
    }
    expect(bad({ capThicknessM: 81 * NM, capK: 4 })).toThrow(RangeError);
    expect(bad({ capThicknessM: 81 * NM, capK: 4 })).toThrow(/capThicknessM must be <= heightAboveM/);
    expect(bad({ capThicknessM: -1 * NM })).toThrow(/capThicknessM/);
    expect(bad({ capThicknessM: Number.POSITIVE_INFINITY, heightAboveM: null })).toThrow(/capThicknessM/);
    expect(bad({ capThicknessM: 10 * NM, capK: 0.5 })).toThrow(RangeError);
    expect(bad({ capThicknessM: 10 * NM, capK: 0.5 })).toThrow(/capK must be >= 1/);
    // An open top takes any finite cap (it extends to the far boundary at most).
    expect(() => fieldSolve({ ...intermediate, heightAboveM: null, capThicknessM: 1e-3, capK: 4 })).not.toThrow();
  });
});

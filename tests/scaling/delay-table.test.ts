import { afterAll, describe, expect, it } from "vitest";
import { exactTau50 } from "@/lib/scaling/delay-table";
import { lineDelay } from "@/lib/scaling/delay";
import { expectClose } from "./close";
import { cleanupSpice, haveSpice, ladder, spiceDelay } from "./spice";

/**
 * The exact 50% delay by an independent route: the eigenfunction series of the step response of driver x·R + line +
 * load y·C. Poles of H(s) = 1/[(1 + x·y·s)·cosh√s + (x + y)·√s·sinh√s] at s = −β², where
 * f(β) = (1 − x·y·β²)·cos β − (x + y)·β·sin β = 0; residues give
 * v(τ) = 1 − Σ 2·exp(−β²τ) / (β·G(β)), G = 2xyβ·cos β + (1 − xyβ²)·sin β + (x + y)(sin β + β·cos β)
 * (transmission-line two-port algebra, residue theorem; with x = y = 0 this is the textbook series of docs/models.md).
 */
function seriesTau50(x: number, y: number): number {
  const f = (b: number) => (1 - x * y * b * b) * Math.cos(b) - (x + y) * b * Math.sin(b);
  const G = (b: number) => 2 * x * y * b * Math.cos(b) + (1 - x * y * b * b) * Math.sin(b) + (x + y) * (Math.sin(b) + b * Math.cos(b));
  const roots: number[] = [];
  const bisect = (lo: number, hi: number) => {
    let flo = f(lo);
    for (let i = 0; i < 200; i++) {
      const mid = 0.5 * (lo + hi);
      const fm = f(mid);
      if (fm < 0 === flo < 0) {
        lo = mid;
        flo = fm;
      } else hi = mid;
    }
    return 0.5 * (lo + hi);
  };
  // scan: log-spaced up to 1, then steps of 0.002 up to β where exp(−β²·0.3) < 1e-17
  let prev = 1e-9;
  let fPrev = f(prev);
  const step = (b: number) => {
    const fb = f(b);
    if (fb < 0 !== fPrev < 0) roots.push(bisect(prev, b));
    prev = b;
    fPrev = fb;
  };
  for (let e = -9; e < 0; e += 0.001) step(10 ** e);
  for (let b = 1; b < 12; b += 0.002) step(b);
  const v = (tau: number) => {
    let s = 0;
    for (const b of roots) s += (2 * Math.exp(-b * b * tau)) / (b * G(b));
    return 1 - s;
  };
  let lo = 0.3;
  let hi = 1.2 * (0.377 + 0.693 * (x + x * y + y)) + 1;
  for (let i = 0; i < 200; i++) {
    const mid = 0.5 * (lo + hi);
    if (v(mid) < 0.5) lo = mid;
    else hi = mid;
  }
  return 0.5 * (lo + hi);
}

describe("exact stage delay table (lib/scaling/delay-table.ts) against the exact series solution", () => {
  it("the open line: 0.3787·RC (docs/models.md; series in delay.test.ts)", () => {
    expectClose(exactTau50(0, 0), 0.3787, 2e-4);
    expectClose(seriesTau50(0, 0), exactTau50(0, 0), 1e-4);
  });
  // Off-grid ratios (the grid is 8 per decade from 1e-4 to 1e4 plus 0), including beyond both ends.
  const xs = [0, 3.3e-5, 2.7e-3, 0.037, 0.23, 0.77, 1.9, 6.1, 47, 530, 2.2e4];
  let worst = 0;
  it.each(xs.map((x) => [x]))("x = Rd/R = %d, all y: within 0.5% (measured worst printed)", (x) => {
    for (const y of xs) {
      const ref = seriesTau50(x, y);
      const err = Math.abs(exactTau50(x, y) / ref - 1);
      worst = Math.max(worst, err);
      expect(err).toBeLessThan(0.005);
    }
  });
  afterAll(() => console.log(`delay table vs exact series: worst relative error ${(worst * 100).toFixed(4)}% over ${xs.length ** 2} off-grid points`));
  it("lumped limits: t50 → ln2·Elmore where the driver or the load dominates (first-order RC, exact ln2)", () => {
    for (const [x, y] of [
      [1e6, 0],
      [0, 1e6],
      [1e5, 1e5],
      [3e5, 0.3],
    ] as [number, number][]) {
      const elmore = x * (1 + y) + 0.5 + y; // T_D/(RC) = x(1 + y) + 1/2 + y (Elmore, J. Appl. Phys. 19, 1948)
      expectClose(exactTau50(x!, y!), Math.LN2 * elmore, 1e-3);
    }
  });
  it("lineDelay uses the table by default and Sakurai on request; Sakurai is 0–3.4% low", () => {
    const d = lineDelay({ rOhm: 1000, cF: 1e-13, driverOhm: 300, loadF: 3e-14 });
    expectClose(d.t50S, 1e-10 * exactTau50(0.3, 0.3), 1e-12);
    const s = lineDelay({ rOhm: 1000, cF: 1e-13, driverOhm: 300, loadF: 3e-14, model: "sakurai" });
    expect(s.t50S).toBe(d.sakuraiS);
    expect(d.t50S / s.t50S).toBeGreaterThan(1);
    expect(d.t50S / s.t50S).toBeLessThan(1.034);
  });
  it("no resistance or no capacitance: lumped ln2·(Rd + R)·(C + CL) (exact)", () => {
    expectClose(lineDelay({ rOhm: 0, cF: 1e-13, driverOhm: 300, loadF: 1e-14 }).t50S, Math.LN2 * 300 * 1.1e-13, 1e-12);
    expectClose(lineDelay({ rOhm: 100, cF: 0, driverOhm: 300, loadF: 1e-14 }).t50S, Math.LN2 * 400 * 1e-14, 1e-12);
  });
  it("non-finite results are a RangeError naming the inputs", () => {
    expect(() => lineDelay({ rOhm: 1e200, cF: 1e200 })).toThrow(RangeError);
    expect(() => lineDelay({ rOhm: 1e200, cF: 1e200 })).toThrow(/rOhm, cF/);
  });
});

describe.skipIf(!haveSpice)("exact stage delay vs ngspice (200-section π ladder)", () => {
  afterAll(cleanupSpice);
  const R = 1000;
  const C = 200e-15;
  it.each([
    [0, 0],
    [0.2, 0.2],
    [0.4, 0.4],
    [1, 1],
    [5, 0.5],
    [0.1, 3],
    [3, 0],
    [0.03, 20],
  ])("Rd/R = %d, CL/C = %d: within 0.5%", (x, y) => {
    const rd = x * R;
    const cl = y * C;
    const body = [`RD in n0 ${rd > 0 ? rd : 1e-3}`];
    ladder(body, "L", "n0", "out", R, C, 200);
    if (cl > 0) body.push(`CL out 0 ${cl}`);
    const sim = spiceDelay(body, "out", 6 * (rd * (C + cl) + R * (C / 2 + cl)));
    const model = lineDelay({ rOhm: R, cF: C, driverOhm: rd, loadF: cl }).t50S;
    console.log(`ngspice ${sim.toExponential(5)} s, table ${model.toExponential(5)} s, error ${((model / sim - 1) * 100).toFixed(3)}% (x ${x}, y ${y})`);
    expectClose(model, sim, 0.005);
  });
});

import { describe, expect, it } from "vitest";
import {
  cohnThickStripFringeFPerM,
  lineCapacitance,
  parallelPlateFPerM,
  sakuraiTamaruC1FPerM,
  sakuraiTamaruC21FPerM,
  yuanTrickFPerM,
} from "@/lib/scaling/capacitance";
import { EPSILON_0_F_PER_M } from "@/lib/scaling/constants";
import { fieldSolve } from "@/lib/scaling/field-solve";
import { expectClose } from "./close";

const E0 = EPSILON_0_F_PER_M;
const H = 100e-9;

describe("published forms", () => {
  it("parallelPlateFPerM = ε·W/H (common practice, no source)", () => {
    expectClose(parallelPlateFPerM(3.9 * E0, 200e-9, 100e-9), 3.9 * E0 * 2, 1e-14);
  });
  it("yuanTrickFPerM: ε[(W − T/2)/H + 2π/ln(1 + 2H/T + sqrt(2H/T·(2H/T + 2)))] (Yuan & Trick, IEEE EDL-3(12), 1982)", () => {
    // hand-evaluated at W = 2H, T = H: 1.5 + 2π/ln(3 + sqrt(8)) = 1.5 + 2π/1.762747 = 5.064423
    expectClose(yuanTrickFPerM(E0, 2 * H, H, H) / E0, 1.5 + (2 * Math.PI) / Math.log(3 + Math.sqrt(8)), 1e-12);
    expectClose(yuanTrickFPerM(E0, 2 * H, H, H) / E0, 5.064423, 1e-6);
  });
  it("sakuraiTamaruC1FPerM = ε[1.15 W/H + 2.80 (T/H)^0.222] (Sakurai & Tamaru, IEEE TED ED-30(2), 1983)", () => {
    // W = H = T: 1.15 + 2.80 = 3.95
    expectClose(sakuraiTamaruC1FPerM(E0, H, H, H) / E0, 3.95, 1e-12);
    expectClose(sakuraiTamaruC1FPerM(E0, 2 * H, 0.5 * H, H) / E0, 2.3 + 2.8 * 0.5 ** 0.222, 1e-12);
  });
  it("sakuraiTamaruC21FPerM = ε[0.03 W/H + 0.83 T/H − 0.07 (T/H)^0.222](S/H)^−1.34 (same paper)", () => {
    // W = T = S = H: 0.03 + 0.83 − 0.07 = 0.79
    expectClose(sakuraiTamaruC21FPerM(E0, H, H, H, H) / E0, 0.79, 1e-12);
    expectClose(sakuraiTamaruC21FPerM(E0, H, H, H, 2 * H) / E0, 0.79 * 2 ** -1.34, 1e-12);
  });
  it("Cohn thick strip fringe: (4/π)[2g ln(g+1) − (g−1) ln(g²−1)], g = 1/(1 − T/b) (Cohn, IRE Trans. MTT-3, 1955)", () => {
    const g = 1 / (1 - 0.2);
    expectClose(cohnThickStripFringeFPerM(E0, 0.2, 1) / E0, (4 / Math.PI) * (2 * g * Math.log(g + 1) - (g - 1) * Math.log(g * g - 1)), 1e-12);
  });
});

describe("lineCapacitance({ ..., model })", () => {
  const base = { widthM: 50e-9, thicknessM: 100e-9, spacingM: 50e-9, heightBelowM: 60e-9, heightAboveM: null, k: 3.9, miller: 1 } as const;
  it("ideal: k 3.9 → 1.0 divides the parallel-plate C by 3.9 (common practice, no source)", () => {
    const a = lineCapacitance({ ...base, model: "ideal" }).totalFPerM;
    const b = lineCapacitance({ ...base, k: 1, model: "ideal" }).totalFPerM;
    expectClose(a / b, 3.9, 1e-14);
  });
  it("ideal with a plane above adds ε·W/H2 (common practice, no source)", () => {
    const r = lineCapacitance({ ...base, heightAboveM: 80e-9, model: "ideal" });
    expectClose(r.totalFPerM, 3.9 * E0 * (50 / 60 + 50 / 80), 1e-14);
  });
  it("coupled, one plane, quiet neighbours: total = Sakurai–Tamaru C1 + 2·C21 (Sakurai 1993, middle line of three)", () => {
    const r = lineCapacitance({ ...base, model: "coupled" });
    const eps = 3.9 * E0;
    const expected = sakuraiTamaruC1FPerM(eps, 50e-9, 100e-9, 60e-9) + 2 * sakuraiTamaruC21FPerM(eps, 50e-9, 100e-9, 60e-9, 50e-9);
    expectClose(r.totalFPerM, expected, 1e-12);
    expectClose(r.areaFPerM + r.fringeFPerM + r.couplingMillerFPerM, r.totalFPerM, 1e-12);
  });
  it("Miller factor: C_eff = C_ground + MCF·2·C_couple (docs/models.md, Miller coupling factor)", () => {
    const m0 = lineCapacitance({ ...base, miller: 0, model: "coupled" });
    const m2 = lineCapacitance({ ...base, miller: 2, model: "coupled" });
    expectClose(m2.totalFPerM - m0.totalFPerM, 4 * m0.couplingEachFPerM, 1e-12);
    expect(m0.couplingMillerFPerM).toBe(0);
  });
  it("flags inputs outside the fitted ranges and stays silent inside", () => {
    expect(lineCapacitance({ ...base, model: "coupled" }).validity).toEqual([]);
    const out = lineCapacitance({ ...base, widthM: 10e-9, spacingM: 15e-9, model: "coupled" }).validity.map((f) => `${f.model}:${f.quantity}`);
    expect(out).toContain("sakurai-tamaru-c1:W/H"); // W/H = 0.17 < 0.3 (Sakurai–Tamaru fitted range, from memory)
    expect(out).toContain("sakurai-tamaru-c21:S/H"); // S/H = 0.25 < 0.5
    const yt = lineCapacitance({ ...base, widthM: 40e-9, model: "fringe" }).validity.map((f) => f.model);
    expect(yt).toContain("yuan-trick"); // W < T/2 (Yuan–Trick needs W ≥ T/2)
    const pp = lineCapacitance({ ...base, model: "ideal" }).validity.map((f) => f.model);
    expect(pp).toContain("parallel-plate");
  });
  it("rejects impossible input with RangeError naming the field", () => {
    expect(() => lineCapacitance({ ...base, widthM: -1, model: "coupled" })).toThrow("widthM must be > 0 (got -1)");
    expect(() => lineCapacitance({ ...base, k: 0.5, model: "coupled" })).toThrow(/k must be >= 1/);
    expect(() => lineCapacitance({ ...base, heightBelowM: null, heightAboveM: 80e-9, model: "coupled" })).not.toThrow();
    expect(() => lineCapacitance({ ...base, heightBelowM: null, heightAboveM: null, model: "coupled" })).toThrow(/plane/);
    expect(() => lineCapacitance({ ...base, miller: 3, model: "coupled" })).toThrow(/miller/);
    expect(() => lineCapacitance({ ...base, widthM: NaN, model: "coupled" })).toThrow(RangeError);
  });
  it("plumbing: the field model returns fieldSolve's split", () => {
    const r = lineCapacitance({ ...base, model: "field" });
    const f = fieldSolve({ widthM: 50e-9, thicknessM: 100e-9, spacingM: 50e-9, heightBelowM: 60e-9, heightAboveM: null, k: 3.9 });
    expectClose(r.couplingEachFPerM, f.couplingEachFPerM, 1e-9);
    expectClose(r.totalFPerM, f.totalFPerM, 1e-9);
  });
});

/*
 * Closed forms against the field solver (lib/scaling/field-solve.ts, default grid), measured 2025 for scaling/README.md
 * over W/H 0.3–10, T/H 0.3–4, S/H 0.5–8 (one plane, 245 geometries) and W/H 0.3–8, T/H 0.3–3, H2/H 1–3, S/H 0.5–4
 * (two planes, 720 geometries, engine 1.0.0; two-plane split remeasured below). Max |error| (rms):
 *   one plane, isolated:  Yuan–Trick 10.8% (5.7%) for W ≥ T/2 [54% outside, flagged]; Sakurai–Tamaru C1 5.1% (2.5%)
 *   one plane, neighbours: ST total (Miller 1) 11.1% (4.9%); ground 10.7% (2.9%); Miller 2 total 14.1% (6.2%);
 *                          coupling per neighbour 53% (15.5%) — large only where coupling is a small share of the total
 *   two planes, Cohn isolated (H2/H ≤ 2, W/(H+H2) ≥ 0.35): 2.1% (0.7%)
 *   two planes, split of engine 1.1.0 (remeasured on 1,350 solves: W/H 0.3–8, T/H 0.3–3, H2/H 1–3, S/H 0.5–8), in the
 *                          split's range (H2/H ≤ 2, S/H ≤ 4, 840 geometries): ground 3.3% (1.2%); total M1 2.9% (1.0%);
 *                          total M2 4.4% (1.4%); coupling per neighbour 20.5% (5.1%); 200 random held-out geometries
 *                          in the same range: ground 2.6%, total M1 2.4%, M2 3.2%, coupling 13.8%
 * The tests below re-measure a smaller grid live (3 × 3 × 3 one-plane and 2 × 2 × 2 × 2 two-plane geometries) and bound
 * each model's worst error there at about 1.5× what that grid gave when the bounds were set (engine 1.1.0, default
 * field-solver grid): Yuan–Trick 7.72%, Sakurai–Tamaru C1 1.90%, ST total (Miller 1) 7.46%, one-plane ground split 4.45%,
 * ST total at Miller 2 9.64%, Cohn 2.06%, two-plane ground 2.08%, total M1 1.95%, total M2 2.55%, coupling 9.87%.
 */
describe("closed forms against the field solver (inside the validity ranges)", () => {
  const table: Record<string, number> = {};
  const note = (name: string, err: number) => {
    table[name] = Math.max(table[name] ?? 0, Math.abs(err));
  };
  const WH = [0.5, 1, 3];
  const TH = [0.5, 1, 2];
  const SH = [0.75, 1.5, 4];
  it("Yuan–Trick within 11%, Sakurai–Tamaru C1 within 2.9% (isolated line over a plane; measured 7.72%, 1.90%; C1's stated ~6%)", () => {
    for (const w of WH)
      for (const t of TH) {
        const f = fieldSolve({ widthM: w * H, thicknessM: t * H, spacingM: null, heightBelowM: H, heightAboveM: null, k: 1 });
        const geo = { widthM: w * H, thicknessM: t * H, spacingM: null, heightBelowM: H, heightAboveM: null, k: 1, miller: 1 };
        const yt = lineCapacitance({ ...geo, model: "fringe" });
        if (yt.validity.length === 0) note("yuan-trick", yt.totalFPerM / f.totalFPerM - 1);
        note("sakurai-tamaru-c1", lineCapacitance({ ...geo, model: "coupled" }).totalFPerM / f.totalFPerM - 1);
      }
    expect(table["yuan-trick"]!).toBeLessThan(0.11);
    expect(table["sakurai-tamaru-c1"]!).toBeLessThan(0.029);
  });
  it("Sakurai–Tamaru C1 + 2·C21 within 11.2% (stated ~10%; 7.46% here, 11.1% on the full grid), ground split within 6.7%, Miller-2 total within 14.5%", () => {
    for (const w of WH)
      for (const t of TH)
        for (const s of SH) {
          const f = fieldSolve({ widthM: w * H, thicknessM: t * H, spacingM: s * H, heightBelowM: H, heightAboveM: null, k: 1 });
          const geo = { widthM: w * H, thicknessM: t * H, spacingM: s * H, heightBelowM: H, heightAboveM: null, k: 1 };
          const r1 = lineCapacitance({ ...geo, miller: 1, model: "coupled" });
          const r2 = lineCapacitance({ ...geo, miller: 2, model: "coupled" });
          note("st-total-m1", r1.totalFPerM / f.totalFPerM - 1);
          note("split-ground", (r1.areaFPerM + r1.fringeFPerM) / f.groundFPerM - 1);
          note("st-total-m2", r2.totalFPerM / (f.groundFPerM + 4 * f.couplingEachFPerM) - 1);
        }
    expect(table["st-total-m1"]!).toBeLessThan(0.112);
    expect(table["split-ground"]!).toBeLessThan(0.067);
    expect(table["st-total-m2"]!).toBeLessThan(0.145);
  });
  it("two planes: Cohn within 3% isolated; fitted split within 3.2% ground, 3% total, 3.9% at Miller 2, 15% coupling (H2/H ≤ 2)", () => {
    for (const w of [0.5, 2])
      for (const t of [0.5, 1.5])
        for (const h2 of [1, 2]) {
          const iso = fieldSolve({ widthM: w * H, thicknessM: t * H, spacingM: null, heightBelowM: H, heightAboveM: h2 * H, k: 1 });
          const g = { widthM: w * H, thicknessM: t * H, heightBelowM: H, heightAboveM: h2 * H, k: 1 };
          note("cohn", lineCapacitance({ ...g, spacingM: null, miller: 1, model: "fringe" }).totalFPerM / iso.totalFPerM - 1);
          for (const s of [0.75, 2]) {
            const f = fieldSolve({ ...g, spacingM: s * H });
            const r1 = lineCapacitance({ ...g, spacingM: s * H, miller: 1, model: "coupled" });
            const r2 = lineCapacitance({ ...g, spacingM: s * H, miller: 2, model: "coupled" });
            note("two-plane-ground", (r1.areaFPerM + r1.fringeFPerM) / f.groundFPerM - 1);
            note("two-plane-total-m1", r1.totalFPerM / f.totalFPerM - 1);
            note("two-plane-total-m2", r2.totalFPerM / (f.groundFPerM + 4 * f.couplingEachFPerM) - 1);
            note("two-plane-coupling", r1.couplingEachFPerM / f.couplingEachFPerM - 1);
          }
        }
    console.log("max |closed form / field solver − 1|:", Object.fromEntries(Object.entries(table).map(([k, v]) => [k, `${(v * 100).toFixed(2)}%`])));
    expect(table["cohn"]!).toBeLessThan(0.03);
    expect(table["two-plane-ground"]!).toBeLessThan(0.032);
    expect(table["two-plane-total-m1"]!).toBeLessThan(0.03);
    expect(table["two-plane-total-m2"]!).toBeLessThan(0.039);
    expect(table["two-plane-coupling"]!).toBeLessThan(0.15);
  });
  it("the parallel plate is several times too low for W/H ≤ 1 (docs/models.md) — the flag is warranted", () => {
    const f = fieldSolve({ widthM: H, thicknessM: H, spacingM: null, heightBelowM: H, heightAboveM: null, k: 1 });
    const pp = lineCapacitance({ widthM: H, thicknessM: H, spacingM: null, heightBelowM: H, heightAboveM: null, k: 1, miller: 1, model: "ideal" });
    expect(f.totalFPerM / pp.totalFPerM).toBeGreaterThan(2.5);
  });
});

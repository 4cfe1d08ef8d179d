import { describe, expect, it } from "vitest";
import { baselineSettings, evaluateClass } from "@/lib/scaling/evaluate";
import { DEFAULT_TECHNOLOGY } from "@/lib/scaling/technology";
import {
  delayParts,
  DESIGN_OBJECTIVES,
  flattenClass,
  objectiveGrid,
  objectiveOf,
  optimizeClass,
  tornado,
  variation,
  type DesignObjective,
} from "@/lib/scaling/design-space";
import type { ClassResult, ScenarioSettings, WireClass } from "@/lib/scaling/types";
import { expectClose } from "./close";
import { testClass } from "./fixtures";

const tech = DEFAULT_TECHNOLOGY;
const settings = (over: Partial<ScenarioSettings> = {}): ScenarioSettings => ({ ...baselineSettings("full", tech), s: 1.5, ...over });

/**
 * The class drawn at line fraction x and aspect ratio a at its scenario pitch, evaluated through the ordinary path:
 * baseline width and spacing x·P·S and (1 − x)·P·S, and the scenario's own per-class aspectRatio override (independent
 * of design-space.ts's flattening).
 */
function drawnResult(wc: WireClass, st: ScenarioSettings, x: number, a: number): ClassResult {
  const pitchBase = wc.widthM + wc.spacingM;
  const c = { ...wc, widthM: x * pitchBase, spacingM: (1 - x) * pitchBase };
  return evaluateClass({
    wireClass: c,
    technology: tech,
    settings: { ...st, overrides: { ...st.overrides, [wc.name]: { ...st.overrides[wc.name], aspectRatio: a } } },
  });
}

describe("flattenClass", () => {
  it("gives the same result as the class at the scenario (S, S_L, aspect override, vias, air gap)", () => {
    // method: the flattened class at S = 1 against evaluateClass of the original (same engine, exact to rounding)
    const cases: [WireClass, ScenarioSettings][] = [
      [testClass(), settings()],
      [testClass({ viasPerNet: 2 }), settings({ sL: 1.3, overrides: { m2: { aspectRatio: 1.8 } } })],
      [testClass({ viasPerNet: 1, viaOhm: 20 }), settings({ level: "coupled", barrierScales: true })],
      [testClass({ kGap: 1, gapFraction: 0.5, ildAboveM: 60e-9 }), settings({ miller: 1.5, k: 2.4 })],
    ];
    for (const [wc, st] of cases) {
      const ref = evaluateClass({ wireClass: wc, technology: tech, settings: st });
      const f = flattenClass(wc, tech, st);
      const got = evaluateClass({ wireClass: f.wc, technology: tech, settings: f.settings });
      expectClose(got.rOhmPerM, ref.rOhmPerM, 1e-12);
      expectClose(got.cFPerM, ref.cFPerM, 1e-12);
      expectClose(got.delayS, ref.delayS, 1e-12);
      expectClose(got.repeatedDelayS, ref.repeatedDelayS, 1e-12);
      expectClose(got.energyJ, ref.energyJ, 1e-12);
    }
  });
});

describe("optimizeClass", () => {
  // method: a dense 201 × 201 grid search of the same model (evaluateClass through the ordinary scenario path) over the
  // same limits; the optimiser must be within 0.5% of the grid's best or better. Two cases: a 25 µm net at S = 1.5,
  // level full, and a 300 µm semi-global net with repeaters at level coupled, S = 1.2, limits 0.35–0.65 and AR ≤ 2.5
  const wc = testClass();
  const st = settings();
  const cases: { name: string; wc: WireClass; st: ScenarioSettings; lim: { minFraction: number; maxFraction: number; maxAspect: number } }[] = [
    { name: "m2", wc, st, lim: { minFraction: 0.3, maxFraction: 0.7, maxAspect: 3 } },
    {
      name: "semi-global",
      wc: testClass({
        name: "sg",
        widthM: 80e-9,
        spacingM: 80e-9,
        thicknessM: 160e-9,
        ildBelowM: 100e-9,
        ildAboveM: 100e-9,
        barrierM: 3e-9,
        meanLengthM: 300e-6,
        driverOhm: 1200,
        loadF: 2e-15,
      }),
      st: settings({ level: "coupled", s: 1.2 }),
      lim: { minFraction: 0.35, maxFraction: 0.65, maxAspect: 2.5 },
    },
  ];
  const N = 201;
  for (const c of cases) {
    const best: Record<DesignObjective, number> = { delay: Infinity, repeated: Infinity, energy: Infinity, edp: Infinity };
    const { minFraction, maxFraction, maxAspect } = c.lim;
    for (let i = 0; i < N; i++)
      for (let j = 0; j < N; j++) {
        const r = drawnResult(c.wc, c.st, minFraction + ((maxFraction - minFraction) * i) / (N - 1), 1 + ((maxAspect - 1) * j) / (N - 1));
        for (const o of DESIGN_OBJECTIVES) best[o] = Math.min(best[o], objectiveOf(r, o));
      }
    for (const o of DESIGN_OBJECTIVES)
      it(`${c.name}, objective ${o}: within 0.5% of a dense grid search, and the answer re-evaluates to its value`, () => {
        const r = optimizeClass({ wireClass: c.wc, technology: tech, settings: c.st, objective: o, ...c.lim });
        expect(r.objectiveValue).toBeLessThanOrEqual(best[o] * 1.005);
        expect(r.lineFraction).toBeGreaterThanOrEqual(minFraction);
        expect(r.lineFraction).toBeLessThanOrEqual(maxFraction);
        expect(r.aspectRatio).toBeGreaterThanOrEqual(1);
        expect(r.aspectRatio).toBeLessThanOrEqual(maxAspect);
        expectClose(r.widthM + r.spacingM, (c.wc.widthM + c.wc.spacingM) / c.st.s, 1e-12);
        expectClose(r.thicknessM / r.widthM, r.aspectRatio, 1e-12);
        expectClose(objectiveOf(drawnResult(c.wc, c.st, r.lineFraction, r.aspectRatio), o), r.objectiveValue, 1e-9);
        // the optimiser may beat the grid (it looks between the grid's points), but only by a little
        expect(r.objectiveValue).toBeGreaterThan(best[o] * 0.98);
      });
  }

  it("is deterministic and honours width/space limits", () => {
    const p = { wireClass: wc, technology: tech, settings: st, objective: "edp" as const, minWidthM: 30e-9, minSpaceM: 18e-9 };
    const a = optimizeClass(p);
    expect(optimizeClass(p)).toEqual(a);
    expect(a.widthM).toBeGreaterThanOrEqual(30e-9 * (1 - 1e-12));
    expect(a.spacingM).toBeGreaterThanOrEqual(18e-9 * (1 - 1e-12));
  });

  it("limits that leave no feasible geometry throw a RangeError naming the field", () => {
    expect(() => optimizeClass({ wireClass: wc, technology: tech, settings: st, objective: "delay", minFraction: 0.6, maxFraction: 0.5 })).toThrow(
      /^minFraction/,
    );
    expect(() => optimizeClass({ wireClass: wc, technology: tech, settings: st, objective: "delay", minWidthM: 50e-9 })).toThrow(/^minFraction/);
    expect(() => optimizeClass({ wireClass: wc, technology: tech, settings: st, objective: "delay", maxAspect: 0.05 })).toThrow(/^maxAspect/);
    expect(() => optimizeClass({ wireClass: [wc], className: "nope", technology: tech, settings: st, objective: "delay" })).toThrow(/^className/);
  });
});

describe("objectiveGrid", () => {
  it("n × m values of the model, the best point, and a non-dominated delay–energy front", () => {
    // method: each cell against evaluateClass through the ordinary path; Pareto property checked by brute force
    const wc = testClass();
    const st = settings();
    const g = objectiveGrid({ wireClass: wc, technology: tech, settings: st, objective: "delay", n: 9, m: 7 });
    expect(g.values).toHaveLength(9);
    for (const row of g.values) expect(row).toHaveLength(7);
    expectClose(g.values[4]![3]!, drawnResult(wc, st, g.lineFractions[4]!, g.aspectRatios[3]!).repeatedDelayS, 1e-9);
    const all = g.values.flat().filter((v): v is number => v !== null);
    expect(g.best.objectiveValue).toBe(Math.min(...all));
    const pts = g.lineFractions.flatMap((x) => g.aspectRatios.map((a) => drawnResult(wc, st, x, a)));
    for (const p of g.pareto) {
      const dominated = pts.some(
        (r) => r.repeatedDelayS <= p.delayS && r.energyJ <= p.energyJ && (r.repeatedDelayS < p.delayS * (1 - 1e-12) || r.energyJ < p.energyJ * (1 - 1e-12)),
      );
      expect(dominated).toBe(false);
    }
    expect(g.pareto.length).toBeGreaterThan(1);
  });
});

describe("delayParts", () => {
  // tolerance 1e-12 relative: the parts are four Elmore terms × one factor plus the repeaters' change, so their sum
  // equals the engine's delay up to floating-point rounding of five additions
  it("sums to the engine's delay; the four net terms keep the Elmore proportions (Elmore, J. Appl. Phys. 19, 1948)", () => {
    for (const [wc, st] of [
      [testClass(), settings()],
      [testClass({ meanLengthM: 1e-3 }), settings()],
      [testClass({ viasPerNet: 2 }), settings({ level: "coupled" })],
    ] as [WireClass, ScenarioSettings][]) {
      const r = evaluateClass({ wireClass: wc, technology: tech, settings: st });
      const d = delayParts({ wireClass: wc, technology: tech, settings: st });
      expectClose(d.driverWireS + d.driverLoadS + d.wireWireS + d.wireLoadS + d.repeatersS, r.repeatedDelayS, 1e-12);
      expectClose(d.driverWireS + d.driverLoadS + d.wireWireS + d.wireLoadS, r.delayS, 1e-12);
      const rd = r.driverOhm + r.viaOhm;
      expectClose(d.driverLoadS / d.driverWireS, r.loadF / r.cF, 1e-12);
      expectClose(d.wireWireS / d.wireLoadS, r.cF / 2 / r.loadF, 1e-12);
      expectClose(d.driverWireS / d.wireWireS, (rd * r.cF) / ((r.rOhm * r.cF) / 2), 1e-12);
    }
    // a 1 mm net gets repeaters: their part is a saving
    const long = delayParts({ wireClass: testClass({ meanLengthM: 1e-3 }), technology: tech, settings: settings() });
    expect(long.repeatersS).toBeLessThan(0);
  });
  it("level ideal: no driver or load, the whole delay is the wire's", () => {
    const d = delayParts({ wireClass: testClass(), technology: tech, settings: settings({ level: "ideal", barrierScales: true }) });
    expect(d.driverWireS).toBe(0);
    expect(d.driverLoadS).toBe(0);
    expect(d.wireLoadS).toBe(0);
    expectClose(d.wireWireS, d.unrepeatedS, 1e-12);
  });
});

describe("tornado", () => {
  // physics (common practice, no source): R = ρ·L/((W − 2b)(T − b)) falls with W and T and rises with b, ρ; C rises
  // with W (plate area), T (sidewall), k and falls with spacing and ILD height; delay rises with L, Rd, CL, k and ρ
  const t = tornado({ wireClass: testClass(), technology: tech, settings: settings() });
  const bar = (name: string) => t.bars.find((b) => b.input === name)!;
  it("signs match the physics", () => {
    expect(bar("width").rHighOhmPerM).toBeLessThan(bar("width").rLowOhmPerM);
    expect(bar("width").cHighFPerM).toBeGreaterThan(bar("width").cLowFPerM);
    expect(bar("thickness").rHighOhmPerM).toBeLessThan(bar("thickness").rLowOhmPerM);
    expect(bar("thickness").cHighFPerM).toBeGreaterThan(bar("thickness").cLowFPerM);
    expect(bar("spacing").cHighFPerM).toBeLessThan(bar("spacing").cLowFPerM);
    expect(bar("spacing").rHighOhmPerM).toBe(bar("spacing").rLowOhmPerM);
    expect(bar("ildHeight").cHighFPerM).toBeLessThan(bar("ildHeight").cLowFPerM);
    expect(bar("barrier").rHighOhmPerM).toBeGreaterThan(bar("barrier").rLowOhmPerM);
    expect(bar("bulkResistivity").rHighOhmPerM).toBeGreaterThan(bar("bulkResistivity").rLowOhmPerM);
    expect(bar("meanFreePath").rHighOhmPerM).toBeGreaterThan(bar("meanFreePath").rLowOhmPerM);
    for (const up of ["k", "length", "driverR", "loadC", "bulkResistivity", "barrier"]) {
      expect(bar(up).deltaHighS).toBeGreaterThan(0);
      expect(bar(up).deltaLowS).toBeLessThan(0);
    }
    expect(bar("spacing").deltaHighS).toBeLessThan(0);
  });
  it("is sorted by impact, 13 inputs, nominal = the engine's delay", () => {
    expect(t.bars).toHaveLength(13);
    for (let i = 1; i < t.bars.length; i++) expect(t.bars[i]!.impactS).toBeLessThanOrEqual(t.bars[i - 1]!.impactS);
    expect(t.nominalS).toBe(evaluateClass({ wireClass: testClass(), technology: tech, settings: settings() }).delayS);
  });
});

describe("variation", () => {
  const wc = testClass({ ildAboveM: 60e-9 });
  const st = settings();
  const rel = 0.005;
  const sigma = { width: { relative: rel }, thickness: { relative: rel }, barrier: { relative: rel }, ildHeight: { relative: rel }, k: { relative: rel } };
  const run = (seed: number, samples = 4000) => variation({ classes: [wc], technology: tech, settings: st, sigma, samples, seed });

  it("mean and std agree with first-order error propagation for small σ (within 5%)", () => {
    // method: first-order propagation for independent inputs, σ_f² = Σ_i (∂f/∂x_i)²·σ_i², mean_f ≈ f(x0); derivatives
    // by central differences (± σ_i) through evaluateClass of the flattened class with one input moved (ILD heights
    // below and above move by the same share, as in the Monte Carlo)
    const f = flattenClass(wc, tech, st);
    const b = f.wc;
    const at = (c: WireClass) => evaluateClass({ wireClass: c, technology: tech, settings: f.settings });
    const movers: ((c: WireClass, d: number) => void)[] = [
      (c, d) => (c.widthM = b.widthM * (1 + d)),
      (c, d) => (c.thicknessM = b.thicknessM * (1 + d)),
      (c, d) => (c.barrierM = b.barrierM * (1 + d)),
      (c, d) => {
        c.ildBelowM = b.ildBelowM! * (1 + d);
        c.ildAboveM = b.ildAboveM! * (1 + d);
      },
      (c, d) => (c.k = b.k * (1 + d)),
    ];
    const nominal = at(b);
    const mc = run(1)[0]!;
    for (const [key, pick] of [
      ["rOhmPerM", (r: ClassResult) => r.rOhmPerM],
      ["cFPerM", (r: ClassResult) => r.cFPerM],
      ["delayS", (r: ClassResult) => r.repeatedDelayS],
      ["energyJ", (r: ClassResult) => r.energyJ],
    ] as const) {
      let v = 0;
      for (const move of movers) {
        const hi = { ...b };
        const lo = { ...b };
        move(hi, rel);
        move(lo, -rel);
        const dfdx = (pick(at(hi)) - pick(at(lo))) / 2; // per σ
        v += dfdx * dfdx;
      }
      const sd = Math.sqrt(v);
      const s = mc[key];
      expect(Math.abs(s.std - sd) / sd, key).toBeLessThan(0.05);
      expect(Math.abs(s.mean - pick(nominal)) / sd, key).toBeLessThan(0.1);
      expect(s.p5).toBeLessThan(s.p50);
      expect(s.p50).toBeLessThan(s.p95);
    }
  });

  it("same seed → identical output; different seed → different", () => {
    // method: seeded mulberry32 stream, common practice, no source
    expect(run(7, 500)).toEqual(run(7, 500));
    expect(run(8, 500)[0]!.delayS.mean).not.toBe(run(7, 500)[0]!.delayS.mean);
  });

  it("fast and slow corners bracket the samples' p5 … p95", () => {
    const c = run(3, 1000)[0]!;
    expect(c.corners.fast.delayS).toBeLessThan(c.delayS.p5);
    expect(c.corners.slow.delayS).toBeGreaterThan(c.delayS.p95);
    expect(c.corners.nominal.delayS).toBe(evaluateClass({ wireClass: wc, technology: tech, settings: st }).repeatedDelayS);
  });

  it("at fixed pitch the spacing moves against the width: C varies more than with spacing fixed", () => {
    // method: a wider line at fixed pitch also narrows the gap (both raise C), common practice, no source
    const one = (fixedPitch: boolean) =>
      variation({ classes: [wc], technology: tech, settings: st, sigma: { width: { absolute: 1e-9 } }, samples: 2000, seed: 5, fixedPitch })[0]!;
    expect(one(true).cFPerM.std).toBeGreaterThan(1.5 * one(false).cFPerM.std);
  });

  it("bad input throws a RangeError naming the field", () => {
    const p = { classes: [wc], technology: tech, settings: st, samples: 100, seed: 1 };
    expect(() => variation({ ...p, sigma: { width: { absolute: -1e-9 } } })).toThrow(/^sigma\.width/);
    expect(() => variation({ ...p, sigma: { thickness: { relative: 1.5 } } })).toThrow(/^sigma\.thickness/);
    expect(() => variation({ ...p, sigma: {}, samples: 100_001 })).toThrow(/^samples/);
    expect(() => variation({ ...p, sigma: {}, seed: 1.5 })).toThrow(/^seed/);
  });
});

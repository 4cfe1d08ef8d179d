import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { DEFAULT_TECHNOLOGY } from "@/lib/scaling/technology";
import { baselineSettings, evaluateClass } from "@/lib/scaling/evaluate";
import { getMetal } from "@/lib/scaling/materials";
import { scaleClass } from "@/lib/scaling/scale";
import { sweep } from "@/lib/scaling/sweep";
import { MODEL_LEVELS, type ClassOverride, type ScenarioSettings, type WireClass } from "@/lib/scaling/types";

const tech = DEFAULT_TECHNOLOGY;
const nm = (lo: number, hi: number) => fc.double({ min: lo, max: hi, noNaN: true }).map((x) => x * 1e-9);
const metal = fc.constantFrom("Cu", "Al", "W", "Co", "Ru", "cu");

const wireClass = fc
  .record({
    widthM: nm(10, 2000),
    ar: fc.double({ min: 0.5, max: 3, noNaN: true }),
    spacingM: nm(10, 2000),
    below: fc.option(nm(10, 2000)),
    above: nm(10, 2000),
    barrierFrac: fc.double({ min: 0, max: 0.2, noNaN: true }),
    k: fc.double({ min: 1, max: 4.5, noNaN: true }),
    metal,
    lengthM: fc.double({ min: 1e-7, max: 1e-2, noNaN: true }),
    twoPlanes: fc.boolean(),
  })
  .map((r): WireClass => ({
    name: "c",
    tier: "local",
    widthM: r.widthM,
    thicknessM: r.widthM * r.ar,
    spacingM: r.spacingM,
    ildBelowM: r.below,
    ildAboveM: r.below === null || r.twoPlanes ? r.above : null,
    barrierM: r.barrierFrac * r.widthM,
    metal: r.metal,
    k: r.k,
    netCount: 10,
    meanLengthM: r.lengthM,
    driverOhm: 1000,
    loadF: 1e-15,
    activity: 0.1,
  }));

const factor = fc.double({ min: 0.5, max: 3, noNaN: true });
const override: fc.Arbitrary<ClassOverride> = fc.record(
  {
    s: factor,
    sL: factor,
    k: fc.double({ min: 1, max: 4, noNaN: true }),
    metal,
    barrierScales: fc.boolean(),
    aspectRatio: fc.double({ min: 0.5, max: 4, noNaN: true }),
    lineFraction: fc.double({ min: 0.2, max: 0.8, noNaN: true }),
    miller: fc.double({ min: 0, max: 2, noNaN: true }),
    barrierM: nm(0, 3),
  },
  { requiredKeys: [] },
);

const settings: fc.Arbitrary<ScenarioSettings> = fc
  .record({
    level: fc.constantFrom(...MODEL_LEVELS),
    s: factor,
    sL: factor,
    barrierScales: fc.boolean(),
    miller: fc.double({ min: 0, max: 2, noNaN: true }),
    k: fc.option(fc.double({ min: 1, max: 4, noNaN: true })),
    metal: fc.option(metal),
    o: fc.option(override),
  })
  .map((r): ScenarioSettings => ({
    ...baselineSettings(r.level, tech),
    s: r.s,
    sL: r.sL,
    barrierScales: r.barrierScales,
    miller: r.miller,
    k: r.k,
    metal: r.metal,
    overrides: r.o === null ? {} : { c: r.o },
  }));

/** evaluateClass, or null where the scaled barrier fills the line (scaleClass does not check that). */
function evaluated(wc: WireClass, st: ScenarioSettings) {
  try {
    return evaluateClass({ wireClass: wc, technology: tech, settings: st });
  } catch (e) {
    if (e instanceof RangeError && /barrierM must be/.test(e.message)) return null;
    throw e;
  }
}

// The scaling rules live in one function (scaleClassInto); scaleClass, the evaluation and the sweep all use it.
// These properties guard that the geometry they report stays identical, bit for bit.
describe("one implementation of the scaling rules", () => {
  it("plumbing: scaleClass gives exactly the geometry evaluateClass reports, for random classes, settings and overrides", () => {
    fc.assert(
      fc.property(wireClass, settings, (wc, st) => {
        const g = scaleClass(wc, st);
        const r = evaluated(wc, st);
        if (r === null) {
          expect(Math.min(g.widthM - 2 * g.barrierM, g.thicknessM - g.barrierM)).toBeLessThanOrEqual(0);
          return;
        }
        expect([r.widthM, r.thicknessM, r.spacingM, r.ildBelowM, r.ildAboveM, r.barrierM, r.lengthM, r.k, r.pitchM]).toEqual([
          g.widthM,
          g.thicknessM,
          g.spacingM,
          g.ildBelowM,
          g.ildAboveM,
          g.barrierM,
          g.lengthM,
          g.k,
          g.widthM + g.spacingM,
        ]);
        expect(r.metal).toBe(getMetal(g.metal).id);
        expect(r.capacitance.couplingMillerFPerM).toBe(2 * g.miller * r.capacitance.couplingEachFPerM);
      }),
      { numRuns: Number(process.env.PROP_RUNS ?? 500) },
    );
  });
  it("plumbing: a one-point sweep gives exactly evaluateClass's delay, R·C, R and C", () => {
    fc.assert(
      fc.property(wireClass, settings, (wc, st) => {
        const r = evaluated(wc, st);
        if (r === null) return;
        const o = st.overrides.c;
        // the sweep's x replaces the global S and any per-class S override: evaluate at that S
        const x = o?.s ?? st.s;
        const metrics = [
          ["delay", r.delayS],
          ["rc", r.rcS],
          ["r", r.rOhm],
          ["c", r.cF],
        ] as const;
        for (const [metric, y] of metrics) {
          const [curve] = sweep({ classes: [wc], technology: tech, settings: st, variable: "s", metric, from: x, to: x, points: 1, levels: [st.level] });
          expect(curve!.points.map((p) => ({ x: p.x, y: p.y }))).toEqual([{ x, y }]);
          expect(curve!.points[0]!.flags).toEqual(r.validity);
        }
      }),
      { numRuns: Number(process.env.PROP_RUNS ?? 200) },
    );
  });
});

describe("lineFraction override (design-space optimiser's 'apply to scenario')", () => {
  // common practice, no source: at a fixed pitch, width = f·pitch and spacing = (1 − f)·pitch
  const wc: WireClass = {
    name: "m",
    tier: "intermediate",
    widthM: 20e-9,
    thicknessM: 40e-9,
    spacingM: 20e-9,
    ildBelowM: 40e-9,
    ildAboveM: 40e-9,
    barrierM: 2e-9,
    metal: "Cu",
    k: 2.7,
    netCount: 1000,
    meanLengthM: 50e-6,
    driverOhm: 1000,
    loadF: 1e-15,
    activity: 0.1,
  };
  const st = (o: ClassOverride): ScenarioSettings => ({ ...baselineSettings("full", tech), s: 1.25, overrides: { m: o } });
  it("redraws width and spacing at the scaled pitch, keeps the pitch, and the aspect ratio then applies to the new width", () => {
    const g = scaleClass(wc, st({ lineFraction: 0.6 }));
    expect(g.widthM + g.spacingM).toBeCloseTo(32e-9, 20);
    expect(g.widthM).toBeCloseTo(0.6 * 32e-9, 20);
    expect(g.thicknessM).toBeCloseTo(40e-9 / 1.25, 20);
    const h = scaleClass(wc, st({ lineFraction: 0.6, aspectRatio: 2 }));
    expect(h.thicknessM).toBeCloseTo(2 * 0.6 * 32e-9, 20);
  });
  it("refuses a fraction outside (0, 1), naming the field", () => {
    expect(() => evaluateClass({ wireClass: wc, technology: tech, settings: st({ lineFraction: 1 }) })).toThrow(
      /overrides\.m\.lineFraction must be between 0 and 1/,
    );
    expect(() => evaluateClass({ wireClass: wc, technology: tech, settings: st({ lineFraction: 0 }) })).toThrow(/lineFraction/);
  });
});

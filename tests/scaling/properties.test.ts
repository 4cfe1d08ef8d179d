import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { lineCapacitance } from "@/lib/scaling/capacitance";
import { DEFAULT_TECHNOLOGY } from "@/lib/scaling/technology";
import { baselineSettings, evaluateClass } from "@/lib/scaling/evaluate";
import { MODEL_LEVELS, type WireClass } from "@/lib/scaling/types";

const tech = DEFAULT_TECHNOLOGY;
const nm = (lo: number, hi: number) => fc.double({ min: lo, max: hi, noNaN: true }).map((x) => x * 1e-9);

const wireClass = fc
  .record({
    widthM: nm(10, 2000),
    ar: fc.double({ min: 0.5, max: 3, noNaN: true }),
    spacingM: nm(10, 2000),
    below: nm(10, 2000),
    above: fc.option(nm(10, 2000)),
    barrierFrac: fc.double({ min: 0, max: 0.2, noNaN: true }),
    k: fc.double({ min: 1, max: 4.5, noNaN: true }),
    metal: fc.constantFrom("Cu", "Al", "W", "Co", "Ru"),
    lengthM: fc.double({ min: 1e-7, max: 1e-2, noNaN: true }),
    driverOhm: fc.double({ min: 0, max: 1e5, noNaN: true }),
    loadF: fc.double({ min: 0, max: 1e-13, noNaN: true }),
    activity: fc.double({ min: 0, max: 1, noNaN: true }),
  })
  .map((r): WireClass => ({
    name: "p",
    tier: "local",
    widthM: r.widthM,
    thicknessM: r.widthM * r.ar,
    spacingM: r.spacingM,
    ildBelowM: r.below,
    ildAboveM: r.above,
    barrierM: r.barrierFrac * r.widthM,
    metal: r.metal,
    k: r.k,
    netCount: 100,
    meanLengthM: r.lengthM,
    driverOhm: r.driverOhm,
    loadF: r.loadF,
    activity: r.activity,
  }));

// Properties (fast-check): common practice, no source.
describe("properties", () => {
  it("no NaN or infinity for any valid input, at every level", () => {
    fc.assert(
      fc.property(
        wireClass,
        fc.constantFrom(...MODEL_LEVELS),
        fc.double({ min: 1, max: 1.8, noNaN: true }),
        fc.double({ min: 0, max: 2, noNaN: true }),
        (wc, level, s, miller) => {
          const r = evaluateClass({ wireClass: wc, technology: tech, settings: { ...baselineSettings(level, tech), s, miller } });
          for (const v of [
            r.rOhm,
            r.cF,
            r.rcS,
            r.delayS,
            r.elmoreS,
            r.energyJ,
            r.powerW,
            r.repeaters.delayS,
            r.repeaters.size,
            r.repeaters.criticalLengthM,
            r.distribution.meanDelayS,
          ]) {
            expect(Number.isFinite(v)).toBe(true);
          }
          expect(r.cF).toBeGreaterThan(0);
          expect(r.repeaters.count).toBeGreaterThanOrEqual(1);
        },
      ),
      { numRuns: 400 },
    );
  });
  it("at fixed length (S_L = 1), total C falls or stays and R rises with S at every level (scaled cross-section, barrier scaling)", () => {
    fc.assert(
      fc.property(
        wireClass,
        fc.constantFrom(...MODEL_LEVELS),
        fc.double({ min: 1, max: 1.5, noNaN: true }),
        fc.double({ min: 1.01, max: 1.2, noNaN: true }),
        (wc, level, s1, f) => {
          const st = baselineSettings(level, tech);
          st.barrierScales = true;
          const a = evaluateClass({ wireClass: wc, technology: tech, settings: { ...st, s: s1 } });
          const b = evaluateClass({ wireClass: wc, technology: tech, settings: { ...st, s: s1 * f } });
          expect(b.rOhm).toBeGreaterThan(a.rOhm);
          // closed forms are scale-invariant in the cross-section: C per length is constant under uniform S
          expect(b.cF).toBeLessThanOrEqual(a.cF * (1 + 1e-9));
        },
      ),
      { numRuns: Number(process.env.PROP_RUNS ?? 300) },
    );
  });
  it("C per length falls as the line shrinks with fixed dielectric heights (W, T ÷ S only)", () => {
    fc.assert(
      fc.property(
        nm(20, 400),
        nm(20, 400),
        nm(20, 400),
        fc.double({ min: 1.05, max: 2, noNaN: true }),
        fc.constantFrom("ideal", "fringe", "coupled") as fc.Arbitrary<"ideal" | "fringe" | "coupled">,
        (w, h, sp, s, model) => {
          const a = lineCapacitance({ widthM: w, thicknessM: 2 * w, spacingM: sp, heightBelowM: h, heightAboveM: null, k: 3, miller: 1, model });
          const b = lineCapacitance({
            widthM: w / s,
            thicknessM: (2 * w) / s,
            spacingM: sp + w - w / s,
            heightBelowM: h,
            heightAboveM: null,
            k: 3,
            miller: 1,
            model,
          });
          expect(b.totalFPerM).toBeLessThan(a.totalFPerM);
        },
      ),
      { numRuns: 300 },
    );
  });
  // With grounded neighbours the total capacitance of the middle line can only rise as they approach (a grounded
  // conductor moved closer only adds capacitance); the ground part falls and the coupling rises. Both splits are
  // built monotonic in S (capacitance.ts, SPLIT_FIT), so only rounding is allowed: 1e-9 relative.
  for (const planes of ["one plane", "two planes"] as const) {
    it(`coupling rises, ground falls and the total never falls as spacing shrinks (${planes})`, () => {
      const above = planes === "one plane" ? fc.constant(null) : nm(20, 400);
      fc.assert(
        fc.property(
          nm(20, 400),
          nm(20, 400),
          nm(20, 400),
          above,
          fc.double({ min: 1.05, max: 3, noNaN: true }),
          fc.double({ min: 0.5, max: 3, noNaN: true }),
          (w, h, sp, h2, f, ar) => {
            const g = { widthM: w, thicknessM: ar * w, heightBelowM: h, heightAboveM: h2, k: 3, miller: 1, model: "coupled" as const };
            const far = lineCapacitance({ ...g, spacingM: sp * f });
            const near = lineCapacitance({ ...g, spacingM: sp });
            expect(near.couplingEachFPerM).toBeGreaterThan(far.couplingEachFPerM);
            expect(near.areaFPerM + near.fringeFPerM).toBeLessThanOrEqual((far.areaFPerM + far.fringeFPerM) * (1 + 1e-9));
            expect(near.totalFPerM).toBeGreaterThanOrEqual(far.totalFPerM * (1 - 1e-9));
            expect(near.couplingEachFPerM).toBeGreaterThan(0);
            expect(near.areaFPerM + near.fringeFPerM).toBeGreaterThan(0);
          },
        ),
        { numRuns: Number(process.env.PROP_RUNS ?? 400) },
      );
    });
  }
  it("the reported counterexample of engine 1.0.0 (two planes, S 306.6 nm vs 831 nm): the total rises as the neighbours approach", () => {
    const g = { widthM: 46.57e-9, thicknessM: 1.8 * 46.57e-9, heightBelowM: 98.16e-9, heightAboveM: 103.8e-9, k: 3, miller: 1, model: "coupled" as const };
    const near = lineCapacitance({ ...g, spacingM: 306.6e-9 });
    const far = lineCapacitance({ ...g, spacingM: 831e-9 });
    expect(near.totalFPerM).toBeGreaterThan(far.totalFPerM);
  });
});

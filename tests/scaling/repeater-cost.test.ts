import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { DEFAULT_TECHNOLOGY } from "@/lib/scaling/technology";
import { baselineSettings, evaluateClass, evaluateScenario } from "@/lib/scaling/evaluate";
import type { Technology, WireClass } from "@/lib/scaling/types";
import { expectClose } from "./close";
import { testClass } from "./fixtures";

// Energy convention of energy.ts (ours): E = C·V² per rising transition, power = ½·activity·f·ΣE. A repeater of size h
// switches its input h·C0 and its output γ·h·C0 (common practice, no source); its area and leakage are h times a
// minimum repeater's (invented defaults: 0.1 µm², 0 W).
const hist = [
  { lengthM: 5e-6, count: 500 },
  { lengthM: 200e-6, count: 100 },
  { lengthM: 1.2e-3, count: 20 },
];
const wc: WireClass = testClass({ histogram: hist, activity: 0.2 });
const tech: Technology = { ...DEFAULT_TECHNOLOGY, repeaterAreaM2: 0.3e-12, repeaterLeakageW: 2e-9, repeaterOutputCRatio: 0.6 };
const run = (t: Technology, w: WireClass = wc) => evaluateClass({ wireClass: w, technology: t, settings: baselineSettings("full", t) });

describe("cost of repeaters", () => {
  const r = run(tech);
  const bins = r.distribution.bins;
  const sizeSum = bins.reduce((s, b) => s + b.count * b.repeaters * b.repeaterSize, 0);
  it("the histogram's long nets get repeaters", () => {
    expect(bins[2]!.repeaters).toBeGreaterThan(0);
    expect(r.distribution.totalRepeaterSize).toBeCloseTo(sizeSum, 6);
  });
  it("energy per transition of one net: (C + CL)·V² + k·h·C0·(1 + γ)·V²", () => {
    const v2 = tech.supplyV ** 2;
    expectClose(r.repeaterEnergyJ, r.repeaterCount * r.repeaterSize * tech.repeaterC0F * 1.6 * v2, 1e-12);
    expectClose(r.energyJ, (r.cF + r.loadF) * v2 + r.repeaterEnergyJ, 1e-12);
  });
  it("class totals: energy, area, power with switching and leakage written out over the bins", () => {
    const v2 = tech.supplyV ** 2;
    const wire = bins.reduce((s, b) => s + b.count * (r.cFPerM * b.lengthM + r.loadF), 0) * v2;
    const rep = sizeSum * tech.repeaterC0F * 1.6 * v2;
    expectClose(r.totalEnergyJ, wire + rep, 1e-9);
    expectClose(r.totalRepeaterAreaM2, sizeSum * 0.3e-12, 1e-9);
    const leak = sizeSum * 2e-9;
    expectClose(r.powerW, 0.5 * 0.2 * tech.clockHz * (wire + rep) + leak, 1e-9);
    expectClose(r.repeaterPowerW, 0.5 * 0.2 * tech.clockHz * rep + leak, 1e-9);
  });
  it("scenario totals: repeater area, power and share of power", () => {
    const ev = evaluateScenario({
      classes: [wc, testClass({ name: "m3", meanLengthM: 800e-6 })],
      technology: tech,
      settings: { ...baselineSettings("full", tech), s: 1.3 },
    });
    const t = ev.totals.scenario;
    expectClose(
      t.repeaterAreaM2,
      ev.classes.reduce((s, c) => s + c.scenario.totalRepeaterAreaM2, 0),
      1e-12,
    );
    expectClose(
      t.repeaterPowerW,
      ev.classes.reduce((s, c) => s + c.scenario.repeaterPowerW, 0),
      1e-12,
    );
    expectClose(t.repeaterPowerShare, t.repeaterPowerW / t.powerW, 1e-12);
    expect(t.repeaterPowerShare).toBeGreaterThan(0);
    expect(t.repeaterPowerShare).toBeLessThan(1);
  });
  it("defaults: γ = 0.5, area 0.1 µm² per minimum repeater, no leakage", () => {
    const d = run(DEFAULT_TECHNOLOGY);
    expectClose(d.totalRepeaterAreaM2, d.distribution.totalRepeaterSize * 0.1e-12, 1e-12);
    expectClose(d.repeaterEnergyJ, d.repeaterCount * d.repeaterSize * DEFAULT_TECHNOLOGY.repeaterC0F * 1.5 * DEFAULT_TECHNOLOGY.supplyV ** 2, 1e-12);
  });
  it("fast-check: energy and power with repeaters ≥ without (minRepeaterGain 0.999 = none inserted)", () => {
    fc.assert(
      fc.property(
        fc.double({ min: 1e-6, max: 3e-3, noNaN: true }),
        fc.double({ min: 0, max: 1e4, noNaN: true }),
        fc.double({ min: 0, max: 2, noNaN: true }),
        (L, rd, gamma) => {
          const w = testClass({ meanLengthM: L, driverOhm: rd });
          const t = { ...DEFAULT_TECHNOLOGY, repeaterOutputCRatio: gamma };
          const withRep = run(t, w);
          const none = run({ ...t, minRepeaterGain: 0.999 }, w);
          expect(none.repeaterCount).toBe(0);
          expect(withRep.energyJ).toBeGreaterThanOrEqual(none.energyJ);
          expect(withRep.powerW).toBeGreaterThanOrEqual(none.powerW);
        },
      ),
      { numRuns: Number(process.env.PROP_RUNS ?? 200) },
    );
  });
});

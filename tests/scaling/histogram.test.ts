import { describe, expect, it } from "vitest";
import {
  baselineSettings,
  classDistribution,
  coarsenHistogram,
  DEFAULT_TECHNOLOGY,
  evaluateClass,
  evaluateScenario,
  MAX_EVALUATED_BINS,
  type LengthBin,
} from "@/lib/scaling";
import { testClass } from "./fixtures";
import { mulberry32 as prng } from "../helpers/prng";

/** An invented length histogram: `n` log-spaced bins from 0.3 µm to 3 mm, log-normal-shaped counts with ±20% noise. */
function histogram(n: number, seed: number): LengthBin[] {
  const rnd = prng(seed);
  return Array.from({ length: n }, (_, i) => {
    const u = i / (n - 1);
    const lengthM = 0.3e-6 * 10 ** (4 * u);
    const shape = Math.exp(-(((u - 0.35) / 0.18) ** 2) / 2);
    return { lengthM, count: Math.round(1e4 * shape * (0.8 + 0.4 * rnd())) };
  });
}

const netsOf = (h: LengthBin[]) => h.reduce((s, b) => s + b.count, 0);
const lengthOf = (h: LengthBin[]) => h.reduce((s, b) => s + b.lengthM * b.count, 0);

describe("coarsenHistogram (the engine's one merge of long histograms)", () => {
  it("leaves histograms of at most MAX_EVALUATED_BINS bins alone (the same array)", () => {
    const h = histogram(MAX_EVALUATED_BINS, 1);
    expect(coarsenHistogram(h)).toBe(h);
  });

  it("merges 2,000 bins into at most 400, keeping the nets exactly and the total wire length (common practice, no source)", () => {
    const h = histogram(2000, 2);
    const m = coarsenHistogram(h);
    expect(m.length).toBeLessThanOrEqual(MAX_EVALUATED_BINS);
    expect(m.length).toBeGreaterThan(300); // log-spaced input: nearly every merged bin holds nets
    expect(netsOf(m)).toBe(netsOf(h));
    expect(Math.abs(lengthOf(m) / lengthOf(h) - 1)).toBeLessThan(1e-12);
    for (let i = 1; i < m.length; i++) expect(m[i]!.lengthM).toBeGreaterThan(m[i - 1]!.lengthM);
    expect(coarsenHistogram(m)).toBe(m); // merging a merged histogram changes nothing
    expect(coarsenHistogram(histogram(500, 3).map((b) => ({ ...b, count: 0 })))).toEqual([]);
  });

  it("the engine evaluates the merged histogram whether or not the caller merged first (browser = server), bit for bit", () => {
    const h = histogram(2000, 4);
    const full = testClass({ histogram: h });
    const merged = testClass({ histogram: coarsenHistogram(h) });
    const settings = { ...baselineSettings("full", DEFAULT_TECHNOLOGY), s: 1.4 };
    expect(evaluateScenario({ classes: [full], technology: DEFAULT_TECHNOLOGY, settings })).toEqual(
      evaluateScenario({ classes: [merged], technology: DEFAULT_TECHNOLOGY, settings }),
    );
    expect(evaluateClass({ wireClass: full, technology: DEFAULT_TECHNOLOGY, settings })).toEqual(
      evaluateClass({ wireClass: merged, technology: DEFAULT_TECHNOLOGY, settings }),
    );
    // a short histogram is evaluated bin for bin
    const short = histogram(48, 5);
    expect(evaluateClass({ wireClass: testClass({ histogram: short }), technology: DEFAULT_TECHNOLOGY, settings }).distribution.bins).toHaveLength(48);
  });

  it("what the merge costs: delays, share over budget and repeaters of 2,000-bin sets against the full evaluation (measured)", () => {
    const worst: number[] = [];
    const mean: number[] = [];
    const share: number[] = [];
    const reps: number[] = [];
    for (const seed of [6, 7, 8]) {
      const h = histogram(2000, seed);
      for (const s of [1, 1.4]) {
        const r = evaluateClass({ wireClass: testClass(), technology: DEFAULT_TECHNOLOGY, settings: { ...baselineSettings("full", DEFAULT_TECHNOLOGY), s } });
        const t = DEFAULT_TECHNOLOGY;
        const p = {
          source: "histogram" as const,
          rOhmPerM: r.rOhmPerM,
          cFPerM: r.cFPerM,
          driverOhm: r.driverOhm,
          loadF: r.loadF,
          r0Ohm: t.repeaterR0Ohm,
          c0F: t.repeaterC0F,
          delayBudgetS: t.delayBudgetS,
        };
        const a = classDistribution({ ...p, bins: h });
        const b = classDistribution({ ...p, bins: coarsenHistogram(h) });
        for (const delayBudgetS of [5e-12, 2e-11]) {
          const sa = classDistribution({ ...p, delayBudgetS, bins: h }).shareOverBudget;
          expect(sa).toBeGreaterThan(0.01); // the budget cuts through the distribution
          share.push(classDistribution({ ...p, delayBudgetS, bins: coarsenHistogram(h) }).shareOverBudget - sa);
        }
        const maxDelay = (d: typeof a) => Math.max(...d.bins.filter((x) => x.count > 0).map((x) => x.delayS));
        worst.push(maxDelay(b) / maxDelay(a) - 1);
        mean.push(b.meanDelayS / a.meanDelayS - 1);
        reps.push(b.totalRepeaters / a.totalRepeaters - 1);
        expect(b.totalNets).toBe(a.totalNets);
        expect(Math.abs(b.totalCapacitanceF / a.totalCapacitanceF - 1)).toBeLessThan(1e-12);
      }
    }
    const show = (xs: number[]) => xs.map((x) => x.toExponential(2)).join(" ");
    console.log(
      `merged / full − 1: worst delay ${show(worst)} | mean delay ${show(mean)} | share over budget (difference) ${show(share)} | repeaters ${show(reps)}`,
    );
    // Measured (engine 1.1.0; three invented 2,000-bin sets × S = 1, 1.4): worst delay exact (the longest bin is kept);
    // mean delay within 0.14% (1.35e-3); share of nets over a 5 ps or 20 ps budget within 0.0025 (absolute; the
    // budgets cut through each distribution); inserted repeaters within 0.25% (2.54e-3); total capacitance kept. Bounds ≈ 1.5× the measured.
    for (const w of worst) expect(w).toBe(0);
    for (const m of mean) expect(Math.abs(m)).toBeLessThan(2e-3);
    for (const x of share) expect(Math.abs(x)).toBeLessThan(3.7e-3);
    for (const x of reps) expect(Math.abs(x)).toBeLessThan(3.8e-3);
  });
});

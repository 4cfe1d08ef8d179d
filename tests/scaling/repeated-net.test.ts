import fc from "fast-check";
import { afterAll, describe, expect, it } from "vitest";
import { DEFAULT_TECHNOLOGY } from "@/lib/scaling/technology";
import { baselineSettings, evaluateClass } from "@/lib/scaling/evaluate";
import { classDistribution } from "@/lib/scaling/distribution";
import { lineDelay } from "@/lib/scaling/delay";
import { repeatedNet, repeatedNetDelayS } from "@/lib/scaling/repeaters";
import type { WireClass } from "@/lib/scaling/types";
import { expectClose } from "./close";
import { testClass } from "./fixtures";
import { cleanupSpice, haveSpice, ladder, spiceDelay } from "./spice";

const R0 = 6000;
const C0 = 0.25e-15;

describe.skipIf(!haveSpice)("repeated net (real driver → k ideal-threshold repeaters → real load) vs ngspice", () => {
  afterAll(cleanupSpice);
  /**
   * The chain the model assumes, as a circuit: driver resistor; per repeater an input capacitor h·C0, an ideal
   * threshold (a behavioural source switching 0 → 1 V where its input crosses 0.5 V: tanh with a 0.1 mV width), an
   * output resistor R0/h and an output capacitor γ·h·C0; segments as 60-section π ladders; the load capacitor.
   */
  function chain(r: number, c: number, rd: number, cl: number, k: number, h: number, gamma: number): number {
    const body: string[] = [`RD in s0 ${rd > 0 ? rd : 1e-3}`];
    const n = k + 1;
    for (let i = 0; i < n; i++) {
      const end = i === n - 1 ? "out" : `e${i}`;
      ladder(body, `L${i}`, `s${i}`, end, r / n, c / n, 60);
      if (i < n - 1) {
        body.push(`CI${i} e${i} 0 ${h * C0}`);
        body.push(`B${i} x${i} 0 V = 0.5*(1+tanh(10000*(v(e${i})-0.5)))`);
        body.push(`RO${i} x${i} s${i + 1} ${R0 / h}`, `CO${i} s${i + 1} 0 ${gamma * h * C0}`);
      }
    }
    if (cl > 0) body.push(`CL out 0 ${cl}`);
    const elmoreBound = (rd + R0 + r) * (c + cl + n * 2 * h * C0) * 3 + 1e-12;
    return spiceDelay(body, "out", elmoreBound);
  }
  // (driver Ω, load F, line R Ω, line C F, k, h, γ): invented combinations spanning driver- and wire-dominated nets.
  const cases: [number, number, number, number, number, number, number][] = [
    [300, 1e-15, 213, 304e-15, 6, 114, 0.5], // the demo's global class at S = 1.43 (mean length)
    [3000, 1e-15, 1270, 4.55e-15, 1, 4.6, 0.5],
    [1000, 5e-15, 5000, 200e-15, 3, 20, 0.5],
    [100, 20e-15, 20000, 400e-15, 8, 15, 0.5],
    [6000, 0.25e-15, 2000, 100e-15, 2, 10, 0],
    [50, 50e-15, 800, 600e-15, 4, 60, 1],
    [2000, 2e-15, 10000, 50e-15, 5, 3, 0.5],
  ];
  it.each(cases)("driver %d Ω, load %d F, line %d Ω / %d F, k = %d, h = %d, γ = %d: within 3%", (rd, cl, r, c, k, h, gamma) => {
    const sim = chain(r, c, rd, cl, k, h, gamma);
    const model = repeatedNetDelayS({ rOhm: r, cF: c, driverOhm: rd, loadF: cl, r0Ohm: R0, c0F: C0, inserted: k, size: h, outputCRatio: gamma });
    console.log(`chain k=${k}: ngspice ${sim.toExponential(4)} s, model ${model.toExponential(4)} s, error ${((model / sim - 1) * 100).toFixed(2)}%`);
    expectClose(model, sim, 0.03);
  });
});

describe("repeatedNet: the chosen (k, h) against a brute-force search of the same model", () => {
  // brute force: every k from 0 to 60 and h on a log grid of 4,000 points from 1 to 10,000 (repeatedNetDelayS)
  function brute(p: { rOhm: number; cF: number; driverOhm: number; loadF: number }): { k: number; t: number } {
    let best = { k: 0, t: repeatedNetDelayS({ ...p, r0Ohm: R0, c0F: C0, inserted: 0, size: 1 }) };
    for (let k = 1; k <= 60; k++) {
      for (let i = 0; i <= 4000; i++) {
        const h = 10 ** (i / 1000);
        const t = repeatedNetDelayS({ ...p, r0Ohm: R0, c0F: C0, inserted: k, size: h });
        if (t < best.t) best = { k, t };
      }
    }
    return best;
  }
  const nets = [
    { rOhm: 213, cF: 304e-15, driverOhm: 300, loadF: 1e-15 },
    { rOhm: 1270, cF: 4.55e-15, driverOhm: 3000, loadF: 1e-15 },
    { rOhm: 20000, cF: 400e-15, driverOhm: 100, loadF: 20e-15 },
    { rOhm: 5000, cF: 200e-15, driverOhm: 1000, loadF: 5e-15 },
    { rOhm: 100, cF: 10e-15, driverOhm: 50, loadF: 0 },
  ];
  it.each(nets)("net %o", (net) => {
    const b = brute(net);
    const r = repeatedNet({ ...net, r0Ohm: R0, c0F: C0, minGain: 0 });
    // same k (or, on a tie, the same delay), and a delay no worse than the brute force's (its h grid is 0.23% apart)
    if (r.inserted !== b.k) expectClose(r.delayS, b.t, 1e-6);
    expect(r.delayS).toBeLessThanOrEqual(b.t * (1 + 1e-9));
    expectClose(r.delayS, b.t, 2e-5);
    if (r.inserted > 0) expectClose(repeatedNetDelayS({ ...net, r0Ohm: R0, c0F: C0, inserted: r.inserted, size: r.size }), r.delayS, 1e-12);
  });
});

describe("minimum repeater gain", () => {
  it("a net that repeaters speed up by less than 10% keeps none at the default, and gets them at minGain 0", () => {
    // the intermediate demo-like net: a buffer helps by a few per cent only
    let net = { rOhm: 1270, cF: 4.55e-15, driverOhm: 3000, loadF: 1e-15, r0Ohm: R0, c0F: C0 };
    let free = repeatedNet({ ...net, minGain: 0 });
    for (let i = 0; i < 40 && !(free.inserted > 0 && free.delayS > 0.9 * free.unrepeatedDelayS); i++) {
      net = { ...net, rOhm: net.rOhm * 0.93, cF: net.cF * 0.93 };
      free = repeatedNet({ ...net, minGain: 0 });
    }
    expect(free.inserted).toBeGreaterThan(0);
    expect(free.delayS).toBeGreaterThan(0.9 * free.unrepeatedDelayS);
    const def = repeatedNet(net);
    expect(def.inserted).toBe(0);
    expect(def.delayS).toBe(def.unrepeatedDelayS);
    expect(def.unrepeatedDelayS).toBe(lineDelay({ rOhm: net.rOhm, cF: net.cF, driverOhm: net.driverOhm, loadF: net.loadF }).t50S);
  });
  it("when repeaters are inserted they cut the delay by at least minGain", () => {
    for (const g of [0, 0.1, 0.3]) {
      const r = repeatedNet({ rOhm: 5000, cF: 200e-15, driverOhm: 1000, loadF: 5e-15, r0Ohm: R0, c0F: C0, minGain: g });
      expect(r.inserted).toBeGreaterThan(0);
      expect(r.delayS).toBeLessThanOrEqual((1 - g) * r.unrepeatedDelayS);
    }
  });
  it("the technology's minRepeaterGain reaches the class result and the distribution", () => {
    const wc = testClass({ meanLengthM: 400e-6 });
    const t = { ...DEFAULT_TECHNOLOGY, minRepeaterGain: 0.999 };
    const r = evaluateClass({ wireClass: wc, technology: t, settings: baselineSettings("full", t) });
    expect(r.repeaterCount).toBe(0);
    expect(r.distribution.totalRepeaters).toBe(0);
    const d = evaluateClass({ wireClass: wc, technology: DEFAULT_TECHNOLOGY, settings: baselineSettings("full", DEFAULT_TECHNOLOGY) });
    expect(d.repeaterCount).toBeGreaterThan(0);
    expect(d.repeatedDelayS).toBeLessThanOrEqual(0.9 * d.delayS);
    expect(d.stageCount).toBe(d.repeaterCount + 1);
  });
});

describe("properties (fast-check)", () => {
  const runs = Number(process.env.PROP_RUNS ?? 300);
  it("repeaters never make a net slower than unrepeated (repeatedNet, class result, every distribution bin)", () => {
    fc.assert(
      fc.property(
        fc.double({ min: 1, max: 1e6, noNaN: true }),
        fc.double({ min: 1e-17, max: 1e-11, noNaN: true }),
        fc.double({ min: 0, max: 1e5, noNaN: true }),
        fc.double({ min: 0, max: 1e-12, noNaN: true }),
        fc.double({ min: 0, max: 0.5, noNaN: true }),
        fc.double({ min: 0, max: 2, noNaN: true }),
        (r, c, rd, cl, g, gamma) => {
          const n = repeatedNet({ rOhm: r, cF: c, driverOhm: rd, loadF: cl, r0Ohm: R0, c0F: C0, minGain: g, outputCRatio: gamma });
          expect(n.delayS).toBeLessThanOrEqual(n.unrepeatedDelayS);
          if (n.inserted > 0) expect(n.delayS).toBeLessThanOrEqual((1 - g) * n.unrepeatedDelayS * (1 + 1e-12));
          const d = classDistribution({
            bins: [{ lengthM: 1, count: 1 }],
            source: "mean",
            rOhmPerM: r,
            cFPerM: c,
            driverOhm: rd,
            loadF: cl,
            r0Ohm: R0,
            c0F: C0,
            delayBudgetS: 1,
            minGain: g,
            outputCRatio: gamma,
          });
          expect(d.bins[0]!.delayS).toBe(n.delayS);
          expect(d.bins[0]!.repeaters).toBe(n.inserted);
        },
      ),
      { numRuns: runs },
    );
  });
  it("class results: repeatedDelayS ≤ delayS, equal when no repeater", () => {
    const nm = (lo: number, hi: number) => fc.double({ min: lo, max: hi, noNaN: true }).map((x) => x * 1e-9);
    fc.assert(
      fc.property(nm(20, 500), nm(20, 500), fc.double({ min: 1e-6, max: 5e-3, noNaN: true }), fc.double({ min: 0, max: 2e4, noNaN: true }), (w, h, L, rd) => {
        const wc: WireClass = testClass({ widthM: w, thicknessM: 2 * w, spacingM: w, ildBelowM: h, meanLengthM: L, driverOhm: rd });
        const r = evaluateClass({ wireClass: wc, technology: DEFAULT_TECHNOLOGY, settings: baselineSettings("full", DEFAULT_TECHNOLOGY) });
        expect(r.repeatedDelayS).toBeLessThanOrEqual(r.delayS);
        if (r.repeaterCount === 0) expect(r.repeatedDelayS).toBe(r.delayS);
      }),
      { numRuns: runs },
    );
  });
});

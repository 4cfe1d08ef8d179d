import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { REPEATER_A, REPEATER_B } from "@/lib/scaling/constants";
import { lineDelay } from "@/lib/scaling/delay";
import { DEFAULT_TECHNOLOGY } from "@/lib/scaling/technology";
import { baselineSettings, evaluateClass } from "@/lib/scaling/evaluate";
import { criticalLengthM, optimalRepeaters, repeatedDelayS } from "@/lib/scaling/repeaters";
import { MODEL_LEVELS, type ModelLevel, type WireClass } from "@/lib/scaling/types";
import { expectClose } from "./close";
import { testClass } from "./fixtures";

// Bakoglu & Meindl, "Optimal interconnection circuits for VLSI", IEEE TED ED-32(5), 1985 [memory]: stage model and optimum.
describe("optimalRepeaters({ rOhm, cF, lengthM, r0Ohm, c0F })", () => {
  const line = { rOhm: 20e3, cF: 400e-15, lengthM: 2e-3, r0Ohm: 6000, c0F: 0.25e-15 };
  it("matches a brute-force search over whole k and a fine grid of h", () => {
    const r = optimalRepeaters(line);
    let best = Infinity;
    let bestK = 0;
    for (let k = 1; k <= 200; k++) {
      for (let h = 1; h <= 2000; h += 0.5) {
        const t = repeatedDelayS({ ...line, count: k, size: h });
        if (t < best) {
          best = t;
          bestK = k;
        }
      }
    }
    expect(r.count).toBe(bestK);
    expect(r.delayS).toBeLessThanOrEqual(best * (1 + 1e-12));
    expectClose(r.delayS, best, 1e-4); // the h grid step limits the brute force
  });
  it("T* = 2(a + sqrt(ab))·sqrt(R0·C0·R·C) (Bakoglu–Meindl 1985) and delay per metre", () => {
    const r = optimalRepeaters(line);
    const tOpt = 2 * (REPEATER_A + Math.sqrt(REPEATER_A * REPEATER_B)) * Math.sqrt(6000 * 0.25e-15 * 20e3 * 400e-15);
    expectClose(r.delayPerMS, tOpt / 2e-3, 1e-12);
    expect(r.delayS).toBeGreaterThanOrEqual(tOpt * (1 - 1e-12)); // whole k can only be slower than the continuous optimum
  });
  it("k = h = 1 reproduces the Sakurai delay of a minimum driver and load (a = ln2, b = 0.377)", () => {
    expectClose(
      repeatedDelayS({ ...line, count: 1, size: 1 }),
      lineDelay({ rOhm: 20e3, cF: 400e-15, driverOhm: 6000, loadF: 0.25e-15, model: "sakurai" }).t50S,
      1e-12,
    );
  });
  it("short lines get one stage; the critical length is where two stages start to pay (brute force over length)", () => {
    const per = { rOhmPerM: 1e7, cFPerM: 2e-10, r0Ohm: 6000, c0F: 0.25e-15 };
    const lc = criticalLengthM(per);
    const at = (L: number) => optimalRepeaters({ rOhm: per.rOhmPerM * L, cF: per.cFPerM * L, lengthM: L, r0Ohm: 6000, c0F: 0.25e-15 });
    expect(at(lc * 0.99).count).toBe(1);
    expect(at(lc * 1.01).count).toBe(2);
    expectClose(at(lc).criticalLengthM, lc, 1e-12);
  });
  it("rejects non-positive input", () => {
    expect(() => optimalRepeaters({ ...line, r0Ohm: 0 })).toThrow("r0Ohm must be > 0 (got 0)");
  });
});

// The class result's repeaters: count = 1 is the class's own line (its driver as given, not a driver resized to h*);
// stages are inserted only where they beat it, as in the length distribution (common practice, no source).
describe("evaluateClass(...).repeaters: delayS < delayS of the class exactly when repeaters help", () => {
  const tech = DEFAULT_TECHNOLOGY;
  const rc0 = tech.repeaterR0Ohm * tech.repeaterC0F;
  const run = (wc: WireClass, level: ModelLevel = "full") => evaluateClass({ wireClass: wc, technology: tech, settings: baselineSettings(level, tech) });
  /** The class at the length where its line's R·C is x·R0·C0. */
  const withRc = (wc: WireClass, x: number): WireClass => {
    const r = run(wc);
    return { ...wc, meanLengthM: wc.meanLengthM * Math.sqrt((x * rc0) / r.rcS) };
  };
  it("a short line: count 1 and the class's own delay (engine 1.0.0 reported T(1, h*), a driver resized to h*)", () => {
    for (const level of MODEL_LEVELS) {
      const r = run(testClass({ meanLengthM: 5e-6, driverOhm: 1000 }), level);
      expect(r.repeaters.count).toBe(1);
      expect(r.repeaters.delayS).toBe(r.delayS);
      const resized = optimalRepeaters({ rOhm: r.rOhm, cF: r.cF, lengthM: r.lengthM, r0Ohm: tech.repeaterR0Ohm, c0F: tech.repeaterC0F });
      expect(resized.count).toBe(1);
      expect(resized.delayS).not.toBe(r.delayS);
    }
  });
  it("k* ≥ 2 but a strong driver beats two stages (R·C = 8·R0·C0, driver 1 Ω, no load): count 1, own delay", () => {
    const wc = withRc(testClass({ driverOhm: 1, loadF: 0 }), 8);
    const r = run(wc);
    const bare = optimalRepeaters({ rOhm: r.rOhm, cF: r.cF, lengthM: r.lengthM, r0Ohm: tech.repeaterR0Ohm, c0F: tech.repeaterC0F });
    expect(bare.count).toBe(2); // the bare Bakoglu–Meindl optimum would insert a repeater ...
    expect(bare.delayS).toBeGreaterThan(r.delayS); // ... that makes the line slower than its own driver
    expect(r.repeaters.count).toBe(1);
    expect(r.repeaters.delayS).toBe(r.delayS);
    expect(r.distribution.bins[0]!.repeaters).toBe(0); // the mean-length distribution agrees
  });
  it("a long line (R·C = 400·R0·C0): stages inserted, faster than the class's own delay, and the distribution agrees", () => {
    const r = run(withRc(testClass(), 400));
    expect(r.repeaters.count).toBeGreaterThanOrEqual(2);
    expect(r.repeaters.delayS).toBeLessThan(r.delayS);
    const bin = r.distribution.bins[0]!;
    expect(bin.repeaters).toBe(r.repeaters.count - 1);
    expectClose(bin.delayS, r.repeaters.delayS, 1e-12);
  });
  it("public optimalRepeaters with unrepeatedDelayS applies the same rule", () => {
    const line = { rOhm: 20e3, cF: 400e-15, lengthM: 2e-3, r0Ohm: 6000, c0F: 0.25e-15 };
    const r = optimalRepeaters({ ...line, unrepeatedDelayS: 1e-15 });
    expect(r.count).toBe(1);
    expect(r.delayS).toBe(1e-15);
    const helped = optimalRepeaters({ ...line, unrepeatedDelayS: 1 });
    const bare = optimalRepeaters(line);
    expect([helped.count, helped.size, helped.delayS]).toEqual([bare.count, bare.size, bare.delayS]);
    expect(() => optimalRepeaters({ ...line, unrepeatedDelayS: 0 })).toThrow("unrepeatedDelayS must be > 0 (got 0)");
  });
  it("for random classes at every level: count 1 ⇔ repeaters.delayS = delayS, otherwise repeaters.delayS < delayS", () => {
    const nm = (lo: number, hi: number) => fc.double({ min: lo, max: hi, noNaN: true }).map((x) => x * 1e-9);
    fc.assert(
      fc.property(
        nm(10, 2000),
        fc.double({ min: 0.5, max: 3, noNaN: true }),
        nm(10, 2000),
        fc.double({ min: 1e-7, max: 2e-2, noNaN: true }),
        fc.double({ min: 0, max: 1e5, noNaN: true }),
        fc.double({ min: 0, max: 1e-13, noNaN: true }),
        fc.constantFrom(...MODEL_LEVELS),
        (w, ar, h, L, rd, cl, level) => {
          const r = run(
            testClass({ widthM: w, thicknessM: ar * w, spacingM: w, ildBelowM: h, barrierM: 0.05 * w, meanLengthM: L, driverOhm: rd, loadF: cl }),
            level,
          );
          if (r.repeaters.count === 1) expect(r.repeaters.delayS).toBe(r.delayS);
          else expect(r.repeaters.delayS).toBeLessThan(r.delayS);
        },
      ),
      { numRuns: Number(process.env.PROP_RUNS ?? 400) },
    );
  });
});

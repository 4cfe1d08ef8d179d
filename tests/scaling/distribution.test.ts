import { describe, expect, it } from "vitest";
import { classDistribution, davisGamma, rentWireLengths } from "@/lib/scaling/distribution";
import { lineDelay } from "@/lib/scaling/delay";
import { expectClose } from "./close";

describe("rentWireLengths (Davis, De, Meindl, IEEE TED 45(3), 1998)", () => {
  it.each([
    [1e4, 0.6],
    [1e5, 0.66],
    [1e6, 0.75],
    [1e5, 0.5],
  ])("∫ i(l) dl over [1, 2√N] = α·k·N·(1 − N^(p−1)) for N = %d, p = %d", (N, p) => {
    const k = 4;
    const fo = 3;
    const bins = rentWireLengths({ gates: N, rentK: k, rentP: p, fanout: fo, gatePitchM: 1e-6, bins: 64 });
    const total = bins.reduce((s, b) => s + b.count, 0);
    expectClose(total, (fo / (fo + 1)) * k * N * (1 - N ** (p - 1)), 2e-3);
    expect(bins.every((b) => b.count >= 0)).toBe(true);
    expect(bins.length).toBe(64);
  });
  it("Γ is continuous through its removable singularity at p = 0.5", () => {
    expectClose(davisGamma(1e5, 0.5 - 1e-4), davisGamma(1e5, 0.5 + 1e-4), 1e-3);
  });
});

describe("classDistribution", () => {
  it("weights per-bin delays by count and counts nets over budget (common practice, no source)", () => {
    const base = { source: "histogram" as const, rOhmPerM: 1e7, cFPerM: 2e-10, driverOhm: 1000, loadF: 1e-15, r0Ohm: 6000, c0F: 0.25e-15 };
    const bins = [
      { lengthM: 10e-6, count: 100 },
      { lengthM: 50e-6, count: 10 },
    ];
    const d0 = lineDelay({ rOhm: 100, cF: 2e-15, driverOhm: 1000, loadF: 1e-15 }).t50S;
    const d1 = lineDelay({ rOhm: 500, cF: 10e-15, driverOhm: 1000, loadF: 1e-15 }).t50S;
    const r = classDistribution({ ...base, bins, delayBudgetS: (d0 + d1) / 2 });
    expect(r.totalNets).toBe(110);
    expectClose(r.shareOverBudget, 10 / 110, 1e-12);
    expectClose(r.meanDelayS, (100 * d0 + 10 * d1) / 110, 1e-12);
    expectClose(r.totalCapacitanceF, 100 * 2e-15 + 10 * 10e-15, 1e-12);
    expect(r.totalRepeaters).toBe(0);
  });
  it("inserts repeaters on long bins only where they are faster", () => {
    const r = classDistribution({
      source: "mean",
      bins: [{ lengthM: 5e-3, count: 3 }],
      rOhmPerM: 1e7,
      cFPerM: 2e-10,
      driverOhm: 1000,
      loadF: 1e-15,
      r0Ohm: 6000,
      c0F: 0.25e-15,
      delayBudgetS: 1e-9,
    });
    const plain = lineDelay({ rOhm: 5e4, cF: 1e-12, driverOhm: 1000, loadF: 1e-15 }).t50S;
    expect(r.bins[0]!.repeaters).toBeGreaterThan(0);
    expect(r.bins[0]!.delayS).toBeLessThan(plain);
    expect(r.totalRepeaters).toBe(3 * r.bins[0]!.repeaters);
  });
});

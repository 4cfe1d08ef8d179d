import { describe, expect, it } from "vitest";
import { interpolateLogLog, readSweep } from "@/lib/workspace/sweep-reading";
import { logspace } from "@/lib/scaling";

// Synthetic curves with known shapes: y = f(S) sampled like the editor's sweep (log spaced 0.5..4).
const xs = logspace(0.5, 4, 36);
const curve = (f: (s: number) => number) => xs.map((x) => ({ x, y: f(x) }));

describe("readSweep (the plain-words reading under the sweep)", () => {
  it("finds the minimum of a curve that improves then worsens, and where gains fall under 2% per 10% shrink", () => {
    // y = 1/S + S²/8 − 1/8 + … : lowest at S = 4^(1/3) ≈ 1.59 (dy/dS = −1/S² + S/4 = 0).
    const f = (s: number) => 1 / s + (s * s) / 8;
    const r = readSweep(
      {
        className: "local",
        curves: { full: curve(f), ideal: curve(() => 1), coupled: curve((s) => f(s) / 1.1) },
        at1: { full: f(1), ideal: 1 },
      },
      { scenarioS: 1.43, metricLabel: "Delay" },
    );
    expect(r.bestS!).toBeGreaterThan(1.5);
    expect(r.bestS!).toBeLessThan(1.7);
    expect(r.bestRel!).toBeCloseTo(f(r.bestS!) / f(1), 10);
    expect(r.plateauS!).toBeGreaterThan(1.2);
    expect(r.plateauS!).toBeLessThan(r.bestS!);
    expect(r.relAtS!).toBeCloseTo(f(1.43) / f(1), 2);
    expect(r.idealRelAtS).toBe(1);
    expect(r.sizeFactorAtS!).toBeCloseTo(1.1, 6);
    expect(r.text).toMatch(/lowest at S ≈ 1\.[56] .* worsens beyond/);
    expect(r.text).toContain("add 10% over");
  });
  it("says so when the curve only rises beyond S = 1", () => {
    const r = readSweep({ className: "g", curves: { full: curve((s) => s * s) }, at1: { full: 1 } }, { scenarioS: 2, metricLabel: "RC" });
    expect(r.bestS).toBeUndefined();
    expect(r.text).toMatch(/^RC gets no better from shrinking: 16\.00× of S = 1 at S = 4\./);
    expect(r.relAtS!).toBeCloseTo(4, 9);
  });
  it("reports a curve still falling at the end of the range", () => {
    const r = readSweep({ className: "g", curves: { full: curve((s) => 1 / s) }, at1: { full: 1 } }, { scenarioS: 9, metricLabel: "Delay" });
    expect(r.bestS).toBe(4);
    expect(r.plateauS).toBeUndefined();
    expect(r.relAtS).toBeUndefined(); // S = 9 lies outside the swept range: nothing invented
    expect(r.text).toBe("Delay still improves at S = 4 (0.25× of S = 1).");
  });
  it("interpolates on log–log axes and refuses to extrapolate", () => {
    const pts = [
      { x: 1, y: 1 },
      { x: 4, y: 16 },
    ];
    expect(interpolateLogLog(pts, 2)).toBeCloseTo(4, 12);
    expect(interpolateLogLog(pts, 5)).toBeUndefined();
  });
});

import { describe, expect, it } from "vitest";
import { baselineSettings, sweep, type ScenarioSettings, type Technology, type WireClass } from "@/lib/scaling";
import { freezeReport, sweepLengthRule } from "@/lib/reports/freeze";

// Issue 13 item 6: the report's "where delay stops improving" figure uses the scenario's (or the class's) length rule.

const technology: Technology = { supplyV: 0.75, clockHz: 1.5e9, repeaterR0Ohm: 6000, repeaterC0F: 0.25e-15, delayBudgetS: 100e-12 };
const cls = (name: string, tier: WireClass["tier"], w: number, len: number): WireClass => ({
  name,
  tier,
  widthM: w,
  thicknessM: 2 * w,
  spacingM: w,
  ildBelowM: w,
  ildAboveM: w,
  barrierM: 2e-9,
  metal: "Cu",
  k: 2.7,
  netCount: 1000,
  meanLengthM: len,
  driverOhm: 2000,
  loadF: 1e-15,
  activity: 0.1,
});
const classes = [cls("M2", "local", 24e-9, 20e-6), cls("M9", "global", 400e-9, 1.5e-3)];

describe("sweepLengthRule", () => {
  const full = baselineSettings("full", technology);
  it("follows S when the scenario's S_L equals S, keeps lengths when S_L = 1, otherwise follows the tier", () => {
    expect(sweepLengthRule({ ...full, s: 1.43, sL: 1.43 }, classes[1]!)).toBe("follow");
    expect(sweepLengthRule({ ...full, s: 1.43, sL: 1 }, classes[0]!)).toBe("fixed");
    expect(sweepLengthRule({ ...full, s: 1.43, sL: 1.2 }, classes[0]!)).toBe("follow");
    expect(sweepLengthRule({ ...full, s: 1.43, sL: 1.2 }, classes[1]!)).toBe("fixed");
    // a per-class override decides for its class
    expect(sweepLengthRule({ ...full, s: 1.43, sL: 1, overrides: { M9: { sL: 1.43 } } }, classes[1]!)).toBe("follow");
  });
});

describe("freezeReport sweeps", () => {
  it("sweep each class with its length rule, and put each option's mark on its own curve", () => {
    const settings: ScenarioSettings = { ...baselineSettings("full", technology), s: 1.6, sL: 1.6, overrides: { M9: { sL: 1 } } };
    const doc = freezeReport({
      baseline: { id: "b", name: "t", description: "", version: 1, technology, classes },
      scenarios: [{ id: "s", name: "shrink", notes: "", version: 1, settings }],
    });
    const local = doc.sweeps.find((s) => s.className === "M2")!;
    const global = doc.sweeps.find((s) => s.className === "M9")!;
    expect([local.lengthRule, global.lengthRule]).toEqual(["follow", "fixed"]);
    const expected = sweep({
      classes,
      technology,
      settings,
      variable: "s",
      metric: "delay",
      from: local.from,
      to: local.to,
      points: local.series[0]!.points.length,
      levels: ["full"],
      classNames: ["M2"],
      lengthMode: "follow",
    })[0]!;
    expect(local.series.find((s) => s.key === "A")!.points.map((p) => p.y)).toEqual(expected.points.map((p) => p.y));
    // the local class's delay at mean length, lengths shrinking with S, has a minimum inside the range: the plateau shows
    const ys = expected.points.map((p) => p.y);
    const at = ys.indexOf(Math.min(...ys));
    expect(at).toBeGreaterThan(0);
    expect(at).toBeLessThan(ys.length - 1);
    // the mark is the option on that curve at S = 1.6 (S_L = S = 1.6)
    const mark = local.marks.find((m) => m.key === "A")!;
    expect(mark.x).toBe(1.6);
    const one = sweep({
      classes,
      technology,
      settings,
      variable: "s",
      metric: "delay",
      from: 1.6,
      to: 1.6,
      points: 1,
      levels: ["full"],
      classNames: ["M2"],
      lengthMode: "follow",
    });
    expect(mark.y).toBe(one[0]!.points[0]!.y);
  });
});

describe("length rules in the report's sweeps (issue 14)", () => {
  const full = baselineSettings("full", technology);
  it("sweepLengthRule: the class's rule, else the option's global rule when the class has no S_L of its own", () => {
    expect(sweepLengthRule({ ...full, s: 1.43, sL: 1, lengthRule: { kind: "follows-s" } }, classes[1]!)).toBe("follow");
    expect(sweepLengthRule({ ...full, s: 1.43, sL: 1.43, lengthRule: { kind: "fixed" } }, classes[0]!)).toBe("fixed");
    expect(sweepLengthRule({ ...full, s: 1.43, lengthRule: { kind: "power", exponent: 0.5 } }, classes[0]!)).toEqual({ kind: "power", exponent: 0.5 });
    // the class's S_L wins over the global rule; the class's rule over both
    expect(sweepLengthRule({ ...full, s: 1.43, lengthRule: { kind: "power", exponent: 0.5 }, overrides: { M9: { sL: 1 } } }, classes[1]!)).toBe("fixed");
    expect(sweepLengthRule({ ...full, s: 1.43, overrides: { M9: { sL: 1, lengthRule: { kind: "factor", sL: 1.2 } } } }, classes[1]!)).toEqual({
      kind: "factor",
      sL: 1.2,
    });
  });
  it("a power-law rule: the frozen curve is the delay at S_L = S^a at every S (closed form of the rule)", () => {
    const settings: ScenarioSettings = { ...full, s: 1.6, lengthRule: { kind: "power", exponent: 0.5 } };
    const doc = freezeReport({
      baseline: { id: "b", name: "t", description: "", version: 1, technology, classes },
      scenarios: [{ id: "s", name: "shrink", notes: "", version: 1, settings }],
    });
    const local = doc.sweeps.find((s) => s.className === "M2")!;
    expect(local.lengthRule).toEqual({ kind: "power", exponent: 0.5 });
    const pts = local.series.find((s) => s.key === "A")!.points;
    for (const p of [pts[0]!, pts[Math.floor(pts.length / 2)]!, pts.at(-1)!]) {
      const one = sweep({
        classes,
        technology,
        settings: { ...full, s: p.x, sL: Math.sqrt(p.x) },
        variable: "sL",
        metric: "delay",
        from: Math.sqrt(p.x),
        to: Math.sqrt(p.x),
        points: 1,
        levels: ["full"],
        classNames: ["M2"],
      })[0]!.points[0]!;
      expect(p.y).toBeCloseTo(one.y, 24);
    }
    const mark = local.marks.find((m) => m.key === "A")!;
    expect(mark.x).toBe(1.6);
  });
});

import { describe, expect, it } from "vitest";
import { baselineSettings } from "@/lib/scaling/evaluate";
import { DEFAULT_TECHNOLOGY } from "@/lib/scaling/technology";
import { linspace, logspace, sweep } from "@/lib/scaling/sweep";
import { evaluateClass } from "@/lib/scaling/evaluate";
import { lineDelay } from "@/lib/scaling/delay";
import { expectClose } from "./close";
import { testClass } from "./fixtures";

const tech = DEFAULT_TECHNOLOGY;

describe("linspace / logspace", () => {
  it("hit both ends exactly", () => {
    expect(linspace(1, 4, 4)).toEqual([1, 2, 3, 4]);
    const l = logspace(1, 100, 3);
    expect(l[0]).toBe(1);
    expectClose(l[1]!, 10, 1e-14);
    expect(l[2]).toBe(100);
    expect(() => linspace(0, 1, 0)).toThrow(RangeError);
  });
});

describe("sweep({ variable: 's', ... })", () => {
  const classes = [
    testClass(),
    testClass({ name: "g", tier: "global", widthM: 400e-9, thicknessM: 800e-9, spacingM: 400e-9, ildBelowM: 400e-9, meanLengthM: 1e-3, barrierM: 5e-9 }),
  ];
  const curves = sweep({ classes, technology: tech, settings: baselineSettings("full", tech), variable: "s", metric: "rc", from: 1, to: 4, points: 31 });
  it("one curve per class and level", () => {
    expect(curves).toHaveLength(8);
    expect(new Set(curves.map((c) => c.level))).toEqual(new Set(["ideal", "fringe", "coupled", "full"]));
  });
  it("ideal RC of a global wire (S_L = 1) grows as S² (docs/models.md scaling laws)", () => {
    const c = curves.find((x) => x.className === "g" && x.level === "ideal")!;
    for (const p of c.points) expectClose(p.y / c.points[0]!.y, p.x * p.x, 1e-9);
  });
  it("full RC grows faster than ideal (barrier and size effects)", () => {
    const ideal = curves.find((x) => x.className === "m2" && x.level === "ideal")!;
    const full = curves.find((x) => x.className === "m2" && x.level === "full")!;
    const last = full.points.length - 1;
    expect(full.points[last]!.y / full.points[0]!.y).toBeGreaterThan(ideal.points[ideal.points.length - 1]!.y / ideal.points[0]!.y);
  });
  it("skips impossible points instead of failing", () => {
    const far = sweep({
      classes: [testClass()],
      technology: tech,
      settings: baselineSettings("full", tech),
      variable: "s",
      metric: "delay",
      from: 1,
      to: 12,
      points: 12,
      levels: ["full"],
    });
    expect(far[0]!.skipped!.length).toBeGreaterThan(0);
    expect(far[0]!.points.length + far[0]!.skipped!.length).toBe(12);
  });
  it("k sweep: ideal C is proportional to k", () => {
    const k = sweep({
      classes: [testClass()],
      technology: tech,
      settings: baselineSettings("ideal", tech),
      variable: "k",
      metric: "c",
      from: 1,
      to: 4,
      points: 4,
      levels: ["ideal"],
    });
    const p = k[0]!.points;
    expectClose(p[3]!.y / p[0]!.y, 4, 1e-12);
  });
});

// Source: common practice, no source — the textbook reading of ideal scaling: with every cross-section dimension
// and the length divided by S, R per length grows as S², C per length stays, the length falls as 1/S, so the wire's
// RC (and the ideal 0.377·RC delay) stays put; with the length kept, RC grows as S².
describe("sweep lengthMode (S_L follows S, or is fixed at 1)", () => {
  const settings = { ...baselineSettings("ideal", tech), sL: 1.7, overrides: { m2: { sL: 2.5 } } };
  const run = (lengthMode: "follow" | "fixed" | "scenario", metric: "rc" | "delay") =>
    sweep({
      classes: [testClass()],
      technology: tech,
      settings,
      variable: "s",
      metric,
      from: 0.5,
      to: 4,
      points: 15,
      spacing: "log",
      levels: ["ideal"],
      lengthMode,
    })[0]!;
  const atOne = (lengthMode: "follow" | "fixed" | "scenario", metric: "rc" | "delay") =>
    sweep({ classes: [testClass()], technology: tech, settings, variable: "s", metric, from: 1, to: 1, points: 1, levels: ["ideal"], lengthMode })[0]!
      .points[0]!.y;

  it("follow: ideal RC is constant in S and ideal delay relative to S = 1 stays 1", () => {
    const rc = run("follow", "rc");
    expect(rc.points).toHaveLength(15);
    for (const p of rc.points) expectClose(p.y / rc.points[0]!.y, 1, 1e-9);
    const d = run("follow", "delay");
    const d1 = atOne("follow", "delay");
    for (const p of d.points) expectClose(p.y / d1, 1, 1e-9);
  });
  it("fixed: ideal RC relative to S = 1 grows as S² (and ignores the scenario's and the class's S_L)", () => {
    const rc = run("fixed", "rc");
    const rc1 = atOne("fixed", "rc");
    for (const p of rc.points) expectClose(p.y / rc1, p.x * p.x, 1e-9);
  });
  it("scenario (default) keeps the per-class S_L override, so it differs from fixed", () => {
    const fixed = run("fixed", "rc");
    const scen = run("scenario", "rc");
    expectClose(fixed.points[0]!.y / scen.points[0]!.y, 2.5 * 2.5, 1e-9);
  });
});

describe("engine 2: validity along sweeps", () => {
  it("fast-check: every point of every curve carries a flags array, equal to evaluateClass's validity there", async () => {
    const fc = (await import("fast-check")).default;
    const { DEFAULT_TECHNOLOGY: t } = await import("@/lib/scaling/technology");
    const { baselineSettings: bs, evaluateClass: ev } = await import("@/lib/scaling/evaluate");
    const { sweep: sw } = await import("@/lib/scaling/sweep");
    const { testClass: tc } = await import("./fixtures");
    fc.assert(
      fc.property(
        fc.double({ min: 0.5, max: 4, noNaN: true }),
        fc.double({ min: 10, max: 300, noNaN: true }),
        fc.constantFrom("ideal", "fringe", "coupled", "full" as const),
        (s, wNm, level) => {
          const wc = tc({ widthM: wNm * 1e-9, thicknessM: 2 * wNm * 1e-9, spacingM: wNm * 1e-9, barrierM: 1e-9 });
          const curves = sw({
            classes: [wc],
            technology: t,
            settings: bs(level, t),
            variable: "s",
            metric: "delay",
            from: 1,
            to: s,
            points: 4,
            levels: [level],
          });
          for (const c of curves) {
            for (const p of c.points) {
              expect(Array.isArray(p.flags)).toBe(true);
              expect(p.flags).toEqual(ev({ wireClass: wc, technology: t, settings: { ...bs(level, t), s: p.x } }).validity);
            }
          }
        },
      ),
      { numRuns: Number(process.env.PROP_RUNS ?? 100) },
    );
  });
});

describe("sweep idealWithDevices (issue 13 item 6: each curve adds one effect to the previous)", () => {
  const wc = testClass({ viasPerNet: 2 });
  const settings = baselineSettings("full", tech);
  const common = {
    classes: [wc],
    technology: tech,
    settings,
    variable: "s" as const,
    metric: "delay" as const,
    from: 1,
    to: 3,
    points: 5,
    lengthMode: "follow" as const,
  };
  const honest = sweep({ ...common, idealWithDevices: true });
  const bare = sweep(common);

  it("the ideal curve is the exact 50% delay of the ideal line (plate C, bulk ρ) with the class's driver and load and bulk vias (closed form, delay.ts lineDelay)", () => {
    const ideal = honest.find((c) => c.level === "ideal")!;
    for (const p of ideal.points) {
      const s = { ...settings, level: "ideal" as const, s: p.x, sL: p.x, barrierScales: true };
      const r = evaluateClass({ wireClass: wc, technology: tech, settings: s });
      // the via resistance at bulk resistivity is the fringe level's (vias carry no plate or fringe capacitance)
      const viaOhm = evaluateClass({ wireClass: wc, technology: tech, settings: { ...s, level: "fringe" } }).viaOhm;
      expect(viaOhm).toBeGreaterThan(0);
      const d = lineDelay({ rOhm: r.rOhm, cF: r.cF, driverOhm: wc.driverOhm + viaOhm, loadF: wc.loadF });
      expectClose(p.y, d.t50S, 1e-9);
    }
  });

  it("leaves the other levels and the default (bare) ideal curve as they were", () => {
    for (const level of ["fringe", "coupled", "full"] as const)
      expect(honest.find((c) => c.level === level)!.points.map((p) => p.y)).toEqual(bare.find((c) => c.level === level)!.points.map((p) => p.y));
    const bareIdeal = bare.find((c) => c.level === "ideal")!;
    const r = evaluateClass({ wireClass: wc, technology: tech, settings: { ...settings, level: "ideal", barrierScales: true } });
    expectClose(bareIdeal.points[0]!.y, r.delayS, 1e-12);
    // with a driver and a load the ideal line is slower than the bare one, and below the + fringing curve
    const ideal = honest.find((c) => c.level === "ideal")!;
    const fringe = honest.find((c) => c.level === "fringe")!;
    ideal.points.forEach((p, i) => {
      expect(p.y).toBeGreaterThan(bareIdeal.points[i]!.y);
      expect(p.y).toBeLessThan(fringe.points[i]!.y);
    });
  });
});

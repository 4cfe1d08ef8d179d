import { describe, expect, it } from "vitest";
import { DEFAULT_TECHNOLOGY } from "@/lib/scaling/technology";
import { baselineSettings, evaluateClass, evaluateScenario } from "@/lib/scaling/evaluate";
import { lengthFactor, scaleClass } from "@/lib/scaling/scale";
import { sweep } from "@/lib/scaling/sweep";
import type { LengthRule, ScenarioSettings } from "@/lib/scaling/types";
import { checkSettings } from "@/lib/scaling/validity";
import { expectClose } from "./close";
import { testClass } from "./fixtures";

const tech = DEFAULT_TECHNOLOGY;
const wc = testClass({ name: "M2", meanLengthM: 30e-6 });
const other = testClass({ name: "M5", tier: "semi-global", meanLengthM: 200e-6 });
const at = (over: Partial<ScenarioSettings>): ScenarioSettings => ({ ...baselineSettings("full", tech), ...over });

// The four rules are definitions (issue 14, "per-class length rules"): S_L = S, S_L = 1, S_L = a factor, S_L = S^a.
describe("length rules: S_L = rule(S)", () => {
  it("power law S_L = S^a: S = 1.5, a = 0.5 gives S_L = √1.5 = 1.2247… (closed form, from the rule's definition)", () => {
    expectClose(lengthFactor({ kind: "power", exponent: 0.5 }, 1.5), Math.sqrt(1.5), 1e-15);
    expect(lengthFactor({ kind: "power", exponent: 0.5 }, 1.5)).toBeCloseTo(1.224744871, 9);
    // a = 0 is fixed, a = 1 follows S (definition)
    expect(lengthFactor({ kind: "power", exponent: 0 }, 1.5)).toBe(1);
    expect(lengthFactor({ kind: "power", exponent: 1 }, 1.5)).toBe(1.5);
  });
  it("fixed factor, follows-s and fixed (definitions)", () => {
    expect(lengthFactor({ kind: "factor", sL: 1.2 }, 1.5)).toBe(1.2);
    expect(lengthFactor({ kind: "factor", sL: 1.2 }, 3)).toBe(1.2);
    expect(lengthFactor({ kind: "follows-s" }, 1.7)).toBe(1.7);
    expect(lengthFactor({ kind: "fixed" }, 1.7)).toBe(1);
  });
  it("scaleClass divides the mean length by rule(S), globally (definition of S_L: lengths are divided by it)", () => {
    const rules: [LengthRule, number][] = [
      [{ kind: "power", exponent: 0.5 }, Math.sqrt(1.5)],
      [{ kind: "factor", sL: 1.2 }, 1.2],
      [{ kind: "follows-s" }, 1.5],
      [{ kind: "fixed" }, 1],
    ];
    for (const [rule, sL] of rules) {
      const g = scaleClass(wc, at({ s: 1.5, sL: 3, lengthRule: rule }));
      expectClose(g.sL, sL, 1e-15);
      expectClose(g.lengthM, 30e-6 / sL, 1e-15);
      expectClose(g.widthM, 40e-9 / 1.5, 1e-15);
    }
  });
  it("the rule uses the class's own S (a per-class S override)", () => {
    const g = scaleClass(wc, at({ s: 1.5, lengthRule: { kind: "power", exponent: 0.5 }, overrides: { M2: { s: 2 } } }));
    expectClose(g.sL, Math.SQRT2, 1e-15);
  });
  it("precedence: the class's rule wins over its S_L and the scenario's rule; the class's S_L over the scenario's rule (common practice, no source: the contract of issue 14)", () => {
    const st = at({
      s: 1.5,
      sL: 3,
      lengthRule: { kind: "follows-s" },
      overrides: { M2: { sL: 1.1, lengthRule: { kind: "factor", sL: 1.3 } }, M5: { sL: 1.1 } },
    });
    expect(scaleClass(wc, st).sL).toBe(1.3);
    expect(scaleClass(other, st).sL).toBe(1.1);
    // a class without its own: the scenario's rule, not the scenario's sL
    expect(scaleClass(testClass({ name: "M7" }), st).sL).toBe(1.5);
    // without any rule: sL as before
    expect(scaleClass(wc, at({ s: 1.5, sL: 3 })).sL).toBe(3);
  });
  it("an evaluation with a rule equals the same evaluation with the S_L it gives", () => {
    const withRule = evaluateScenario({ classes: [wc, other], technology: tech, settings: at({ s: 1.5, lengthRule: { kind: "power", exponent: 0.5 } }) });
    const plain = evaluateScenario({ classes: [wc, other], technology: tech, settings: at({ s: 1.5, sL: Math.pow(1.5, 0.5) }) });
    expect(withRule.classes).toEqual(plain.classes);
  });
  it("checkSettings: exponent outside 0–2 and factors ≤ 0 are refused, naming the field", () => {
    expect(() => checkSettings(at({ lengthRule: { kind: "power", exponent: 2.5 } }))).toThrow(/lengthRule\.exponent/);
    expect(() => checkSettings(at({ lengthRule: { kind: "power", exponent: -0.1 } }))).toThrow(/lengthRule\.exponent/);
    expect(() => checkSettings(at({ lengthRule: { kind: "factor", sL: 0 } }))).toThrow(/lengthRule\.sL/);
    expect(() => checkSettings(at({ overrides: { M2: { lengthRule: { kind: "power", exponent: 3 } } } }))).toThrow(/overrides\.M2\.lengthRule\.exponent/);
    expect(() => checkSettings(at({ lengthRule: { kind: "square" } as unknown as LengthRule }))).toThrow(/lengthRule\.kind/);
    expect(() => checkSettings(at({ temperatureC: 500 }))).toThrow(/temperatureC/);
  });
});

describe("the sweep honours each class's length rule", () => {
  const xs = [1, 1.5, 2, 3];
  it("S sweep: each point's delay equals an evaluation at S_L = rule(S) (closed form S^a per class)", () => {
    const settings = at({
      lengthRule: { kind: "power", exponent: 0.5 },
      overrides: { M5: { lengthRule: { kind: "fixed" } } },
    });
    const curves = sweep({ classes: [wc, other], technology: tech, settings, variable: "s", metric: "delay", from: 1, to: 3, points: 5, levels: ["full"] });
    for (const c of curves) {
      const rule = c.className === "M5" ? () => 1 : (s: number) => Math.pow(s, 0.5);
      for (const p of c.points.filter((q) => xs.includes(q.x))) {
        const w = c.className === "M5" ? other : wc;
        const r = evaluateClass({ wireClass: w, technology: tech, settings: at({ s: p.x, sL: rule(p.x) }) });
        expectClose(p.y, r.delayS, 1e-12);
      }
    }
  });
  it("S sweep: the class's length follows the rule (R of the line ∝ length: R(S)·S^(−2)/R(1) = S^(−a) at level ideal, bulk resistivity and barrier scaled with S)", () => {
    // at level ideal with bulk resistivity and a barrier that scales, R per length ∝ S² (the cross-section falls as 1/S²,
    // textbook scaling laws, e.g. Bakoglu, Circuits, Interconnections and Packaging for VLSI, 1990, ch. 5) and
    // R = R' · L with L = L0 / S_L, so R(S)/R(1) = S² / S^a
    const a = 0.7;
    const [c] = sweep({
      classes: [wc],
      technology: tech,
      settings: at({ level: "ideal", barrierScales: true, lengthRule: { kind: "power", exponent: a } }),
      variable: "s",
      metric: "r",
      from: 1,
      to: 3,
      points: 5,
      levels: ["ideal"],
    });
    const r1 = c!.points[0]!.y;
    for (const p of c!.points) expectClose(p.y / r1, (p.x * p.x) / Math.pow(p.x, a), 1e-9);
  });
  it("lengthMode follow and fixed replace the rules; an S_L sweep replaces them with the swept value", () => {
    const settings = at({ lengthRule: { kind: "factor", sL: 1.4 }, overrides: { M2: { lengthRule: { kind: "power", exponent: 2 } } } });
    const follow = sweep({
      classes: [wc],
      technology: tech,
      settings,
      variable: "s",
      metric: "r",
      from: 1,
      to: 2,
      points: 3,
      levels: ["full"],
      lengthMode: "follow",
    });
    const fixed = sweep({
      classes: [wc],
      technology: tech,
      settings,
      variable: "s",
      metric: "r",
      from: 1,
      to: 2,
      points: 3,
      levels: ["full"],
      lengthMode: "fixed",
    });
    for (let i = 0; i < 3; i++) {
      const s = follow[0]!.points[i]!.x;
      expectClose(follow[0]!.points[i]!.y, evaluateClass({ wireClass: wc, technology: tech, settings: at({ s, sL: s }) }).rOhm, 1e-12);
      expectClose(fixed[0]!.points[i]!.y, evaluateClass({ wireClass: wc, technology: tech, settings: at({ s, sL: 1 }) }).rOhm, 1e-12);
    }
    const sl = sweep({
      classes: [wc],
      technology: tech,
      settings: { ...settings, s: 1.5 },
      variable: "sL",
      metric: "r",
      from: 1,
      to: 2,
      points: 3,
      levels: ["full"],
    });
    for (const p of sl[0]!.points) expectClose(p.y, evaluateClass({ wireClass: wc, technology: tech, settings: at({ s: 1.5, sL: p.x }) }).rOhm, 1e-12);
  });
});

describe("scenario temperature", () => {
  it("temperatureC of the scenario replaces the technology's for the scenario, the baseline keeps the technology's", () => {
    const ev = evaluateScenario({ classes: [wc], technology: { ...tech, temperatureC: 25 }, settings: at({ temperatureC: 105 }) });
    expect(ev.classes[0]!.scenario.temperatureC).toBe(105);
    expect(ev.classes[0]!.baseline.temperatureC).toBe(25);
    // the scenario's class equals the class evaluated with the technology at that temperature (definition)
    const hot = evaluateScenario({ classes: [wc], technology: { ...tech, temperatureC: 105 }, settings: at({}) });
    expect(ev.classes[0]!.scenario).toEqual(hot.classes[0]!.scenario);
    // and R rises with T (ρ(T) = ρ20·(1 + α(T − 20)), Cu α ≈ 0.0039/K, CRC Handbook; from memory)
    expect(ev.classes[0]!.ratio.rOhm).toBeGreaterThan(1.05);
  });
});

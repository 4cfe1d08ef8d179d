import { describe, expect, it } from "vitest";
import { DEFAULT_TECHNOLOGY } from "@/lib/scaling/technology";
import { baselineSettings, evaluateScenario } from "@/lib/scaling/evaluate";
import { composeRoadmap, evaluateRoadmap, MAX_ROADMAP_STEPS, RoadmapInputError, type RoadmapStep } from "@/lib/scaling/roadmap";
import type { ScenarioSettings, WireClass } from "@/lib/scaling/types";
import { expectClose } from "./close";
import { testClass } from "./fixtures";

// Composition rules are the contract of issue 14 (scaling/README.md, "Roadmaps"): common practice, no source beyond
// the definitions (S and S_L divide sizes and lengths, so successive shrinks multiply).
const technology = DEFAULT_TECHNOLOGY;
const m1 = testClass({
  name: "M1",
  tier: "local",
  widthM: 24e-9,
  thicknessM: 48e-9,
  spacingM: 24e-9,
  ildBelowM: 30e-9,
  ildAboveM: 30e-9,
  barrierM: 2e-9,
  meanLengthM: 4e-6,
});
const m2 = testClass({ name: "M2", tier: "intermediate", meanLengthM: 25e-6 });
const m5 = testClass({
  name: "M5",
  tier: "semi-global",
  widthM: 80e-9,
  thicknessM: 160e-9,
  spacingM: 80e-9,
  ildBelowM: 100e-9,
  barrierM: 3e-9,
  meanLengthM: 150e-6,
});
const classes: WireClass[] = [m1, m2, m5];
const roadmap = (steps: RoadmapStep[]) => ({ classes, technology, steps });
const defaults = (over: Partial<ScenarioSettings> = {}): ScenarioSettings => ({ ...baselineSettings("full", technology), ...over });

describe("composeRoadmap", () => {
  it("S over two steps multiplies: 1.25 × 1.2 = 1.5, and the evaluation equals a plain scenario with S = 1.5", () => {
    const steps: RoadmapStep[] = [
      { name: "N1", settings: { s: 1.25 } },
      { name: "N2", settings: { s: 1.2 } },
    ];
    const abs = composeRoadmap(roadmap(steps));
    expect(abs).toHaveLength(2);
    expectClose(abs[1]!.s, 1.5, 1e-15);
    for (const c of classes) {
      expectClose(abs[0]!.overrides[c.name]!.s!, 1.25, 1e-15);
      expectClose(abs[1]!.overrides[c.name]!.s!, 1.5, 1e-15);
      // no length rule anywhere: fixed, S_L = 1
      expect(abs[1]!.overrides[c.name]!.sL).toBe(1);
    }
    const r = evaluateRoadmap(roadmap(steps));
    expect(r.steps.map((s) => s.name)).toEqual(["N1", "N2"]);
    const plain = evaluateScenario({ classes, technology, settings: defaults({ s: 1.5 }) });
    for (let i = 0; i < classes.length; i++) {
      const a = r.steps[1]!.evaluation.classes[i]!;
      const b = plain.classes[i]!;
      expect(a.baseline).toEqual(b.baseline);
      expectClose(a.scenario.delayS, b.scenario.delayS, 1e-12);
      expectClose(a.scenario.rOhm, b.scenario.rOhm, 1e-12);
      expectClose(a.scenario.cF, b.scenario.cF, 1e-12);
      expectClose(a.ratio.delayS, b.ratio.delayS, 1e-12);
    }
  });
  it("a per-class override in step 2 leaves the other classes alone", () => {
    const base: RoadmapStep[] = [
      { name: "N1", settings: { s: 1.4 } },
      { name: "N2", settings: { s: 1.3 } },
    ];
    const withOverride: RoadmapStep[] = [base[0]!, { name: "N2", settings: { s: 1.3, overrides: { M2: { s: 1.1, metal: "Ru", barrierM: 0 } } } }];
    const a = composeRoadmap(roadmap(base))[1]!;
    const b = composeRoadmap(roadmap(withOverride))[1]!;
    expect(b.overrides.M1).toEqual(a.overrides.M1);
    expect(b.overrides.M5).toEqual(a.overrides.M5);
    expectClose(b.overrides.M2!.s!, 1.4 * 1.1, 1e-15);
    expect(b.overrides.M2!.metal).toBe("Ru");
    const ea = evaluateRoadmap(roadmap(base)).steps[1]!.evaluation;
    const eb = evaluateRoadmap(roadmap(withOverride)).steps[1]!.evaluation;
    expect(eb.classes[0]).toEqual(ea.classes[0]);
    expect(eb.classes[2]).toEqual(ea.classes[2]);
    expect(eb.classes[1]!.scenario.metal).toBe("Ru");
  });
  it("targetPitchM derives S per class from the previous step's pitch (S = previous pitch / target)", () => {
    // M2 pitch at N0: 40 + 40 = 80 nm; N1 S = 1.25 → 64 nm; N2 target 48 nm → S_2 = 64/48, absolute 80/48
    const abs = composeRoadmap(
      roadmap([
        { name: "N1", settings: { s: 1.25 } },
        { name: "N2", settings: { s: 1.1, overrides: { M2: { targetPitchM: 48e-9 } } } },
      ]),
    );
    expectClose(abs[1]!.overrides.M2!.s!, 80 / 48, 1e-14);
    expectClose(abs[1]!.overrides.M1!.s!, 1.25 * 1.1, 1e-15);
    const ev = evaluateRoadmap(
      roadmap([
        { name: "N1", settings: { s: 1.25 } },
        { name: "N2", settings: { s: 1.1, overrides: { M2: { targetPitchM: 48e-9 } } } },
      ]),
    );
    expectClose(ev.steps[1]!.evaluation.classes[1]!.scenario.pitchM, 48e-9, 1e-12);
  });
  it("length rules compose: S_L is the product of rule(S) over the steps; a rule is carried to the next step", () => {
    const abs = composeRoadmap(
      roadmap([
        { name: "N1", settings: { s: 1.5, lengthRule: { kind: "power", exponent: 0.5 }, overrides: { M5: { lengthRule: { kind: "fixed" } } } } },
        { name: "N2", settings: { s: 1.2, overrides: { M1: { lengthRule: { kind: "follows-s" } } } } },
      ]),
    );
    // N1: S_L = 1.5^0.5 = 1.2247… (closed form); M5 fixed
    expectClose(abs[0]!.overrides.M2!.sL!, Math.sqrt(1.5), 1e-15);
    expect(abs[0]!.overrides.M5!.sL).toBe(1);
    // N2: the power rule carried (M2), the fixed rule carried (M5), M1 follows S
    expectClose(abs[1]!.overrides.M2!.sL!, Math.sqrt(1.5) * Math.sqrt(1.2), 1e-15);
    expect(abs[1]!.overrides.M5!.sL).toBe(1);
    expectClose(abs[1]!.overrides.M1!.sL!, Math.sqrt(1.5) * 1.2, 1e-15);
    // a step's sL is a fixed factor for that step
    const f = composeRoadmap(roadmap([{ name: "N1", settings: { s: 2, sL: 1.3 } }]));
    expect(f[0]!.overrides.M2!.sL).toBe(1.3);
    // the output carries explicit s/sL per class and no rule (a rule would win over them)
    expect(abs[1]!.lengthRule).toBeUndefined();
    for (const o of Object.values(abs[1]!.overrides)) expect(o.lengthRule).toBeUndefined();
  });
  it("device factors multiply; metal, k, air gap, temperature and level carry forward", () => {
    const abs = composeRoadmap(
      roadmap([
        { name: "N1", settings: { s: 1.2, deviceRFactor: 0.9, deviceCFactor: 0.8, metal: "Ru", k: 2.5, temperatureC: 85 } },
        { name: "N2", settings: { s: 1.2, deviceRFactor: 0.9, airGap: { kGap: 1, gapFraction: 0.5 }, overrides: { M5: { metal: "Cu" } } } },
        { name: "N3", settings: { s: 1.1, level: "coupled" } },
      ]),
    );
    expectClose(abs[1]!.deviceRFactor, 0.81, 1e-15);
    expectClose(abs[2]!.deviceRFactor, 0.81, 1e-15);
    expect(abs[2]!.deviceCFactor).toBe(0.8);
    expect(abs[2]!.metal).toBe("Ru");
    expect(abs[2]!.k).toBe(2.5);
    expect(abs[2]!.temperatureC).toBe(85);
    expect(abs[2]!.airGap).toEqual({ kGap: 1, gapFraction: 0.5 });
    expect(abs[0]!.airGap).toBeUndefined();
    expect(abs[2]!.overrides.M5!.metal).toBe("Cu");
    expect(abs[2]!.level).toBe("coupled");
    expect(abs[1]!.level).toBe("full");
    expectClose(abs[2]!.s, 1.2 * 1.2 * 1.1, 1e-15);
    // defaults before any step sets them: the technology's supply, Miller 1, barrier kept
    expect(abs[0]!.supplyV).toBe(technology.supplyV);
    expect(abs[0]!.miller).toBe(1);
    expect(abs[0]!.barrierScales).toBe(false);
  });
});

describe("bad roadmaps throw RoadmapInputError naming the step and field", () => {
  const bad = (steps: RoadmapStep[]): RoadmapInputError => {
    try {
      composeRoadmap(roadmap(steps));
    } catch (e) {
      expect(e).toBeInstanceOf(RoadmapInputError);
      return e as RoadmapInputError;
    }
    throw new Error("expected a RoadmapInputError");
  };
  const ok = { name: "N1", settings: { s: 1.2 } };
  it("no steps, more than 8", () => {
    expect(bad([]).path).toEqual(["steps"]);
    const nine = Array.from({ length: MAX_ROADMAP_STEPS + 1 }, (_, i) => ({ name: `N${i + 1}`, settings: {} }));
    const e = bad(nine);
    expect(e.path).toEqual(["steps"]);
    expect(e.message).toMatch(/at most 8/);
    expect(composeRoadmap(roadmap(nine.slice(0, 8)))).toHaveLength(8);
  });
  it("a class not in the baseline", () => {
    const e = bad([ok, { name: "N2", settings: { overrides: { M9: { s: 1.1 } } } }]);
    expect(e.path).toEqual(["steps", 1, "settings", "overrides", "M9"]);
    expect(e.message).toMatch(/^step 2 "N2": class "M9" is not in the baseline/);
  });
  it("targetPitchM with s", () => {
    const e = bad([{ name: "N1", settings: { overrides: { M2: { s: 1.2, targetPitchM: 60e-9 } } } }]);
    expect(e.path).toEqual(["steps", 0, "settings", "overrides", "M2", "targetPitchM"]);
    expect(e.message).toMatch(/step 1 "N1"/);
  });
  it("a target pitch ≤ 2 × the barrier (no metal left)", () => {
    // M1 barrier 2 nm kept (level full, barrier kept): 4 nm is not more than 2 × 2 nm; 4.1 nm is
    const e = bad([ok, { name: "N2", settings: { overrides: { M1: { targetPitchM: 4e-9 } } } }]);
    expect(e.path).toEqual(["steps", 1, "settings", "overrides", "M1", "targetPitchM"]);
    expect(e.message).toMatch(/barrier/);
    expect(() => composeRoadmap(roadmap([ok, { name: "N2", settings: { overrides: { M1: { targetPitchM: 4.1e-9 } } } }]))).not.toThrow();
    // with an absolute barrier of the step, that one counts
    expect(bad([{ name: "N1", settings: { overrides: { M5: { barrierM: 10e-9, targetPitchM: 19e-9 } } } }]).path).toEqual([
      "steps",
      0,
      "settings",
      "overrides",
      "M5",
      "targetPitchM",
    ]);
  });
  it("a length-rule exponent outside 0–2, globally and per class", () => {
    expect(bad([ok, { name: "N2", settings: { lengthRule: { kind: "power", exponent: 2.1 } } }]).path).toEqual(["steps", 1, "settings", "lengthRule"]);
    const e = bad([{ name: "N1", settings: { overrides: { M2: { lengthRule: { kind: "power", exponent: -1 } } } } }]);
    expect(e.path).toEqual(["steps", 0, "settings", "overrides", "M2", "lengthRule"]);
    expect(e.message).toMatch(/exponent/);
  });
  it("non-positive factors", () => {
    expect(bad([{ name: "N1", settings: { s: 0 } }]).path).toEqual(["steps", 0, "settings", "s"]);
    expect(bad([ok, { name: "N2", settings: { sL: -1 } }]).path).toEqual(["steps", 1, "settings", "sL"]);
    expect(bad([ok, { name: "N2", settings: { deviceRFactor: 0 } }]).path).toEqual(["steps", 1, "settings", "deviceRFactor"]);
    expect(bad([ok, { name: "N2", settings: { deviceCFactor: Number.NaN } }]).path).toEqual(["steps", 1, "settings", "deviceCFactor"]);
    expect(bad([{ name: "N1", settings: { overrides: { M5: { s: -2 } } } }]).path).toEqual(["steps", 0, "settings", "overrides", "M5", "s"]);
    expect(bad([{ name: "N1", settings: { overrides: { M5: { targetPitchM: 0 } } } }]).path).toEqual([
      "steps",
      0,
      "settings",
      "overrides",
      "M5",
      "targetPitchM",
    ]);
    expect(bad([{ name: "N1", settings: { lengthRule: { kind: "factor", sL: 0 } } }]).path).toEqual(["steps", 0, "settings", "lengthRule"]);
  });
  it("other values out of range, and a step without a name", () => {
    expect(bad([{ name: "N1", settings: { miller: 3 } }]).path).toEqual(["steps", 0, "settings", "miller"]);
    expect(bad([{ name: "N1", settings: { metal: "Unobtainium" } }]).path).toEqual(["steps", 0, "settings", "metal"]);
    expect(bad([{ name: "N1", settings: { temperatureC: 900 } }]).path).toEqual(["steps", 0, "settings", "temperatureC"]);
    expect(bad([{ name: "", settings: {} }]).path).toEqual(["steps", 0, "name"]);
  });
  it("evaluateRoadmap: a step whose geometry is impossible names the step", () => {
    // a kept 3 nm barrier of M5 in a line of 80/30 nm width is fine; at S = 20 (4 nm width) the barrier fills it
    try {
      evaluateRoadmap(roadmap([ok, { name: "N2", settings: { s: 20 } }]));
      expect.fail("expected a RoadmapInputError");
    } catch (e) {
      expect(e).toBeInstanceOf(RoadmapInputError);
      expect((e as RoadmapInputError).path).toEqual(["steps", 1, "settings"]);
      expect((e as RoadmapInputError).message).toMatch(/^step 2 "N2": /);
    }
  });
});

import { readFileSync } from "node:fs";
import { describe, expect, it } from "vitest";
import { DEFAULT_TECHNOLOGY } from "@/lib/scaling/technology";
import { baselineSettings, evaluateClass, evaluateScenario } from "@/lib/scaling/evaluate";
import { lineDelay } from "@/lib/scaling/delay";
import { energyPerTransitionJ, switchingPowerW } from "@/lib/scaling/energy";
import { sFromTargetPitch } from "@/lib/scaling/scale";
import { MODEL_LEVELS, type ScenarioSettings } from "@/lib/scaling/types";
import { parseWireClassCsv } from "@/lib/import/wire-classes";
import { expectClose } from "./close";
import { testClass } from "./fixtures";

const tech = DEFAULT_TECHNOLOGY;
const at = (level: ScenarioSettings["level"], over: Partial<ScenarioSettings> = {}): ScenarioSettings => ({ ...baselineSettings(level, tech), ...over });

// Scaling laws (docs/models.md, "Scaling laws to test against", common practice, no source): with cross-section ÷ S and
// length ÷ S_L, parallel-plate C ∝ 1/S_L, bulk R ∝ S²/S_L, RC ∝ S²/S_L².
describe("evaluateClass at level ideal: textbook scaling laws", () => {
  const wc = testClass();
  const b = evaluateClass({ wireClass: wc, technology: tech, settings: at("ideal") });
  it.each([
    [1.4, 1],
    [2, 2],
    [1.7, 1.3],
    [3, 0.5],
  ])("S = %d, S_L = %d", (s, sL) => {
    const r = evaluateClass({ wireClass: wc, technology: tech, settings: at("ideal", { s, sL }) });
    expectClose(r.cF / b.cF, 1 / sL, 1e-12);
    expectClose(r.rOhm / b.rOhm, (s * s) / sL, 1e-12);
    expectClose(r.rcS / b.rcS, (s * s) / (sL * sL), 1e-12);
    expectClose(r.delayS / b.delayS, (s * s) / (sL * sL), 1e-12);
  });
  it("ideal delay is the exact open-line 0.3787·RC with no driver or load (series solution, delay.test.ts), Sakurai's 0.377·RC when chosen", () => {
    expectClose(b.delayS, 0.37875 * b.rcS, 2e-4);
    const sk = evaluateClass({ wireClass: wc, technology: { ...tech, delayModel: "sakurai" }, settings: at("ideal") });
    expectClose(sk.delayS, 0.377 * sk.rcS, 1e-12);
    expect(sk.accuracy.delay).toMatch(/^sakurai:/);
    expect(b.accuracy.delay).toMatch(/^exact:/);
  });
  it("k 3.9 → 1.0 divides C by 3.9 (common practice, no source)", () => {
    const a = evaluateClass({ wireClass: testClass({ k: 3.9 }), technology: tech, settings: at("ideal") });
    const c = evaluateClass({ wireClass: testClass({ k: 3.9 }), technology: tech, settings: at("ideal", { k: 1 }) });
    expectClose(a.cF / c.cF, 3.9, 1e-12);
  });
});

describe("evaluateClass at realistic levels", () => {
  const wc = testClass();
  it("a non-scaling barrier and size effects make R grow faster than S² (docs/models.md, barrier and size effects)", () => {
    const b = evaluateClass({ wireClass: wc, technology: tech, settings: at("full") });
    const r = evaluateClass({ wireClass: wc, technology: tech, settings: at("full", { s: 1.5 }) });
    expect(r.rOhm / b.rOhm).toBeGreaterThan(2.25);
    expect(r.barrierM).toBe(wc.barrierM);
  });
  it("overrides: barrierM 0 and Ru metal, aspect ratio, per-class k and S", () => {
    const r = evaluateClass({
      wireClass: wc,
      technology: tech,
      settings: at("full", { s: 1.4, overrides: { m2: { metal: "Ru", barrierM: 0, aspectRatio: 2.5, k: 1.9, s: 2 } } }),
    });
    expect(r.metal).toBe("Ru");
    expect(r.barrierM).toBe(0);
    expectClose(r.widthM, 20e-9, 1e-12);
    expectClose(r.thicknessM, 50e-9, 1e-12);
    expect(r.k).toBe(1.9);
  });
  it("device factors scale the driver and load", () => {
    const r = evaluateClass({ wireClass: wc, technology: tech, settings: at("coupled", { deviceRFactor: 0.5, deviceCFactor: 0.8 }) });
    expect(r.driverOhm).toBe(1500);
    expectClose(r.loadF, 0.8e-15, 1e-12);
  });
  it("energy and power follow the module convention", () => {
    const r = evaluateClass({ wireClass: wc, technology: tech, settings: at("coupled") });
    expectClose(r.energyJ, (r.cF + r.loadF) * tech.supplyV ** 2, 1e-12);
    expectClose(r.powerW, 0.5 * wc.activity * tech.clockHz * wc.netCount * r.energyJ, 1e-9);
  });
  it("plumbing: evaluateClass takes its delays from lineDelay and its energy from energyPerTransitionJ, bit for bit", () => {
    for (const level of MODEL_LEVELS) {
      const r = evaluateClass({ wireClass: wc, technology: tech, settings: at(level, { s: 1.3, supplyV: 0.7 }) });
      const d = lineDelay({ rOhm: r.rOhm, cF: r.cF, driverOhm: r.driverOhm, loadF: r.loadF });
      expect(r.delayS).toBe(d.t50S);
      expect(r.elmoreS).toBe(d.elmoreS);
      expect(r.intrinsicDelayS).toBe(d.intrinsicS);
      // repeaters' input + output capacitance: k·h·C0·(1 + γ)·V², γ = 0.5 by default (common practice, no source)
      expectClose(r.repeaterEnergyJ, r.repeaterCount * r.repeaterSize * tech.repeaterC0F * 1.5 * 0.7 ** 2, 1e-12);
      expect(r.energyJ).toBe(energyPerTransitionJ({ cF: r.cF, loadF: r.loadF, supplyV: 0.7 }) + r.repeaterEnergyJ);
      expectClose(r.powerW, switchingPowerW({ energyJ: r.energyJ, activity: wc.activity, clockHz: tech.clockHz, netCount: wc.netCount }), 1e-12);
    }
  });
  it("a barrier that fills the scaled line is a RangeError", () => {
    expect(() => evaluateClass({ wireClass: wc, technology: tech, settings: at("full", { s: 10 }) })).toThrow(RangeError);
  });
  it("rejects bad classes with the field named", () => {
    expect(() => evaluateClass({ wireClass: testClass({ widthM: -1 }), technology: tech, settings: at("full") })).toThrow("m2.widthM must be > 0 (got -1)");
    expect(() => evaluateClass({ wireClass: testClass({ k: 0.9 }), technology: tech, settings: at("full") })).toThrow(/k must be >= 1/);
  });
  it("sFromTargetPitch = (W + S)/target", () => {
    expectClose(sFromTargetPitch({ wireClass: wc, targetPitchM: 56e-9 }), 80 / 56, 1e-12);
  });
});

describe("evaluateScenario on the Skua demo", () => {
  const { classes } = parseWireClassCsv(readFileSync("scaling/examples/skua-baseline.csv"));
  const scenarios = JSON.parse(readFileSync("scaling/examples/skua-scenarios.json", "utf8")) as { name: string; settings: ScenarioSettings }[];
  const techJ = DEFAULT_TECHNOLOGY;
  it("all three demo scenarios evaluate with finite results and ratios", () => {
    expect(scenarios).toHaveLength(3);
    for (const sc of scenarios) {
      const ev = evaluateScenario({ classes, technology: techJ, settings: sc.settings });
      expect(ev.classes).toHaveLength(4);
      for (const c of ev.classes) for (const v of Object.values(c.ratio)) expect(Number.isFinite(v)).toBe(true);
    }
  });
  it("air gaps lower the intermediate C; barrier-free Ru lowers the local R against Cu with a fixed barrier", () => {
    const [plain, air, ru] = scenarios.map((sc) => evaluateScenario({ classes, technology: techJ, settings: sc.settings }));
    const get = (ev: typeof plain, n: string) => ev!.classes.find((c) => c.name === n)!.scenario;
    expect(get(air, "intermediate").cF).toBeLessThan(get(plain, "intermediate").cF);
    expect(get(ru, "local").rOhm).toBeLessThan(get(plain, "local").rOhm);
    expect(get(ru, "global").rOhm).toBe(get(plain, "global").rOhm);
  });
  it("baseline uses the scenario's level and Miller factor", () => {
    const ev = evaluateScenario({ classes, technology: techJ, settings: at("coupled", { s: 1.4, miller: 2 }) });
    const b = ev.classes[0]!.baseline;
    expect(b.capacitance.model).toBe("accurate");
    expectClose(b.capacitance.couplingMillerFPerM, 4 * b.capacitance.couplingEachFPerM, 1e-12);
  });
});

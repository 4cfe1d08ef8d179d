import { describe, expect, it } from "vitest";
import { baselineSettings, DEFAULT_TECHNOLOGY, evaluateClass, evaluateScenario, fieldSolve, lineCapacitance, type ScenarioSettings } from "@/lib/scaling";
import { testClass } from "./fixtures";

// Air gaps as geometry (issue 11): the gap between the lines (kGap up to gapFraction·T) changes the coupling much more
// than the ground, so the engine computes the two separately (the accurate tables, lib/scaling/cap-accurate.ts) and the
// Miller factor acts on the coupling part only. Reference: our own layered field solver (lib/scaling/field-solve.ts,
// checked against exact layered plates in tests/scaling/field-solve-layered.test.ts).
const tech = DEFAULT_TECHNOLOGY;
const two = testClass({ ildAboveM: 50e-9 });
const coupled = (over: Partial<ScenarioSettings> = {}): ScenarioSettings => ({ ...baselineSettings("coupled", tech), ...over });

describe("air gaps in the evaluation", () => {
  it("a class without a gap takes the accurate tables by default, and the published forms when the technology chooses them", () => {
    const acc = evaluateClass({ wireClass: two, technology: tech, settings: coupled() });
    expect(acc.capacitance.model).toBe("accurate");
    const tables = lineCapacitance({
      widthM: 40e-9,
      thicknessM: 80e-9,
      spacingM: 40e-9,
      heightBelowM: 50e-9,
      heightAboveM: 50e-9,
      k: 2.7,
      miller: 1,
      model: "accurate",
    });
    expect(acc.capacitance.couplingEachFPerM).toBe(tables.couplingEachFPerM);
    expect(acc.cFPerM).toBe(tables.totalFPerM);
    // without a gap the effective k is the class's k at every Miller factor
    expect(acc.capacitance.effectiveK).toEqual({ miller0: 2.7, miller1: 2.7, miller2: 2.7 });
    const r = evaluateClass({ wireClass: two, technology: { ...tech, capacitanceModel: "published" }, settings: coupled() });
    const ref = lineCapacitance({
      widthM: 40e-9,
      thicknessM: 80e-9,
      spacingM: 40e-9,
      heightBelowM: 50e-9,
      heightAboveM: 50e-9,
      k: 2.7,
      miller: 1,
      model: "coupled",
    });
    expect(r.capacitance.model).toBe("coupled");
    expect(r.capacitance.couplingEachFPerM).toBe(ref.couplingEachFPerM);
    expect(r.cFPerM).toBe(ref.totalFPerM);
  });

  it("a class with an air gap takes the accurate tables, within 1% of the layered field solve for ground and total", () => {
    const gapped = { ...two, kGap: 1, gapFraction: 0.6 };
    const r = evaluateClass({ wireClass: gapped, technology: tech, settings: coupled() });
    expect(r.capacitance.model).toBe("accurate");
    const acc = lineCapacitance({
      widthM: 40e-9,
      thicknessM: 80e-9,
      spacingM: 40e-9,
      heightBelowM: 50e-9,
      heightAboveM: 50e-9,
      k: 2.7,
      kGap: 1,
      gapFraction: 0.6,
      miller: 1,
      model: "accurate",
    });
    expect(r.capacitance.couplingEachFPerM).toBe(acc.couplingEachFPerM);
    const f = fieldSolve({ widthM: 40e-9, thicknessM: 80e-9, spacingM: 40e-9, heightBelowM: 50e-9, heightAboveM: 50e-9, k: 2.7, kGap: 1, gapFraction: 0.6 });
    const ground = r.capacitance.areaFPerM + r.capacitance.fringeFPerM;
    expect(Math.abs(ground / f.groundFPerM - 1)).toBeLessThan(0.01);
    expect(Math.abs(r.cFPerM / f.totalFPerM - 1)).toBeLessThan(0.01);
  });

  it("the Miller factor acts on the coupling part only, and the gap takes more off the coupling than off the ground", () => {
    const gapped = { ...two, kGap: 1, gapFraction: 1 };
    const at = (miller: number, wc = gapped) => evaluateClass({ wireClass: wc, technology: tech, settings: coupled({ miller }) }).capacitance;
    const m0 = at(0);
    const m2 = at(2);
    expect(m2.totalFPerM - m0.totalFPerM).toBeCloseTo(4 * m0.couplingEachFPerM, 22);
    // homogeneous reference from the same tables (kGap = k)
    const h = lineCapacitance({
      widthM: 40e-9,
      thicknessM: 80e-9,
      spacingM: 40e-9,
      heightBelowM: 50e-9,
      heightAboveM: 50e-9,
      k: 2.7,
      miller: 1,
      model: "accurate",
    });
    const groundRatio = (m0.areaFPerM + m0.fringeFPerM) / (h.areaFPerM + h.fringeFPerM);
    const couplingRatio = m0.couplingEachFPerM / h.couplingEachFPerM;
    expect(couplingRatio).toBeLessThan(0.75);
    expect(groundRatio).toBeGreaterThan(0.9);
    // the derived effective k: k × C / C(homogeneous) at each Miller factor, falling as the coupling weighs more
    const hg = h.areaFPerM + h.fringeFPerM;
    const eff = m0.effectiveK;
    expect(eff.miller0).toBeCloseTo(2.7 * groundRatio, 12);
    expect(eff.miller2).toBeCloseTo((2.7 * (m0.areaFPerM + m0.fringeFPerM + 4 * m0.couplingEachFPerM)) / (hg + 4 * h.couplingEachFPerM), 12);
    expect(eff.miller0).toBeGreaterThan(eff.miller1);
    expect(eff.miller1).toBeGreaterThan(eff.miller2);
    expect(eff.miller2).toBeGreaterThan(1);
  });

  it("the scenario's air gap applies to every class; a class override null removes it; kGap is held at the class's k", () => {
    const a = { ...two, name: "a" };
    const b = { ...two, name: "b" };
    const s = coupled({ airGap: { kGap: 1, gapFraction: 1 }, overrides: { b: { airGap: null } } });
    const ev = evaluateScenario({ classes: [a, b], technology: { ...tech, capacitanceModel: "published" }, settings: s });
    // a gapped class takes the tables even when the technology chooses the published forms (they have no gap layer)
    expect(ev.classes[0]!.scenario.capacitance.model).toBe("accurate");
    expect(ev.classes[1]!.scenario.capacitance.model).toBe("coupled");
    expect(ev.classes[0]!.scenario.cFPerM).toBeLessThan(ev.classes[1]!.scenario.cFPerM);
    // a scenario k of 1 (air everywhere) leaves no gap to speak of: kGap is held at k = 1, the published forms apply
    const air = evaluateScenario({
      classes: [a],
      technology: { ...tech, capacitanceModel: "published" },
      settings: coupled({ k: 1, airGap: { kGap: 1, gapFraction: 1 } }),
    });
    expect(air.classes[0]!.scenario.capacitance.model).toBe("coupled");
  });

  it("a gap given by its fraction alone is air, in lineCapacitance as in a wire class (kGap 1)", () => {
    const geo = { widthM: 40e-9, thicknessM: 80e-9, spacingM: 40e-9, heightBelowM: 50e-9, heightAboveM: 50e-9, k: 2.7, miller: 1, model: "accurate" as const };
    expect(lineCapacitance({ ...geo, gapFraction: 0.5 }).totalFPerM).toBe(lineCapacitance({ ...geo, kGap: 1, gapFraction: 0.5 }).totalFPerM);
    const viaClass = evaluateClass({ wireClass: { ...two, gapFraction: 0.5 }, technology: tech, settings: coupled() });
    expect(viaClass.airGap).toEqual({ kGap: 1, gapFraction: 0.5 });
    expect(viaClass.cFPerM).toBe(lineCapacitance({ ...geo, gapFraction: 0.5 }).totalFPerM);
  });

  it("bad air gaps are RangeErrors naming the field", () => {
    expect(() => evaluateScenario({ classes: [two], technology: tech, settings: coupled({ airGap: { kGap: 0.5, gapFraction: 1 } }) })).toThrow(/^airGap\.kGap/);
    expect(() => evaluateScenario({ classes: [two], technology: tech, settings: coupled({ airGap: { kGap: 1, gapFraction: 1.5 } }) })).toThrow(
      /^airGap\.gapFraction/,
    );
    expect(() => evaluateScenario({ classes: [{ ...two, kGap: 3 }], technology: tech, settings: coupled() })).toThrow(/kGap must be >= 1 and <= the class's k/);
  });
});

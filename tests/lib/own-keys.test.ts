import { describe, expect, it } from "vitest";
import {
  DEFAULT_TECHNOLOGY,
  DIELECTRICS,
  evaluateScenario,
  getDielectric,
  getMetal,
  isMetalId,
  METALS,
  parseQuantity,
  sweep,
  type ScenarioSettings,
  type WireClass,
} from "@/lib/scaling";
import { materialSources } from "@/lib/reports/models";
import { technologySchema } from "@/lib/validation/baseline";
import { scenarioSettingsSchema } from "@/lib/validation/scenario";
import { metalIdSchema, wireClassSchema } from "@/lib/validation/wire-class";

// Issue 12 finding 5: every keyed table is looked up by its own entries only. OWASP ASVS 4.0.3 5.1.3 (positive
// validation against an allow list) — an inherited Object.prototype member is not on the list.
const PROTOTYPE_NAMES = [...Object.getOwnPropertyNames(Object.prototype), "prototype"];

const cls: WireClass = {
  name: "M1",
  tier: "local",
  widthM: 2e-8,
  thicknessM: 4e-8,
  spacingM: 2e-8,
  ildBelowM: 3e-8,
  ildAboveM: null,
  barrierM: 2e-9,
  metal: "Cu",
  k: 2.7,
  netCount: 10,
  meanLengthM: 5e-6,
  driverOhm: 8000,
  loadF: 4e-16,
  activity: 0.1,
};
const settings: ScenarioSettings = {
  s: 0.7,
  sL: 1,
  level: "full",
  barrierScales: false,
  miller: 1,
  deviceRFactor: 1,
  deviceCFactor: 1,
  supplyV: 0.75,
  k: null,
  metal: null,
  overrides: {},
};

describe("catalogues: own entries only (issue 12 finding 5)", () => {
  it("the prototype names include the reported ones", () => {
    expect(PROTOTYPE_NAMES).toEqual(expect.arrayContaining(["constructor", "__proto__", "toString", "hasOwnProperty", "valueOf"]));
  });

  it.each(PROTOTYPE_NAMES)("metals: %s is not a metal (getMetal, isMetalId, metalIdSchema, a class's metal)", (name) => {
    if (name !== "prototype") expect(name in METALS).toBe(true); // the trap: `in` finds it…
    expect(isMetalId(name)).toBe(false); // …the own check does not
    expect(() => getMetal(name)).toThrow(RangeError);
    expect(metalIdSchema.safeParse(name).success).toBe(false);
    const r = wireClassSchema.safeParse({ ...cls, metal: name });
    expect(r.success).toBe(false);
    expect(r.error?.issues.map((i) => i.path.join("."))).toEqual(["metal"]);
    expect(r.error?.issues[0]?.message).toMatch(/^Metal must be one of Cu, /);
  });

  it.each(PROTOTYPE_NAMES)("dielectrics: %s is not a dielectric", (name) => {
    expect(getDielectric(name)).toBeUndefined();
  });

  it("every real catalogue entry is still found", () => {
    for (const id of Object.keys(METALS)) expect(getMetal(id).id).toBe(id);
    for (const id of Object.keys(DIELECTRICS)) expect(getDielectric(id)?.id).toBe(id);
  });

  it.each(PROTOTYPE_NAMES)("unit prefixes: 1 %s… is not a quantity", (name) => {
    expect(() => parseQuantity(`1 ${name}m`, "m")).toThrow(RangeError);
    expect(() => parseQuantity(`1${name}`, "F")).toThrow(RangeError);
  });

  it.each(PROTOTYPE_NAMES)("scenario settings: metal %s rejected, globally and in an override", (name) => {
    const g = scenarioSettingsSchema.safeParse({ metal: name });
    expect(g.success).toBe(false);
    expect(g.error?.issues[0]?.path).toEqual(["metal"]);
    const o = scenarioSettingsSchema.safeParse({ overrides: { M1: { metal: name } } });
    expect(o.success).toBe(false);
    expect(o.error?.issues[0]?.path).toEqual(["overrides", "M1", "metal"]);
  });

  it.each(PROTOTYPE_NAMES)("materials: a block for %s is rejected naming the key", (name) => {
    const body = JSON.parse(
      `{"supplyV":0.75,"clockHz":1e9,"repeaterR0Ohm":8000,"repeaterC0F":1e-15,"delayBudgetS":1e-10,"materials":{${JSON.stringify(name)}:{"specularity":0.5}}}`,
    );
    const r = technologySchema.safeParse(body);
    expect(r.success).toBe(false);
    expect(r.error?.issues.map((i) => i.path.join("."))).toContain(`materials.${name}`);
  });

  it('an own "__proto__" key of overrides (JSON.parse makes one) is refused, not silently dropped', () => {
    const r = scenarioSettingsSchema.safeParse(JSON.parse('{"overrides":{"__proto__":{"s":0.5}}}'));
    expect(r.success).toBe(false);
    expect(r.error?.issues[0]?.path).toEqual(["overrides", "__proto__"]);
    expect(wireClassSchema.safeParse({ ...cls, name: "__proto__" }).success).toBe(false);
  });

  it.each(["constructor", "toString", "valueOf", "hasOwnProperty"])(
    "a class named %s without an override evaluates like any other class (overrides looked up as own entries)",
    (name) => {
      const plain = evaluateScenario({ classes: [cls], technology: DEFAULT_TECHNOLOGY, settings });
      const odd = evaluateScenario({ classes: [{ ...cls, name }], technology: DEFAULT_TECHNOLOGY, settings });
      expect(odd.classes[0]!.scenario.delayS).toBe(plain.classes[0]!.scenario.delayS);
      expect(Number.isFinite(odd.classes[0]!.scenario.delayS)).toBe(true);
      // …and with an override under its own name, the override applies
      const withO = evaluateScenario({
        classes: [{ ...cls, name }],
        technology: DEFAULT_TECHNOLOGY,
        settings: { ...settings, overrides: { [name]: { s: 0.5 } } },
      });
      const ref = evaluateScenario({ classes: [cls], technology: DEFAULT_TECHNOLOGY, settings: { ...settings, overrides: { M1: { s: 0.5 } } } });
      expect(withO.classes[0]!.scenario.delayS).toBe(ref.classes[0]!.scenario.delayS);
      const sw = sweep({ classes: [{ ...cls, name }], technology: DEFAULT_TECHNOLOGY, settings, variable: "s", from: 0.5, to: 1, points: 3, metric: "delay" });
      const swRef = sweep({ classes: [cls], technology: DEFAULT_TECHNOLOGY, settings, variable: "s", from: 0.5, to: 1, points: 3, metric: "delay" });
      expect(sw.map((c) => c.points.map((p) => p.y))).toEqual(swRef.map((c) => c.points.map((p) => p.y)));
    },
  );

  it("report material sources skip ids that are not own catalogue entries", () => {
    const report = {
      baseline: { technology: { materials: {} } },
      options: [{ evaluation: { classes: [{ baseline: { metal: "constructor" }, scenario: { metal: "Cu" } }] } }],
    } as unknown as Parameters<typeof materialSources>[0];
    expect(materialSources(report).map((m) => m.metal)).toEqual([expect.stringContaining("Cu")]);
  });
});

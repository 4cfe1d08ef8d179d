import { describe, expect, it } from "vitest";
import { baselineSettings, MODEL_LEVELS, type ClassOverride, type ScenarioSettings, type Technology, type WireClass } from "@/lib/scaling";
import { scenarioSettingsSchema } from "@/lib/validation/scenario";
import { technologySchema } from "@/lib/validation/baseline";
import { wireClassListSchema, wireClassSchema } from "@/lib/validation/wire-class";

const good = {
  name: "M1",
  tier: "local",
  widthM: "20 nm",
  thicknessM: "0.04 µm",
  spacingM: 2e-8,
  ildBelowM: "30nm",
  ildAboveM: null,
  barrierM: "2 nm",
  metal: "Cu",
  k: 2.7,
  netCount: 10,
  meanLengthM: "5 µm",
  driverOhm: "8 kΩ",
  loadF: "0.4 fF",
  activity: 0.1,
};
const fields = (r: { success: boolean; error?: { issues: { path: PropertyKey[]; message: string }[] } }) =>
  Object.fromEntries((r.error?.issues ?? []).map((i) => [i.path.map(String).join("."), i.message]));

describe("wireClassSchema", () => {
  it("parses values with SI prefixes exactly into SI", () => {
    const c = wireClassSchema.parse(good);
    expect(c).toMatchObject({
      widthM: 2e-8,
      thicknessM: 4e-8,
      ildBelowM: 3e-8,
      ildAboveM: null,
      barrierM: 2e-9,
      meanLengthM: 5e-6,
      driverOhm: 8000,
      loadF: 4e-16,
    });
  });
  it.each([
    ["widthM", "abc", /"abc" is not a number with a known unit/],
    ["widthM", -1e-9, /Width must be greater than 0/],
    ["thicknessM", "40 parsecs", /not a number with a known unit/],
    ["ildBelowM", "-3 nm", /ILD below must be greater than 0/],
    ["k", 0.5, /k must be at least 1/],
    ["activity", 1.5, /between 0 and 1/],
    ["netCount", 1.5, /whole number/],
    ["metal", "Unobtainium", /Metal must be one of/],
    ["tier", "orbital", /Tier must be one of/],
  ])("rejects %s = %s with a field message", (key, value, msg) => {
    const r = wireClassSchema.safeParse({ ...good, [key]: value });
    expect(r.success).toBe(false);
    expect(fields(r)[key]).toMatch(msg);
  });
  it("needs at least one ILD and a barrier thinner than half the width", () => {
    expect(fields(wireClassSchema.safeParse({ ...good, ildBelowM: null, ildAboveM: null })).ildBelowM).toMatch(/at least one ILD/);
    expect(fields(wireClassSchema.safeParse({ ...good, barrierM: "10 nm" })).barrierM).toMatch(/less than half the width/);
  });
  it("flags a class name used twice, case-insensitively, on the second row", () => {
    const r = wireClassListSchema.safeParse([good, { ...good, name: "m1" }]);
    expect(fields(r)["1.name"]).toMatch(/used twice \(rows 1 and 2\)/);
  });
});

describe("scenarioSettingsSchema", () => {
  it("fills defaults", () => {
    expect(scenarioSettingsSchema.parse({})).toEqual({
      s: 1,
      sL: 1,
      level: "full",
      barrierScales: false,
      miller: 1,
      deviceRFactor: 1,
      deviceCFactor: 1,
      k: null,
      metal: null,
      overrides: {},
    });
  });
  it.each([
    [{ s: 0 }, "s", /S must be greater than 0/],
    [{ s: -2 }, "s", /S must be greater than 0/],
    [{ sL: 0 }, "sL", /S_L must be greater than 0/],
    [{ miller: 2.01 }, "miller", /between 0 and 2/],
    [{ miller: -1 }, "miller", /between 0 and 2/],
    [{ k: 0.99 }, "k", /k must be at least 1/],
    [{ level: "extreme" }, "level", /Model level must be one of/],
    [{ overrides: { M1: { sL: 0 } } }, "overrides.M1.sL", /S_L must be greater than 0/],
    [{ overrides: { M1: { colour: "red" } } }, "overrides.M1", /Unrecognized key/],
  ])("rejects %j", (input, key, msg) => {
    const r = scenarioSettingsSchema.safeParse(input);
    expect(r.success).toBe(false);
    expect(fields(r)[key]).toMatch(msg);
  });
});

describe("technologySchema", () => {
  it("accepts units and rejects a zero budget", () => {
    expect(
      technologySchema.parse({
        supplyV: "750 mV",
        clockHz: "1.5 GHz",
        repeaterR0Ohm: "6 kohm",
        repeaterC0F: "0.25 fF",
        delayBudgetS: "100 ps",
      }),
    ).toEqual({ supplyV: 0.75, clockHz: 1.5e9, repeaterR0Ohm: 6000, repeaterC0F: 2.5e-16, delayBudgetS: 1e-10 });
    expect(fields(technologySchema.safeParse({ supplyV: 0.75, clockHz: 1e9, repeaterR0Ohm: 1, repeaterC0F: 1e-16, delayBudgetS: 0 })).delayBudgetS).toMatch(
      /greater than 0/,
    );
  });
});

// The input schemas mirror the engine's types field for field (mirrorOf, checked by tsc); at run time, a value of
// the engine type passes through them unchanged, so nothing the engine uses is dropped or altered at the API edge.
describe("input schemas and the engine types", () => {
  const technology: Technology = { supplyV: 0.7, clockHz: 2e9, repeaterR0Ohm: 5000, repeaterC0F: 3e-16, delayBudgetS: 80e-12 };
  it("ScenarioSettings: every level's baseline settings, and overrides with every ClassOverride field", () => {
    for (const level of MODEL_LEVELS) {
      const settings = baselineSettings(level, technology);
      expect(scenarioSettingsSchema.parse(settings)).toEqual(settings);
    }
    const override: Required<ClassOverride> = {
      s: 1.4,
      sL: 1.2,
      k: 2.2,
      metal: "Ru",
      barrierScales: true,
      aspectRatio: 2.5,
      miller: 1.5,
      barrierM: 1e-9,
    };
    const settings: ScenarioSettings = { ...baselineSettings("full", technology), k: 2.5, metal: "Co", overrides: { M1: override } };
    expect(scenarioSettingsSchema.parse(settings)).toEqual(settings);
  });
  it("Technology", () => {
    expect(technologySchema.parse(technology)).toEqual(technology);
  });
  it("WireClass (without its histogram, which is imported separately)", () => {
    const c: Omit<WireClass, "histogram"> = wireClassSchema.parse(good);
    expect(wireClassSchema.parse(c)).toEqual(c);
    expect(Object.keys(c).sort()).toEqual(Object.keys(good).sort());
  });
});

import { describe, expect, it } from "vitest";
import { baselineSettings, MODEL_LEVELS, type ClassOverride, type ScenarioSettings, type Technology, type WireClass } from "@/lib/scaling";
import { scenarioSettingsSchema } from "@/lib/validation/scenario";
import { technologySchema } from "@/lib/validation/baseline";
import { wireClassListSchema, wireClassSchema } from "@/lib/validation/wire-class";
import { classOverrideSnapshotSchema, settingsSnapshotSchema, wireClassSnapshotSchema } from "@/lib/validation/report";
import { normalizeSettings } from "@/lib/workspace/settings";

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

describe("technologySchema: engine 2 settings (optional; the engine's ranges, checkTechnology)", () => {
  const base = { supplyV: 0.75, clockHz: 1.5e9, repeaterR0Ohm: 6000, repeaterC0F: 2.5e-16, delayBudgetS: 1e-10 };
  it("accepts every new field, with units where they have one, and leaves absent ones absent", () => {
    expect(
      technologySchema.parse({
        ...base,
        delayModel: "sakurai",
        temperatureC: 85,
        minRepeaterGain: 0.05,
        repeaterOutputCRatio: "0.8",
        repeaterAreaM2: 2e-13,
        repeaterLeakageW: "3 nW",
        materials: { Cu: { specularity: 0.2, meanFreePathM: "30 nm" }, Ru: {} },
      }),
    ).toEqual({
      ...base,
      delayModel: "sakurai",
      temperatureC: 85,
      minRepeaterGain: 0.05,
      repeaterOutputCRatio: 0.8,
      repeaterAreaM2: 2e-13,
      repeaterLeakageW: 3e-9,
      materials: { Cu: { specularity: 0.2, meanFreePathM: 3e-8 }, Ru: {} },
    });
    expect(Object.keys(technologySchema.parse(base)).sort()).toEqual(Object.keys(base).sort());
    // the ends of the ranges the engine accepts
    expect(technologySchema.parse({ ...base, temperatureC: 400, minRepeaterGain: 0, repeaterOutputCRatio: 10 }).temperatureC).toBe(400);
    expect(technologySchema.parse({ ...base, temperatureC: -273 }).temperatureC).toBe(-273);
  });
  it.each([
    [{ delayModel: "elmore" }, "delayModel", /Delay model must be one of exact, sakurai/],
    [{ temperatureC: -273.15 }, "temperatureC", /above −273.15 °C/],
    [{ temperatureC: 400.5 }, "temperatureC", /at most 400 °C/],
    [{ temperatureC: "hot" }, "temperatureC", /not a number/],
    [{ minRepeaterGain: 1 }, "minRepeaterGain", /less than 1/],
    [{ minRepeaterGain: -0.1 }, "minRepeaterGain", /must not be negative/],
    [{ repeaterOutputCRatio: 11 }, "repeaterOutputCRatio", /at most 10/],
    [{ repeaterAreaM2: -1e-13 }, "repeaterAreaM2", /must not be negative/],
    [{ repeaterLeakageW: -1 }, "repeaterLeakageW", /must not be negative/],
    [{ materials: { Xx: { specularity: 0.1 } } }, "materials.Xx", /not a metal of the catalogue/],
    [{ materials: { Cu: { specularity: 1 } } }, "materials.Cu.specularity", /less than 1/],
    [{ materials: { Cu: { grainReflection: -0.1 } } }, "materials.Cu.grainReflection", /must not be negative/],
    [{ materials: { Cu: { resistivityOhmM: 0 } } }, "materials.Cu.resistivityOhmM", /greater than 0/],
    [{ materials: { Cu: { tempCoeffPerK: 0.03 } } }, "materials.Cu.tempCoeffPerK", /at most 0.02/],
    [{ materials: { Cu: { meanFreePathM: 2e-6 } } }, "materials.Cu.meanFreePathM", /at most 1 µm/],
    [{ materials: { Cu: { steinhoglC: 11 } } }, "materials.Cu.steinhoglC", /at most 10/],
    [{ materials: { Cu: { colour: 1 } } }, "materials.Cu", /Unrecognized key/],
  ])("rejects %j naming the field", (extra, key, msg) => {
    const r = technologySchema.safeParse({ ...base, ...extra });
    expect(r.success).toBe(false);
    expect(fields(r)[key]).toMatch(msg);
  });
});

describe("wireClassSchema: vias (engine 2, optional)", () => {
  it("keeps the via fields (units accepted) and adds none when they are absent", () => {
    expect(wireClassSchema.parse({ ...good, viasPerNet: 2, viaOhm: "15 ohm", viaWidthM: "20 nm", viaHeightM: 3e-8 })).toMatchObject({
      viasPerNet: 2,
      viaOhm: 15,
      viaWidthM: 2e-8,
      viaHeightM: 3e-8,
    });
    const plain = wireClassSchema.parse(good);
    expect(["viasPerNet", "viaOhm", "viaWidthM", "viaHeightM"].filter((k) => k in plain)).toEqual([]);
  });
  it.each([
    [{ viasPerNet: 1.5 }, "viasPerNet", /whole number/],
    [{ viasPerNet: -1 }, "viasPerNet", /must not be negative/],
    [{ viaOhm: -2 }, "viaOhm", /must not be negative/],
    [{ viaWidthM: 0 }, "viaWidthM", /greater than 0/],
    [{ viaHeightM: "1 mm" }, "viaHeightM", /at most 100 µm/],
  ])("rejects %j naming the field", (extra, key, msg) => {
    const r = wireClassSchema.safeParse({ ...good, ...extra });
    expect(r.success).toBe(false);
    expect(fields(r)[key]).toMatch(msg);
  });
});

describe("air gaps (issue 11, optional): class fields and scenario settings", () => {
  it("keeps kGap and gapFraction on a class (either alone too) and adds none when they are absent", () => {
    expect(wireClassSchema.parse({ ...good, kGap: "1", gapFraction: 0.5 })).toMatchObject({ kGap: 1, gapFraction: 0.5 });
    expect(wireClassSchema.parse({ ...good, kGap: 2.7 })).toMatchObject({ kGap: 2.7 }); // = k: allowed
    expect(wireClassSchema.parse({ ...good, gapFraction: 0 })).toMatchObject({ gapFraction: 0 });
    const plain = wireClassSchema.parse(good);
    expect(["kGap", "gapFraction"].filter((k) => k in plain)).toEqual([]);
  });
  it.each([
    [{ kGap: 2.8 }, "kGap", /^Air-gap k must not exceed the class's k \(2\.7\)\.$/],
    [{ kGap: 0.5 }, "kGap", /Air-gap k must be at least 1/],
    [{ k: 31, kGap: 30.5 }, "k", /k must be at most 30/],
    [{ kGap: "x" }, "kGap", /Air-gap k: "x" is not a number/],
    [{ gapFraction: 1.2 }, "gapFraction", /Gap fraction must be between 0 and 1/],
    [{ gapFraction: -0.1 }, "gapFraction", /Gap fraction must be between 0 and 1/],
  ])("rejects the class %j naming the field", (extra, key, msg) => {
    const r = wireClassSchema.safeParse({ ...good, ...extra });
    expect(r.success).toBe(false);
    expect(fields(r)[key]).toMatch(msg);
  });
  it("settings: a global air gap and per-class ones (null = none for that class); absent stays absent", () => {
    const s = scenarioSettingsSchema.parse({
      airGap: { kGap: "1.0", gapFraction: 1 },
      overrides: { M1: { airGap: null }, M2: { airGap: { kGap: 1.5, gapFraction: 0.5 } } },
    });
    expect(s.airGap).toEqual({ kGap: 1, gapFraction: 1 });
    expect(s.overrides.M1).toEqual({ airGap: null });
    expect(s.overrides.M2).toEqual({ airGap: { kGap: 1.5, gapFraction: 0.5 } });
    expect(scenarioSettingsSchema.parse({ airGap: null }).airGap).toBeNull();
    expect("airGap" in scenarioSettingsSchema.parse({})).toBe(false);
  });
  it.each([
    [{ airGap: { kGap: 0.5, gapFraction: 1 } }, "airGap.kGap", /Air-gap k must be at least 1/],
    [{ airGap: { kGap: 31, gapFraction: 1 } }, "airGap.kGap", /Air-gap k must be at most 30/],
    [{ airGap: { kGap: 1, gapFraction: 1.2 } }, "airGap.gapFraction", /Gap fraction must be between 0 and 1/],
    [{ airGap: { kGap: 1 } }, "airGap.gapFraction", /Gap fraction is required/],
    [{ airGap: { gapFraction: 1 } }, "airGap.kGap", /Air-gap k is required/],
    [{ airGap: { kGap: 1, gapFraction: 1, k: 2 } }, "airGap", /Unrecognized key/],
    [{ airGap: 1.9 }, "airGap", /Air gap must be an object/],
    [{ overrides: { M1: { airGap: { kGap: 1, gapFraction: 2 } } } }, "overrides.M1.airGap.gapFraction", /Gap fraction must be between 0 and 1/],
  ])("rejects the settings %j naming the field", (input, key, msg) => {
    const r = scenarioSettingsSchema.safeParse(input);
    expect(r.success).toBe(false);
    expect(fields(r)[key]).toMatch(msg);
  });
  it("normalised settings store a global gap only when one is set; per-class null is kept", () => {
    const tech: Technology = { supplyV: 0.7, clockHz: 2e9, repeaterR0Ohm: 5000, repeaterC0F: 3e-16, delayBudgetS: 80e-12 };
    expect(normalizeSettings(scenarioSettingsSchema.parse({ airGap: null, overrides: { M1: { airGap: null } } }), tech)).not.toHaveProperty("airGap");
    const n = normalizeSettings(scenarioSettingsSchema.parse({ airGap: { kGap: 1, gapFraction: 0.5 }, overrides: { M1: { airGap: null } } }), tech);
    expect(n.airGap).toEqual({ kGap: 1, gapFraction: 0.5 });
    expect(n.overrides).toEqual({ M1: { airGap: null } });
  });
  it("frozen reports: classes, settings and overrides frozen before air gaps still parse, without the fields", () => {
    const cls = wireClassSchema.parse(good);
    expect(wireClassSnapshotSchema.parse(cls)).toEqual(cls);
    const old = baselineSettings("full", { supplyV: 0.7, clockHz: 2e9, repeaterR0Ohm: 5000, repeaterC0F: 3e-16, delayBudgetS: 80e-12 });
    const parsed = settingsSnapshotSchema.parse({ ...old, overrides: { M1: { k: 1.9 } } });
    expect(parsed).not.toHaveProperty("airGap");
    expect(parsed.overrides.M1).toEqual({ k: 1.9 });
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
      lineFraction: 0.55,
      miller: 1.5,
      barrierM: 1e-9,
      airGap: { kGap: 1, gapFraction: 0.6 },
      lengthRule: { kind: "power", exponent: 0.5 },
    };
    const settings: Required<ScenarioSettings> = {
      ...baselineSettings("full", technology),
      k: 2.5,
      metal: "Co",
      airGap: { kGap: 1.2, gapFraction: 1 },
      lengthRule: { kind: "factor", sL: 1.2 },
      temperatureC: 85,
      overrides: { M1: override, M2: { airGap: null } },
    };
    expect(scenarioSettingsSchema.parse(settings)).toEqual(settings);
    // the frozen report's copies of settings and overrides keep every field too
    expect(settingsSnapshotSchema.parse(settings)).toEqual(settings);
    expect(classOverrideSnapshotSchema.parse(override)).toEqual(override);
  });
  it("Technology", () => {
    expect(technologySchema.parse(technology)).toEqual(technology);
    const all: Required<Technology> = {
      ...technology,
      delayModel: "exact",
      capacitanceModel: "published",
      temperatureC: 105,
      minRepeaterGain: 0.2,
      repeaterOutputCRatio: 0.4,
      repeaterAreaM2: 1.5e-13,
      repeaterLeakageW: 2e-9,
      materials: { Cu: { resistivityOhmM: 1.7e-8, tempCoeffPerK: 0.004, meanFreePathM: 3.9e-8, specularity: 0.1, grainReflection: 0.3, steinhoglC: 1.2 } },
      materialsSource: "Fitted to 3 measured lines, 2026-12-02",
    };
    expect(technologySchema.parse(all)).toEqual(all);
  });
  it("WireClass (without its histogram, which is imported separately)", () => {
    const c: Omit<WireClass, "histogram"> = wireClassSchema.parse(good);
    expect(wireClassSchema.parse(c)).toEqual(c);
    expect(Object.keys(c).sort()).toEqual(Object.keys(good).sort());
    const all: Required<Omit<WireClass, "histogram">> = { ...c, viasPerNet: 2, viaOhm: 12, viaWidthM: 2e-8, viaHeightM: 3e-8, kGap: 1.5, gapFraction: 0.75 };
    expect(wireClassSchema.parse(all)).toEqual(all);
    expect(wireClassSnapshotSchema.parse(all)).toEqual(all);
  });
});

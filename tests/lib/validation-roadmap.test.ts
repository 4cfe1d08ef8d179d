import { describe, expect, it } from "vitest";
import type { RoadmapStep } from "@/lib/scaling";
import { roadmapCreateSchema, roadmapPatchSchema, roadmapStepsSchema } from "@/lib/validation/roadmap";
import { classOverrideSchema, scenarioSettingsSchema } from "@/lib/validation/scenario";
import { classOverrideSnapshotSchema, settingsSnapshotSchema } from "@/lib/validation/report";

const fields = (r: { success: boolean; error?: { issues: { path: PropertyKey[]; message: string }[] } }) =>
  Object.fromEntries((r.error?.issues ?? []).map((i) => [i.path.map(String).join("."), i.message]));

describe("length rules and temperature in the scenario settings schema", () => {
  it("accepts the four rules, globally and per class, and a temperature", () => {
    const settings = {
      lengthRule: { kind: "power", exponent: 0.5 },
      temperatureC: 85,
      overrides: { M2: { lengthRule: { kind: "factor", sL: 1.2 } }, M5: { lengthRule: { kind: "fixed" } }, M1: { lengthRule: { kind: "follows-s" } } },
    };
    const out = scenarioSettingsSchema.parse(settings);
    expect(out.lengthRule).toEqual({ kind: "power", exponent: 0.5 });
    expect(out.temperatureC).toBe(85);
    expect(out.overrides.M2!.lengthRule).toEqual({ kind: "factor", sL: 1.2 });
    // absent stays absent
    const plain = scenarioSettingsSchema.parse({});
    expect("lengthRule" in plain).toBe(false);
    expect("temperatureC" in plain).toBe(false);
  });
  it("an exponent outside 0–2 is an issue naming the field, globally and per class", () => {
    expect(fields(scenarioSettingsSchema.safeParse({ lengthRule: { kind: "power", exponent: 2.5 } }))).toEqual({
      "lengthRule.exponent": "Length-rule exponent must be between 0 and 2.",
    });
    expect(Object.keys(fields(scenarioSettingsSchema.safeParse({ overrides: { M2: { lengthRule: { kind: "power", exponent: -0.5 } } } })))).toEqual([
      "overrides.M2.lengthRule.exponent",
    ]);
    expect(Object.keys(fields(scenarioSettingsSchema.safeParse({ lengthRule: { kind: "factor", sL: 0 } })))).toEqual(["lengthRule.sL"]);
    expect(Object.keys(fields(scenarioSettingsSchema.safeParse({ lengthRule: { kind: "power" } })))).toEqual(["lengthRule.exponent"]);
    expect(scenarioSettingsSchema.safeParse({ lengthRule: { kind: "square" } }).success).toBe(false);
    expect(Object.keys(fields(scenarioSettingsSchema.safeParse({ temperatureC: 401 })))).toEqual(["temperatureC"]);
    expect(classOverrideSchema.safeParse({ lengthRule: { kind: "fixed", sL: 2 } }).success).toBe(false);
  });
  it("frozen reports: settings stored before the new fields read unchanged; new ones keep them", () => {
    const old = {
      s: 1.5,
      sL: 1,
      level: "full",
      barrierScales: false,
      miller: 1,
      deviceRFactor: 1,
      deviceCFactor: 1,
      supplyV: 0.7,
      k: null,
      metal: null,
      overrides: { M2: { s: 1.2 } },
    };
    expect(JSON.stringify(settingsSnapshotSchema.parse(old))).toBe(JSON.stringify(old));
    const withRules = { ...old, lengthRule: { kind: "power", exponent: 0.5 }, temperatureC: 85, overrides: { M2: { s: 1.2, lengthRule: { kind: "fixed" } } } };
    expect(settingsSnapshotSchema.parse(withRules)).toEqual(withRules);
    expect(classOverrideSnapshotSchema.parse({ lengthRule: { kind: "factor", sL: 1.2 } })).toEqual({ lengthRule: { kind: "factor", sL: 1.2 } });
  });
});

describe("roadmap schemas", () => {
  const steps: RoadmapStep[] = [
    { name: "N1", settings: { s: 1.25, lengthRule: { kind: "power", exponent: 0.5 } } },
    {
      name: "N2",
      settings: { s: 1.2, overrides: { M2: { targetPitchM: 48e-9, lengthRule: { kind: "fixed" } } }, airGap: { kGap: 1, gapFraction: 0.5 } },
      fromScenarioId: "abc",
    },
  ];
  it("a valid chain parses to the engine's RoadmapStep values unchanged", () => {
    expect(roadmapStepsSchema.parse(steps)).toEqual(steps);
    const created = roadmapCreateSchema.parse({ name: "Skua N3", baselineId: "b1", steps });
    expect(created.steps).toEqual(steps);
    // settings may be left out: nothing changes at that step; units are read as in scenarios
    expect(roadmapStepsSchema.parse([{ name: "N1" }])).toEqual([{ name: "N1", settings: {} }]);
    expect(
      roadmapStepsSchema.parse([{ name: "N1", settings: { overrides: { M2: { targetPitchM: "48 nm" } } } }])[0]!.settings.overrides!.M2!.targetPitchM,
    ).toBeCloseTo(48e-9, 20);
  });
  it("paths name the step and field: steps.N.settings…", () => {
    const r = roadmapCreateSchema.safeParse({
      name: "R",
      baselineId: "b1",
      steps: [
        { name: "N1", settings: { s: 0 } },
        { name: "N2", settings: { overrides: { M2: { s: 1.1, targetPitchM: 40e-9 } } } },
        { name: "N3", settings: { lengthRule: { kind: "power", exponent: 3 } } },
        { name: "N4", settings: { overrides: { M2: { lengthRule: { kind: "power", exponent: 2.01 } } } } },
        { name: "N5", settings: { deviceRFactor: -1, bogus: 1 } },
      ],
    });
    expect(Object.keys(fields(r)).sort()).toEqual(
      [
        "steps.0.settings.s",
        "steps.1.settings.overrides.M2.targetPitchM",
        "steps.2.settings.lengthRule.exponent",
        "steps.3.settings.overrides.M2.lengthRule.exponent",
        "steps.4.settings",
        "steps.4.settings.deviceRFactor",
      ].sort(),
    );
  });
  it("1 to 8 steps, each named once", () => {
    expect(fields(roadmapStepsSchema.safeParse([]))).toEqual({ "": "A roadmap needs at least one step after its baseline N0." });
    const nine = Array.from({ length: 9 }, (_, i) => ({ name: `N${i + 1}`, settings: {} }));
    expect(Object.values(fields(roadmapStepsSchema.safeParse(nine)))).toEqual(["A roadmap holds at most 8 steps after its baseline N0."]);
    expect(roadmapStepsSchema.safeParse(nine.slice(0, 8)).success).toBe(true);
    expect(Object.keys(fields(roadmapStepsSchema.safeParse([{ name: "N1" }, { name: "N1" }])))).toEqual(["1.name"]);
    expect(Object.keys(fields(roadmapStepsSchema.safeParse([{ name: "  ", settings: {} }])))).toEqual(["0.name"]);
  });
  it("patch takes the version and optional name and steps", () => {
    expect(roadmapPatchSchema.parse({ version: 3, name: "New" })).toEqual({ version: 3, name: "New" });
    expect(Object.keys(fields(roadmapPatchSchema.safeParse({ name: "x" })))).toEqual(["version"]);
    expect(Object.keys(fields(roadmapPatchSchema.safeParse({ version: 1, steps: [{ name: "N1", settings: { miller: 5 } }] })))).toEqual([
      "steps.0.settings.miller",
    ]);
  });
});

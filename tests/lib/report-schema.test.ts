import { describe, expect, it } from "vitest";
import { z } from "zod";
import { baselineSettings, ENGINE_VERSION, type ScenarioSettings, type Technology, type WireClass } from "@/lib/scaling";
import { freezeReport, type FreezeInput } from "@/lib/reports/freeze";
import { mirrorOf } from "@/lib/validation/mirror";
import { frozenReportSchema, type FrozenReport } from "@/lib/validation/report";

// Invented classes, in SI units; the histogram makes the distribution come from bins rather than the mean length.
const classes: WireClass[] = [
  {
    name: "M2 local",
    tier: "local",
    widthM: 24e-9,
    thicknessM: 48e-9,
    spacingM: 24e-9,
    ildBelowM: 40e-9,
    ildAboveM: 40e-9,
    barrierM: 2.5e-9,
    metal: "Cu",
    k: 2.7,
    netCount: 400_000,
    meanLengthM: 6e-6,
    driverOhm: 4000,
    loadF: 0.4e-15,
    activity: 0.15,
    histogram: [
      { lengthM: 2e-6, count: 250_000 },
      { lengthM: 8e-6, count: 120_000 },
      { lengthM: 30e-6, count: 30_000 },
    ],
  },
  {
    name: "M9 global",
    tier: "global",
    widthM: 400e-9,
    thicknessM: 800e-9,
    spacingM: 400e-9,
    ildBelowM: 600e-9,
    ildAboveM: null,
    barrierM: 5e-9,
    metal: "Cu",
    k: 3.0,
    netCount: 2000,
    meanLengthM: 1.5e-3,
    driverOhm: 300,
    loadF: 5e-15,
    activity: 0.2,
  },
];

function input(): FreezeInput {
  const technology: Technology = { supplyV: 0.75, clockHz: 1.5e9, repeaterR0Ohm: 6000, repeaterC0F: 0.25e-15, delayBudgetS: 100e-12 };
  const full = baselineSettings("full", technology);
  const shrink: ScenarioSettings = { ...full, s: 1 / 0.7 };
  const airGap: ScenarioSettings = { ...full, s: 1 / 0.7, overrides: { "M2 local": { k: 1.9, metal: "Ru" } } };
  const ideal: ScenarioSettings = { ...baselineSettings("ideal", technology), s: 1.4 };
  return {
    baseline: { id: "b1", name: "Invented tile", description: "test data", version: 3, technology, classes },
    scenarios: [
      { id: "s1", name: "Plain shrink", notes: "", version: 1, settings: shrink },
      { id: "s2", name: "Air gap and Ru", notes: "local tier", version: 2, settings: airGap },
      { id: "s3", name: "Textbook scaling", notes: "", version: 1, settings: ideal },
    ],
  };
}

/** The stored text of a frozen report, read back as a plain JSON value (what the database hands the schema). */
const stored = (r: FrozenReport): Record<string, unknown> => JSON.parse(JSON.stringify(r)) as Record<string, unknown>;

/** Delete one field (dotted path, numeric segments index arrays) from a copy of a stored document. */
function without(doc: Record<string, unknown>, path: string): Record<string, unknown> {
  const copy = structuredClone(doc);
  const keys = path.split(".");
  let at: unknown = copy;
  for (const k of keys.slice(0, -1)) at = (at as Record<string, unknown>)[k];
  expect(at, `${path} exists`).toBeTypeOf("object");
  expect(Object.hasOwn(at as object, keys.at(-1)!), `${path} exists`).toBe(true);
  delete (at as Record<string, unknown>)[keys.at(-1)!];
  return copy;
}

describe("frozenReportSchema and the current engine", () => {
  it("accepts a report frozen by the current engine and keeps every field of it", () => {
    const report = freezeReport(input(), 1_780_000_000_000);
    expect(report.engineVersion).toBe(ENGINE_VERSION);
    const doc = stored(report);
    const parsed = frozenReportSchema.safeParse(doc);
    expect(parsed.success, parsed.error?.message).toBe(true);
    // Nothing the engine produced was dropped as unknown: the schema lists every field.
    expect(parsed.data).toEqual(doc);
    const result = report.options[1]!.evaluation.classes[0]!.scenario;
    expect(result.intrinsicDelayS).toBeGreaterThan(0);
    expect(result.repeaters.delayPerMS).toBeGreaterThan(0);
    expect(result.distribution.source).toBe("histogram");
  });

  it("a report frozen now carries engine 2's result fields; one frozen by engine 1.x (without them) still parses", () => {
    const doc = stored(freezeReport(input(), 1_780_000_000_000)) as unknown as FrozenReport;
    const opt = doc.options[0]!;
    const global = opt.evaluation.classes[1]!.scenario;
    // evaluateScenario (engine 2) on the invented global class (1.5 mm, 300 Ω driver): repeaters are inserted
    expect(global.repeaterCount).toBeGreaterThan(0);
    expect(global.repeaterCount).toBe(global.repeaters.inserted);
    expect(global.repeaterAreaM2).toBeGreaterThan(0);
    expect(global.temperatureC).toBe(25);
    expect(global.delayModel).toBe("exact");
    expect(opt.evaluation.totals.scenario.repeaterPowerShare).toBeGreaterThan(0);
    expect(global.capacitance).not.toHaveProperty("couplingFPerM");
    expect(doc.sweeps[0]!.series[0]!.points.every((p) => Array.isArray(p.flags))).toBe(true);

    // An engine 1.x document: the same shape minus every field engine 2 added.
    const old = structuredClone(doc) as unknown as Record<string, unknown> & FrozenReport;
    const strip = (o: Record<string, unknown>, keys: string[]) => keys.forEach((k) => delete o[k]);
    const classKeys = [
      "temperatureC",
      "delayModel",
      "viaOhm",
      "repeaterCount",
      "repeaterSize",
      "repeatedDelayS",
      "stageCount",
      "repeaterAreaM2",
      "repeaterEnergyJ",
      "totalRepeaterAreaM2",
      "repeaterPowerW",
    ];
    old.engineVersion = "1.1.0";
    for (const o of old.options) {
      o.evaluation.engineVersion = "1.1.0";
      for (const t of [o.evaluation.totals.baseline, o.evaluation.totals.scenario]) strip(t, ["repeaterAreaM2", "repeaterPowerW", "repeaterPowerShare"]);
      for (const c of o.evaluation.classes)
        for (const r of [c.baseline, c.scenario]) {
          strip(r as unknown as Record<string, unknown>, classKeys);
          strip(r.repeaters, ["inserted", "stageCount", "unrepeatedDelayS"]);
          strip(r.distribution, ["totalRepeaterSize"]);
          for (const b of r.distribution.bins) strip(b, ["repeaterSize"]);
        }
    }
    for (const sw of old.sweeps) for (const s of sw.series) for (const p of s.points) strip(p as unknown as Record<string, unknown>, ["flags"]);
    // what 1.x documents parse to: the same, with the coupling parts under their engine-2 names
    const expected = structuredClone(old);
    // engine 1.x named the coupling parts couplingFPerM (Miller × both neighbours) and couplingPerNeighbourFPerM
    for (const o of old.options)
      for (const c of o.evaluation.classes)
        for (const r of [c.baseline, c.scenario]) {
          const cap = r.capacitance as unknown as Record<string, unknown>;
          cap.couplingFPerM = cap.couplingMillerFPerM;
          cap.couplingPerNeighbourFPerM = cap.couplingEachFPerM;
          strip(cap, ["couplingMillerFPerM", "couplingEachFPerM"]);
        }
    const parsed = frozenReportSchema.safeParse(old);
    expect(parsed.success, parsed.error?.message).toBe(true);
    expect(parsed.data!.options[0]!.evaluation.classes[1]!.scenario.repeaterCount).toBeUndefined();
    expect(parsed.data).toEqual(expected);
    expect(parsed.data!.options[0]!.evaluation.classes[1]!.scenario.capacitance.couplingEachFPerM).toBe(global.capacitance.couplingEachFPerM);
    // the old fields stay required
    const noCount = structuredClone(old);
    delete (noCount.options[0]!.evaluation.classes[1]!.scenario.repeaters as Partial<{ count: number }>).count;
    expect(frozenReportSchema.safeParse(noCount).success).toBe(false);
  });

  it("accepts the share view of a report (source ids left out)", () => {
    const doc = stored(freezeReport(input()));
    const shared = without(without(doc, "baseline.id"), "options.0.scenarioId");
    expect(frozenReportSchema.safeParse(shared).success).toBe(true);
  });

  it("accepts a ratio stored as null (a non-finite number in JSON) but no null in a required engine number", () => {
    const doc = stored(freezeReport(input()));
    const ratioNull = structuredClone(doc) as FrozenReport;
    ratioNull.options[0]!.evaluation.classes[0]!.ratio.repeaters = null;
    expect(frozenReportSchema.safeParse(ratioNull).success).toBe(true);

    const delayNull = structuredClone(doc) as unknown as {
      options: { evaluation: { classes: { scenario: { delayS: number | null } }[] } }[];
    };
    delayNull.options[0]!.evaluation.classes[0]!.scenario.delayS = null;
    const r = frozenReportSchema.safeParse(delayNull);
    expect(r.success).toBe(false);
    expect(r.error?.issues.map((i) => i.path.join("."))).toContain("options.0.evaluation.classes.0.scenario.delayS");
  });

  it.each([
    "baseline.technology.delayBudgetS",
    "baseline.classes.1.activity",
    "options.0.settings.miller",
    "options.0.evaluation.engineVersion",
    "options.1.evaluation.classes.0.scenario.intrinsicDelayS",
    "options.1.evaluation.classes.0.baseline.totalEnergyJ",
    "options.1.evaluation.classes.1.scenario.capacitance.couplingEachFPerM",
    "options.2.evaluation.classes.1.scenario.repeaters.delayPerMS",
    "options.0.evaluation.classes.0.scenario.distribution.totalCapacitanceF",
    "options.0.evaluation.classes.0.ratio.energyJ",
    "options.0.evaluation.totals.scenario.worstDelayS",
  ])("rejects a document without the engine field %s", (path) => {
    const r = frozenReportSchema.safeParse(without(stored(freezeReport(input())), path));
    expect(r.success).toBe(false);
    expect(r.error?.issues.map((i) => i.path.join("."))).toContain(path);
  });
});

describe("mirrorOf", () => {
  type Pair = { a: number; b: string | null };
  it("returns the schema itself, which parses the mirrored type", () => {
    const schema = z.object({ a: z.number(), b: z.string().nullable() });
    expect(mirrorOf<Pair>()(schema)).toBe(schema);
    expect(schema.safeParse({ a: 1 }).success).toBe(false);
  });

  it("does not compile for a schema that differs from the mirrored type (checked by tsc)", () => {
    // Each line below is a compile error; tsc fails on an unused @ts-expect-error, so these checks cannot pass silently.
    // @ts-expect-error a field of the type is missing
    const missing = mirrorOf<Pair>()(z.object({ a: z.number() }));
    // @ts-expect-error a field the type does not have
    const extra = mirrorOf<Pair>()(z.object({ a: z.number(), b: z.string().nullable(), c: z.number() }));
    // @ts-expect-error a field of another type
    const retyped = mirrorOf<Pair>()(z.object({ a: z.string(), b: z.string().nullable() }));
    // @ts-expect-error a required field made optional
    const optional = mirrorOf<Pair>()(z.object({ a: z.number().optional(), b: z.string().nullable() }));
    expect([missing, extra, retyped, optional].every((s) => s instanceof z.ZodObject)).toBe(true);
  });
});

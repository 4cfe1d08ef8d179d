import { z } from "zod";
import {
  CAPACITANCE_CHOICES,
  DELAY_MODELS,
  MODEL_LEVELS,
  TIERS,
  type AirGap,
  type CapacitanceChoice,
  type CapacitanceModel,
  type ClassCapacitance,
  type ClassComparison,
  type ClassOverride,
  type ClassRatio,
  type ClassResult,
  type DelayModel,
  type DistributionResult,
  type EffectiveK,
  type Evaluation,
  type LengthBin,
  type LengthRule,
  type MetalOverride,
  type ModelLevel,
  type RepeaterResult,
  type ScenarioSettings,
  type SweepMetric,
  type SweepPoint,
  type SweepVariable,
  type Technology,
  type Tier,
  type ValidityFlag,
  type WireClass,
} from "@/lib/scaling/types";
import type { RoadmapClassStep, RoadmapStepSettings } from "@/lib/scaling/client";
import { mirrorOf, type NullableFields, type OptionalFields, type Same } from "./mirror";
import { cleanText } from "./text";
import { classNameSchema } from "./wire-class";
import { composeShapingSchema, frozenShapingSchema } from "./report-shaping";

/** Metrics a report can put in its tables (the compose form's "which metrics matter"). */
export const REPORT_METRICS = ["delay", "rc", "resistance", "capacitance", "repeaters", "energy", "power", "overBudget"] as const;
export type ReportMetric = (typeof REPORT_METRICS)[number];
export const DEFAULT_REPORT_METRICS: ReportMetric[] = ["delay", "rc", "capacitance", "repeaters", "energy"];
export const reportMetricSchema = z.enum(REPORT_METRICS, { error: `Metric must be one of ${REPORT_METRICS.join(", ")}.` });

const idSchema = (what: string) =>
  z
    .string({ error: `${what} is required.` })
    .min(1, `${what} is required.`)
    .max(64, `${what} is not valid.`);

export const reportTitleSchema = cleanText(
  z.string({ error: "Title is required." }).trim().min(1, "Title is required.").max(200, "Title must be at most 200 characters."),
  "Title",
);
export const audienceNoteSchema = cleanText(
  z.string({ error: "Audience note must be text." }).trim().max(2000, "Audience note must be at most 2000 characters."),
  "Audience note",
  { multiline: true },
);

/** POST /api/teams/[teamId]/reports: compose and freeze a report. */
export const composeReportSchema = z
  .object({
    baselineId: idSchema("Baseline"),
    scenarioIds: z
      .array(idSchema("Scenario"), { error: "Pick 2 to 4 scenarios." })
      .min(2, "Pick at least 2 scenarios.")
      .max(4, "Pick at most 4 scenarios.")
      .refine((ids) => new Set(ids).size === ids.length, "Each scenario can appear only once."),
    title: reportTitleSchema,
    audienceNote: audienceNoteSchema.optional().default(""),
    classNames: z
      .array(classNameSchema)
      .min(1, "Pick at least one class, or leave the choice out for all classes.")
      .max(50, "Pick at most 50 classes.")
      .refine((n) => new Set(n).size === n.length, "Each class can appear only once.")
      .optional(),
    metrics: z
      .array(reportMetricSchema)
      .min(1, "Pick at least one metric.")
      .refine((m) => new Set(m).size === m.length, "Each metric can appear only once.")
      .optional(),
    /** Roadmaps (issue 14) of the team on the same baseline, frozen beside the scenarios: 0 to MAX_REPORT_ROADMAPS. */
    roadmapIds: z
      .array(idSchema("Roadmap"), { error: "roadmapIds must be a list of roadmap ids." })
      .max(3, "Pick at most 3 roadmaps.")
      .refine((ids) => new Set(ids).size === ids.length, "Each roadmap can appear only once.")
      .optional(),
    /** The "Layer shaping" section (issue 15): present = include it, for this objective. */
    shaping: composeShapingSchema.optional(),
  })
  .strict();
/** Roadmaps one report freezes at most (a chain and up to two alternative branches). */
export const MAX_REPORT_ROADMAPS = 3;
export type ComposeReport = z.infer<typeof composeReportSchema>;

export const SHARE_LINK_DEFAULT_DAYS = 14;
export const SHARE_LINK_MAX_DAYS = 90;
const expiresInDaysSchema = z
  .number({ error: "Expiry must be a whole number of days." })
  .int("Expiry must be a whole number of days.")
  .min(1, "Expiry must be at least 1 day.")
  .max(SHARE_LINK_MAX_DAYS, `Expiry must be at most ${SHARE_LINK_MAX_DAYS} days.`);

/** POST /api/reports/[id]/share-links. */
export const createShareLinkSchema = z
  .object({ expiresInDays: expiresInDaysSchema.optional().default(SHARE_LINK_DEFAULT_DAYS) })
  .strict()
  .optional()
  .transform((v) => v ?? { expiresInDays: SHARE_LINK_DEFAULT_DAYS });

export const EMAIL_MAX_RECIPIENTS = 20;

/** POST /api/reports/[id]/email: send a short summary and a (new) share link. */
export const emailReportSchema = z
  .object({
    to: z
      .array(
        z
          .string()
          .trim()
          .toLowerCase()
          .pipe(z.email({ error: (iss) => `"${String(iss.input)}" is not an e-mail address.` })),
        {
          error: "List the addresses to send to.",
        },
      )
      .min(1, "Add at least one address.")
      .max(EMAIL_MAX_RECIPIENTS, `Send to at most ${EMAIL_MAX_RECIPIENTS} addresses at a time.`),
    message: cleanText(z.string().trim().max(1000, "The message must be at most 1000 characters."), "Message", { multiline: true }).optional().default(""),
    expiresInDays: expiresInDaysSchema.optional().default(SHARE_LINK_DEFAULT_DAYS),
  })
  .strict();
export type EmailReport = z.infer<typeof emailReportSchema>;

// ---------------------------------------------------------------------------------------------
// The frozen report document (reports.frozen). Validated before it is stored and on every read.
// Each part that stores an engine value mirrors its type from lib/scaling exactly (`mirrorOf`): the schema lists
// every field of the engine type and parses to it, so an engine change breaks the build here rather than letting
// a report be stored unchecked. Where a stored document legitimately differs from the engine type it is written
// down: JSON has no NaN or Infinity, so `freezeReport` stores non-finite numbers as null (a ratio of 0/0), and the
// share view leaves out source ids. Unknown keys are dropped on parse.

const num = z.number();
const level = z.enum(MODEL_LEVELS as [ModelLevel, ...ModelLevel[]]);
const tier = z.enum(TIERS as [Tier, ...Tier[]]);
const lengthBinSchema = mirrorOf<LengthBin>()(z.object({ lengthM: num, count: num }));
const delayModel = z.enum(DELAY_MODELS as [DelayModel, ...DelayModel[]]);

const metalOverrideSnapshotSchema = mirrorOf<MetalOverride>()(
  z.object({
    resistivityOhmM: num.optional(),
    tempCoeffPerK: num.optional(),
    meanFreePathM: num.optional(),
    specularity: num.optional(),
    grainReflection: num.optional(),
    steinhoglC: num.optional(),
  }),
);

/** The engine's Technology; the engine 2 settings are optional there too (absent = the engine's default). */
export const technologySnapshotSchema = mirrorOf<Technology>()(
  z.object({
    supplyV: num,
    clockHz: num,
    repeaterR0Ohm: num,
    repeaterC0F: num,
    delayBudgetS: num,
    delayModel: delayModel.optional(),
    capacitanceModel: z.enum(CAPACITANCE_CHOICES as [CapacitanceChoice, ...CapacitanceChoice[]]).optional(),
    temperatureC: num.optional(),
    minRepeaterGain: num.optional(),
    repeaterOutputCRatio: num.optional(),
    repeaterAreaM2: num.optional(),
    repeaterLeakageW: num.optional(),
    materials: z.record(z.string(), metalOverrideSnapshotSchema).optional(),
    materialsSource: z.string().optional(),
  }),
);

/** An air gap between the lines (issue 11); settings, overrides and classes frozen before it have none. */
const airGapSnapshotSchema = mirrorOf<AirGap>()(z.object({ kGap: num, gapFraction: num }));
const lengthRuleSnapshotSchema = mirrorOf<LengthRule>()(
  z.discriminatedUnion("kind", [
    z.object({ kind: z.literal("follows-s") }),
    z.object({ kind: z.literal("fixed") }),
    z.object({ kind: z.literal("factor"), sL: num }),
    z.object({ kind: z.literal("power"), exponent: num }),
  ]),
);

export const classOverrideSnapshotSchema = mirrorOf<ClassOverride>()(
  z.object({
    s: num.optional(),
    sL: num.optional(),
    k: num.optional(),
    metal: z.string().optional(),
    barrierScales: z.boolean().optional(),
    aspectRatio: num.optional(),
    lineFraction: num.optional(),
    miller: num.optional(),
    barrierM: num.optional(),
    airGap: airGapSnapshotSchema.nullable().optional(),
    lengthRule: lengthRuleSnapshotSchema.optional(),
  }),
);

export const settingsSnapshotSchema = mirrorOf<ScenarioSettings>()(
  z.object({
    s: num,
    sL: num,
    level,
    barrierScales: z.boolean(),
    miller: num,
    deviceRFactor: num,
    deviceCFactor: num,
    supplyV: num,
    k: num.nullable(),
    metal: z.string().nullable(),
    airGap: airGapSnapshotSchema.nullable().optional(),
    lengthRule: lengthRuleSnapshotSchema.optional(),
    temperatureC: num.optional(),
    overrides: z.record(z.string(), classOverrideSnapshotSchema),
  }),
);

/**
 * The relative settings of a roadmap step as frozen (issue 14, lib/scaling/roadmap.ts RoadmapStepSettings): any
 * scenario setting, all optional, and per class a target pitch besides the override's fields.
 */
export const roadmapStepSettingsSnapshotSchema = mirrorOf<RoadmapStepSettings>()(
  settingsSnapshotSchema
    .omit({ overrides: true })
    .partial()
    .extend({ overrides: z.record(z.string(), mirrorOf<RoadmapClassStep>()(classOverrideSnapshotSchema.extend({ targetPitchM: num.optional() }))).optional() }),
);

/** A baseline class as frozen: the engine's WireClass plus the size of its stored histogram (kept when the bins were not). */
export const wireClassSnapshotSchema = mirrorOf<WireClass & { histogramBins?: number }>()(
  z.object({
    name: z.string(),
    tier,
    widthM: num,
    thicknessM: num,
    spacingM: num,
    ildBelowM: num.nullable(),
    ildAboveM: num.nullable(),
    barrierM: num,
    metal: z.string(),
    k: num,
    netCount: num,
    meanLengthM: num,
    driverOhm: num,
    loadF: num,
    activity: num,
    histogram: z.array(lengthBinSchema).optional(),
    viasPerNet: num.optional(),
    viaOhm: num.optional(),
    viaWidthM: num.optional(),
    viaHeightM: num.optional(),
    kGap: num.optional(),
    gapFraction: num.optional(),
    /** Bins in the stored histogram (also when the bins themselves were too many to freeze). */
    histogramBins: num.optional(),
  }),
);

/** `value` is null when the quantity was not finite. */
const validityFlagSchema = mirrorOf<NullableFields<ValidityFlag, "value">>()(
  z.object({
    model: z.string(),
    quantity: z.string(),
    value: num.nullable(),
    min: num.nullable(),
    max: num.nullable(),
    message: z.string(),
  }),
);

// Result fields added by engine 2.0.0: reports frozen by engine 1.x lack them (optional here), reports frozen since carry them.
type Engine2RepeaterFields = "inserted" | "stageCount" | "unrepeatedDelayS";
type Engine2ClassFields =
  | "temperatureC"
  | "delayModel"
  | "viaOhm"
  | "repeaterCount"
  | "repeaterSize"
  | "repeatedDelayS"
  | "stageCount"
  | "repeaterAreaM2"
  | "repeaterEnergyJ"
  | "totalRepeaterAreaM2"
  | "repeaterPowerW"
  // engine 2.2.0
  | "airGap";
type Engine2TotalsFields = "repeaterAreaM2" | "repeaterPowerW" | "repeaterPowerShare";

/**
 * Reports frozen before engine 2.1 name the coupling parts `couplingFPerM` (Miller × both neighbours) and
 * `couplingPerNeighbourFPerM` (Maxwell, one neighbour); they read as couplingMillerFPerM and couplingEachFPerM.
 */
function renameOldCouplingFields(v: unknown): unknown {
  if (typeof v !== "object" || v === null || Array.isArray(v)) return v;
  const { couplingFPerM, couplingPerNeighbourFPerM, ...rest } = v as Record<string, unknown>;
  return {
    ...rest,
    ...(rest.couplingMillerFPerM === undefined && couplingFPerM !== undefined ? { couplingMillerFPerM: couplingFPerM } : {}),
    ...(rest.couplingEachFPerM === undefined && couplingPerNeighbourFPerM !== undefined ? { couplingEachFPerM: couplingPerNeighbourFPerM } : {}),
  };
}

const capacitanceSchema = z.preprocess(
  renameOldCouplingFields,
  // effectiveK: engine 2.2 (reports frozen before it have none)
  mirrorOf<OptionalFields<ClassCapacitance, "effectiveK">>()(
    z.object({
      areaFPerM: num,
      fringeFPerM: num,
      couplingMillerFPerM: num,
      couplingEachFPerM: num,
      totalFPerM: num,
      model: z.enum(["ideal", "fringe", "coupled", "accurate", "field"] satisfies CapacitanceModel[]),
      effectiveK: mirrorOf<EffectiveK>()(z.object({ miller0: num, miller1: num, miller2: num })).optional(),
    }),
  ),
);
const _capacitanceModels: Same<CapacitanceModel, z.output<typeof capacitanceSchema>["model"]> = true;

const repeaterSchema = mirrorOf<OptionalFields<RepeaterResult, Engine2RepeaterFields>>()(
  z.object({
    inserted: num.optional(),
    stageCount: num.optional(),
    unrepeatedDelayS: num.optional(),
    count: num,
    size: num,
    delayS: num,
    delayPerMS: num,
    criticalLengthM: num,
  }),
);

type DistributionBin = DistributionResult["bins"][number];
const distributionSchema = mirrorOf<
  Omit<OptionalFields<DistributionResult, "totalRepeaterSize">, "bins"> & { bins: OptionalFields<DistributionBin, "repeaterSize">[] }
>()(
  z.object({
    bins: z.array(
      mirrorOf<OptionalFields<DistributionBin, "repeaterSize">>()(
        z.object({ lengthM: num, count: num, delayS: num, repeaters: num, repeaterSize: num.optional() }),
      ),
    ),
    totalNets: num,
    shareOverBudget: num,
    totalRepeaters: num,
    meanDelayS: num,
    totalCapacitanceF: num,
    totalRepeaterSize: num.optional(),
    source: z.enum(["histogram", "mean"]),
  }),
);
const _distributionSources: Same<DistributionResult["source"], z.output<typeof distributionSchema>["source"]> = true;

/**
 * One class at one scenario: the engine's ClassResult (validity values may be null, see validityFlagSchema; the
 * engine 2 fields are optional for reports frozen by engine 1.x, and the parts carry the old shapes too).
 */
const classResultSchema = mirrorOf<
  Omit<OptionalFields<ClassResult, Engine2ClassFields>, "validity" | "capacitance" | "repeaters" | "distribution"> & {
    validity: z.output<typeof validityFlagSchema>[];
    capacitance: z.output<typeof capacitanceSchema>;
    repeaters: z.output<typeof repeaterSchema>;
    distribution: z.output<typeof distributionSchema>;
  }
>()(
  z.object({
    name: z.string(),
    tier,
    widthM: num,
    thicknessM: num,
    spacingM: num,
    ildBelowM: num.nullable(),
    ildAboveM: num.nullable(),
    barrierM: num,
    pitchM: num,
    lengthM: num,
    metal: z.string(),
    k: num,
    airGap: airGapSnapshotSchema.nullable().optional(),
    resistivityOhmM: num,
    rOhmPerM: num,
    capacitance: capacitanceSchema,
    cFPerM: num,
    rOhm: num,
    cF: num,
    rcS: num,
    intrinsicDelayS: num,
    delayS: num,
    elmoreS: num,
    repeaters: repeaterSchema,
    driverOhm: num,
    loadF: num,
    energyJ: num,
    totalEnergyJ: num,
    powerW: num,
    temperatureC: num.optional(),
    delayModel: delayModel.optional(),
    viaOhm: num.optional(),
    repeaterCount: num.optional(),
    repeaterSize: num.optional(),
    repeatedDelayS: num.optional(),
    stageCount: num.optional(),
    repeaterAreaM2: num.optional(),
    repeaterEnergyJ: num.optional(),
    totalRepeaterAreaM2: num.optional(),
    repeaterPowerW: num.optional(),
    distribution: distributionSchema,
    validity: z.array(validityFlagSchema),
    accuracy: z.record(z.string(), z.string()),
  }),
);

/** Ratios can be 0/0 or x/0 in odd inputs; JSON stores those as null. */
const ratioNum = num.nullable();
const classRatioSchema = mirrorOf<NullableFields<ClassRatio, keyof ClassRatio>>()(
  z.object({
    rOhmPerM: ratioNum,
    cFPerM: ratioNum,
    rOhm: ratioNum,
    cF: ratioNum,
    rcS: ratioNum,
    delayS: ratioNum,
    repeaters: ratioNum,
    energyJ: ratioNum,
  }),
);

type FrozenResult = z.output<typeof classResultSchema>;
const classComparisonSchema = mirrorOf<
  Omit<ClassComparison, "baseline" | "scenario" | "ratio"> & {
    baseline: FrozenResult;
    scenario: FrozenResult;
    ratio: z.output<typeof classRatioSchema>;
  }
>()(
  z.object({
    name: z.string(),
    baseline: classResultSchema,
    scenario: classResultSchema,
    ratio: classRatioSchema,
  }),
);

type Totals = OptionalFields<Evaluation["totals"]["baseline"], Engine2TotalsFields>;
const totalsSchema = mirrorOf<Totals>()(
  z.object({
    capacitanceF: num,
    energyJ: num,
    powerW: num,
    repeaters: num,
    worstDelayS: num,
    meanDelayS: num,
    repeaterAreaM2: num.optional(),
    repeaterPowerW: num.optional(),
    repeaterPowerShare: num.optional(),
  }),
);

/** An option's Evaluation as frozen (ratios and validity values may be null, engine 2 fields optional, see above). */
export const evaluationSnapshotSchema = mirrorOf<
  Omit<Evaluation, "classes" | "totals"> & { classes: z.output<typeof classComparisonSchema>[]; totals: { baseline: Totals; scenario: Totals } }
>()(
  z.object({
    engineVersion: z.string(),
    level,
    classes: z.array(classComparisonSchema),
    totals: mirrorOf<{ baseline: Totals; scenario: Totals }>()(z.object({ baseline: totalsSchema, scenario: totalsSchema })),
  }),
);

/** A sweep point; `flags` (engine 2, every point) are absent in reports frozen by engine 1.x. */
const sweepPointSchema = mirrorOf<Omit<SweepPoint, "flags"> & { flags?: z.output<typeof validityFlagSchema>[] }>()(
  z.object({ x: num, y: num, flags: z.array(validityFlagSchema).optional() }),
);
const sweepMetricSchema = z.enum(["delay", "rc", "r", "c"] satisfies SweepMetric[]);
const sweepVariableSchema = z.enum(["s", "sL", "k"] satisfies SweepVariable[]);
const _sweepMetrics: Same<SweepMetric, z.output<typeof sweepMetricSchema>> = true;
const _sweepVariables: Same<SweepVariable, z.output<typeof sweepVariableSchema>> = true;

const sweepSeriesSchema = z.object({
  /** Option key ("A".."D") or "reference" for the first option without size effects. */
  key: z.string(),
  label: z.string(),
  level,
  points: z.array(sweepPointSchema),
});

export const frozenSweepSchema = z.object({
  className: z.string(),
  metric: sweepMetricSchema,
  variable: sweepVariableSchema,
  from: num,
  to: num,
  series: z.array(sweepSeriesSchema),
  /** Where each option sits on the curve (its own S and result). */
  marks: z.array(z.object({ key: z.string(), x: num, y: num })),
  /**
   * What the wire length does while S moves (issue 13 item 6): "follow" (S_L = S, the class's lengths shrink with the
   * section) or "fixed" (S_L = 1), or (issue 14) the class's factor or power-law LengthRule applied at every S.
   * Absent in reports frozen before: those kept the scenario's S_L.
   */
  lengthRule: z.union([z.enum(["follow", "fixed"]), lengthRuleSnapshotSchema]).optional(),
});

export const frozenOptionSchema = z.object({
  /** "A", "B", … in the order the scenarios were picked. */
  key: z.string().regex(/^[A-Z]$/),
  /** Source scenario id; left out of the share-link view. */
  scenarioId: z.string().optional(),
  name: z.string(),
  notes: z.string(),
  version: z.number().int(),
  settings: settingsSnapshotSchema,
  evaluation: evaluationSnapshotSchema,
});

/**
 * A roadmap step as frozen (issue 14): the step as entered (`settings` relative to the step before, as the roadmap
 * stores it), the composed absolute settings against N0 and the evaluation against N0. `fromScenarioId` is left out of
 * the share-link view.
 */
export const frozenRoadmapStepSchema = z.object({
  name: z.string(),
  fromScenarioId: z.string().optional(),
  settings: roadmapStepSettingsSnapshotSchema,
  composed: settingsSnapshotSchema,
  evaluation: evaluationSnapshotSchema,
});

/** A roadmap as frozen in a report: its steps N1 … in order (N0 is the report's baseline). */
export const frozenRoadmapSchema = z.object({
  /** "R1", "R2", … in the order the roadmaps were picked. */
  key: z.string().regex(/^R[1-9]$/),
  /** Source roadmap id; left out of the share-link view. */
  roadmapId: z.string().optional(),
  name: z.string(),
  version: z.number().int(),
  steps: z.array(frozenRoadmapStepSchema).min(1),
});

export const FROZEN_SCHEMA_VERSION = 1;

export const frozenReportSchema = z.object({
  schemaVersion: z.literal(FROZEN_SCHEMA_VERSION),
  createdAt: z.number().int(),
  engineVersion: z.string(),
  modelLevels: z.array(level),
  baseline: z.object({
    /** Source baseline id; left out of the share-link view. */
    id: z.string().optional(),
    name: z.string(),
    description: z.string(),
    version: z.number().int(),
    technology: technologySnapshotSchema,
    classes: z.array(wireClassSnapshotSchema),
  }),
  options: z.array(frozenOptionSchema).min(1).max(4),
  classNames: z.array(z.string()),
  metrics: z.array(reportMetricSchema),
  sweeps: z.array(frozenSweepSchema),
  /** Histogram bins were dropped from the frozen results (too many to keep); totals were computed with them. */
  binsTrimmed: z.boolean(),
  /** Roadmaps frozen beside the options (issue 14); absent when the report names none (and in reports frozen before). */
  roadmaps: z.array(frozenRoadmapSchema).max(3).optional(),
  /** The "Layer shaping" section (issue 15); absent when not asked for (and in reports frozen before). */
  shaping: frozenShapingSchema.optional(),
});
export type FrozenReport = z.infer<typeof frozenReportSchema>;
export type FrozenOption = z.infer<typeof frozenOptionSchema>;
export type FrozenSweep = z.infer<typeof frozenSweepSchema>;
export type FrozenRoadmap = z.infer<typeof frozenRoadmapSchema>;
export type FrozenClassResult = z.infer<typeof classResultSchema>;

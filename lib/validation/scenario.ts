import { z } from "zod";
import {
  MAX_LENGTH_RULE_EXPONENT,
  MODEL_LEVELS,
  type AirGap,
  type ClassOverride,
  type LengthRule,
  type ModelLevel,
  type ScenarioSettings,
} from "@/lib/scaling/client";
import { mirrorOf, type OptionalFields } from "./mirror";
import { cleanText, withoutProtoKey } from "./text";
import { airGapKSchema, classNameSchema, gapFractionSchema, kSchema, metalIdSchema, quantity } from "./wire-class";

export const sSchema = (label: string) =>
  quantity(label, "", {
    min: 0,
    minExclusive: true,
    minHint: `${label} must be greater than 0.`,
    max: 20,
    maxHint: `${label} must be at most 20.`,
  });
export const millerSchema = quantity("Miller factor", "", {
  min: 0,
  minHint: "Miller factor must be between 0 and 2.",
  max: 2,
  maxHint: "Miller factor must be between 0 and 2.",
});
export const factorSchema = (label: string) => quantity(label, "", { min: 0, minExclusive: true, max: 10, maxHint: `${label} must be at most 10.` });
export const aspectSchema = quantity("Aspect ratio", "", { min: 0, minExclusive: true, max: 10, maxHint: "Aspect ratio must be at most 10." });

/** Line fraction W/pitch of a per-class override (the design-space optimiser's result). */
export const lineFractionSchema = quantity("Line fraction", "", {
  min: 0,
  minExclusive: true,
  max: 1,
  maxExclusive: true,
  maxHint: "Line fraction (width ÷ pitch) must be between 0 and 1.",
});

export const supplySchema = quantity("Supply voltage", "V", {
  min: 0,
  minExclusive: true,
  max: 5,
  maxHint: "Supply voltage must be at most 5 V.",
});

export const levelSchema = z.enum(MODEL_LEVELS as [ModelLevel, ...ModelLevel[]], {
  error: `Model level must be one of ${MODEL_LEVELS.join(", ")}.`,
});

/**
 * The engine's AirGap: both fields required, no others. null (on the settings: no global gap; on an override: this
 * class has none) and absent are told apart by the fields that use it.
 */
export const airGapSchema = mirrorOf<AirGap>()(
  z
    .object(
      {
        kGap: airGapKSchema.optional().pipe(z.number({ error: "Air-gap k is required (1 for air)." })),
        gapFraction: gapFractionSchema.optional().pipe(z.number({ error: "Gap fraction is required (1 = the whole line thickness)." })),
      },
      { error: (iss) => (iss.code === "invalid_type" ? "Air gap must be an object { kGap, gapFraction }, or null for none." : undefined) },
    )
    .strict(),
);

/**
 * The engine's LengthRule: { kind: "follows-s" } (S_L = S), { kind: "fixed" } (S_L = 1), { kind: "factor", sL }
 * (S_L = sL > 0) or { kind: "power", exponent } (S_L = S^exponent, 0 ≤ exponent ≤ 2). An exponent outside 0–2 is a 400
 * naming `…lengthRule.exponent`.
 */
export const lengthRuleSchema = mirrorOf<LengthRule>()(
  z.discriminatedUnion(
    "kind",
    [
      z.object({ kind: z.literal("follows-s") }).strict(),
      z.object({ kind: z.literal("fixed") }).strict(),
      z
        .object({
          kind: z.literal("factor"),
          sL: sSchema("Length factor S_L")
            .optional()
            .pipe(z.number({ error: "Length factor S_L is required for a factor rule." })),
        })
        .strict(),
      z
        .object({
          kind: z.literal("power"),
          exponent: quantity("Length-rule exponent", "", {
            min: 0,
            minHint: `Length-rule exponent must be between 0 and ${MAX_LENGTH_RULE_EXPONENT}.`,
            max: MAX_LENGTH_RULE_EXPONENT,
            maxHint: `Length-rule exponent must be between 0 and ${MAX_LENGTH_RULE_EXPONENT}.`,
          })
            .optional()
            .pipe(z.number({ error: "Length-rule exponent is required for a power rule (S_L = S^exponent)." })),
        })
        .strict(),
    ],
    { error: 'Length rule must be { "kind": "follows-s" | "fixed" | "factor" (with "sL") | "power" (with "exponent") }.' },
  ),
);

/** Operating temperature of a scenario, °C (absent = the technology's). */
export const scenarioTemperatureSchema = quantity("Operating temperature", "", {
  min: -273.15,
  minHint: "Operating temperature must be above −273.15 °C (absolute zero).",
  max: 400,
  maxHint: "Operating temperature must be at most 400 °C.",
});

/** The engine's ClassOverride, field for field. */
export const classOverrideSchema = mirrorOf<ClassOverride>()(
  z
    .object({
      s: sSchema("S").optional(),
      sL: sSchema("S_L").optional(),
      k: kSchema.optional(),
      metal: metalIdSchema.optional(),
      barrierScales: z.boolean().optional(),
      aspectRatio: aspectSchema.optional(),
      lineFraction: lineFractionSchema.optional(),
      miller: millerSchema.optional(),
      barrierM: quantity("Barrier", "m", { min: 0, max: 1e-6, maxHint: "Barrier must be at most 1 µm." }).optional(),
      airGap: airGapSchema.nullable().optional(),
      lengthRule: lengthRuleSchema.optional(),
    })
    .strict(),
);

/**
 * The engine's ScenarioSettings, field for field. Missing fields take defaults; supplyV may be left out and then
 * defaults to the baseline's technology (server side, lib/workspace/settings.ts).
 */
export const scenarioSettingsSchema = mirrorOf<OptionalFields<ScenarioSettings, "supplyV">>()(
  z
    .object({
      s: sSchema("S").default(1),
      sL: sSchema("S_L").default(1),
      level: levelSchema.default("full"),
      barrierScales: z.boolean().default(false),
      miller: millerSchema.default(1),
      deviceRFactor: factorSchema("Device R factor").default(1),
      deviceCFactor: factorSchema("Device C factor").default(1),
      supplyV: supplySchema.optional(),
      k: kSchema.nullable().default(null),
      metal: metalIdSchema.nullable().default(null),
      airGap: airGapSchema.nullable().optional(),
      lengthRule: lengthRuleSchema.optional(),
      temperatureC: scenarioTemperatureSchema.optional(),
      overrides: withoutProtoKey(z.record(classNameSchema, classOverrideSchema), "Overrides").default({}),
    })
    .strict(),
);
export type ScenarioSettingsInput = z.infer<typeof scenarioSettingsSchema>;

export const nameSchema = cleanText(
  z.string({ error: "Name is required." }).trim().min(1, "Name is required.").max(100, "Name must be at most 100 characters."),
  "Name",
);
const notesSchema = cleanText(z.string().max(10_000, "Notes must be at most 10 000 characters."), "Notes", { multiline: true });
export const versionSchema = z.number({ error: "version is required (the version you loaded)." }).int().min(1);

export const scenarioCreateSchema = z.object({
  baselineId: z.string({ error: "Baseline is required." }).min(1, "Baseline is required.").max(64),
  name: nameSchema,
  notes: notesSchema.optional().default(""),
  settings: scenarioSettingsSchema.optional(),
});
export type ScenarioCreate = z.infer<typeof scenarioCreateSchema>;

export const scenarioPatchSchema = z.object({
  version: versionSchema,
  name: nameSchema.optional(),
  notes: notesSchema.optional(),
  settings: scenarioSettingsSchema.optional(),
});
export type ScenarioPatch = z.infer<typeof scenarioPatchSchema>;

export const scenarioRestoreSchema = z.object({
  revisionId: z.number({ error: "revisionId is required." }).int().positive(),
  version: versionSchema,
});

/** Body of POST /api/scenarios/[id]/duplicate (optional): the copy's name; without one, a free "X (copy)". */
export const scenarioDuplicateSchema = z
  .object({ name: nameSchema.optional() })
  .strict()
  .optional()
  .transform((v) => v ?? {});

/** Body of POST /api/scenarios/[id]/evaluate: optional unsaved settings. */
export const scenarioEvaluateSchema = z
  .object({ settings: scenarioSettingsSchema.optional() })
  .optional()
  .transform((v) => v ?? {});

export const SCENARIO_JSON_LIMIT = 64 * 1024;

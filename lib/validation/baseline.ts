import { z } from "zod";
import {
  CAPACITANCE_CHOICES,
  DELAY_MODELS,
  getMetal,
  type CapacitanceChoice,
  METALS,
  type DelayModel,
  type MetalOverride,
  type Technology,
} from "@/lib/scaling/client";
import { mirrorOf } from "./mirror";
import { cleanText, withoutProtoKey } from "./text";
import { quantity, wireClassListSchema } from "./wire-class";

export const capacitanceModelSchema = z.enum(CAPACITANCE_CHOICES as [CapacitanceChoice, ...CapacitanceChoice[]], {
  error: `Capacitance model must be one of ${CAPACITANCE_CHOICES.join(", ")}.`,
});

export const delayModelSchema = z.enum(DELAY_MODELS as [DelayModel, ...DelayModel[]], { error: `Delay model must be one of ${DELAY_MODELS.join(", ")}.` });

/** Per-metal overrides of the materials catalogue (SI), with the engine's ranges (checkMetalOverride). */
export const metalOverrideSchema = mirrorOf<MetalOverride>()(
  z
    .object({
      resistivityOhmM: quantity("Resistivity", "", {
        min: 0,
        minExclusive: true,
        max: 1e-4,
        maxExclusive: true,
        maxHint: "Resistivity must be below 1e-4 Ω·m.",
      }).optional(),
      tempCoeffPerK: quantity("Temperature coefficient", "", { min: 0, max: 0.02, maxHint: "Temperature coefficient must be at most 0.02 /K." }).optional(),
      meanFreePathM: quantity("Mean free path", "m", { min: 0, minExclusive: true, max: 1e-6, maxHint: "Mean free path must be at most 1 µm." }).optional(),
      specularity: quantity("Specularity", "", { min: 0, max: 1, maxExclusive: true, maxHint: "Specularity must be from 0 to less than 1." }).optional(),
      grainReflection: quantity("Grain reflection", "", {
        min: 0,
        max: 1,
        maxExclusive: true,
        maxHint: "Grain reflection must be from 0 to less than 1.",
      }).optional(),
      steinhoglC: quantity("Steinhögl C", "", { min: 0, max: 10 }).optional(),
    })
    .strict(),
);

export const materialsSchema = withoutProtoKey(z.record(z.string(), metalOverrideSchema), "Materials").superRefine((m, ctx) => {
  for (const id of Object.keys(m)) {
    try {
      getMetal(id);
    } catch {
      ctx.addIssue({ code: "custom", path: [id], message: `Materials: "${id}" is not a metal of the catalogue (one of ${Object.keys(METALS).join(", ")}).` });
    }
  }
});

/** Technology shared by a baseline's classes (the engine's Technology, field for field), SI or strings with units. */
export const technologySchema = mirrorOf<Technology>()(
  z.object({
    supplyV: quantity("Supply voltage", "V", { min: 0, minExclusive: true, max: 5, maxHint: "Supply voltage must be at most 5 V." }),
    clockHz: quantity("Clock", "Hz", { min: 0, minExclusive: true, max: 100e9, maxHint: "Clock must be at most 100 GHz." }),
    repeaterR0Ohm: quantity("Repeater R0", "ohm", { min: 0, minExclusive: true, max: 1e7 }),
    repeaterC0F: quantity("Repeater C0", "F", { min: 0, minExclusive: true, max: 1e-12, maxHint: "Repeater C0 must be at most 1 pF." }),
    delayBudgetS: quantity("Delay budget", "s", { min: 0, minExclusive: true, max: 1e-6, maxHint: "Delay budget must be at most 1 µs." }),
    // Engine 2 settings, all optional (absent = the engine's default); the ranges are the engine's own (checkTechnology).
    delayModel: delayModelSchema.optional(),
    capacitanceModel: capacitanceModelSchema.optional(),
    temperatureC: quantity("Operating temperature", "", {
      min: -273.15,
      minExclusive: true,
      minHint: "Operating temperature must be above −273.15 °C (absolute zero).",
      max: 400,
      maxHint: "Operating temperature must be at most 400 °C.",
    }).optional(),
    minRepeaterGain: quantity("Minimum repeater gain", "", {
      min: 0,
      max: 1,
      maxExclusive: true,
      maxHint: "Minimum repeater gain must be a share from 0 to less than 1 (0.1 = 10%).",
    }).optional(),
    repeaterOutputCRatio: quantity("Repeater output-capacitance ratio", "", { min: 0, max: 10 }).optional(),
    repeaterAreaM2: quantity("Repeater area", "", { min: 0, max: 1e-6, maxHint: "Repeater area must be at most 1 mm² (1e-6 m²)." }).optional(),
    repeaterLeakageW: quantity("Repeater leakage", "W", { min: 0, max: 1, maxHint: "Repeater leakage must be at most 1 W." }).optional(),
    materials: materialsSchema.optional(),
    materialsSource: cleanText(
      z.string({ error: "Materials source must be text." }).trim().max(300, "Materials source must be at most 300 characters."),
      "Materials source",
      { multiline: true },
    )
      .optional()
      .transform((v) => (v === "" ? undefined : v)),
  }),
);
export type TechnologyInput = z.infer<typeof technologySchema>;

export const baselineNameSchema = cleanText(
  z.string({ error: "Name is required." }).trim().min(1, "Name is required.").max(100, "Name must be at most 100 characters."),
  "Name",
);
const descriptionSchema = cleanText(z.string().trim().max(2000, "Description must be at most 2000 characters."), "Description", { multiline: true });
const versionSchema = z.number({ error: "version is required (the version you loaded)." }).int().min(1);

export const baselineCreateSchema = z.object({
  name: baselineNameSchema,
  description: descriptionSchema.optional().default(""),
  technology: technologySchema.optional(),
  classes: wireClassListSchema.optional().default([]),
});
export type BaselineCreate = z.infer<typeof baselineCreateSchema>;

export const baselinePatchSchema = z.object({
  version: versionSchema,
  name: baselineNameSchema.optional(),
  description: descriptionSchema.optional(),
  technology: technologySchema.optional(),
});
export type BaselinePatch = z.infer<typeof baselinePatchSchema>;

/** PUT /api/baselines/[id]/classes: replace all classes; rows with a known `id` keep it (and their histogram). */
export const classesPutSchema = z.object({
  version: versionSchema,
  classes: wireClassListSchema,
});
export type ClassesPut = z.infer<typeof classesPutSchema>;

export const baselineDuplicateSchema = z.object({
  name: baselineNameSchema.optional(),
});

/** One measured line of POST /api/baselines/[id]/fit: resistance per length of a class at its baseline geometry. */
export const measuredLineSchema = z
  .object({
    class: z.string({ error: "Class is required (the name of a class of the baseline)." }).trim().min(1, "Class is required."),
    rOhmPerUm: z
      .number({ error: "Measured resistance must be a number in Ω/µm." })
      .refine((v) => Number.isFinite(v), "Measured resistance must be a finite number.")
      .refine((v) => v > 0, "Measured resistance must be greater than 0 Ω/µm.")
      .refine((v) => v < 1e9, "Measured resistance must be below 1e9 Ω/µm."),
    temperatureC: quantity("Measurement temperature", "", {
      min: -273.15,
      minExclusive: true,
      minHint: "Measurement temperature must be above −273.15 °C (absolute zero).",
      max: 400,
      maxHint: "Measurement temperature must be at most 400 °C.",
    }).optional(),
  })
  .strict();

/**
 * POST /api/baselines/[id]/fit: measured lines (1–50) and optionally the technology to start from (the editor's
 * unsaved one; default: the stored baseline's). Nothing is stored: applying the fit is a PATCH of `technology.materials`.
 */
export const fitRequestSchema = z
  .object({
    measured: z.array(measuredLineSchema, { error: "measured must be a list of measured lines." }).min(1, "Enter at least one measured line.").max(50),
    technology: technologySchema.optional(),
  })
  .strict();
export type FitRequest = z.infer<typeof fitRequestSchema>;

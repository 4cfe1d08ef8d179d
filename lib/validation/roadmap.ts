import { z } from "zod";
import { MAX_ROADMAP_STEPS, type RoadmapClassStep, type RoadmapStep, type RoadmapStepSettings } from "@/lib/scaling/client";
import { mirrorOf } from "./mirror";
import { withoutProtoKey } from "./text";
import { classNameSchema, kSchema, metalIdSchema, quantity } from "./wire-class";
import {
  airGapSchema,
  classOverrideSchema,
  factorSchema,
  lengthRuleSchema,
  levelSchema,
  millerSchema,
  nameSchema,
  scenarioTemperatureSchema,
  sSchema,
  supplySchema,
  versionSchema,
} from "./scenario";

/** Target pitch (width + spacing) of a class at a step: more than 0, at most 1 mm. */
const targetPitchSchema = quantity("Target pitch", "m", {
  min: 0,
  minExclusive: true,
  minHint: "Target pitch must be greater than 0.",
  max: 1e-3,
  maxHint: "Target pitch must be at most 1 mm.",
});

/**
 * One class at one step (the engine's RoadmapClassStep): a scenario's class override, relative to the previous step,
 * or a target pitch instead of `s`. Both `s` and `targetPitchM` → an issue at `targetPitchM`.
 */
export const roadmapClassStepSchema = mirrorOf<RoadmapClassStep>()(
  classOverrideSchema
    .extend({ targetPitchM: targetPitchSchema.optional() })
    .strict()
    .superRefine((o, ctx) => {
      if (o.s !== undefined && o.targetPitchM !== undefined)
        ctx.addIssue({
          code: "custom",
          path: ["targetPitchM"],
          message: "Give either S or a target pitch for a class, not both (S follows from the target pitch).",
        });
    }),
);

/**
 * A step's settings (the engine's RoadmapStepSettings): any setting a scenario takes, every one optional and without
 * defaults (an absent field is carried from the previous step, see composeRoadmap).
 */
export const roadmapStepSettingsSchema = mirrorOf<RoadmapStepSettings>()(
  z
    .object({
      s: sSchema("S").optional(),
      sL: sSchema("S_L").optional(),
      level: levelSchema.optional(),
      barrierScales: z.boolean({ error: "Barrier scales must be true or false." }).optional(),
      miller: millerSchema.optional(),
      deviceRFactor: factorSchema("Device R factor").optional(),
      deviceCFactor: factorSchema("Device C factor").optional(),
      supplyV: supplySchema.optional(),
      k: kSchema.nullable().optional(),
      metal: metalIdSchema.nullable().optional(),
      airGap: airGapSchema.nullable().optional(),
      lengthRule: lengthRuleSchema.optional(),
      temperatureC: scenarioTemperatureSchema.optional(),
      overrides: withoutProtoKey(z.record(classNameSchema, roadmapClassStepSchema), "Overrides").optional(),
    })
    .strict(),
);

const scenarioIdSchema = z
  .string({ error: "fromScenarioId must be a scenario id." })
  .min(1, "fromScenarioId must be a scenario id.")
  .max(64, "fromScenarioId is not valid.");

/** One step (the engine's RoadmapStep); settings may be left out (= {}: nothing changes at this step). */
export const roadmapStepSchema = mirrorOf<RoadmapStep>()(
  z
    .object({
      name: nameSchema,
      settings: roadmapStepSettingsSchema.optional().transform((v): RoadmapStepSettings => v ?? {}),
      fromScenarioId: scenarioIdSchema.optional(),
    })
    .strict(),
);

/**
 * The steps of a roadmap after its baseline N0: 1 to MAX_ROADMAP_STEPS, each named once. Inside a body's `steps`, an
 * issue's path reads `steps.N.settings.…` (N from 0), so a 400 names the step and field. What needs the baseline (a
 * class it does not have, a target pitch below twice a class's barrier) is checked by composeRoadmap
 * (RoadmapInputError, whose `path` reads the same).
 */
export const roadmapStepsSchema = z
  .array(roadmapStepSchema, { error: "steps must be a list of steps { name, settings }." })
  .min(1, "A roadmap needs at least one step after its baseline N0.")
  .max(MAX_ROADMAP_STEPS, `A roadmap holds at most ${MAX_ROADMAP_STEPS} steps after its baseline N0.`)
  .superRefine((steps, ctx) => {
    const seen = new Set<string>();
    steps.forEach((s, i) => {
      if (seen.has(s.name)) ctx.addIssue({ code: "custom", path: [i, "name"], message: `Step ${i + 1}: another step is already named "${s.name}".` });
      seen.add(s.name);
    });
  });

/** POST /api/teams/[teamId]/roadmaps. */
export const roadmapCreateSchema = z
  .object({
    name: nameSchema,
    baselineId: z.string({ error: "Baseline is required." }).min(1, "Baseline is required.").max(64),
    steps: roadmapStepsSchema,
  })
  .strict();
export type RoadmapCreate = z.infer<typeof roadmapCreateSchema>;

/** PATCH /api/roadmaps/[id]: the version loaded (409 stale_version when not the current one), and what changes. */
export const roadmapPatchSchema = z
  .object({
    version: versionSchema,
    name: nameSchema.optional(),
    steps: roadmapStepsSchema.optional(),
  })
  .strict();
export type RoadmapPatch = z.infer<typeof roadmapPatchSchema>;

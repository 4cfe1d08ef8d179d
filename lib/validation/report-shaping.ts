/**
 * The report's optional "Layer shaping" section (issue 15 items 2 and 3): the compose choice and the frozen shape.
 * Frozen per option (scenario) and chosen class: the fixed-pitch optimum of one objective against the current
 * drawing, the delay's parts and the five inputs with the most impact on delay (±10%). lib/reports/shaping.ts freezes it.
 */
import { z } from "zod";

export const SHAPING_OBJECTIVE_VALUES = ["delay", "repeated", "energy", "edp"] as const;
export const shapingObjectiveSchema = z.enum(SHAPING_OBJECTIVE_VALUES, { error: "shaping.objective must be delay, repeated, energy or edp." });

/** Compose: include the section, for this objective (default 50% delay). */
export const composeShapingSchema = z.object({ objective: shapingObjectiveSchema.optional().default("delay") }).strict();

const num = z.number();
const drawing = z.object({
  widthM: num,
  spacingM: num,
  thicknessM: num,
  lineFraction: num,
  aspectRatio: num,
  objectiveValue: num,
  delayS: num,
  energyJ: num,
  repeaters: num,
  /** The models' validity messages at this drawing (empty = inside every range). */
  flags: z.array(z.string()),
});

export const frozenShapingClassSchema = z.object({
  className: z.string(),
  /** Why this class could not be shaped (the limits leave no geometry); the figures are then absent. */
  error: z.string().optional(),
  current: drawing.optional(),
  optimum: drawing.optional(),
  parts: z.object({ driverWireS: num, driverLoadS: num, wireWireS: num, wireLoadS: num, repeatersS: num, totalS: num }).optional(),
  /** The five inputs with the most impact on the net's delay, ±step, as changes in s against nominalS. */
  tornado: z.object({ nominalS: num, step: num, top: z.array(z.object({ input: z.string(), deltaLowS: num, deltaHighS: num })).max(5) }).optional(),
});

export const frozenShapingSchema = z.object({
  objective: shapingObjectiveSchema,
  /** The search limits used (the screen's defaults). */
  limits: z.object({ minWidthNm: num, minSpaceNm: num, minFraction: num, maxFraction: num, maxAspect: num }),
  /** Classes shaped (the first chosen ones, at most MAX_SHAPING_CLASSES) and options, in the report's order. */
  options: z.array(z.object({ key: z.string(), classes: z.array(frozenShapingClassSchema) })),
  /** Chosen classes left out (beyond the cap). */
  omittedClasses: z.array(z.string()),
});
export type FrozenShaping = z.infer<typeof frozenShapingSchema>;
export type FrozenShapingClass = z.infer<typeof frozenShapingClassSchema>;

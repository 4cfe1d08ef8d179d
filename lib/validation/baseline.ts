import { z } from "zod";
import type { Technology } from "@/lib/scaling";
import { mirrorOf } from "./mirror";
import { quantity, wireClassListSchema } from "./wire-class";

/** Technology shared by a baseline's classes (the engine's Technology, field for field), SI or strings with units. */
export const technologySchema = mirrorOf<Technology>()(
  z.object({
    supplyV: quantity("Supply voltage", "V", { min: 0, minExclusive: true, max: 5, maxHint: "Supply voltage must be at most 5 V." }),
    clockHz: quantity("Clock", "Hz", { min: 0, minExclusive: true, max: 100e9, maxHint: "Clock must be at most 100 GHz." }),
    repeaterR0Ohm: quantity("Repeater R0", "ohm", { min: 0, minExclusive: true, max: 1e7 }),
    repeaterC0F: quantity("Repeater C0", "F", { min: 0, minExclusive: true, max: 1e-12, maxHint: "Repeater C0 must be at most 1 pF." }),
    delayBudgetS: quantity("Delay budget", "s", { min: 0, minExclusive: true, max: 1e-6, maxHint: "Delay budget must be at most 1 µs." }),
  }),
);
export type TechnologyInput = z.infer<typeof technologySchema>;

export const baselineNameSchema = z.string({ error: "Name is required." }).trim().min(1, "Name is required.").max(100, "Name must be at most 100 characters.");
const descriptionSchema = z.string().trim().max(2000, "Description must be at most 2000 characters.");
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

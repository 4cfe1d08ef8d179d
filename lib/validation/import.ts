import { z } from "zod";
import { baselineNameSchema } from "./baseline";

/** replace: the file becomes the baseline's classes (or histograms); merge: rows update or add by class name. */
export const importModeSchema = z.enum(["replace", "merge"], { error: "Choose mode=replace or mode=merge explicitly." });
export type ImportMode = z.infer<typeof importModeSchema>;

const flag = z
  .enum(["0", "1", "true", "false"], { error: "Use dryRun=1 (validate only) or dryRun=0." })
  .optional()
  .transform((v) => v === "1" || v === "true");

/**
 * Query of POST /api/baselines/[id]/import and /histograms. The body is the CSV, so the baseline version the client
 * loaded travels in the query like mode and dryRun: `version` is required unless dryRun (a dry run stores nothing),
 * and a stale one answers 409 stale_version with currentVersion, like every other write to a baseline.
 */
export const importQuerySchema = z
  .object({
    mode: importModeSchema,
    dryRun: flag,
    version: z
      .string()
      .regex(/^[1-9][0-9]{0,14}$/, "version must be the baseline version you loaded (a whole number ≥ 1).")
      .transform(Number)
      .optional(),
  })
  .superRefine((q, ctx) => {
    if (!q.dryRun && q.version === undefined)
      ctx.addIssue({ code: "custom", path: ["version"], message: "version is required (the baseline version you loaded): add ?version=N." });
  });
export type ImportQuery = z.infer<typeof importQuerySchema>;

/** Query of POST /api/teams/[teamId]/baselines/import. */
export const newBaselineImportQuerySchema = z.object({
  name: baselineNameSchema,
  dryRun: flag,
});

/** Histogram cells after unit conversion (the CSV has length in µm, stored in m). */
export const histogramLengthSchema = z.number().finite("must be a finite number").gt(0, "must be > 0");
export const histogramCountSchema = z
  .number()
  .finite("must be a finite number")
  .int("must be a whole number")
  .min(0, "must be ≥ 0")
  .max(Number.MAX_SAFE_INTEGER, "is too large");

/** One stored histogram bin as the JSON API returns it. */
export const histogramBinSchema = z.object({ lengthUm: z.number().positive(), count: z.number().int().nonnegative() });

/** Search params → plain object for the schemas above. */
export function searchParamsObject(url: string): Record<string, string> {
  return Object.fromEntries(new URL(url).searchParams.entries());
}

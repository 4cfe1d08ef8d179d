import { db } from "@/db/client";
import { baselineTeamId, getBaselineWithClasses } from "@/db/queries/baselines";
import { requireResourceRole } from "@/lib/access";
import { apiRoute, notFound } from "@/lib/api";
import { runFit } from "@/lib/workspace/fit";
import { readInput } from "@/lib/workspace/input";
import { fitRequestSchema } from "@/lib/validation/baseline";

export const dynamic = "force-dynamic";

/**
 * Fit the size-effect model to measured line resistance (viewer+; nothing is stored).
 * Body `{ measured: [{ class, rOhmPerUm, temperatureC? }], technology? }` →
 * `{ metals: { <metal>: { specularity, grainReflection } | { resistivityOhmM, meanFreePathM } }, points: [{ class, measuredOhmPerM, fittedOhmPerM, residual }] }`.
 * `metals` has the shape of `technology.materials`: apply it with PATCH /api/baselines/[id].
 */
export const POST = apiRoute<{ id: string }>(async (req, { id }) => {
  await requireResourceRole(() => baselineTeamId(db, id), "viewer", "Baseline");
  const request = await readInput(req, fitRequestSchema);
  const b = await getBaselineWithClasses(db, id);
  if (!b) throw notFound("Baseline");
  return Response.json(runFit({ classes: b.classes, storedTechnology: b.technology, request }));
});

import { db } from "@/db/client";
import { getRoadmap } from "@/db/queries/roadmaps";
import { requireResource } from "@/lib/access";
import { apiRoute } from "@/lib/api";
import { evaluateRoadmapOrThrow, loadEngineInputs } from "@/lib/workspace/evaluate-server";

export const dynamic = "force-dynamic";

/**
 * The engine's evaluateRoadmap of the stored chain on the stored baseline: `{ steps: [{ name, settings, evaluation }],
 * baselineVersion, roadmapVersion }`; each step's `settings` are its absolute (composed) settings against N0 and its
 * `evaluation` is the scenario evaluate route's shape. Steps that no longer fit the baseline (a class since removed)
 * answer 400 naming the step.
 */
export const POST = apiRoute<{ id: string }>(async (_req, { id }) => {
  const { resource: roadmap } = await requireResource(() => getRoadmap(db, id), "viewer", "Roadmap");
  const { baseline, classes, technology } = await loadEngineInputs(db, roadmap.baselineId);
  const { steps } = evaluateRoadmapOrThrow({ classes, technology, steps: roadmap.steps });
  return Response.json({ steps, baselineVersion: baseline.version, roadmapVersion: roadmap.version });
});

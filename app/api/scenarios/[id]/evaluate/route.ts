import { db } from "@/db/client";
import { getScenario } from "@/db/queries/scenarios";
import { requireResource } from "@/lib/access";
import { apiRoute, badRequest } from "@/lib/api";
import { readInput } from "@/lib/workspace/input";
import { SCENARIO_JSON_LIMIT, scenarioEvaluateSchema } from "@/lib/validation/scenario";
import { evaluateOrThrow, loadEngineInputs } from "@/lib/workspace/evaluate-server";
import { unknownOverrideFields } from "@/db/writes/scenarios";
import { normalizeSettings } from "@/lib/workspace/settings";

export const dynamic = "force-dynamic";

/** The engine's Evaluation of the stored baseline under the stored settings (or unsaved `settings` from the body). */
export const POST = apiRoute<{ id: string }>(async (req, { id }) => {
  // The scenario row is read once: the access check takes its team from it.
  const { resource: scenario } = await requireResource(() => getScenario(db, id), "viewer", "Scenario");
  const hasBody = (req.headers.get("content-length") ?? "0") !== "0" || req.headers.get("content-type");
  const input = hasBody ? await readInput(req, scenarioEvaluateSchema, SCENARIO_JSON_LIMIT) : {};
  const { baseline, classes, technology } = await loadEngineInputs(db, scenario.baselineId);
  const settings = input.settings ? normalizeSettings(input.settings, technology) : scenario.settings;
  const unknown = unknownOverrideFields(
    settings,
    classes.map((c) => c.name),
  );
  if (unknown) throw badRequest(`Per-class settings name classes that are not in the baseline: ${Object.values(unknown).flat().join(" ")}`, unknown);
  const evaluation = evaluateOrThrow({ classes, technology, settings });
  return Response.json({ evaluation, settings, baselineVersion: baseline.version, scenarioVersion: scenario.version });
});

import { db } from "@/db/client";
import { getBaseline } from "@/db/queries/baselines";
import { getScenario, listScenarios } from "@/db/queries/scenarios";
import { createScenario } from "@/db/writes/scenarios";
import { requireTeamRole } from "@/lib/access";
import { apiRoute, notFound } from "@/lib/api";
import { readInput } from "@/lib/workspace/input";
import { SCENARIO_JSON_LIMIT, scenarioCreateSchema } from "@/lib/validation/scenario";
import { defaultScenarioSettings, normalizeSettings } from "@/lib/workspace/settings";

export const dynamic = "force-dynamic";

export const GET = apiRoute<{ teamId: string }>(async (req, { teamId }) => {
  await requireTeamRole(teamId, "viewer");
  const baselineId = new URL(req.url).searchParams.get("baselineId") ?? undefined;
  return Response.json({ scenarios: await listScenarios(db, teamId, baselineId) });
});

export const POST = apiRoute<{ teamId: string }>(async (req, { teamId }) => {
  const a = await requireTeamRole(teamId, "editor");
  const input = await readInput(req, scenarioCreateSchema, SCENARIO_JSON_LIMIT);
  const baseline = await getBaseline(db, input.baselineId);
  // Another team's baseline answers exactly like a missing one.
  if (!baseline || baseline.teamId !== teamId) throw notFound("Baseline");
  const settings = input.settings ? normalizeSettings(input.settings, baseline.technology) : defaultScenarioSettings(baseline.technology);
  const id = await createScenario(db, {
    teamId,
    baselineId: baseline.id,
    userId: a.user.id,
    name: input.name,
    notes: input.notes,
    settings,
  });
  return Response.json({ scenario: await getScenario(db, id) }, { status: 201 });
});

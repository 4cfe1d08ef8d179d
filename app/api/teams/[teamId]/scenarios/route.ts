import { db } from "@/db/client";
import { getBaseline } from "@/db/queries/baselines";
import { listClasses } from "@/db/queries/wire-classes";
import { createScenario, getScenario, listScenarios, scenarioNameTaken } from "@/db/queries/scenarios";
import { audit, requireTeamRole } from "@/lib/access";
import { apiRoute, badRequest, notFound } from "@/lib/api";
import { readInput } from "@/lib/workspace/input";
import { SCENARIO_JSON_LIMIT, scenarioCreateSchema } from "@/lib/validation/scenario";
import { defaultScenarioSettings, normalizeSettings, unknownOverrideFields } from "@/lib/workspace/settings";

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
  const unknown = unknownOverrideFields(settings, (await listClasses(db, baseline.id)).map((c) => c.name));
  if (unknown) throw badRequest(`Per-class settings name classes that are not in the baseline: ${Object.values(unknown).flat().join(" ")}`, unknown);
  if (await scenarioNameTaken(db, baseline.id, input.name)) {
    throw badRequest("A scenario with this name already exists on this baseline.", { name: ["A scenario with this name already exists on this baseline."] });
  }
  const id = await db.transaction(async (trx) => {
    const newId = await createScenario(trx, { teamId, baselineId: baseline.id, userId: a.user.id, name: input.name, notes: input.notes, settings });
    await audit({ teamId, userId: a.user.id, action: "scenario.create", entityType: "scenario", entityId: newId, detail: { name: input.name, baselineId: baseline.id } }, trx);
    return newId;
  });
  return Response.json({ scenario: await getScenario(db, id) }, { status: 201 });
});

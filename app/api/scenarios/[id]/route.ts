import { db } from "@/db/client";
import { getBaseline } from "@/db/queries/baselines";
import { listClasses } from "@/db/queries/wire-classes";
import { deleteScenario, getScenario, scenarioNameTaken, scenarioTeamId, updateScenario } from "@/db/queries/scenarios";
import { audit, requireResourceRole } from "@/lib/access";
import { apiRoute, badRequest, forbidden } from "@/lib/api";
import { readInput } from "@/lib/workspace/input";
import { SCENARIO_JSON_LIMIT, scenarioPatchSchema } from "@/lib/validation/scenario";
import { normalizeSettings, unknownOverrideFields } from "@/lib/workspace/settings";
import { withStale } from "@/lib/workspace/stale";

export const dynamic = "force-dynamic";

export const GET = apiRoute<{ id: string }>(async (_req, { id }) => {
  const a = await requireResourceRole(() => scenarioTeamId(db, id), "viewer", "Scenario");
  return Response.json({ scenario: await getScenario(db, id), role: a.role });
});

/** Versioned save: `version` is the version the client loaded; a newer stored version answers 409 stale_version. */
export const PATCH = apiRoute<{ id: string }>(async (req, { id }) => {
  const a = await requireResourceRole(() => scenarioTeamId(db, id), "editor", "Scenario");
  const input = await readInput(req, scenarioPatchSchema, SCENARIO_JSON_LIMIT);
  const current = (await getScenario(db, id))!;
  const baseline = (await getBaseline(db, current.baselineId))!;
  const settings = input.settings ? normalizeSettings(input.settings, baseline.technology) : undefined;
  if (settings) {
    const unknown = unknownOverrideFields(settings, (await listClasses(db, baseline.id)).map((c) => c.name));
    if (unknown) throw badRequest(`Per-class settings name classes that are not in the baseline: ${Object.values(unknown).flat().join(" ")}`, unknown);
  }
  if (input.name !== undefined && (await scenarioNameTaken(db, current.baselineId, input.name, id))) {
    throw badRequest("A scenario with this name already exists on this baseline.", { name: ["A scenario with this name already exists on this baseline."] });
  }
  return withStale(async () => {
    const scenario = await db.transaction(async (trx) => {
      const updated = await updateScenario(trx, { id, userId: a.user.id, version: input.version, name: input.name, notes: input.notes, settings });
      const fields = (["name", "notes", "settings"] as const).filter((k) => input[k] !== undefined);
      await audit({ teamId: a.teamId, userId: a.user.id, action: "scenario.update", entityType: "scenario", entityId: id, detail: { version: updated.version, fields } }, trx);
      return updated;
    });
    return Response.json({ scenario });
  });
});

export const DELETE = apiRoute<{ id: string }>(async (_req, { id }) => {
  const a = await requireResourceRole(() => scenarioTeamId(db, id), "editor", "Scenario");
  const s = await getScenario(db, id);
  if (a.role !== "owner" && s?.createdBy !== a.user.id) throw forbidden("Only a team owner or the scenario's author can delete it.");
  await db.transaction(async (trx) => {
    await deleteScenario(trx, id);
    await audit({ teamId: a.teamId, userId: a.user.id, action: "scenario.delete", entityType: "scenario", entityId: id, detail: { name: s?.name } }, trx);
  });
  return new Response(null, { status: 204 });
});

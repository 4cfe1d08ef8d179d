import { db } from "@/db/client";
import { getScenario, scenarioEditTarget } from "@/db/queries/scenarios";
import { deleteScenario, updateScenario } from "@/db/writes/scenarios";
import { requireResource } from "@/lib/access";
import { apiRoute, forbidden } from "@/lib/api";
import { readInput } from "@/lib/workspace/input";
import { SCENARIO_JSON_LIMIT, scenarioPatchSchema } from "@/lib/validation/scenario";
import { normalizeSettings } from "@/lib/workspace/settings";

export const dynamic = "force-dynamic";

export const GET = apiRoute<{ id: string }>(async (_req, { id }) => {
  const { resource: scenario, role } = await requireResource(() => getScenario(db, id), "viewer", "Scenario");
  return Response.json({ scenario, role });
});

/**
 * Versioned save: `version` is the version the client loaded; a newer stored version answers 409 stale_version.
 * Before the write's one transaction: the session, one scenario+baseline read (team and technology) and the membership.
 */
export const PATCH = apiRoute<{ id: string }>(async (req, { id }) => {
  const { resource: target, ...a } = await requireResource(() => scenarioEditTarget(db, id), "editor", "Scenario");
  const input = await readInput(req, scenarioPatchSchema, SCENARIO_JSON_LIMIT);
  const settings = input.settings ? normalizeSettings(input.settings, target.technology) : undefined;
  const scenario = await updateScenario(db, {
    id,
    teamId: a.teamId,
    userId: a.user.id,
    version: input.version,
    name: input.name,
    notes: input.notes,
    settings,
  });
  return Response.json({ scenario });
});

export const DELETE = apiRoute<{ id: string }>(async (_req, { id }) => {
  const { resource: s, ...a } = await requireResource(() => getScenario(db, id), "editor", "Scenario");
  if (a.role !== "owner" && s.createdBy !== a.user.id) throw forbidden("Only a team owner or the scenario's author can delete it.");
  await deleteScenario(db, { id, teamId: a.teamId, userId: a.user.id });
  return new Response(null, { status: 204 });
});

import { db } from "@/db/client";
import { getScenario, scenarioTeamId } from "@/db/queries/scenarios";
import { duplicateScenario } from "@/db/writes/scenarios";
import { requireResourceRole } from "@/lib/access";
import { apiRoute } from "@/lib/api";
import { readInput } from "@/lib/workspace/input";
import { scenarioDuplicateSchema } from "@/lib/validation/scenario";

export const dynamic = "force-dynamic";

/** Copy of the scenario (settings and notes) on the same baseline: 201 `{ scenario }`, the create route's shape. */
export const POST = apiRoute<{ id: string }>(async (req, { id }) => {
  const a = await requireResourceRole(() => scenarioTeamId(db, id), "editor", "Scenario");
  const hasBody = (req.headers.get("content-length") ?? "0") !== "0" || req.headers.get("content-type");
  const input = hasBody ? await readInput(req, scenarioDuplicateSchema) : {};
  const newId = await duplicateScenario(db, { id, teamId: a.teamId, userId: a.user.id, name: input.name });
  return Response.json({ scenario: await getScenario(db, newId) }, { status: 201 });
});

import { db } from "@/db/client";
import { listScenarioRevisions, scenarioTeamId } from "@/db/queries/scenarios";
import { requireResourceRole } from "@/lib/access";
import { apiRoute } from "@/lib/api";

export const dynamic = "force-dynamic";

export const GET = apiRoute<{ id: string }>(async (_req, { id }) => {
  await requireResourceRole(() => scenarioTeamId(db, id), "viewer", "Scenario");
  return Response.json({ revisions: await listScenarioRevisions(db, id) });
});

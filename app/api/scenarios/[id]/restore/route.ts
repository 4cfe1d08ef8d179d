import { db } from "@/db/client";
import { scenarioTeamId } from "@/db/queries/scenarios";
import { restoreScenario } from "@/db/writes/scenarios";
import { requireResourceRole } from "@/lib/access";
import { apiRoute } from "@/lib/api";
import { readInput } from "@/lib/workspace/input";
import { scenarioRestoreSchema } from "@/lib/validation/scenario";

export const dynamic = "force-dynamic";

/** Restore an old revision's name, notes and settings as a new revision (history is never rewritten). */
export const POST = apiRoute<{ id: string }>(async (req, { id }) => {
  const a = await requireResourceRole(() => scenarioTeamId(db, id), "editor", "Scenario");
  const input = await readInput(req, scenarioRestoreSchema);
  const scenario = await restoreScenario(db, {
    id,
    teamId: a.teamId,
    userId: a.user.id,
    version: input.version,
    revisionId: input.revisionId,
  });
  return Response.json({ scenario });
});

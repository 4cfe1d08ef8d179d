import { db } from "@/db/client";
import { getScenarioRevision, scenarioNameTaken, scenarioTeamId, getScenario, updateScenario } from "@/db/queries/scenarios";
import { audit, requireResourceRole } from "@/lib/access";
import { apiRoute, notFound } from "@/lib/api";
import { readInput } from "@/lib/workspace/input";
import { scenarioRestoreSchema } from "@/lib/validation/scenario";
import { withStale } from "@/lib/workspace/stale";

export const dynamic = "force-dynamic";

/** Restore an old revision's name, notes and settings as a new revision (history is never rewritten). */
export const POST = apiRoute<{ id: string }>(async (req, { id }) => {
  const a = await requireResourceRole(() => scenarioTeamId(db, id), "editor", "Scenario");
  const input = await readInput(req, scenarioRestoreSchema);
  const rev = await getScenarioRevision(db, id, input.revisionId);
  if (!rev) throw notFound("Revision");
  const current = (await getScenario(db, id))!;
  // Keep the current name when the old one now belongs to another scenario on the baseline.
  const name = (await scenarioNameTaken(db, current.baselineId, rev.name, id)) ? current.name : rev.name;
  return withStale(async () => {
    const scenario = await db.transaction(async (trx) => {
      const updated = await updateScenario(trx, {
        id,
        userId: a.user.id,
        version: input.version,
        name,
        notes: rev.notes,
        settings: rev.settings,
        summary: `Restored version ${rev.version}`,
      });
      await audit({ teamId: a.teamId, userId: a.user.id, action: "scenario.update", entityType: "scenario", entityId: id, detail: { version: updated.version, restoredVersion: rev.version } }, trx);
      return updated;
    });
    return Response.json({ scenario });
  });
});

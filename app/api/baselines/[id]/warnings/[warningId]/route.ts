import { db } from "@/db/client";
import { baselineTeamId } from "@/db/queries/baselines";
import { dismissBaselineWarning } from "@/db/writes/baselines";
import { requireResourceRole } from "@/lib/access";
import { apiRoute } from "@/lib/api";

export const dynamic = "force-dynamic";

/** Dismiss one open warning (editor or owner): 204; unknown or already dismissed: 404. */
export const DELETE = apiRoute<{ id: string; warningId: string }>(async (_req, { id, warningId }) => {
  const a = await requireResourceRole(() => baselineTeamId(db, id), "editor", "Baseline");
  await dismissBaselineWarning(db, { baselineId: id, teamId: a.teamId, userId: a.user.id, warningId });
  return new Response(null, { status: 204 });
});

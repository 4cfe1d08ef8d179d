import { db } from "@/db/client";
import { getBaselineWithClasses, listBaselines } from "@/db/queries/baselines";
import { createBaseline } from "@/db/writes/baselines";
import { requireTeamRole } from "@/lib/access";
import { apiRoute } from "@/lib/api";
import { DEFAULT_TECHNOLOGY } from "@/lib/scaling/client";
import { readInput } from "@/lib/workspace/input";
import { baselineCreateSchema } from "@/lib/validation/baseline";

export const dynamic = "force-dynamic";

export const GET = apiRoute<{ teamId: string }>(async (_req, { teamId }) => {
  await requireTeamRole(teamId, "viewer");
  return Response.json({ baselines: await listBaselines(db, teamId) });
});

/** The baseline, its classes, its first revision and the audit row commit together. */
export const POST = apiRoute<{ teamId: string }>(async (req, { teamId }) => {
  const a = await requireTeamRole(teamId, "editor");
  const input = await readInput(req, baselineCreateSchema);
  const id = await createBaseline(db, {
    teamId,
    userId: a.user.id,
    baseline: { ...input, technology: input.technology ?? DEFAULT_TECHNOLOGY },
  });
  return Response.json({ baseline: await getBaselineWithClasses(db, id) }, { status: 201 });
});

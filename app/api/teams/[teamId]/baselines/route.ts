import { db } from "@/db/client";
import { baselineNameTaken, createBaseline, getBaselineWithClasses, listBaselines } from "@/db/queries/baselines";
import { requireTeamRole } from "@/lib/access";
import { apiRoute, badRequest } from "@/lib/api";
import { readInput } from "@/lib/workspace/input";
import { baselineCreateSchema } from "@/lib/validation/baseline";

export const dynamic = "force-dynamic";

export const GET = apiRoute<{ teamId: string }>(async (_req, { teamId }) => {
  await requireTeamRole(teamId, "viewer");
  return Response.json({ baselines: await listBaselines(db, teamId) });
});

export const POST = apiRoute<{ teamId: string }>(async (req, { teamId }) => {
  const a = await requireTeamRole(teamId, "editor");
  const input = await readInput(req, baselineCreateSchema);
  if (await baselineNameTaken(db, teamId, input.name)) {
    throw badRequest("A baseline with this name already exists in the team.", { name: ["A baseline with this name already exists in the team."] });
  }
  const id = await createBaseline(db, { teamId, userId: a.user.id, input });
  return Response.json({ baseline: await getBaselineWithClasses(db, id) }, { status: 201 });
});

import { db } from "@/db/client";
import { baselineNameTaken, createBaseline, getBaselineWithClasses, listBaselines } from "@/db/queries/baselines";
import { audit, requireTeamRole } from "@/lib/access";
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
  // The baseline, its classes, its first revision and the audit row commit together.
  const id = await db.transaction(async (trx) => {
    const newId = await createBaseline(trx, { teamId, userId: a.user.id, input });
    await audit({ teamId, userId: a.user.id, action: "baseline.create", entityType: "baseline", entityId: newId, detail: { name: input.name, classes: input.classes?.length ?? 0 } }, trx);
    return newId;
  });
  return Response.json({ baseline: await getBaselineWithClasses(db, id) }, { status: 201 });
});

import { db } from "@/db/client";
import { baselineNameTaken, baselineTeamId, duplicateBaseline, freeBaselineName, getBaseline, getBaselineWithClasses } from "@/db/queries/baselines";
import { audit, requireResourceRole } from "@/lib/access";
import { apiRoute, badRequest } from "@/lib/api";
import { readInput } from "@/lib/workspace/input";
import { baselineDuplicateSchema } from "@/lib/validation/baseline";

export const dynamic = "force-dynamic";

export const POST = apiRoute<{ id: string }>(async (req, { id }) => {
  const a = await requireResourceRole(() => baselineTeamId(db, id), "editor", "Baseline");
  const input = await readInput(req, baselineDuplicateSchema.optional().transform((v) => v ?? {}));
  const src = await getBaseline(db, id);
  const name = input.name ?? (await freeBaselineName(db, a.teamId, src!.name));
  if (await baselineNameTaken(db, a.teamId, name)) {
    throw badRequest("A baseline with this name already exists in the team.", { name: ["A baseline with this name already exists in the team."] });
  }
  const newId = await db.transaction(async (trx) => {
    const created = await duplicateBaseline(trx, { id, userId: a.user.id, name });
    await audit({ teamId: a.teamId, userId: a.user.id, action: "baseline.create", entityType: "baseline", entityId: created, detail: { name, duplicatedFrom: id } }, trx);
    return created;
  });
  return Response.json({ baseline: await getBaselineWithClasses(db, newId) }, { status: 201 });
});

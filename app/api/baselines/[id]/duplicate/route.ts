import { db } from "@/db/client";
import { baselineTeamId, getBaselineWithClasses } from "@/db/queries/baselines";
import { duplicateBaseline } from "@/db/writes/baselines";
import { requireResourceRole } from "@/lib/access";
import { apiRoute } from "@/lib/api";
import { readInput } from "@/lib/workspace/input";
import { baselineDuplicateSchema } from "@/lib/validation/baseline";

export const dynamic = "force-dynamic";

export const POST = apiRoute<{ id: string }>(async (req, { id }) => {
  const a = await requireResourceRole(() => baselineTeamId(db, id), "editor", "Baseline");
  const input = await readInput(
    req,
    baselineDuplicateSchema.optional().transform((v) => v ?? {}),
  );
  const newId = await duplicateBaseline(db, { id, teamId: a.teamId, userId: a.user.id, name: input.name });
  return Response.json({ baseline: await getBaselineWithClasses(db, newId) }, { status: 201 });
});

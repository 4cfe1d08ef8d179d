import { db } from "@/db/client";
import { baselineTeamId, getBaselineWithClasses } from "@/db/queries/baselines";
import { listClasses } from "@/db/queries/wire-classes";
import { replaceBaselineClasses } from "@/db/writes/baselines";
import { requireResourceRole } from "@/lib/access";
import { apiRoute } from "@/lib/api";
import { readInput } from "@/lib/workspace/input";
import { classesPutSchema } from "@/lib/validation/baseline";

export const dynamic = "force-dynamic";

export const GET = apiRoute<{ id: string }>(async (_req, { id }) => {
  await requireResourceRole(() => baselineTeamId(db, id), "viewer", "Baseline");
  return Response.json({ classes: await listClasses(db, id) });
});

/** Replace all classes in one transaction; `version` must be the baseline version the client loaded. */
export const PUT = apiRoute<{ id: string }>(async (req, { id }) => {
  const a = await requireResourceRole(() => baselineTeamId(db, id), "editor", "Baseline");
  const input = await readInput(req, classesPutSchema);
  await replaceBaselineClasses(db, { id, teamId: a.teamId, userId: a.user.id, version: input.version, classes: input.classes });
  return Response.json({ baseline: await getBaselineWithClasses(db, id) });
});

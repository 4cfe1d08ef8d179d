import { db } from "@/db/client";
import { baselineTeamId, getBaselineWithClasses, putBaselineClasses } from "@/db/queries/baselines";
import { listClasses } from "@/db/queries/wire-classes";
import { audit, requireResourceRole } from "@/lib/access";
import { apiRoute } from "@/lib/api";
import { readInput } from "@/lib/workspace/input";
import { classesPutSchema } from "@/lib/validation/baseline";
import { withStale } from "@/lib/workspace/stale";

export const dynamic = "force-dynamic";

export const GET = apiRoute<{ id: string }>(async (_req, { id }) => {
  await requireResourceRole(() => baselineTeamId(db, id), "viewer", "Baseline");
  return Response.json({ classes: await listClasses(db, id) });
});

/** Replace all classes in one transaction; `version` must be the baseline version the client loaded. */
export const PUT = apiRoute<{ id: string }>(async (req, { id }) => {
  const a = await requireResourceRole(() => baselineTeamId(db, id), "editor", "Baseline");
  const input = await readInput(req, classesPutSchema);
  return withStale(async () => {
    await db.transaction(async (trx) => {
      const version = await putBaselineClasses(trx, { id, userId: a.user.id, version: input.version, classes: input.classes });
      await audit({ teamId: a.teamId, userId: a.user.id, action: "baseline.classes_update", entityType: "baseline", entityId: id, detail: { version, classes: input.classes.length } }, trx);
    });
    return Response.json({ baseline: await getBaselineWithClasses(db, id) });
  });
});

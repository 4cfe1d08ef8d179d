import { db } from "@/db/client";
import { baselineNameTaken, baselineTeamId, deleteBaseline, getBaseline, getBaselineWithClasses, patchBaseline } from "@/db/queries/baselines";
import { listClassesWithHistograms } from "@/db/queries/wire-classes";
import { audit, requireResourceRole } from "@/lib/access";
import { apiRoute, badRequest, forbidden } from "@/lib/api";
import { readInput } from "@/lib/workspace/input";
import { baselinePatchSchema } from "@/lib/validation/baseline";
import { coarsenHistogram } from "@/lib/workspace/histogram";
import { withStale } from "@/lib/workspace/stale";

export const dynamic = "force-dynamic";

/** GET ?histograms=1 attaches each class's length histogram (merged to ≤ 400 bins). */
export const GET = apiRoute<{ id: string }>(async (req, { id }) => {
  const a = await requireResourceRole(() => baselineTeamId(db, id), "viewer", "Baseline");
  const b = await getBaselineWithClasses(db, id);
  if (new URL(req.url).searchParams.get("histograms") === "1" && b) {
    const withHist = await listClassesWithHistograms(db, id);
    b.classes = withHist.map((c) => (c.histogram ? { ...c, histogram: coarsenHistogram(c.histogram) } : c));
  }
  return Response.json({ baseline: b, role: a.role });
});

export const PATCH = apiRoute<{ id: string }>(async (req, { id }) => {
  const a = await requireResourceRole(() => baselineTeamId(db, id), "editor", "Baseline");
  const patch = await readInput(req, baselinePatchSchema);
  if (patch.name !== undefined && (await baselineNameTaken(db, a.teamId, patch.name, id))) {
    throw badRequest("A baseline with this name already exists in the team.", { name: ["A baseline with this name already exists in the team."] });
  }
  return withStale(async () => {
    await db.transaction(async (trx) => {
      const version = await patchBaseline(trx, { id, userId: a.user.id, patch });
      const fields = (["name", "description", "technology"] as const).filter((k) => patch[k] !== undefined);
      await audit({ teamId: a.teamId, userId: a.user.id, action: "baseline.update", entityType: "baseline", entityId: id, detail: { version, fields } }, trx);
    });
    return Response.json({ baseline: await getBaselineWithClasses(db, id) });
  });
});

export const DELETE = apiRoute<{ id: string }>(async (_req, { id }) => {
  const a = await requireResourceRole(() => baselineTeamId(db, id), "editor", "Baseline");
  const b = await getBaseline(db, id);
  if (a.role !== "owner" && b?.createdBy !== a.user.id) throw forbidden("Only a team owner or the baseline's author can delete it.");
  await db.transaction(async (trx) => {
    await deleteBaseline(trx, id);
    await audit({ teamId: a.teamId, userId: a.user.id, action: "baseline.delete", entityType: "baseline", entityId: id, detail: { name: b?.name } }, trx);
  });
  return new Response(null, { status: 204 });
});

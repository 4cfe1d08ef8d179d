import { db } from "@/db/client";
import { baselineTeamId, getBaseline, getBaselineWithClasses } from "@/db/queries/baselines";
import { listClassesWithHistograms } from "@/db/queries/wire-classes";
import { deleteBaseline, updateBaseline } from "@/db/writes/baselines";
import { requireResource, requireResourceRole } from "@/lib/access";
import { apiRoute, forbidden } from "@/lib/api";
import { coarsenHistogram } from "@/lib/scaling/client";
import { readInput } from "@/lib/workspace/input";
import { baselinePatchSchema } from "@/lib/validation/baseline";

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

/** Versioned save: `version` is the version the client loaded; a newer stored version answers 409 stale_version. */
export const PATCH = apiRoute<{ id: string }>(async (req, { id }) => {
  const a = await requireResourceRole(() => baselineTeamId(db, id), "editor", "Baseline");
  const patch = await readInput(req, baselinePatchSchema);
  await updateBaseline(db, { id, teamId: a.teamId, userId: a.user.id, ...patch });
  return Response.json({ baseline: await getBaselineWithClasses(db, id) });
});

export const DELETE = apiRoute<{ id: string }>(async (_req, { id }) => {
  const { resource: b, ...a } = await requireResource(() => getBaseline(db, id), "editor", "Baseline");
  if (a.role !== "owner" && b.createdBy !== a.user.id) throw forbidden("Only a team owner or the baseline's author can delete it.");
  await deleteBaseline(db, { id, teamId: a.teamId, userId: a.user.id });
  return new Response(null, { status: 204 });
});

import { db } from "@/db/client";
import { getRoadmap, roadmapTeamId } from "@/db/queries/roadmaps";
import { deleteRoadmap, updateRoadmap } from "@/db/writes/roadmaps";
import { requireResource, requireResourceRole } from "@/lib/access";
import { composeRoadmap } from "@/lib/scaling";
import { apiRoute, forbidden } from "@/lib/api";
import { readInput } from "@/lib/workspace/input";
import { roadmapPatchSchema } from "@/lib/validation/roadmap";

export const dynamic = "force-dynamic";

export const GET = apiRoute<{ id: string }>(async (_req, { id }) => {
  const { resource: roadmap, role } = await requireResource(() => getRoadmap(db, id), "viewer", "Roadmap");
  return Response.json({ roadmap, role });
});

/** Versioned save `{ version, name?, steps? }`: a newer stored version answers 409 stale_version. */
export const PATCH = apiRoute<{ id: string }>(async (req, { id }) => {
  const a = await requireResourceRole(() => roadmapTeamId(db, id), "editor", "Roadmap");
  const input = await readInput(req, roadmapPatchSchema);
  const roadmap = await updateRoadmap(db, {
    id,
    teamId: a.teamId,
    userId: a.user.id,
    version: input.version,
    name: input.name,
    steps: input.steps,
    compose: composeRoadmap,
  });
  return Response.json({ roadmap });
});

/** Owner or the roadmap's author, as for scenarios: 204. */
export const DELETE = apiRoute<{ id: string }>(async (_req, { id }) => {
  const { resource: r, ...a } = await requireResource(() => getRoadmap(db, id), "editor", "Roadmap");
  if (a.role !== "owner" && r.createdBy !== a.user.id) throw forbidden("Only a team owner or the roadmap's author can delete it.");
  await deleteRoadmap(db, { id, teamId: a.teamId, userId: a.user.id });
  return new Response(null, { status: 204 });
});

import { db } from "@/db/client";
import { getRoadmap, listRoadmaps } from "@/db/queries/roadmaps";
import { createRoadmap } from "@/db/writes/roadmaps";
import { requireTeamRole } from "@/lib/access";
import { composeRoadmap } from "@/lib/scaling";
import { apiRoute } from "@/lib/api";
import { readInput } from "@/lib/workspace/input";
import { roadmapCreateSchema } from "@/lib/validation/roadmap";

export const dynamic = "force-dynamic";

/** The team's roadmaps (`?baselineId=` for one baseline's): `{ roadmaps: [...] }`. */
export const GET = apiRoute<{ teamId: string }>(async (req, { teamId }) => {
  await requireTeamRole(teamId, "viewer");
  const baselineId = new URL(req.url).searchParams.get("baselineId") ?? undefined;
  return Response.json({ roadmaps: await listRoadmaps(db, teamId, baselineId) });
});

/** A new roadmap `{ name, baselineId, steps }`: 201 `{ roadmap }`; bad steps answer 400 naming `steps.N.<field>`. */
export const POST = apiRoute<{ teamId: string }>(async (req, { teamId }) => {
  const a = await requireTeamRole(teamId, "editor");
  const input = await readInput(req, roadmapCreateSchema);
  const id = await createRoadmap(db, {
    teamId,
    baselineId: input.baselineId,
    userId: a.user.id,
    name: input.name,
    steps: input.steps,
    compose: composeRoadmap,
  });
  return Response.json({ roadmap: await getRoadmap(db, id) }, { status: 201 });
});

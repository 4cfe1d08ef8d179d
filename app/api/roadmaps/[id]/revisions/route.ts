import { db } from "@/db/client";
import { listRoadmapRevisions, roadmapTeamId } from "@/db/queries/roadmaps";
import { requireResourceRole } from "@/lib/access";
import { apiRoute } from "@/lib/api";

export const dynamic = "force-dynamic";

/** Saved versions, newest first: `{ revisions: [{ id, version, userId, userName, at, summary, name, steps }] }`. */
export const GET = apiRoute<{ id: string }>(async (_req, { id }) => {
  await requireResourceRole(() => roadmapTeamId(db, id), "viewer", "Roadmap");
  return Response.json({ revisions: await listRoadmapRevisions(db, id) });
});

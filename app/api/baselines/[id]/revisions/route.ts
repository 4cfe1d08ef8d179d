import { db } from "@/db/client";
import { baselineTeamId, listBaselineRevisions } from "@/db/queries/baselines";
import { requireResourceRole } from "@/lib/access";
import { apiRoute } from "@/lib/api";

export const dynamic = "force-dynamic";

export const GET = apiRoute<{ id: string }>(async (_req, { id }) => {
  await requireResourceRole(() => baselineTeamId(db, id), "viewer", "Baseline");
  return Response.json({ revisions: await listBaselineRevisions(db, id) });
});

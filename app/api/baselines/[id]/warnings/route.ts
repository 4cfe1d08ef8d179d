import { db } from "@/db/client";
import { baselineTeamId, listOpenWarnings } from "@/db/queries/baselines";
import { requireResourceRole } from "@/lib/access";
import { apiRoute } from "@/lib/api";

export const dynamic = "force-dynamic";

/** The baseline's open warnings (from imports), oldest first: `{ warnings: [{ id, source, className, message, createdAt }] }`. */
export const GET = apiRoute<{ id: string }>(async (_req, { id }) => {
  await requireResourceRole(() => baselineTeamId(db, id), "viewer", "Baseline");
  return Response.json({ warnings: await listOpenWarnings(db, id) });
});

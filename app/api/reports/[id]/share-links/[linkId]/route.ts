import { db } from "@/db/client";
import { reportTeamId } from "@/db/queries/reports";
import { revokeShareLink } from "@/db/writes/share-links";
import { requireResourceRole } from "@/lib/access";
import { apiRoute } from "@/lib/api";

export const dynamic = "force-dynamic";

/** Revoke a share link: it answers 404 from now on. Editor and up. */
export const DELETE = apiRoute<{ id: string; linkId: string }>(async (_req, { id, linkId }) => {
  const { user, teamId } = await requireResourceRole(() => reportTeamId(db, id), "editor", "Report");
  await revokeShareLink(db, { reportId: id, linkId, teamId, userId: user.id });
  return new Response(null, { status: 204 });
});

import { db } from "@/db/client";
import { revokeInvite } from "@/db/writes/teams";
import { requireTeamRole } from "@/lib/access";
import { apiRoute } from "@/lib/api";

type P = { teamId: string; inviteId: string };

export const DELETE = apiRoute<P>(async (_req, { teamId, inviteId }) => {
  const a = await requireTeamRole(teamId, "owner");
  await revokeInvite(db, { teamId, userId: a.user.id, inviteId });
  return Response.json({ ok: true });
});

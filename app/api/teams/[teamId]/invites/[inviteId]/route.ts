import { db } from "@/db/client";
import { getInvite, revokeInvite } from "@/db/queries/invites";
import { audit, requireTeamRole } from "@/lib/access";
import { apiRoute, conflict, notFound } from "@/lib/api";
import { inviteStatus } from "@/lib/invites";

type P = { teamId: string; inviteId: string };

export const DELETE = apiRoute<P>(async (_req, { teamId, inviteId }) => {
  const a = await requireTeamRole(teamId, "owner");
  await db.transaction(async (trx) => {
    const invite = await getInvite(trx, teamId, inviteId);
    if (!invite) throw notFound("Invite");
    const status = inviteStatus(invite);
    if (status === "accepted") throw conflict("This invite was already accepted; remove the member instead.");
    if (status === "revoked") throw conflict("This invite was already revoked.");
    await revokeInvite(trx, inviteId);
    await audit({ teamId, userId: a.user.id, action: "invite.revoke", entityType: "invite", entityId: inviteId, detail: { email: invite.email } }, trx);
  });
  return Response.json({ ok: true });
});

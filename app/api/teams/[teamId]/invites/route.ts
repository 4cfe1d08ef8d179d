import { db } from "@/db/client";
import { insertInvite, listInvites, revokeOpenInvitesFor } from "@/db/queries/invites";
import { getTeam } from "@/db/queries/teams";
import { getUserByEmail } from "@/db/queries/users";
import { audit, getMembershipRole, requireTeamRole } from "@/lib/access";
import { apiRoute, conflict, notFound, readJson } from "@/lib/api";
import { INVITE_TTL_MS, inviteMail, newInviteToken, publicBaseUrl, publicInvite } from "@/lib/invites";
import { sendMail } from "@/lib/mail/send";
import { inviteSchema } from "@/lib/validation/team";

type P = { teamId: string };

export const GET = apiRoute<P>(async (_req, { teamId }) => {
  await requireTeamRole(teamId, "owner");
  const invites = await listInvites(db, teamId);
  const now = Date.now();
  return Response.json({ invites: invites.map((i) => publicInvite(i, now)) });
});

export const POST = apiRoute<P>(async (req, { teamId }) => {
  const a = await requireTeamRole(teamId, "owner");
  const input = await readJson(req, inviteSchema, 4 * 1024);
  const team = await getTeam(db, teamId);
  if (!team) throw notFound("Team");
  const existing = await getUserByEmail(db, input.email);
  if (existing && (await getMembershipRole(teamId, existing.id))) {
    const msg = `${input.email} is already a member of this team.`;
    throw conflict(msg, { email: [msg] });
  }
  const { token, tokenHash } = newInviteToken();
  const now = Date.now();
  // One open invite per address: a new one replaces (revokes) any earlier link.
  const invite = await db.transaction(async (trx) => {
    const replaced = await revokeOpenInvitesFor(trx, teamId, input.email, now);
    const i = await insertInvite(trx, { teamId, email: input.email, role: input.role, tokenHash, invitedBy: a.user.id, expiresAt: now + INVITE_TTL_MS, now });
    await audit({ teamId, userId: a.user.id, action: "invite.create", entityType: "invite", entityId: i.id, detail: { email: i.email, role: i.role, replaced } }, trx);
    return i;
  });
  const link = `${publicBaseUrl(req)}/invite/${token}`;
  const mail = await sendMail({ teamId, kind: "invite", to: invite.email, ...inviteMail({ teamName: team.name, inviterName: a.user.name, role: invite.role, link, expiresAt: invite.expiresAt }) });
  return Response.json({ invite: publicInvite(invite, now), mail: { status: mail.status, outboxId: mail.outboxId } }, { status: 201 });
});

import { db } from "@/db/client";
import { listInvites } from "@/db/queries/invites";
import { createInvite } from "@/db/writes/teams";
import { requireTeamRole } from "@/lib/access";
import { apiRoute, readJson } from "@/lib/api";
import { INVITE_TTL_MS, inviteMail, newInviteToken, publicInvite } from "@/lib/invites";
import { publicBaseUrl } from "@/lib/public-url";
import { sendMail } from "@/lib/mail/send";
import { inviteSchema } from "@/lib/validation/team";

type P = { teamId: string };

export const GET = apiRoute<P>(async (_req, { teamId }) => {
  await requireTeamRole(teamId, "owner");
  const invites = await listInvites(db, teamId);
  const now = Date.now();
  return Response.json({ invites: invites.map((i) => publicInvite(i, now)) });
});

/** One open invite per address: a new one replaces (revokes) any earlier link. The mail goes out after the commit. */
export const POST = apiRoute<P>(async (req, { teamId }) => {
  const a = await requireTeamRole(teamId, "owner");
  const input = await readJson(req, inviteSchema, 4 * 1024);
  const { token, tokenHash } = newInviteToken();
  const now = Date.now();
  const { invite, team } = await createInvite(db, {
    teamId,
    invitedBy: a.user.id,
    email: input.email,
    role: input.role,
    tokenHash,
    expiresAt: now + INVITE_TTL_MS,
    now,
  });
  const link = `${publicBaseUrl()}/invite/${token}`;
  const mail = await sendMail({
    teamId,
    kind: "invite",
    to: invite.email,
    ...inviteMail({ teamName: team.name, inviterName: a.user.name, role: invite.role, link, expiresAt: invite.expiresAt }),
  });
  return Response.json({ invite: publicInvite(invite, now), mail: { status: mail.status, outboxId: mail.outboxId } }, { status: 201 });
});

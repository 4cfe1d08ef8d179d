import { db } from "@/db/client";
import { listInvites } from "@/db/queries/invites";
import { createInvite } from "@/db/writes/teams";
import { requireTeamRole } from "@/lib/access";
import { apiRoute, readJson } from "@/lib/api";
import { INVITE_TTL_MS, inviteMail, newInviteToken, publicInvite } from "@/lib/invites";
import { publicBaseUrl } from "@/lib/public-url";
import { requireVerifiedEmail } from "@/lib/email-verification";
import { withMailQuota } from "@/lib/mail/quota";
import { deliverMail, queueMail } from "@/lib/mail/send";
import { inviteSchema } from "@/lib/validation/team";

type P = { teamId: string };

export const GET = apiRoute<P>(async (_req, { teamId }) => {
  await requireTeamRole(teamId, "owner");
  const invites = await listInvites(db, teamId);
  const now = Date.now();
  return Response.json({ invites: invites.map((i) => publicInvite(i, now)) });
});

/**
 * One open invite per address: a new one replaces (revokes) any earlier link. Only an owner whose own address is
 * verified may invite (403 email_unverified), within the mail limits (429 mail_rate_limited with Retry-After); the
 * invite and its outbox row are stored under the limit's lock, and the mail goes out after it.
 */
export const POST = apiRoute<P>(async (req, { teamId }) => {
  const a = await requireTeamRole(teamId, "owner");
  requireVerifiedEmail(a.user);
  const input = await readJson(req, inviteSchema, 4 * 1024);
  const { token, tokenHash } = newInviteToken();
  const now = Date.now();
  const link = `${publicBaseUrl()}/invite/${token}`;
  const { invite, message, outboxId } = await withMailQuota({ userId: a.user.id, teamId, messages: 1 }, async () => {
    const { invite, team } = await createInvite(db, {
      teamId,
      invitedBy: a.user.id,
      email: input.email,
      role: input.role,
      tokenHash,
      expiresAt: now + INVITE_TTL_MS,
      now,
    });
    const message = {
      teamId,
      userId: a.user.id,
      kind: "invite",
      to: invite.email,
      ...inviteMail({ teamName: team.name, inviterName: a.user.name, role: invite.role, link, expiresAt: invite.expiresAt }),
    };
    return { invite, message, outboxId: await queueMail(message) };
  });
  const mail = await deliverMail(outboxId, message);
  return Response.json({ invite: publicInvite(invite, now), mail: { status: mail.status, outboxId: mail.outboxId } }, { status: 201 });
});

import { db } from "@/db/client";
import { getInviteByTokenHash } from "@/db/queries/invites";
import { acceptInvite } from "@/db/writes/teams";
import { getMembershipRole, requireApiUser } from "@/lib/access";
import { ApiError, apiRoute, conflict, readJson } from "@/lib/api";
import { inviteStatus } from "@/db/queries/invites";
import { hashInviteToken } from "@/lib/invites";
import { acceptInviteSchema } from "@/lib/validation/team";

const INVITE_OTHER_ADDRESS = "This invite was sent to a different e-mail address. Sign in with the address the invite was sent to, then open the link again.";
const INVITE_NOT_FOUND = "This invite link is not valid. Check that you copied the whole link, or ask the team's owner for a new invite.";

export const POST = apiRoute(async (req) => {
  const user = await requireApiUser();
  const { token } = await readJson(req, acceptInviteSchema, 4 * 1024);
  const invite = await getInviteByTokenHash(db, hashInviteToken(token));
  if (!invite) throw new ApiError(404, "not_found", INVITE_NOT_FOUND);
  const status = inviteStatus(invite);
  if (status === "accepted") throw conflict("This invite has already been used. Ask the team's owner for a new one if you still need access.");
  if (status === "revoked") throw conflict("This invite was withdrawn by the team's owner. Ask them for a new one.");
  if (status === "expired") throw new ApiError(410, "invite_expired", "This invite has expired (invites last 7 days). Ask the team's owner to send a new one.");
  if (invite.email !== user.email) {
    // Never echo the invited address: whoever holds a forwarded link learns nothing (issue 12 finding 8).
    throw new ApiError(403, "invite_email_mismatch", INVITE_OTHER_ADDRESS);
  }
  if (await getMembershipRole(invite.teamId, user.id)) throw conflict("You are already a member of this team.");
  const joined = await acceptInvite(db, { inviteId: invite.id, userId: user.id });
  return Response.json({ team: { id: joined.teamId, name: joined.teamName, role: joined.role } });
});

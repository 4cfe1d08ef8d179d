import "server-only";
import { createHash, randomBytes } from "node:crypto";
import { inviteStatus, type Invite } from "@/db/queries/invites";
import { mailSafeName } from "@/lib/mail/rules";

export const INVITE_TTL_MS = 7 * 24 * 60 * 60 * 1000;

/** A fresh invite token (256 random bits, base64url) and the SHA-256 hash that is stored instead. */
export function newInviteToken(): { token: string; tokenHash: string } {
  const token = randomBytes(32).toString("base64url");
  return { token, tokenHash: hashInviteToken(token) };
}

export function hashInviteToken(token: string): string {
  return createHash("sha256").update(token, "utf8").digest("hex");
}

/** An invite as the API and the team settings page show it (never its token). */
export type PublicInvite = ReturnType<typeof publicInvite>;

export function publicInvite(i: Invite, now = Date.now()) {
  return {
    id: i.id,
    email: i.email,
    role: i.role,
    createdAt: i.createdAt,
    expiresAt: i.expiresAt,
    acceptedAt: i.acceptedAt,
    revokedAt: i.revokedAt,
    status: inviteStatus(i, now),
  };
}

const ROLE_WORDS = { owner: "an owner", editor: "an editor", viewer: "a viewer" } as const;

/** The invite e-mail. Its subject is fixed wording with only the (sanitised) team name quoted in it. */
export function inviteMail(p: { teamName: string; inviterName: string; role: Invite["role"]; link: string; expiresAt: number }) {
  const until = new Date(p.expiresAt).toUTCString();
  const team = mailSafeName(p.teamName);
  const inviter = mailSafeName(p.inviterName);
  const subject = `Invitation to join the team "${team}" on Plateau`;
  const text = [
    `${inviter} invited you to join the team "${team}" on Plateau as ${ROLE_WORDS[p.role]}.`,
    "",
    "Open this link to accept (sign in or create an account first, with this e-mail address):",
    p.link,
    "",
    `The link works once and expires on ${until}.`,
    "If you did not expect this invite, ignore this message.",
  ].join("\n");
  return { subject, text };
}

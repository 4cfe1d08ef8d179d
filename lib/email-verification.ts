import "server-only";
import { createHash, randomBytes } from "node:crypto";
import { db, ready } from "@/db/client";
import { verificationSendTimes } from "@/db/queries/users";
import { createEmailVerification } from "@/db/writes/users";
import { ApiError, tooManyRequests } from "@/lib/api";
import { withMailLock } from "@/lib/mail/quota";
import { DAY_MS, VERIFY_TTL_MS, mailSafeName, secondsUntilNextLink } from "@/lib/mail/rules";
import { sendMail, type MailResult } from "@/lib/mail/send";
import { publicBaseUrl } from "@/lib/public-url";

export function hashVerificationToken(token: string): string {
  return createHash("sha256").update(token, "utf8").digest("hex");
}

export const UNVERIFIED_MESSAGE = (email: string) =>
  `Confirm your e-mail address (${email}) before sending invites or report e-mails: open the link we sent you, or send a new one from the notice at the top of the page.`;

/** 403 `email_unverified` unless the signed-in user's address is verified (invites and report e-mails need it). */
export function requireVerifiedEmail(user: { email: string; emailVerified: boolean }): void {
  if (!user.emailVerified) throw new ApiError(403, "email_unverified", UNVERIFIED_MESSAGE(user.email));
}

export function verificationMail(p: { name: string; link: string; expiresAt: number }): { subject: string; text: string } {
  return {
    subject: "Confirm your e-mail address for Plateau",
    text: [
      `Hello ${mailSafeName(p.name)},`,
      "",
      "Open this link to confirm that this is your e-mail address on Plateau:",
      p.link,
      "",
      `The link works once and expires on ${new Date(p.expiresAt).toUTCString()}.`,
      "Until then you can use Plateau, but not send invites or report e-mails.",
      "If you did not create a Plateau account, ignore this message.",
    ].join("\n"),
  };
}

/**
 * Mail the account a new verification link (a random 256-bit token; only its SHA-256 is stored). Paced per account
 * (429 with Retry-After): an address someone else signed up with cannot be flooded with links.
 */
export async function sendVerificationLink(user: { id: string; email: string; name: string }): Promise<MailResult> {
  await ready();
  const queued = await withMailLock(async () => {
    const now = Date.now();
    const wait = secondsUntilNextLink(await verificationSendTimes(db, user.id, now - DAY_MS), now);
    if (wait > 0) {
      const when = wait < 120 ? `${wait} seconds` : `${Math.ceil(wait / 60)} minutes`;
      throw tooManyRequests("verification_rate_limited", `A confirmation link was sent recently. Check your mail, or ask for a new one in ${when}.`, wait);
    }
    const token = randomBytes(32).toString("base64url");
    const expiresAt = now + VERIFY_TTL_MS;
    await createEmailVerification(db, { userId: user.id, email: user.email, tokenHash: hashVerificationToken(token), expiresAt, now });
    return { token, expiresAt };
  });
  const link = `${publicBaseUrl()}/verify-email/${queued.token}`;
  return sendMail({
    teamId: null,
    userId: user.id,
    kind: "verify_email",
    to: user.email,
    ...verificationMail({ name: user.name, link, expiresAt: queued.expiresAt }),
  });
}

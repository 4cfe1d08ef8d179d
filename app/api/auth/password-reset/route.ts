import { db, ready } from "@/db/client";
import { countPasswordResetsSince } from "@/db/queries/auth-tokens";
import { getUserByEmail } from "@/db/queries/users";
import { createPasswordReset } from "@/db/writes/users";
import { RESET_MAILS_PER_HOUR, RESET_TTL_MS, newResetToken, resetMail } from "@/lib/account-mail";
import { apiRoute, readJson } from "@/lib/api";
import { sendMail } from "@/lib/mail/send";
import { publicBaseUrl } from "@/lib/public-url";
import { passwordResetRequestSchema } from "@/lib/validation/auth";

const SENT = "If an account uses this address, we sent it a link to choose a new password. The link works once, for 1 hour.";

/**
 * Ask for a password-reset link by e-mail. The answer is the same whether or not the address has an account
 * (OWASP ASVS 4.0.3 2.5.x); at most 3 links per account an hour are made and mailed.
 */
export const POST = apiRoute(async (req) => {
  const { email } = await readJson(req, passwordResetRequestSchema, 4 * 1024);
  await ready();
  const user = await getUserByEmail(db, email);
  if (user && (await countPasswordResetsSince(db, user.id, Date.now() - 60 * 60 * 1000)) < RESET_MAILS_PER_HOUR) {
    const { token, tokenHash } = newResetToken();
    await createPasswordReset(db, { userId: user.id, tokenHash, ttlMs: RESET_TTL_MS });
    // The token travels in the query of a page that sends no Referer (app/(auth)/reset-password).
    const link = `${publicBaseUrl()}/reset-password?token=${token}`;
    await sendMail({ teamId: null, userId: user.id, kind: "password_reset", to: user.email, ...resetMail({ name: user.name, link }) });
  }
  return Response.json({ ok: true, message: SENT }, { status: 202 });
});

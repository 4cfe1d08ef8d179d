import "server-only";
import { createHash, randomBytes } from "node:crypto";

/** Password-reset links (OWASP ASVS 4.0.3 2.5.x, 2.3.1): 256 random bits, only the SHA-256 stored, 1 hour, single use. */
export const RESET_TTL_MS = 60 * 60 * 1000;
/** At most this many reset e-mails per account per hour (the request answers the same either way). */
export const RESET_MAILS_PER_HOUR = 3;

export function newResetToken(): { token: string; tokenHash: string } {
  const token = randomBytes(32).toString("base64url");
  return { token, tokenHash: hashResetToken(token) };
}

export function hashResetToken(token: string): string {
  return createHash("sha256").update(token, "utf8").digest("hex");
}

export function resetMail(p: { name: string; link: string }) {
  return {
    subject: "Reset your Plateau password",
    text: [
      `Hello ${p.name},`,
      "",
      "Someone (we hope you) asked to reset the password of your Plateau account. Open this link to choose a new one:",
      p.link,
      "",
      "The link works once and expires in 1 hour. Using it signs you out everywhere.",
      "If you did not ask for this, ignore this message: your password stays as it is.",
    ].join("\n"),
  };
}

/** To the owner of an address someone tried to sign up with (the sign-up itself answers as for a new account). */
export function accountExistsMail(p: { name: string; signInUrl: string; resetUrl: string }) {
  return {
    subject: "Someone tried to create a Plateau account with your address",
    text: [
      `Hello ${p.name},`,
      "",
      "Someone (perhaps you) just tried to create a Plateau account with this e-mail address, which already has one. No new account was made.",
      "",
      `To sign in: ${p.signInUrl}`,
      `Forgot your password? ${p.resetUrl}`,
      "",
      "If this was not you, you can ignore this message.",
    ].join("\n"),
  };
}

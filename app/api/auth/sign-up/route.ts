import { db, ready } from "@/db/client";
import { ConflictError } from "@/db/errors";
import { newId } from "@/db/ids";
import { countMailToSince } from "@/db/queries/auth-tokens";
import { getUserByEmail, type UserRecord } from "@/db/queries/users";
import { signUpUser } from "@/db/writes/users";
import { accountExistsMail } from "@/lib/account-mail";
import { apiRoute, readJson } from "@/lib/api";
import { startSession } from "@/lib/auth";
import { sendVerificationLink } from "@/lib/email-verification";
import { rememberThisDevice } from "@/lib/known-device";
import { sendMail } from "@/lib/mail/send";
import { hashPassword } from "@/lib/password";
import { publicBaseUrl } from "@/lib/public-url";
import { publicUser } from "@/lib/users";
import { signUpSchema, type SignUpInput } from "@/lib/validation/auth";

const HOUR = 60 * 60 * 1000;

/**
 * A sign-up with an address that already has an account answers exactly like a new one (201, the same body
 * shape, after the same KDF work) so the API does not tell which addresses have accounts (OWASP ASVS 4.0.3
 * 2.2.x, issue 12 finding 8); no account or session is made and the real owner is told by e-mail (at most
 * once an hour). Only a fresh account gets a session.
 */
async function answerTaken(existing: UserRecord, input: SignUpInput): Promise<Response> {
  if ((await countMailToSince(db, "account_exists", existing.email, Date.now() - HOUR)) === 0) {
    const base = publicBaseUrl();
    await sendMail({
      teamId: null,
      userId: existing.id,
      kind: "account_exists",
      to: existing.email,
      ...accountExistsMail({ name: existing.name, signInUrl: `${base}/sign-in`, resetUrl: `${base}/forgot-password` }),
    });
  }
  return Response.json({ user: { id: newId(), email: input.email, name: input.name, emailVerified: false } }, { status: 201 });
}

export const POST = apiRoute(async (req) => {
  const input = await readJson(req, signUpSchema, 16 * 1024);
  await ready();
  const existing = await getUserByEmail(db, input.email);
  // The (slow on purpose) hash runs in both cases, so timing tells as little as the answer.
  const passwordHash = await hashPassword(input.password);
  if (existing) return answerTaken(existing, input);
  let user: UserRecord;
  try {
    user = await signUpUser(db, { email: input.email, name: input.name, passwordHash });
  } catch (e) {
    // Two sign-ups racing for one address: the unique index decides; the loser is answered like any taken address.
    const winner = e instanceof ConflictError ? await getUserByEmail(db, input.email) : undefined;
    if (winner) return answerTaken(winner, input);
    throw e;
  }
  await startSession(user.id);
  await rememberThisDevice(db, user.id);
  // The account works at once; invites and report e-mails wait until the address is confirmed through this link.
  await sendVerificationLink(user);
  return Response.json({ user: publicUser(user) }, { status: 201 });
});

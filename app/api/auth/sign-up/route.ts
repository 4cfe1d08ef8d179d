import { db, ready } from "@/db/client";
import { ConflictError, fieldError } from "@/db/errors";
import { getUserByEmail } from "@/db/queries/users";
import { EMAIL_TAKEN, signUpUser } from "@/db/writes/users";
import { apiRoute, readJson } from "@/lib/api";
import { startSession } from "@/lib/auth";
import { sendVerificationLink } from "@/lib/email-verification";
import { hashPassword } from "@/lib/password";
import { publicUser } from "@/lib/users";
import { signUpSchema } from "@/lib/validation/auth";

export const POST = apiRoute(async (req) => {
  const input = await readJson(req, signUpSchema, 16 * 1024);
  await ready();
  // Checked before the (slow on purpose) password hash; the write's unique index settles a race.
  if (await getUserByEmail(db, input.email)) throw new ConflictError(EMAIL_TAKEN, fieldError("email", EMAIL_TAKEN));
  const passwordHash = await hashPassword(input.password);
  const user = await signUpUser(db, { email: input.email, name: input.name, passwordHash });
  await startSession(user.id);
  // The account works at once; invites and report e-mails wait until the address is confirmed through this link.
  await sendVerificationLink(req, user);
  return Response.json({ user: publicUser(user) }, { status: 201 });
});

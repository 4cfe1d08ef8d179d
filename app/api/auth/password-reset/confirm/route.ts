import { db, ready } from "@/db/client";
import { getPasswordResetByHash } from "@/db/queries/auth-tokens";
import { getUserById } from "@/db/queries/users";
import { resetPassword } from "@/db/writes/users";
import { hashResetToken } from "@/lib/account-mail";
import { apiRoute, badRequest, readJson } from "@/lib/api";
import { clearSessionCookie } from "@/lib/auth";
import { hashPassword, passwordProblem } from "@/lib/password";
import { passwordResetSchema } from "@/lib/validation/auth";

/**
 * Choose a new password with a reset link's token: single use, 1 hour, only its hash is stored. All the user's
 * sessions and known devices end (db/writes/users.ts resetPassword, one transaction); sign in afterwards.
 */
export const POST = apiRoute(async (req) => {
  const input = await readJson(req, passwordResetSchema, 4 * 1024);
  await ready();
  const tokenHash = hashResetToken(input.token);
  // The e-mail rule needs the account; a bad token is refused by the write itself (nothing changes).
  const pending = await getPasswordResetByHash(db, tokenHash);
  const owner = pending ? await getUserById(db, pending.userId) : undefined;
  const problem = owner ? passwordProblem(input.password, owner.email) : null;
  if (problem) throw badRequest("Some fields are not valid.", { password: [problem] });
  await resetPassword(db, { tokenHash, passwordHash: await hashPassword(input.password) });
  await clearSessionCookie();
  return Response.json({ ok: true });
});

import { db } from "@/db/client";
import { getUserById } from "@/db/queries/users";
import { changePassword } from "@/db/writes/users";
import { requireApiUser } from "@/lib/access";
import { ApiError, apiRoute, badRequest, readJson, unauthorized } from "@/lib/api";
import { validateRequest } from "@/lib/auth";
import { clientAddress } from "@/lib/client-address";
import { knownDeviceId } from "@/lib/known-device";
import { hashPassword, passwordProblem, verifyPassword } from "@/lib/password";
import { lockedUntil, recordFailure, recordSuccess, throttleKeys, waitWords } from "@/lib/throttle";
import { changePasswordSchema } from "@/lib/validation/auth";

const WRONG_CURRENT = "That is not your current password.";

/**
 * Change the password (OWASP ASVS 4.0.3 2.1.5, 3.3.3): the current password proves it is the owner (a wrong
 * one counts against sign-in throttling like a failed sign-in), the new one follows the sign-up rules, and
 * every other session of the user ends; this one stays signed in.
 */
export const POST = apiRoute(async (req) => {
  const me = await requireApiUser();
  const { session } = await validateRequest();
  const input = await readJson(req, changePasswordSchema, 16 * 1024);
  const user = await getUserById(db, me.id);
  if (!user || !session) throw unauthorized();
  const keys = throttleKeys(user.email, clientAddress(req.headers), await knownDeviceId(db, user.id));
  const until = await lockedUntil(db, keys);
  if (until) throw new ApiError(429, "too_many_attempts", `Too many wrong passwords. Wait ${waitWords(until - Date.now())}, then try again.`);
  if (!(await verifyPassword(input.currentPassword, user.passwordHash))) {
    await recordFailure(db, keys);
    throw badRequest(WRONG_CURRENT, { currentPassword: [WRONG_CURRENT] });
  }
  await recordSuccess(db, keys);
  const problem =
    passwordProblem(input.newPassword, user.email) ??
    (input.newPassword === input.currentPassword ? "Choose a password different from the current one." : null);
  if (problem) throw badRequest("Some fields are not valid.", { newPassword: [problem] });
  const { endedSessions } = await changePassword(db, { userId: user.id, passwordHash: await hashPassword(input.newPassword), keepSessionId: session.id });
  return Response.json({ ok: true, endedSessions });
});

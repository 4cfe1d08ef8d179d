import { db, ready } from "@/db/client";
import { getUserByEmail, insertUser, isUniqueViolation } from "@/db/queries/users";
import { audit } from "@/lib/access";
import { apiRoute, conflict, readJson } from "@/lib/api";
import { startSession } from "@/lib/auth";
import { hashPassword } from "@/lib/password";
import { publicUser } from "@/lib/users";
import { signUpSchema } from "@/lib/validation/auth";

const TAKEN = "An account with this e-mail address already exists. Sign in instead.";

export const POST = apiRoute(async (req) => {
  const input = await readJson(req, signUpSchema, 16 * 1024);
  await ready();
  if (await getUserByEmail(db, input.email)) throw conflict(TAKEN, { email: [TAKEN] });
  const passwordHash = await hashPassword(input.password);
  let user;
  try {
    user = await db.transaction(async (trx) => {
      const u = await insertUser(trx, { email: input.email, name: input.name, passwordHash });
      await audit({ teamId: null, userId: u.id, action: "user.sign_up", entityType: "user", entityId: u.id }, trx);
      return u;
    });
  } catch (e) {
    // Two sign-ups racing for one address: the unique index decides.
    if (isUniqueViolation(e)) throw conflict(TAKEN, { email: [TAKEN] });
    throw e;
  }
  await startSession(user.id);
  return Response.json({ user: publicUser(user) }, { status: 201 });
});

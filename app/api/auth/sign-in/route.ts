import { db, ready } from "@/db/client";
import { getUserByEmail } from "@/db/queries/users";
import { ApiError, apiRoute, readJson } from "@/lib/api";
import { startSession } from "@/lib/auth";
import { clientAddress } from "@/lib/client-address";
import { knownDeviceId, rememberThisDevice } from "@/lib/known-device";
import { dummyHash, verifyPassword } from "@/lib/password";
import { lockedUntil, recordFailure, recordSuccess, throttleKeys, waitWords } from "@/lib/throttle";
import { publicUser } from "@/lib/users";
import { signInSchema } from "@/lib/validation/auth";

const WRONG = "E-mail or password is wrong.";

function tooMany(until: number): Response {
  const seconds = Math.max(1, Math.ceil((until - Date.now()) / 1000));
  return Response.json(
    { error: { code: "too_many_attempts", message: `Too many failed sign-in attempts. Wait ${waitWords(seconds * 1000)}, then try again.` } },
    { status: 429, headers: { "retry-after": String(seconds) } },
  );
}

export const POST = apiRoute(async (req) => {
  const input = await readJson(req, signInSchema, 16 * 1024);
  await ready();
  const user = await getUserByEmail(db, input.email);
  // A browser that signed in to this account before is throttled on its own (lib/throttle.ts, lib/known-device.ts).
  const keys = throttleKeys(input.email, clientAddress(req.headers), await knownDeviceId(db, user?.id));
  const until = await lockedUntil(db, keys);
  if (until) return tooMany(until);
  // Unknown e-mails still pay for one KDF run, so timing doesn't tell which addresses exist.
  const ok = await verifyPassword(input.password, user?.passwordHash ?? (await dummyHash()));
  if (!user || !ok) {
    const locked = await recordFailure(db, keys);
    if (locked) return tooMany(locked);
    throw new ApiError(401, "invalid_credentials", WRONG);
  }
  await recordSuccess(db, keys);
  await startSession(user.id);
  await rememberThisDevice(db, user.id);
  return Response.json({ user: publicUser(user) });
});

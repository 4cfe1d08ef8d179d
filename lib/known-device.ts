import "server-only";
import { createHash, randomBytes } from "node:crypto";
import { cookies } from "next/headers";
import type { Knex } from "knex";
import { getKnownDevice } from "@/db/queries/auth-tokens";
import { rememberDevice } from "@/db/writes/users";
import { secureCookies } from "@/lib/auth";

/**
 * Known devices (OWASP "device cookies"; ASVS 4.0.3 2.2.1 "first login on a device"): a successful sign-in
 * sets `plateau_device`, a random 256-bit token (only its SHA-256 is stored, with the user), sent only to
 * /api/auth. A later sign-in to the same account with that cookie is throttled on its own key (lib/throttle.ts),
 * so an attacker failing on the account from elsewhere never locks the owner's browser out.
 */
export const DEVICE_COOKIE = "plateau_device";
const DEVICE_TTL_S = 180 * 24 * 60 * 60;

const hashToken = (token: string) => createHash("sha256").update(token, "utf8").digest("hex");

async function deviceToken(): Promise<string | null> {
  const v = (await cookies()).get(DEVICE_COOKIE)?.value;
  return v && /^[A-Za-z0-9_-]{43}$/.test(v) ? v : null;
}

/** The throttling id of this browser when it is a known device of `userId`, else null. */
export async function knownDeviceId(q: Knex, userId: string | undefined): Promise<string | null> {
  const token = await deviceToken();
  if (!token || !userId) return null;
  const d = await getKnownDevice(q, hashToken(token));
  return d && d.userId === userId ? d.tokenHash.slice(0, 32) : null;
}

/** After a successful sign-in: refresh this browser's device token for the user, or issue a new one. */
export async function rememberThisDevice(q: Knex, userId: string): Promise<void> {
  const current = await deviceToken();
  const known = current ? await getKnownDevice(q, hashToken(current)) : undefined;
  const token = known && known.userId === userId && current ? current : randomBytes(32).toString("base64url");
  await rememberDevice(q, { userId, tokenHash: hashToken(token) });
  (await cookies()).set(DEVICE_COOKIE, token, { httpOnly: true, sameSite: "lax", secure: secureCookies(), path: "/api/auth", maxAge: DEVICE_TTL_S });
}

import "server-only";
import type { Knex } from "knex";
import { deleteThrottleRows, getThrottleRows, updateThrottleRows, type ThrottleRow } from "@/db/queries/throttle";

/**
 * Sign-in throttling. Two keys per attempt: the account (the normalised e-mail, whether or not it
 * exists, so a lock says nothing about existence) and the client address. Within a 15-minute window,
 * 5 failures lock an account key and 20 failures lock a client key, each for 15 minutes.
 */
export const WINDOW_MS = 15 * 60 * 1000;
export const LOCK_MS = 15 * 60 * 1000;
export const LIMITS = { account: 5, client: 20 } as const;

export type ThrottleKey = { kind: keyof typeof LIMITS; key: string };

export function throttleKeys(email: string, clientAddress: string): ThrottleKey[] {
  return [
    { kind: "account", key: `account:${email}` },
    { kind: "client", key: `client:${clientAddress}` },
  ];
}

/** When the attempt is locked out: the time (ms) the lock ends; otherwise null. */
export async function lockedUntil(q: Knex, keys: ThrottleKey[], now = Date.now()): Promise<number | null> {
  const rows = await getThrottleRows(
    q,
    keys.map((k) => k.key),
  );
  let until: number | null = null;
  for (const r of rows) if (r.lockedUntil !== null && r.lockedUntil > now) until = Math.max(until ?? 0, r.lockedUntil);
  return until;
}

/** Count a failure on every key; returns the lock end if this failure started a lock. */
export async function recordFailure(q: Knex, keys: ThrottleKey[], now = Date.now()): Promise<number | null> {
  const pruneBefore = Math.random() < 0.02 ? now - Math.max(WINDOW_MS, LOCK_MS) : undefined;
  return updateThrottleRows(
    q,
    keys.map((k) => k.key),
    (stored) => {
      const rows: ThrottleRow[] = [];
      let locked: number | null = null;
      for (const k of keys) {
        const prev = stored.get(k.key);
        const fresh = !prev || now - prev.windowStart >= WINDOW_MS;
        const failures = fresh ? 1 : prev.failures + 1;
        const windowStart = fresh ? now : prev.windowStart;
        let lockEnd = prev?.lockedUntil && prev.lockedUntil > now ? prev.lockedUntil : null;
        if (failures >= LIMITS[k.kind] && lockEnd === null) {
          lockEnd = now + LOCK_MS;
          locked = Math.max(locked ?? 0, lockEnd);
        }
        // After a lock the count starts again, so the next lock needs a full set of new failures.
        rows.push({ key: k.key, failures: lockEnd ? 0 : failures, windowStart: lockEnd ? now : windowStart, lockedUntil: lockEnd });
      }
      return { rows, result: locked };
    },
    pruneBefore,
  );
}

/** A successful sign-in clears the account's count (the client's count stays). */
export async function recordSuccess(q: Knex, keys: ThrottleKey[]): Promise<void> {
  await deleteThrottleRows(
    q,
    keys.filter((k) => k.kind === "account").map((k) => k.key),
  );
}

/** Client address for throttling: the first hop of x-forwarded-for, else x-real-ip, else null. */
export function clientAddress(headers: Headers): string | null {
  const xff = headers.get("x-forwarded-for");
  const first = xff?.split(",")[0]?.trim();
  if (first) return first.slice(0, 100);
  const real = headers.get("x-real-ip")?.trim();
  return real ? real.slice(0, 100) : null;
}

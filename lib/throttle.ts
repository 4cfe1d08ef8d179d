import "server-only";
import type { Knex } from "knex";
import { deleteThrottleRows, getThrottleRows, updateThrottleRows, type ThrottleRow } from "@/db/queries/throttle";
import { addressKey } from "@/lib/client-address";

/**
 * Sign-in throttling that slows attackers without locking the owner out (OWASP ASVS 4.0.3 2.2.1:
 * "soft lockouts, rate limiting, … ever increasing delays between attempts, … first login on a device";
 * "no more than 100 failed attempts per hour is possible on a single account").
 *
 * Keys of an attempt from a client that has not signed in to this account before:
 * - `pair:<e-mail>|<client>`: 5 failures in 15 minutes lock this account FOR THIS CLIENT for 15 minutes;
 * - `client:<client>`: 20 failures in 15 minutes (any accounts: password spraying) lock the client for 15 minutes;
 * - `account:<e-mail>`: from the 5th failure within an hour (from all clients together) every further
 *   failure makes the account wait a growing delay, 1 s, 2 s, 4 s … capped at 60 s, before the next attempt
 *   is even checked: at most about 65 failures an hour, and never more than a minute's wait for the owner.
 * An attempt from a known device (a `plateau_device` cookie that this account's earlier sign-in set, see
 * lib/known-device.ts) is keyed by `device:<id>` only (5 failures in 15 minutes lock that device): whatever an
 * attacker does elsewhere, the owner's own browser keeps working.
 * The account keys exist whether or not the account does, so throttling says nothing about existence.
 */
export const WINDOW_MS = 15 * 60 * 1000;
export const LOCK_MS = 15 * 60 * 1000;
export const ACCOUNT_WINDOW_MS = 60 * 60 * 1000;
export const ACCOUNT_FREE_FAILURES = 5;
export const ACCOUNT_MAX_DELAY_MS = 60 * 1000;
export const LIMITS = { pair: 5, client: 20, device: 5 } as const;

export type ThrottleKind = keyof typeof LIMITS | "account";
export type ThrottleKey = { kind: ThrottleKind; key: string };

/** "45 seconds", "1 second", "15 minutes": how long a throttled client waits, in words. */
export function waitWords(ms: number): string {
  const seconds = Math.max(1, Math.ceil(ms / 1000));
  if (seconds < 60) return `${seconds} second${seconds === 1 ? "" : "s"}`;
  const minutes = Math.ceil(seconds / 60);
  return `${minutes} minute${minutes === 1 ? "" : "s"}`;
}

/** The delay the account waits after its `failures`-th failure within the hour (0 below the free allowance). */
export function accountDelayMs(failures: number): number {
  if (failures < ACCOUNT_FREE_FAILURES) return 0;
  return Math.min(ACCOUNT_MAX_DELAY_MS, 1000 * 2 ** Math.min(20, failures - ACCOUNT_FREE_FAILURES));
}

/**
 * The keys of one attempt: from a known device of this account, its device key only; otherwise the
 * account-and-client pair, the client (both only when the address is known) and the account.
 */
export function throttleKeys(email: string, clientAddress: string | null, knownDeviceId: string | null = null): ThrottleKey[] {
  if (knownDeviceId) return [{ kind: "device", key: `device:${knownDeviceId}` }];
  const keys: ThrottleKey[] = [{ kind: "account", key: `account:${email}` }];
  if (clientAddress) {
    const client = addressKey(clientAddress);
    keys.push({ kind: "pair", key: `pair:${email}|${client}` }, { kind: "client", key: `client:${client}` });
  }
  return keys;
}

/** When the attempt has to wait: the time (ms) the longest lock or delay ends; otherwise null. */
export async function lockedUntil(q: Knex, keys: ThrottleKey[], now = Date.now()): Promise<number | null> {
  const rows = await getThrottleRows(
    q,
    keys.map((k) => k.key),
  );
  let until: number | null = null;
  for (const r of rows) if (r.lockedUntil !== null && r.lockedUntil > now) until = Math.max(until ?? 0, r.lockedUntil);
  return until;
}

function nextRow(k: ThrottleKey, prev: ThrottleRow | undefined, now: number): ThrottleRow {
  if (k.kind === "account") {
    const fresh = !prev || now - prev.windowStart >= ACCOUNT_WINDOW_MS;
    const failures = fresh ? 1 : prev.failures + 1;
    const delay = accountDelayMs(failures);
    return { key: k.key, failures, windowStart: fresh ? now : prev.windowStart, lockedUntil: delay > 0 ? now + delay : null };
  }
  const fresh = !prev || now - prev.windowStart >= WINDOW_MS;
  const failures = fresh ? 1 : prev.failures + 1;
  const windowStart = fresh ? now : prev.windowStart;
  const running = prev?.lockedUntil && prev.lockedUntil > now ? prev.lockedUntil : null;
  if (running === null && failures >= LIMITS[k.kind]) {
    // After a lock the count starts again, so the next lock needs a full set of new failures.
    return { key: k.key, failures: 0, windowStart: now, lockedUntil: now + LOCK_MS };
  }
  return { key: k.key, failures: running ? 0 : failures, windowStart: running ? now : windowStart, lockedUntil: running };
}

/** Count a failure on every key; returns when the next attempt may come if this failure started a lock or delay. */
export async function recordFailure(q: Knex, keys: ThrottleKey[], now = Date.now()): Promise<number | null> {
  const pruneBefore = Math.random() < 0.02 ? now - Math.max(WINDOW_MS, LOCK_MS, ACCOUNT_WINDOW_MS) : undefined;
  return updateThrottleRows(
    q,
    keys.map((k) => k.key),
    (stored) => {
      const rows = keys.map((k) => nextRow(k, stored.get(k.key), now));
      let locked: number | null = null;
      for (const r of rows) {
        const before = stored.get(r.key)?.lockedUntil ?? null;
        if (r.lockedUntil !== null && r.lockedUntil !== before) locked = Math.max(locked ?? 0, r.lockedUntil);
      }
      return { rows, result: locked };
    },
    pruneBefore,
  );
}

/** A successful sign-in clears the account's and this client's (or device's) counts; the client's spray count stays. */
export async function recordSuccess(q: Knex, keys: ThrottleKey[]): Promise<void> {
  await deleteThrottleRows(
    q,
    keys.filter((k) => k.kind !== "client").map((k) => k.key),
  );
}

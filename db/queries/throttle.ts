import "server-only";
import type { Knex } from "knex";

type Q = Knex | Knex.Transaction;

export interface ThrottleRow {
  key: string;
  failures: number;
  windowStart: number;
  lockedUntil: number | null;
}

export async function getThrottleRows(q: Q, keys: string[]): Promise<ThrottleRow[]> {
  if (keys.length === 0) return [];
  const rows = await q("sign_in_throttle").whereIn("key", keys).select();
  return rows.map((r: { key: string; failures: number; window_start: number; locked_until: number | null }) => ({
    key: r.key,
    failures: r.failures,
    windowStart: r.window_start,
    lockedUntil: r.locked_until,
  }));
}

/**
 * Read-modify-write of the rows of `keys` in ONE transaction, so concurrent failures never lose a count:
 * `next` gets the stored rows (by key; absent keys have none) and returns the rows to store and a result.
 * With `pruneBefore`, rows whose window and lock both ended before it are dropped in the same transaction.
 */
export async function updateThrottleRows<T>(
  q: Knex,
  keys: string[],
  next: (stored: Map<string, ThrottleRow>) => { rows: ThrottleRow[]; result: T },
  pruneBefore?: number,
): Promise<T> {
  return q.transaction(async (trx) => {
    const stored = new Map((await getThrottleRows(trx, keys)).map((r) => [r.key, r]));
    const { rows, result } = next(stored);
    for (const r of rows) await putThrottleRow(trx, r);
    if (pruneBefore !== undefined) await pruneThrottle(trx, pruneBefore);
    return result;
  });
}

export async function putThrottleRow(q: Q, r: ThrottleRow): Promise<void> {
  await q("sign_in_throttle").insert({ key: r.key, failures: r.failures, window_start: r.windowStart, locked_until: r.lockedUntil }).onConflict("key").merge();
}

export async function deleteThrottleRows(q: Q, keys: string[]): Promise<void> {
  if (keys.length) await q("sign_in_throttle").whereIn("key", keys).delete();
}

/** Drop rows whose window and lock both ended before `before` (keeps the table small). */
export async function pruneThrottle(q: Q, before: number): Promise<void> {
  await q("sign_in_throttle")
    .where("window_start", "<", before)
    .andWhere((w) => w.whereNull("locked_until").orWhere("locked_until", "<", before))
    .delete();
}

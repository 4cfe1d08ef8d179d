import "server-only";
import type { Knex } from "knex";

/** The cheapest round trip to the database: throws when it cannot answer. */
export async function pingDatabase(q: Knex): Promise<void> {
  await q.raw("select 1");
}

const ROLLBACK = Symbol("rollback");

/**
 * Whether the database can be written now: in a transaction that is rolled back, `PRAGMA user_version` is set to
 * its own value, which needs the write lock and a writable file (a read-only file, a full disk or another process
 * holding the lock for longer than `waitMs` fail it). Stores nothing. Throws the driver's error when it cannot.
 */
export async function probeWritable(q: Knex, waitMs = 500): Promise<void> {
  try {
    await q.transaction(async (trx) => {
      await trx.raw(`pragma busy_timeout = ${Math.max(0, Math.round(waitMs))}`);
      try {
        const rows = (await trx.raw("pragma user_version")) as { user_version: number }[];
        await trx.raw(`pragma user_version = ${Number(rows[0]?.user_version ?? 0)}`);
      } finally {
        await trx.raw("pragma busy_timeout = 5000");
      }
      throw ROLLBACK;
    });
  } catch (e) {
    if (e !== ROLLBACK) throw e;
  }
}

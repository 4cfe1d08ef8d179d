import "server-only";
import type { Knex } from "knex";

/** The cheapest round trip to the database (the health check): throws when it cannot answer. */
export async function pingDatabase(q: Knex): Promise<void> {
  await q.raw("select 1");
}

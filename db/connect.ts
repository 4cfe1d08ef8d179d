import fs from "node:fs";
import path from "node:path";
import knexFactory, { type Knex } from "knex";
import { databasePath } from "./path";

/**
 * Open a Knex instance on a SQLite file with foreign keys on, WAL and a busy timeout.
 * Used by db/client.ts (the app's single instance), the demo seeder and the tests.
 */
export function openDatabase(filename: string = databasePath()): Knex {
  fs.mkdirSync(path.dirname(filename), { recursive: true });
  return knexFactory({
    client: "better-sqlite3",
    connection: { filename },
    useNullAsDefault: true,
    pool: {
      min: 1,
      max: 1,
      afterCreate(conn: { pragma: (s: string) => unknown }, done: (err: Error | null, conn: unknown) => void) {
        conn.pragma("journal_mode = WAL");
        conn.pragma("foreign_keys = ON");
        conn.pragma("busy_timeout = 5000");
        conn.pragma("synchronous = NORMAL");
        done(null, conn);
      },
    },
  });
}

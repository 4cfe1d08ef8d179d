import fs from "node:fs";
import path from "node:path";
import knexFactory, { type Knex } from "knex";
import { databasePath } from "./path";

/** The part of a better-sqlite3 connection the pool hooks use. */
interface RawConnection {
  pragma: (s: string, o?: { simple?: boolean }) => unknown;
  exec: (s: string) => unknown;
  close: () => unknown;
}

/** SQLite result codes after which the connection is closed and a fresh one opened on the next query. */
const REOPEN = /^SQLITE_(READONLY|CANTOPEN|IOERR|PERM|NOTADB|CORRUPT)(_|$)/;

/**
 * Proves the connection can write: `PRAGMA user_version = <its value>` in a transaction that is rolled back, which
 * needs the write lock and a writable file. SQLite silently opens a file it may not write read-only (and keeps it so
 * after the permissions are restored), so a connection that fails this is closed and never pooled.
 */
function probeWrite(conn: RawConnection): void {
  conn.exec("BEGIN IMMEDIATE");
  try {
    const v = Number(conn.pragma("user_version", { simple: true }));
    conn.pragma(`user_version = ${v}`);
  } finally {
    conn.exec("ROLLBACK");
  }
}

/**
 * Open a Knex instance on a SQLite file with foreign keys on, WAL and a busy timeout.
 * Used by db/client.ts (the app's single instance), the demo seeder and the tests.
 *
 * Fault handling (issue 12 finding 15): a connection that cannot write is refused at creation (the pool then answers
 * the query with that error at once, and opens a new connection for the next one, so the app recovers by itself once
 * the file is writable again); after a query fails with a code of REOPEN the connection is replaced on the next use.
 */
export function openDatabase(filename: string = databasePath()): Knex {
  fs.mkdirSync(path.dirname(filename), { recursive: true });
  let reopen = false;
  const knex = knexFactory({
    client: "better-sqlite3",
    connection: { filename },
    useNullAsDefault: true,
    pool: {
      min: 1,
      max: 1,
      afterCreate(conn: RawConnection, done: (err: Error | null, conn: unknown) => void) {
        try {
          conn.pragma("journal_mode = WAL");
          conn.pragma("foreign_keys = ON");
          conn.pragma("busy_timeout = 5000");
          conn.pragma("synchronous = NORMAL");
          probeWrite(conn);
        } catch (e) {
          // close it: another open connection to the file would keep this one's read-only shared memory alive
          try {
            conn.close();
          } catch {
            /* already unusable */
          }
          done(e instanceof Error ? e : new Error(String(e)), conn);
          return;
        }
        done(null, conn);
      },
      // a connection that failed with a file-level error is replaced rather than reused
      validate: () => {
        if (!reopen) return true;
        reopen = false;
        return false;
      },
    },
  });
  knex.on("query-error", (err: unknown) => {
    const code = typeof err === "object" && err !== null && "code" in err ? String((err as { code: unknown }).code) : "";
    if (REOPEN.test(code)) reopen = true;
  });
  return knex;
}

import Database from "better-sqlite3";
import { inject } from "vitest";

/** Read-write access to the running test server's SQLite file (for checking what was stored), or to `dbPath`'s. */
export function openTestDb(dbPath: string = inject("dbPath")): Database.Database {
  const db = new Database(dbPath);
  db.pragma("busy_timeout = 5000");
  return db;
}

/** Number of rows in `table` matching an optional where clause. */
export function countRows(db: Database.Database, table: string, where = "1 = 1", ...args: unknown[]): number {
  return (db.prepare(`select count(*) as n from ${table} where ${where}`).get(...args) as { n: number }).n;
}

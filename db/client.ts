import "server-only";
import type { Knex } from "knex";
import { openDatabase } from "./connect";
import { DatabaseUnavailableError } from "./errors";
import { migrateLatest } from "./migrate";

// One instance per server process; kept on globalThis so dev-mode reloads don't open more.
const g = globalThis as unknown as {
  __plateauDb?: Knex;
  __plateauMigrated?: Promise<void>;
  __plateauMigrateFailure?: { at: number; error: DatabaseUnavailableError };
};

export const db: Knex = g.__plateauDb ?? (g.__plateauDb = openDatabase());

/** Seconds between two attempts to migrate a database that could not be migrated (read-only, missing, locked…). */
const RETRY_MS = 1000;

/**
 * Resolves once migrations have run on the app's database (instrumentation starts it; apiRoute and the pages that
 * read wait for it). A failed attempt is not kept for the life of the process: it throws DatabaseUnavailableError
 * (503 with Retry-After through apiRoute) and the next call at least RETRY_MS later tries again, so the app
 * recovers without a restart once the file can be written (issue 12 finding 15).
 */
export function ready(): Promise<void> {
  if (g.__plateauMigrated) return g.__plateauMigrated;
  const failed = g.__plateauMigrateFailure;
  if (failed && Date.now() - failed.at < RETRY_MS) return Promise.reject(failed.error);
  const attempt = migrateLatest(db).then(
    () => {
      g.__plateauMigrateFailure = undefined;
    },
    (e: unknown) => {
      const error = new DatabaseUnavailableError(
        "The database cannot be opened or prepared right now (is its file writable?); nothing was stored. Try again shortly.",
        e,
      );
      console.error("[db] migrations failed; retrying on the next request:", e instanceof Error ? e.message : e);
      g.__plateauMigrateFailure = { at: Date.now(), error };
      if (g.__plateauMigrated === attempt) g.__plateauMigrated = undefined;
      throw error;
    },
  );
  g.__plateauMigrated = attempt;
  return attempt;
}

import "server-only";
import type { Knex } from "knex";
import { openDatabase } from "./connect";
import { migrateLatest } from "./migrate";

// One instance per server process; kept on globalThis so dev-mode reloads don't open more.
const g = globalThis as unknown as { __plateauDb?: Knex; __plateauMigrated?: Promise<void> };

export const db: Knex = g.__plateauDb ?? (g.__plateauDb = openDatabase());

/** Resolves once migrations have run on the app's database (instrumentation starts it). */
export function ready(): Promise<void> {
  return (g.__plateauMigrated ??= migrateLatest(db));
}

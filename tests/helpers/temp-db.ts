import fs from "node:fs";
import os from "node:os";
import path from "node:path";
import type { Knex } from "knex";
import { openDatabase } from "@/db/connect";
import { migrateLatest } from "@/db/migrate";
import type { NewWireClass } from "@/db/writes/baselines";
import { createTeam } from "@/db/writes/teams";
import { signUpUser } from "@/db/writes/users";

/** A migrated SQLite file in a temp folder, with `close()` to destroy the pool and remove it. */
export async function tempDb(prefix: string): Promise<{ db: Knex; close: () => Promise<void> }> {
  const dir = fs.mkdtempSync(path.join(os.tmpdir(), `plateau-${prefix}-`));
  const db = openDatabase(path.join(dir, "t.sqlite"));
  await migrateLatest(db);
  return {
    db,
    close: async () => {
      await db.destroy();
      fs.rmSync(dir, { recursive: true, force: true });
    },
  };
}

let n = 0;
/** A user (through the users write module) and a team they own (through the teams write module). */
export async function ownerWithTeam(db: Knex, name = "Team"): Promise<{ userId: string; teamId: string; email: string }> {
  const email = `owner-${process.pid}-${++n}@example.test`;
  const user = await signUpUser(db, { email, name: `Owner ${n}`, passwordHash: "not-a-real-hash" });
  const team = await createTeam(db, { name: `${name} ${n}`, ownerId: user.id });
  return { userId: user.id, teamId: team.id, email };
}

export async function newUser(db: Knex, name = "Member"): Promise<{ userId: string; email: string }> {
  const email = `${name.toLowerCase()}-${process.pid}-${++n}@example.test`;
  const user = await signUpUser(db, { email, name: `${name} ${n}`, passwordHash: "not-a-real-hash" });
  return { userId: user.id, email };
}

/** A valid wire class (invented figures). */
export function wireClass(name: string, over: Partial<NewWireClass> = {}): NewWireClass {
  return {
    name,
    tier: "local",
    widthM: 2.4e-8,
    thicknessM: 4.8e-8,
    spacingM: 2.4e-8,
    ildBelowM: 3e-8,
    ildAboveM: 3e-8,
    barrierM: 2e-9,
    metal: "Cu",
    k: 2.7,
    netCount: 1000,
    meanLengthM: 4e-6,
    driverOhm: 8000,
    loadF: 4e-16,
    activity: 0.15,
    ...over,
  };
}

/** Row counts of the given tables (optionally filtered), to prove a failed write left nothing behind. */
export async function counts(db: Knex, tables: readonly string[]): Promise<Record<string, number>> {
  const out: Record<string, number> = {};
  for (const t of tables) out[t] = Number(((await db(t).count({ n: "*" }).first()) as { n: number }).n);
  return out;
}

/** The audit rows of a team, oldest first, with detail parsed. */
export async function auditRows(
  db: Knex,
  where: Record<string, unknown>,
): Promise<{ action: string; entity_type: string; entity_id: string; user_id: string | null; team_id: string | null; detail: unknown }[]> {
  const rows = await db("audit_log").where(where).orderBy("id").select("action", "entity_type", "entity_id", "user_id", "team_id", "detail");
  return rows.map((r: { detail: string | null }) => ({ ...r, detail: r.detail === null ? null : JSON.parse(r.detail) })) as never;
}

/**
 * Make the database refuse inserts into `table` matching `when` (SQL over NEW) with a real SQLite error:
 * a failure in the middle of a write, to prove the whole transaction rolls back. Returns the undo.
 */
export async function refuseInsert(db: Knex, table: string, when: string): Promise<() => Promise<void>> {
  const name = `refuse_${table}_${++n}`;
  await db.raw(`create trigger ${name} before insert on ${table} when ${when} begin select raise(abort, 'refused by the test'); end`);
  return async () => {
    await db.raw(`drop trigger ${name}`);
  };
}

import "server-only";
import type { Knex } from "knex";

export interface UserRecord {
  id: string;
  email: string;
  name: string;
  passwordHash: string;
  createdAt: number;
}

// Reads of users. Writes: db/writes/users.ts.

type Q = Knex | Knex.Transaction;

export function toUser(row: { id: string; email: string; name: string; password_hash: string; created_at: number }): UserRecord {
  return { id: row.id, email: row.email, name: row.name, passwordHash: row.password_hash, createdAt: row.created_at };
}

export async function getUserByEmail(q: Q, email: string): Promise<UserRecord | undefined> {
  const row = await q("users").where({ email }).first();
  return row ? toUser(row) : undefined;
}

export async function getUserById(q: Q, id: string): Promise<UserRecord | undefined> {
  const row = await q("users").where({ id }).first();
  return row ? toUser(row) : undefined;
}

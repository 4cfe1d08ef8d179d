import "server-only";
import type { Knex } from "knex";
import { newId } from "@/lib/ids";

export interface UserRecord {
  id: string;
  email: string;
  name: string;
  passwordHash: string;
  createdAt: number;
}

type Q = Knex | Knex.Transaction;

function toUser(row: { id: string; email: string; name: string; password_hash: string; created_at: number }): UserRecord {
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

/** Insert a user; the caller has normalised the e-mail (lower case) and hashed the password. */
export async function insertUser(q: Q, u: { email: string; name: string; passwordHash: string; id?: string; now?: number }): Promise<UserRecord> {
  const row = { id: u.id ?? newId(), email: u.email, name: u.name, password_hash: u.passwordHash, created_at: u.now ?? Date.now() };
  await q("users").insert(row);
  return toUser(row);
}

export function isUniqueViolation(e: unknown): boolean {
  return typeof e === "object" && e !== null && "code" in e && String((e as { code: unknown }).code).startsWith("SQLITE_CONSTRAINT_UNIQUE");
}

import "server-only";
import type { Knex } from "knex";

export interface UserRecord {
  id: string;
  email: string;
  name: string;
  passwordHash: string;
  createdAt: number;
  /** When the address was proven (a verification link or an accepted invite); null = not yet. */
  emailVerifiedAt: number | null;
}

// Reads of users. Writes: db/writes/users.ts.

type Q = Knex | Knex.Transaction;

export function toUser(row: {
  id: string;
  email: string;
  name: string;
  password_hash: string;
  created_at: number;
  email_verified_at?: number | null;
}): UserRecord {
  return {
    id: row.id,
    email: row.email,
    name: row.name,
    passwordHash: row.password_hash,
    createdAt: row.created_at,
    emailVerifiedAt: row.email_verified_at ?? null,
  };
}

export async function getUserByEmail(q: Q, email: string): Promise<UserRecord | undefined> {
  const row = await q("users").where({ email }).first();
  return row ? toUser(row) : undefined;
}

export async function getUserById(q: Q, id: string): Promise<UserRecord | undefined> {
  const row = await q("users").where({ id }).first();
  return row ? toUser(row) : undefined;
}

/** A verification link's row by the SHA-256 of its token. */
export interface EmailVerification {
  id: string;
  userId: string;
  email: string;
  createdAt: number;
  expiresAt: number;
  usedAt: number | null;
}

export async function getEmailVerificationByTokenHash(q: Q, tokenHash: string): Promise<EmailVerification | undefined> {
  const row = await q("email_verifications").where({ token_hash: tokenHash }).first();
  return row
    ? { id: row.id, userId: row.user_id, email: row.email, createdAt: row.created_at, expiresAt: row.expires_at, usedAt: row.used_at ?? null }
    : undefined;
}

/** When the user's verification links were sent, newest first, since `since` (ms). */
export async function verificationSendTimes(q: Q, userId: string, since: number): Promise<number[]> {
  const rows: { created_at: number }[] = await q("email_verifications")
    .where({ user_id: userId })
    .andWhere("created_at", ">", since)
    .orderBy("created_at", "desc")
    .select("created_at");
  return rows.map((r) => r.created_at);
}

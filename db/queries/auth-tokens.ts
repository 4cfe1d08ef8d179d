import "server-only";
import type { Knex } from "knex";

// Reads of known devices and password-reset tokens. Writes: db/writes/users.ts.

type Q = Knex | Knex.Transaction;

export interface KnownDevice {
  tokenHash: string;
  userId: string;
  createdAt: number;
  lastUsedAt: number;
}

export async function getKnownDevice(q: Q, tokenHash: string): Promise<KnownDevice | undefined> {
  const r = await q("known_devices").where({ token_hash: tokenHash }).first();
  return r ? { tokenHash: r.token_hash, userId: r.user_id, createdAt: r.created_at, lastUsedAt: r.last_used_at } : undefined;
}

export interface PasswordReset {
  id: string;
  userId: string;
  createdAt: number;
  expiresAt: number;
  usedAt: number | null;
}

export async function getPasswordResetByHash(q: Q, tokenHash: string): Promise<PasswordReset | undefined> {
  const r = await q("password_resets").where({ token_hash: tokenHash }).first();
  return r ? { id: r.id, userId: r.user_id, createdAt: r.created_at, expiresAt: r.expires_at, usedAt: r.used_at } : undefined;
}

/** How many reset links were made for a user since `since` (ms): the per-account limit on reset e-mails. */
export async function countPasswordResetsSince(q: Q, userId: string, since: number): Promise<number> {
  const r = await q("password_resets").where({ user_id: userId }).andWhere("created_at", ">=", since).count<{ n: number }[]>({ n: "*" });
  return Number(r[0]?.n ?? 0);
}

/** How many outbox messages of `kind` went to exactly `to` since `since` (ms): the per-address limit on account mails. */
export async function countMailToSince(q: Q, kind: string, to: string, since: number): Promise<number> {
  const r = await q("outbox").where({ kind, to_addresses: to }).andWhere("created_at", ">=", since).count<{ n: number }[]>({ n: "*" });
  return Number(r[0]?.n ?? 0);
}

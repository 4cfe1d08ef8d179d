// Server code only (see db/queries/reports.ts for why there is no `import "server-only"`).
import { createHash, randomBytes } from "node:crypto";
import type { Knex } from "knex";

// Reads of share links and the DTOs they produce. Writes: db/writes/share-links.ts.

type Q = Knex | Knex.Transaction;

/** 32 random bytes = 256 bits, base64url without padding: 43 characters. */
const TOKEN_RE = /^[A-Za-z0-9_-]{43}$/;

export type ShareLinkStatus = "active" | "expired" | "revoked";

export interface ShareLink {
  id: string;
  reportId: string;
  createdAt: number;
  createdByName: string | null;
  expiresAt: number;
  revokedAt: number | null;
  lastUsedAt: number | null;
  status: ShareLinkStatus;
}

/** Only the SHA-256 of a token is stored; the token itself is shown once, when the link is made. */
export function hashShareToken(token: string): string {
  return createHash("sha256").update(token, "utf8").digest("hex");
}

export function newShareToken(): string {
  return randomBytes(32).toString("base64url");
}

function statusOf(r: { expires_at: number; revoked_at: number | null }, now: number): ShareLinkStatus {
  if (r.revoked_at !== null) return "revoked";
  return r.expires_at <= now ? "expired" : "active";
}

export async function listShareLinks(conn: Q, reportId: string, now = Date.now()): Promise<ShareLink[]> {
  const rows = await conn("share_links as s")
    .leftJoin("users as u", "u.id", "s.created_by")
    .where("s.report_id", reportId)
    .orderBy("s.created_at", "desc")
    .select("s.id", "s.report_id", "s.created_at", "s.expires_at", "s.revoked_at", "s.last_used_at", "u.name as created_by_name");
  return rows.map((r) => ({
    id: r.id,
    reportId: r.report_id,
    createdAt: r.created_at,
    createdByName: r.created_by_name ?? null,
    expiresAt: r.expires_at,
    revokedAt: r.revoked_at ?? null,
    lastUsedAt: r.last_used_at ?? null,
    status: statusOf(r, now),
  }));
}

export type ShareResolution = { status: "ok"; reportId: string; linkId: string; expiresAt: number } | { status: "expired" } | { status: "missing" };

/**
 * What a share token opens. A malformed, unknown or revoked token is "missing" (404: nothing to tell a
 * guesser apart); a known one past its expiry is "expired" (410). Records when the link was last used.
 */
export async function resolveShareToken(conn: Q, token: string, now = Date.now()): Promise<ShareResolution> {
  if (!TOKEN_RE.test(token)) return { status: "missing" };
  const row = await conn("share_links")
    .where({ token_hash: hashShareToken(token) })
    .first("id", "report_id", "expires_at", "revoked_at");
  if (!row || row.revoked_at !== null) return { status: "missing" };
  if (row.expires_at <= now) return { status: "expired" };
  await conn("share_links").where({ id: row.id }).update({ last_used_at: now });
  return { status: "ok", reportId: row.report_id, linkId: row.id, expiresAt: row.expires_at };
}

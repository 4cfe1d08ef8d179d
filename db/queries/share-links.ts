// Server code only (see db/queries/reports.ts for why there is no `import "server-only"`).
import { createHash, randomBytes } from "node:crypto";
import type { Knex } from "knex";
import { newId } from "@/lib/ids";

const DAY_MS = 24 * 60 * 60 * 1000;
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

export async function createShareLink(
  conn: Knex,
  p: { reportId: string; teamId: string; userId: string; expiresInDays: number; reason?: string; now?: number },
): Promise<{ link: ShareLink; token: string }> {
  const now = p.now ?? Date.now();
  const token = newShareToken();
  const id = newId();
  const expiresAt = now + p.expiresInDays * DAY_MS;
  await conn.transaction(async (trx) => {
    await trx("share_links").insert({
      id,
      report_id: p.reportId,
      token_hash: hashShareToken(token),
      created_by: p.userId,
      created_at: now,
      expires_at: expiresAt,
      revoked_at: null,
      last_used_at: null,
    });
    await trx("audit_log").insert({
      team_id: p.teamId,
      user_id: p.userId,
      action: "share_link.create",
      entity_type: "share_link",
      entity_id: id,
      detail: JSON.stringify({ reportId: p.reportId, expiresAt, ...(p.reason ? { reason: p.reason } : {}) }),
      at: now,
    });
  });
  const user = await conn("users").where({ id: p.userId }).first("name");
  return {
    token,
    link: { id, reportId: p.reportId, createdAt: now, createdByName: user?.name ?? null, expiresAt, revokedAt: null, lastUsedAt: null, status: "active" },
  };
}

export async function listShareLinks(conn: Knex, reportId: string, now = Date.now()): Promise<ShareLink[]> {
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

/** Revoke a link of the report; false when the report has no such link. Revoking twice is harmless. */
export async function revokeShareLink(conn: Knex, p: { reportId: string; linkId: string; teamId: string; userId: string }): Promise<boolean> {
  return conn.transaction(async (trx) => {
    const row = await trx("share_links").where({ id: p.linkId, report_id: p.reportId }).first("id", "revoked_at");
    if (!row) return false;
    if (row.revoked_at === null) {
      const now = Date.now();
      await trx("share_links").where({ id: p.linkId }).update({ revoked_at: now });
      await trx("audit_log").insert({
        team_id: p.teamId,
        user_id: p.userId,
        action: "share_link.revoke",
        entity_type: "share_link",
        entity_id: p.linkId,
        detail: JSON.stringify({ reportId: p.reportId }),
        at: now,
      });
    }
    return true;
  });
}

export type ShareResolution = { status: "ok"; reportId: string; linkId: string; expiresAt: number } | { status: "expired" } | { status: "missing" };

/**
 * What a share token opens. A malformed, unknown or revoked token is "missing" (404: nothing to tell a
 * guesser apart); a known one past its expiry is "expired" (410). Records when the link was last used.
 */
export async function resolveShareToken(conn: Knex, token: string, now = Date.now()): Promise<ShareResolution> {
  if (!TOKEN_RE.test(token)) return { status: "missing" };
  const row = await conn("share_links").where({ token_hash: hashShareToken(token) }).first("id", "report_id", "expires_at", "revoked_at");
  if (!row || row.revoked_at !== null) return { status: "missing" };
  if (row.expires_at <= now) return { status: "expired" };
  await conn("share_links").where({ id: row.id }).update({ last_used_at: now });
  return { status: "ok", reportId: row.report_id, linkId: row.id, expiresAt: row.expires_at };
}

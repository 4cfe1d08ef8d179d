// Server code only (see db/writes/reports.ts for why there is no `import "server-only"`).
import type { Knex } from "knex";
import { writeAudit } from "@/db/audit";
import { NotFoundError } from "@/db/errors";
import { newId } from "@/db/ids";
import { hashShareToken, newShareToken, type ShareLink } from "@/db/queries/share-links";

/** Writes of a report's share links, each one transaction with its audit row. */

type Conn = Knex | Knex.Transaction;

const DAY_MS = 24 * 60 * 60 * 1000;

/** A new read-only link to the report; the token is returned once (only its SHA-256 is stored). */
export async function createShareLink(
  conn: Conn,
  p: { reportId: string; teamId: string; userId: string; expiresInDays: number; reason?: string; now?: number },
): Promise<{ link: ShareLink; token: string }> {
  const now = p.now ?? Date.now();
  const token = newShareToken();
  const id = newId();
  const expiresAt = now + p.expiresInDays * DAY_MS;
  const createdByName = await conn.transaction(async (trx) => {
    if (!(await trx("reports").where({ id: p.reportId, team_id: p.teamId }).first("id"))) throw new NotFoundError("Report");
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
    await writeAudit(trx, {
      teamId: p.teamId,
      userId: p.userId,
      action: "share_link.create",
      entityType: "share_link",
      entityId: id,
      detail: { reportId: p.reportId, expiresAt, ...(p.reason ? { reason: p.reason } : {}) },
      at: now,
    });
    const user = await trx("users").where({ id: p.userId }).first("name");
    return (user?.name as string | undefined) ?? null;
  });
  return {
    token,
    link: { id, reportId: p.reportId, createdAt: now, createdByName, expiresAt, revokedAt: null, lastUsedAt: null, status: "active" },
  };
}

/** Revoke a link of the report (NotFoundError when the report has no such link). Revoking twice is harmless. */
export async function revokeShareLink(conn: Conn, p: { reportId: string; linkId: string; teamId: string; userId: string }): Promise<void> {
  await conn.transaction(async (trx) => {
    const row = await trx("share_links as s")
      .join("reports as r", "r.id", "s.report_id")
      .where({ "s.id": p.linkId, "s.report_id": p.reportId, "r.team_id": p.teamId })
      .first("s.id", "s.revoked_at");
    if (!row) throw new NotFoundError("Share link");
    if (row.revoked_at === null) {
      const now = Date.now();
      await trx("share_links").where({ id: p.linkId }).update({ revoked_at: now });
      await writeAudit(trx, {
        teamId: p.teamId,
        userId: p.userId,
        action: "share_link.revoke",
        entityType: "share_link",
        entityId: p.linkId,
        detail: { reportId: p.reportId },
        at: now,
      });
    }
  });
}

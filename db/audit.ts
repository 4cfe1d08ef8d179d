import type { Knex } from "knex";

/** One audit_log row: who did what to which entity of which team. */
export interface AuditEntry {
  teamId: string | null;
  userId: string | null;
  /** `<entity>.<verb>`, e.g. "baseline.create", "member.role_change". */
  action: string;
  entityType: string;
  entityId: string;
  detail?: unknown;
  at?: number;
}

/**
 * THE one writer of `audit_log`. Only the write modules (db/writes/*) call it, inside the transaction
 * of the change it records, so the row commits or rolls back with it.
 */
export async function writeAudit(trx: Knex.Transaction, e: AuditEntry): Promise<void> {
  await trx("audit_log").insert({
    team_id: e.teamId,
    user_id: e.userId,
    action: e.action,
    entity_type: e.entityType,
    entity_id: e.entityId,
    detail: e.detail === undefined ? null : JSON.stringify(e.detail),
    at: e.at ?? Date.now(),
  });
}

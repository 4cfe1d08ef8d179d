import "server-only";
import type { Knex } from "knex";

type Q = Knex | Knex.Transaction;

export interface OutboxEntry {
  id: number;
  teamId: string | null;
  kind: string;
  to: string[];
  subject: string;
  text: string;
  status: "queued" | "sent" | "failed";
  error: string | null;
  createdAt: number;
  sentAt: number | null;
  captured: { id: number; raw: string; receivedAt: number }[];
}

export async function insertOutbox(
  q: Q,
  m: { teamId: string | null; userId: string | null; kind: string; to: string[]; subject: string; text: string; html?: string | null },
): Promise<number> {
  const [id] = await q("outbox").insert({
    team_id: m.teamId,
    user_id: m.userId,
    kind: m.kind,
    to_addresses: m.to.join(", "),
    subject: m.subject,
    text_body: m.text,
    html_body: m.html ?? null,
    status: "queued",
    created_at: Date.now(),
  });
  return Number(id);
}

export async function markOutboxSent(q: Q, id: number, messageId: string | null): Promise<void> {
  await q("outbox").where({ id }).update({ status: "sent", message_id: messageId, sent_at: Date.now(), error: null });
}

export async function markOutboxFailed(q: Q, id: number, error: string): Promise<void> {
  await q("outbox")
    .where({ id })
    .update({ status: "failed", error: error.slice(0, 1000) });
}

export async function insertCapturedMail(
  q: Q,
  m: { outboxId: number | null; envelopeFrom: string | null; envelopeTo: string[]; subject: string | null; raw: string },
): Promise<void> {
  // The outbox row may belong to another database (a misconfigured URL); keep the mail, drop the link.
  const outboxId = m.outboxId !== null && (await q("outbox").where({ id: m.outboxId }).first("id")) ? m.outboxId : null;
  await q("captured_mail").insert({
    outbox_id: outboxId,
    envelope_from: m.envelopeFrom,
    envelope_to: m.envelopeTo.join(", "),
    subject: m.subject,
    raw: m.raw,
    received_at: Date.now(),
  });
}

/**
 * When messages of `kinds` were queued since `since` (ms), oldest first: by one user (`userId`) or from one team
 * (`teamId`). The sending limits (lib/mail/quota.ts) count these.
 */
export async function mailSendTimes(q: Q, by: { userId: string } | { teamId: string }, kinds: readonly string[], since: number): Promise<number[]> {
  const rows: { created_at: number }[] = await q("outbox")
    .where("userId" in by ? { user_id: by.userId } : { team_id: by.teamId })
    .whereIn("kind", kinds)
    .andWhere("created_at", ">", since)
    .orderBy("created_at", "asc")
    .select("created_at");
  return rows.map((r) => r.created_at);
}

/**
 * Latest outbox rows with what the fake SMTP server captured: all of them, or those of the teams `teamIds` plus
 * every message `userId` caused (their own account mail, the reports they sent).
 */
export async function listOutbox(q: Q, opts: { scope?: { teamIds: string[]; userId: string }; limit?: number } = {}): Promise<OutboxEntry[]> {
  let query = q("outbox")
    .orderBy("id", "desc")
    .limit(opts.limit ?? 100);
  const scope = opts.scope;
  if (scope) query = query.where((w) => w.whereIn("team_id", scope.teamIds).orWhere("user_id", scope.userId));
  const rows = await query.select();
  const ids = rows.map((r: { id: number }) => r.id);
  const captured = ids.length ? await q("captured_mail").whereIn("outbox_id", ids).orderBy("id").select("id", "outbox_id", "raw", "received_at") : [];
  return rows.map(
    (r: {
      id: number;
      team_id: string | null;
      kind: string;
      to_addresses: string;
      subject: string;
      text_body: string;
      status: OutboxEntry["status"];
      error: string | null;
      created_at: number;
      sent_at: number | null;
    }) => ({
      id: r.id,
      teamId: r.team_id,
      kind: r.kind,
      to: r.to_addresses.split(", "),
      subject: r.subject,
      text: r.text_body,
      status: r.status,
      error: r.error,
      createdAt: r.created_at,
      sentAt: r.sent_at,
      captured: captured
        .filter((c: { outbox_id: number }) => c.outbox_id === r.id)
        .map((c: { id: number; raw: string; received_at: number }) => ({ id: c.id, raw: c.raw, receivedAt: c.received_at })),
    }),
  );
}

import "server-only";
import { db, ready } from "@/db/client";
import { insertOutbox, markOutboxFailed, markOutboxSent } from "@/db/queries/mail";
import { OUTBOX_HEADER } from "./fake-smtp";
import { startMailIfNeeded } from "./start";
import { MAIL_FROM, currentTransport } from "./transport";

export interface MailInput {
  teamId: string | null;
  /** Who caused the message (the inviter, the report's sender, the account being verified): the per-user limit counts it. */
  userId: string | null;
  /** What the mail is for, e.g. "invite", "report", "verify_email". */
  kind: string;
  to: string | string[];
  subject: string;
  text: string;
  html?: string;
}

export type MailResult = { outboxId: number; status: "sent" } | { outboxId: number; status: "failed"; error: string };

function recipients(m: MailInput): string[] {
  return Array.isArray(m.to) ? m.to : [m.to];
}

/** Record the message in the outbox (queued) without sending it yet; deliverMail sends it. */
export async function queueMail(m: MailInput): Promise<number> {
  await ready();
  return insertOutbox(db, {
    teamId: m.teamId,
    userId: m.userId,
    kind: m.kind,
    to: recipients(m),
    subject: m.subject,
    text: m.text,
    html: m.html ?? null,
  });
}

/**
 * Send a queued message, then mark its outbox row sent or failed. Never throws for a delivery failure: the caller's
 * own work (an invite, a report) stays done, and the outbox row says what happened.
 */
export async function deliverMail(outboxId: number, m: MailInput): Promise<MailResult> {
  try {
    await startMailIfNeeded();
    const t = currentTransport();
    if (!t) throw new Error("mail transport is not configured");
    const info = await t.transport.sendMail({
      from: MAIL_FROM,
      to: recipients(m),
      subject: m.subject,
      text: m.text,
      ...(m.html ? { html: m.html } : {}),
      headers: { [OUTBOX_HEADER]: String(outboxId) },
    });
    await markOutboxSent(db, outboxId, typeof info.messageId === "string" ? info.messageId : null);
    return { outboxId, status: "sent" };
  } catch (e) {
    const error = e instanceof Error ? e.message : String(e);
    console.error(`[mail] outbox ${outboxId} failed`, e);
    await markOutboxFailed(db, outboxId, error);
    return { outboxId, status: "failed", error };
  }
}

/** Record the message in the outbox (queued), send it, then mark it sent or failed (queueMail + deliverMail). */
export async function sendMail(m: MailInput): Promise<MailResult> {
  return deliverMail(await queueMail(m), m);
}

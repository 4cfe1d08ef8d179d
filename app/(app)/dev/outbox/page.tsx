import type { Metadata } from "next";
import { notFound } from "next/navigation";
import { db } from "@/db/client";
import { listOutbox } from "@/db/queries/mail";
import { Badge, Card, EmptyState, Notice } from "@/components/ui/card";
import { outboxScope } from "@/lib/outbox-access";
import { requirePageUser } from "@/lib/team-context";

export const metadata: Metadata = { title: "Outbox" };

const fmt = new Intl.DateTimeFormat("en-GB", { dateStyle: "medium", timeStyle: "medium", timeZone: "UTC" });

export default async function OutboxPage() {
  const user = await requirePageUser("/dev/outbox");
  const scope = await outboxScope(user.id);
  if (!scope) notFound();
  const rows = await listOutbox(db, { scope, limit: 100 });
  return (
    <div className="space-y-4">
      <h1 className="text-xl font-semibold text-ink">Outbox</h1>
      <Notice>
        Mail of the teams you own and the messages you caused yourself (such as your address&apos;s confirmation link), as this development or demo server sent
        them. Unless PLATEAU_SMTP_URL is set, mail goes to Plateau&apos;s local catcher and never leaves this machine; the captured copy is shown under each
        message.
      </Notice>
      {rows.length === 0 ? (
        <EmptyState title="No mail yet">Confirmation links, invites and shared reports appear here once sent.</EmptyState>
      ) : (
        rows.map((m) => (
          <Card
            key={m.id}
            title={
              <span>
                #{m.id} · {m.subject}
              </span>
            }
            actions={<Badge tone={m.status === "sent" ? "good" : m.status === "failed" ? "bad" : "neutral"}>{m.status}</Badge>}
          >
            <dl className="mb-2 grid grid-cols-[6rem_1fr] gap-x-3 text-sm">
              <dt className="text-muted">To</dt>
              <dd>{m.to.join(", ")}</dd>
              <dt className="text-muted">Kind</dt>
              <dd>{m.kind}</dd>
              <dt className="text-muted">Queued</dt>
              <dd className="tabular">{fmt.format(new Date(m.createdAt))} UTC</dd>
              {m.error ? (
                <>
                  <dt className="text-muted">Error</dt>
                  <dd className="text-bad">{m.error}</dd>
                </>
              ) : null}
            </dl>
            <pre className="max-h-64 overflow-auto whitespace-pre-wrap rounded border border-rule bg-ground p-2 font-mono text-xs">{m.text}</pre>
            {m.captured.map((c) => (
              <details key={c.id} className="mt-2 text-sm">
                <summary className="cursor-pointer text-muted">
                  Captured by the local mail catcher ({fmt.format(new Date(c.receivedAt))} UTC): raw message
                </summary>
                <pre className="mt-1 max-h-80 overflow-auto whitespace-pre-wrap rounded border border-rule bg-ground p-2 font-mono text-xs">{c.raw}</pre>
              </details>
            ))}
          </Card>
        ))
      )}
    </div>
  );
}

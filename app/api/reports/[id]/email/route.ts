import { db } from "@/db/client";
import { reportTeamId } from "@/db/queries/reports";
import { createShareLink } from "@/db/writes/share-links";
import { CAUTION_TEXT } from "@/components/caution";
import { requireResourceRole } from "@/lib/access";
import { apiRoute, readJson } from "@/lib/api";
import { requireVerifiedEmail } from "@/lib/email-verification";
import { withMailQuota } from "@/lib/mail/quota";
import { deliverMail, queueMail } from "@/lib/mail/send";
import { reportEmail } from "@/lib/reports/email";
import { loadReport, shareUrl } from "@/lib/reports/service";
import { emailReportSchema } from "@/lib/validation/report";

export const dynamic = "force-dynamic";

/**
 * E-mail the report: a short summary and a new share link, one message per address (recipients don't see
 * each other), each recorded in the outbox. Editor and up, with a verified address (403 email_unverified), within
 * the mail limits (429 mail_rate_limited with Retry-After; checked before the share link is made).
 */
export const POST = apiRoute<{ id: string }>(async (req, { id }) => {
  const { user, teamId } = await requireResourceRole(() => reportTeamId(db, id), "editor", "Report");
  requireVerifiedEmail(user);
  const input = await readJson(req, emailReportSchema, 16 * 1024);
  const to = [...new Set(input.to)];
  const report = await loadReport(db, id);
  const { link, queued } = await withMailQuota({ userId: user.id, teamId, messages: to.length }, async () => {
    const { link, token } = await createShareLink(db, {
      reportId: id,
      teamId,
      userId: user.id,
      expiresInDays: input.expiresInDays,
      reason: `e-mail to ${to.length} address${to.length === 1 ? "" : "es"}`,
    });
    const content = reportEmail({
      title: report.title,
      audienceNote: report.audienceNote,
      senderName: user.name,
      message: input.message,
      frozen: report.frozen,
      link: shareUrl(token),
      expiresAt: link.expiresAt,
      caution: CAUTION_TEXT,
    });
    const queued = [];
    for (const address of to) {
      const message = { teamId, userId: user.id, kind: "report", to: address, ...content };
      queued.push({ message, outboxId: await queueMail(message) });
    }
    return { link, queued };
  });
  const results = [];
  for (const q of queued) {
    const r = await deliverMail(q.outboxId, q.message);
    results.push({ to: q.message.to, outboxId: r.outboxId, status: r.status });
  }
  const failed = results.filter((r) => r.status !== "sent").length;
  return Response.json({ link, sent: results.length - failed, failed, results }, { status: failed === results.length ? 502 : 200 });
});

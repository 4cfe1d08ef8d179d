import { db } from "@/db/client";
import { reportTeamId } from "@/db/queries/reports";
import { createShareLink } from "@/db/writes/share-links";
import { CAUTION_TEXT } from "@/components/caution";
import { requireResourceRole } from "@/lib/access";
import { apiRoute, readJson } from "@/lib/api";
import { sendMail } from "@/lib/mail/send";
import { reportEmail } from "@/lib/reports/email";
import { loadReport, shareUrl } from "@/lib/reports/service";
import { emailReportSchema } from "@/lib/validation/report";

export const dynamic = "force-dynamic";

/**
 * E-mail the report: a short summary and a new share link, one message per address (recipients don't see
 * each other), each recorded in the outbox. Editor and up.
 */
export const POST = apiRoute<{ id: string }>(async (req, { id }) => {
  const { user, teamId } = await requireResourceRole(() => reportTeamId(db, id), "editor", "Report");
  const input = await readJson(req, emailReportSchema, 16 * 1024);
  const to = [...new Set(input.to)];
  const report = await loadReport(db, id);
  const { link, token } = await createShareLink(db, {
    reportId: id,
    teamId,
    userId: user.id,
    expiresInDays: input.expiresInDays,
    reason: `e-mail to ${to.length} address${to.length === 1 ? "" : "es"}`,
  });
  const url = shareUrl(token);
  const mail = reportEmail({
    title: report.title,
    audienceNote: report.audienceNote,
    senderName: user.name,
    message: input.message,
    frozen: report.frozen,
    link: url,
    expiresAt: link.expiresAt,
    caution: CAUTION_TEXT,
  });
  const results = [];
  for (const address of to) {
    const r = await sendMail({ teamId, kind: "report", to: address, ...mail });
    results.push({ to: address, outboxId: r.outboxId, status: r.status });
  }
  const failed = results.filter((r) => r.status !== "sent").length;
  return Response.json({ link, sent: results.length - failed, failed, results }, { status: failed === results.length ? 502 : 200 });
});

import type { FrozenReport } from "@/lib/validation/report";
import { date } from "./format";
import { summarizeReport } from "./summary";

function escapeHtml(s: string): string {
  return s.replace(/[&<>"']/g, (c) => ({ "&": "&amp;", "<": "&lt;", ">": "&gt;", '"': "&quot;", "'": "&#39;" })[c]!);
}

/** Subject, text and HTML of the e-mail that carries a report's share link: a short summary and the link. */
export function reportEmail(p: {
  title: string;
  audienceNote: string;
  senderName: string;
  message: string;
  frozen: FrozenReport;
  link: string;
  expiresAt: number;
  caution: string;
}): { subject: string; text: string; html: string } {
  const s = summarizeReport(p.frozen);
  const subject = `Plateau report: ${p.title}`.replace(/[\r\n]+/g, " ").slice(0, 200);
  const options = p.frozen.options.map((o) => `Option ${o.key}: ${o.name}`);
  const lines = [
    `${p.senderName} shared a Plateau report with you: "${p.title}".`,
    ...(p.message ? ["", p.message] : []),
    ...(p.audienceNote ? ["", p.audienceNote] : []),
    "",
    `Baseline "${p.frozen.baseline.name}" compared with:`,
    ...options.map((o) => `  - ${o}`),
    "",
    "In short:",
    ...s.headlines.map((h) => `  - ${h.sentence}`),
    ...s.verdicts.map((v) => `  - ${v.sentence}`),
    "",
    `Open the report (read-only, no sign-in, until ${date(p.expiresAt)}):`,
    p.link,
    "",
    p.caution,
  ];
  const text = lines.join("\n");
  const li = (xs: string[]) => `<ul>${xs.map((x) => `<li>${escapeHtml(x)}</li>`).join("")}</ul>`;
  const html = `<!doctype html><html><body style="font-family:sans-serif;color:#1d1f22;font-size:14px;line-height:1.5">
<p>${escapeHtml(p.senderName)} shared a Plateau report with you: <strong>${escapeHtml(p.title)}</strong>.</p>
${p.message ? `<p>${escapeHtml(p.message)}</p>` : ""}${p.audienceNote ? `<p style="color:#5f6368">${escapeHtml(p.audienceNote)}</p>` : ""}
<p>Baseline “${escapeHtml(p.frozen.baseline.name)}” compared with:</p>${li(options)}
<p>In short:</p>${li([...s.headlines.map((h) => h.sentence), ...s.verdicts.map((v) => v.sentence)])}
<p><a href="${escapeHtml(p.link)}" style="color:#b4622d">Open the report</a> (read-only, no sign-in, until ${date(p.expiresAt)}).<br><span style="font-size:12px;color:#5f6368">${escapeHtml(p.link)}</span></p>
<p style="font-size:12px;color:#8a6410">${escapeHtml(p.caution)}</p>
</body></html>`;
  return { subject, text, html };
}

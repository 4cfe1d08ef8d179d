"use client";
import Link from "next/link";
import { useRouter } from "next/navigation";
import { useState, type FormEvent } from "react";
import useSWR from "swr";
import { Button, buttonClass } from "@/components/ui/button";
import { Badge, Notice } from "@/components/ui/card";
import { FieldErrors, inputClass } from "@/components/ui/field";
import { RevokeCell } from "@/components/ui/revoke-cell";
import { TableHead } from "@/components/ui/table";
import type { ReportVersion } from "@/db/queries/reports";
import type { ShareLink } from "@/db/queries/share-links";
import { ApiRequestError, apiSend, errorMessage, fetchJson } from "@/lib/api-client";
import { swrKeys } from "@/lib/swr-keys";

interface Props {
  teamId: string;
  reportId: string;
  canEdit: boolean;
  canDelete: boolean;
  versions: ReportVersion[];
  currentVersion: number;
  initialLinks: ShareLink[];
}

/** Answer of POST /api/reports/[id]/email (200, or 502 with the same body when every delivery failed). */
type EmailAnswer = { sent: number; failed: number };

const fmt = (ms: number) => new Date(ms).toISOString().slice(0, 16).replace("T", " ") + " UTC";
const dayFmt = new Intl.DateTimeFormat("en-GB", { day: "numeric", month: "short", timeZone: "UTC" });
const timeFmt = new Intl.DateTimeFormat("en-GB", { hour: "2-digit", minute: "2-digit", hour12: false, timeZone: "UTC" });
/** A compact UTC time (day over time) for the narrow share-link table; the full stamp is in the tooltip. */
function Stamp({ ms }: { ms: number }) {
  const d = new Date(ms);
  return (
    <time dateTime={d.toISOString()} title={fmt(ms)}>
      <span className="block whitespace-nowrap">{dayFmt.format(d)}</span>
      <span className="block text-muted">{timeFmt.format(d)}</span>
    </time>
  );
}

/** Everything one can do with a report besides reading it: export, print, share, e-mail, refresh, versions. */
export function ReportActions({ teamId, reportId, canEdit, canDelete, versions, currentVersion, initialLinks }: Props) {
  const router = useRouter();
  const base = `/api/reports/${encodeURIComponent(reportId)}`;
  // Share links are for editors and owners only (the API answers 403 to viewers): no key, no request.
  const { data: linkData, mutate: reloadLinks } = useSWR<{ links: ShareLink[] }>(canEdit ? swrKeys.reportShareLinks(reportId) : null, fetchJson, {
    fallbackData: { links: initialLinks },
  });
  const links = linkData?.links ?? initialLinks;
  const [days, setDays] = useState("14");
  const [newUrl, setNewUrl] = useState<string | null>(null);
  const [shareError, setShareError] = useState<string | null>(null);
  const [to, setTo] = useState("");
  const [note, setNote] = useState("");
  const [mailState, setMailState] = useState<{ tone: "good" | "bad"; text: string; fields?: Record<string, string[]> } | null>(null);
  const [busy, setBusy] = useState<string | null>(null);
  const [topError, setTopError] = useState<string | null>(null);

  async function createLink(e: FormEvent) {
    e.preventDefault();
    setBusy("share");
    setShareError(null);
    try {
      const r = await apiSend<{ link: ShareLink; url: string }>("POST", swrKeys.reportShareLinks(reportId), {
        expiresInDays: Number(days),
      });
      setNewUrl(r.url);
      await reloadLinks();
    } catch (err) {
      setShareError(err instanceof ApiRequestError ? (err.fields.expiresInDays?.[0] ?? err.message) : errorMessage(err));
    } finally {
      setBusy(null);
    }
  }

  async function revoke(id: string) {
    setBusy(`revoke-${id}`);
    setShareError(null);
    try {
      await apiSend("DELETE", `${swrKeys.reportShareLinks(reportId)}/${encodeURIComponent(id)}`);
    } catch (err) {
      setShareError(errorMessage(err));
    } finally {
      setBusy(null);
    }
    await reloadLinks();
  }

  async function sendMail(e: FormEvent) {
    e.preventDefault();
    const addresses = to
      .split(/[\s,;]+/)
      .map((s) => s.trim())
      .filter(Boolean);
    setBusy("mail");
    setMailState(null);
    try {
      const r = await apiSend<EmailAnswer>("POST", `${base}/email`, { to: addresses, message: note });
      setMailState({
        tone: "good",
        text: `Sent to ${r.sent} address${r.sent === 1 ? "" : "es"}${r.failed ? `; ${r.failed} failed (see the outbox)` : ""}, with a new share link.`,
      });
      setTo("");
      await reloadLinks();
    } catch (err) {
      const failed = err instanceof ApiRequestError && err.status === 502 ? (err.answer as Partial<EmailAnswer> | undefined)?.failed : undefined;
      if (failed !== undefined) {
        // Every delivery failed; the share link was still made.
        setMailState({
          tone: "bad",
          text: `Could not send: ${failed === 1 ? "the message" : `all ${failed} messages`} failed (see the outbox).`,
        });
        await reloadLinks();
      } else {
        const fields = err instanceof ApiRequestError && err.hasFields ? err.fields : undefined;
        const detail = fields ? Object.values(fields).flat().slice(0, 3).join(" ") : "";
        setMailState({ tone: "bad", text: `${errorMessage(err)} ${detail}`.trim(), fields });
      }
    } finally {
      setBusy(null);
    }
  }

  async function refresh() {
    setBusy("refresh");
    setTopError(null);
    try {
      const r = await apiSend<{ report: { id: string } }>("POST", `${base}/refresh`);
      router.push(`/teams/${encodeURIComponent(teamId)}/reports/${encodeURIComponent(r.report.id)}`);
    } catch (err) {
      setTopError(errorMessage(err));
    } finally {
      setBusy(null);
    }
  }

  async function remove() {
    if (!window.confirm("Delete this version of the report and its share links?")) return;
    setBusy("delete");
    setTopError(null);
    try {
      await apiSend("DELETE", base);
      router.push(`/teams/${encodeURIComponent(teamId)}/reports`);
      router.refresh();
    } catch (err) {
      setTopError(errorMessage(err));
    } finally {
      setBusy(null);
    }
  }

  return (
    <div className="space-y-4 text-sm">
      {topError ? <Notice tone="bad">{topError}</Notice> : null}
      <div className="flex flex-wrap gap-2">
        <a className={buttonClass("secondary")} href={`${base}/pdf`} download>
          Download PDF
        </a>
        <a className={buttonClass("secondary")} href={`${base}/export.csv`} download>
          Download CSV
        </a>
        <a className={buttonClass("secondary")} href={`/print/reports/${encodeURIComponent(reportId)}`} target="_blank" rel="noopener">
          Print view
        </a>
        {canEdit ? (
          <Button
            variant="secondary"
            onClick={refresh}
            disabled={busy !== null}
            title="Evaluate the scenarios as they are now, as a new version; this version is kept"
          >
            {busy === "refresh" ? "Refreshing…" : "Refresh from current scenarios"}
          </Button>
        ) : null}
        {canDelete ? (
          <Button variant="danger" onClick={remove} disabled={busy !== null}>
            Delete this version
          </Button>
        ) : null}
      </div>

      {versions.length > 1 ? (
        <div>
          <h3 className="mb-1 text-xs font-semibold uppercase tracking-wide text-muted">Versions</h3>
          <ul className="space-y-0.5">
            {versions.map((v) => (
              <li key={v.id}>
                {v.version === currentVersion ? (
                  <span className="font-medium text-ink">Version {v.version} (this one)</span>
                ) : (
                  <Link className="text-copper-dark hover:underline" href={`/teams/${encodeURIComponent(teamId)}/reports/${v.id}`}>
                    Version {v.version}
                  </Link>
                )}
                <span className="text-xs text-muted">
                  {" "}
                  · {fmt(v.createdAt)}
                  {v.createdByName ? ` · ${v.createdByName}` : ""}
                </span>
              </li>
            ))}
          </ul>
        </div>
      ) : null}

      {canEdit ? (
        <>
          <div>
            <h3 className="mb-1 text-xs font-semibold uppercase tracking-wide text-muted">Share links</h3>
            <form onSubmit={createLink} className="flex flex-wrap items-end gap-2">
              <div>
                <label htmlFor="share-days" className="mb-1 block text-xs text-ink">
                  Valid for (days, 1–90)
                </label>
                <input
                  id="share-days"
                  type="number"
                  min={1}
                  max={90}
                  value={days}
                  onChange={(e) => setDays(e.target.value)}
                  className={`${inputClass} w-24`}
                  aria-describedby={shareError ? "share-days-error" : undefined}
                />
              </div>
              <Button type="submit" disabled={busy !== null}>
                Create share link
              </Button>
            </form>
            <FieldErrors id="share-days-error" errors={shareError ? [shareError] : undefined} />
            {newUrl ? (
              <div className="mt-2 rounded-md border border-good/30 bg-good-soft p-2 text-xs text-good" role="status">
                <p className="mb-1">New read-only link (shown only now; anyone with it can read this report until it expires):</p>
                <div className="flex gap-2">
                  <input
                    readOnly
                    value={newUrl}
                    aria-label="New share link"
                    className={`${inputClass} font-mono text-xs`}
                    onFocus={(e) => e.currentTarget.select()}
                    data-testid="new-share-url"
                  />
                  <Button variant="secondary" onClick={() => navigator.clipboard?.writeText(newUrl)}>
                    Copy
                  </Button>
                </div>
              </div>
            ) : null}
            {links.length > 0 ? (
              <table className="mt-2 w-full caption-bottom text-xs">
                <caption className="pt-1 text-left text-[11px] text-faint">Times in UTC; hover for the full stamp.</caption>
                <TableHead
                  rowClassName="text-left text-muted"
                  cell="py-1 pr-2"
                  lastCell="py-1"
                  columns={["Made", "Expires", "Last opened", "Status", { label: "Action", srOnly: true }]}
                />
                <tbody>
                  {links.map((l) => (
                    <tr key={l.id} className="border-t border-rule/60 align-top">
                      <td className="py-1 pr-2">
                        <Stamp ms={l.createdAt} />
                        {l.createdByName ? <span className="block text-muted">{l.createdByName}</span> : null}
                      </td>
                      <td className="py-1 pr-2 tabular">
                        <Stamp ms={l.expiresAt} />
                      </td>
                      <td className="py-1 pr-2 tabular">{l.lastUsedAt ? <Stamp ms={l.lastUsedAt} /> : "never"}</td>
                      <td className="py-1 pr-2">
                        <Badge tone={l.status === "active" ? "good" : l.status === "revoked" ? "bad" : "neutral"}>{l.status}</Badge>
                      </td>
                      <RevokeCell
                        className="py-1"
                        live={l.status === "active"}
                        onRevoke={() => revoke(l.id)}
                        disabled={busy !== null}
                        label={`Revoke the link made ${fmt(l.createdAt)}`}
                      />
                    </tr>
                  ))}
                </tbody>
              </table>
            ) : (
              <p className="mt-1 text-xs text-muted">No share links yet.</p>
            )}
          </div>

          <div>
            <h3 className="mb-1 text-xs font-semibold uppercase tracking-wide text-muted">Send by e-mail</h3>
            <form onSubmit={sendMail} className="space-y-2">
              <div>
                <label htmlFor="mail-to" className="mb-1 block text-xs text-ink">
                  To (up to 20 addresses, separated by commas or new lines)
                </label>
                <textarea
                  id="mail-to"
                  rows={2}
                  value={to}
                  onChange={(e) => setTo(e.target.value)}
                  className={inputClass}
                  placeholder="director@example.com, pm@example.com"
                />
              </div>
              <div>
                <label htmlFor="mail-note" className="mb-1 block text-xs text-ink">
                  Message (optional)
                </label>
                <textarea id="mail-note" rows={2} maxLength={1000} value={note} onChange={(e) => setNote(e.target.value)} className={inputClass} />
              </div>
              <Button type="submit" disabled={busy !== null || to.trim() === ""}>
                {busy === "mail" ? "Sending…" : "Send summary and link"}
              </Button>
              {mailState ? <Notice tone={mailState.tone}>{mailState.text}</Notice> : null}
            </form>
          </div>
        </>
      ) : (
        <p className="text-xs text-muted">Editors and owners can share this report by link or e-mail.</p>
      )}
    </div>
  );
}

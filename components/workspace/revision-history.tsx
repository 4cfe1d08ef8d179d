"use client";
import useSWR from "swr";
import { Button } from "@/components/ui/button";
import { fetchJson } from "@/lib/api-client";

/** What every saved version carries (scenario and roadmap revisions alike). */
interface Revision {
  id: number;
  version: number;
  userName: string | null;
  at: number;
  summary: string;
}

/**
 * A scenario's or roadmap's history, newest first (`url`: its revisions route, keyed by the current version so a
 * save reloads it); editors can restore an old revision (`restoreLabel` names what that does).
 */
export function RevisionHistory<R extends Revision>({
  url,
  currentVersion,
  canRestore,
  onRestore,
  busy,
  restoreLabel = "Restore",
}: {
  url: string;
  currentVersion: number;
  canRestore: boolean;
  onRestore: (r: R) => void;
  busy: boolean;
  restoreLabel?: string;
}) {
  const { data, error } = useSWR<{ revisions: R[] }>(url, fetchJson);
  if (error) return <p className="text-xs text-bad">Could not load the history.</p>;
  if (!data) return <p className="text-xs text-muted">Loading history…</p>;
  return (
    <ol className="divide-y divide-rule text-xs" data-testid="history">
      {data.revisions.map((r) => (
        <li key={r.id} className="flex items-start gap-3 py-1.5">
          <span className="tabular w-8 shrink-0 font-semibold text-ink">v{r.version}</span>
          <span className="flex-1">
            <span className="text-ink">{r.summary}</span>
            <span className="block text-muted">
              {r.userName ?? "someone"} ·{" "}
              <time dateTime={new Date(r.at).toISOString()}>{new Date(r.at).toLocaleString("en-GB", { dateStyle: "medium", timeStyle: "short" })}</time>
            </span>
          </span>
          {canRestore && r.version !== currentVersion ? (
            <Button variant="ghost" className="px-2 py-0.5 text-xs" disabled={busy} onClick={() => onRestore(r)}>
              {restoreLabel}
            </Button>
          ) : r.version === currentVersion ? (
            <span className="text-muted">current</span>
          ) : null}
        </li>
      ))}
    </ol>
  );
}

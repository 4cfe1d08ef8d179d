"use client";
import useSWR from "swr";
import { Button } from "@/components/ui/button";
import type { ScenarioRevision } from "@/db/queries/scenarios";
import { fetchJson } from "@/lib/api-client";
import { swrKeys } from "@/lib/swr-keys";

/** A scenario's history, newest first; editors can restore an old revision (which becomes a new one). */
export function RevisionHistory({
  scenarioId,
  currentVersion,
  canRestore,
  onRestore,
  busy,
}: {
  scenarioId: string;
  currentVersion: number;
  canRestore: boolean;
  onRestore: (r: ScenarioRevision) => void;
  busy: boolean;
}) {
  const { data, error } = useSWR<{ revisions: ScenarioRevision[] }>(swrKeys.scenarioRevisions(scenarioId, currentVersion), fetchJson);
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
              Restore
            </Button>
          ) : r.version === currentVersion ? (
            <span className="text-muted">current</span>
          ) : null}
        </li>
      ))}
    </ol>
  );
}

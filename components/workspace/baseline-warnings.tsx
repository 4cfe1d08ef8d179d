"use client";
import { useState } from "react";
import useSWR from "swr";
import type { BaselineWarning } from "@/db/queries/baselines";
import { apiSend, errorMessage, fetchJson } from "@/lib/api-client";
import { swrKeys } from "@/lib/swr-keys";
import { Button } from "@/components/ui/button";

const when = new Intl.DateTimeFormat("en-GB", { dateStyle: "medium", timeStyle: "short" });

/**
 * The warnings imports returned for this baseline (e.g. a histogram whose net count differs from the class table's),
 * kept until someone dismisses them: an import that redirects here can never lose one. Editors and owners dismiss.
 */
export function BaselineWarnings({ baselineId, initial, canDismiss }: { baselineId: string; initial: BaselineWarning[]; canDismiss: boolean }) {
  const key = swrKeys.baselineWarnings(baselineId);
  const { data, mutate } = useSWR<{ warnings: BaselineWarning[] }>(key, fetchJson, { fallbackData: { warnings: initial }, revalidateOnFocus: false });
  const [busy, setBusy] = useState<string | null>(null);
  const [error, setError] = useState<string | null>(null);
  const warnings = data?.warnings ?? [];
  if (!warnings.length) return null;

  async function dismiss(id: string) {
    setBusy(id);
    setError(null);
    try {
      await apiSend("DELETE", `${key}/${encodeURIComponent(id)}`);
      await mutate({ warnings: warnings.filter((w) => w.id !== id) }, { revalidate: true });
    } catch (e) {
      setError(errorMessage(e, "Could not dismiss the warning."));
    } finally {
      setBusy(null);
    }
  }

  return (
    <section
      role="status"
      aria-labelledby="baseline-warnings-title"
      className="rounded-md border border-warn/30 bg-warn-soft px-3 py-2 text-sm text-warn"
      data-testid="baseline-warnings"
    >
      <h2 id="baseline-warnings-title" className="font-medium">
        {warnings.length === 1 ? "1 warning from an import" : `${warnings.length} warnings from imports`} — kept here until dismissed
      </h2>
      <ul className="mt-1 space-y-1">
        {warnings.map((w) => (
          <li
            key={w.id}
            className="flex flex-wrap items-start justify-between gap-2 border-t border-warn/20 pt-1 first:border-t-0 first:pt-0"
            data-testid="baseline-warning"
          >
            <span className="min-w-0 flex-1">
              {w.message} <span className="text-xs opacity-80">({when.format(w.createdAt)})</span>
            </span>
            {canDismiss ? (
              <Button variant="ghost" onClick={() => dismiss(w.id)} disabled={busy !== null} aria-label={`Dismiss: ${w.message}`}>
                {busy === w.id ? "Dismissing…" : "Dismiss"}
              </Button>
            ) : null}
          </li>
        ))}
      </ul>
      {error ? <p className="mt-1 text-bad">{error}</p> : null}
    </section>
  );
}

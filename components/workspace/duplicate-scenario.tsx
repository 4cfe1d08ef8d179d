"use client";
import { useRouter } from "next/navigation";
import { useState } from "react";
import type { Scenario } from "@/db/queries/scenarios";
import { ApiRequestError, apiSend, errorMessage } from "@/lib/api-client";
import { Button } from "@/components/ui/button";
import { inputClass } from "@/components/ui/field";

/**
 * "Duplicate" (a copy named "<name> (copy)", opened at once) and "New scenario from this one" (the copy under a name
 * typed here) of a saved scenario, through POST /api/scenarios/[id]/duplicate. `compact`: the list's row buttons.
 */
export function DuplicateScenario({
  teamId,
  scenarioId,
  name,
  compact = false,
  unsaved = false,
}: {
  teamId: string;
  scenarioId: string;
  name: string;
  compact?: boolean;
  /** The editor has unsaved edits: the copy takes the saved version (said on the buttons). */
  unsaved?: boolean;
}) {
  const router = useRouter();
  const [busy, setBusy] = useState(false);
  const [asking, setAsking] = useState(false);
  const [newName, setNewName] = useState(`${name} variant`);
  const [error, setError] = useState<string | null>(null);

  async function duplicate(body?: { name: string }) {
    setBusy(true);
    setError(null);
    try {
      const r = await apiSend<{ scenario: Scenario }>("POST", `/api/scenarios/${scenarioId}/duplicate`, body);
      router.push(`/teams/${teamId}/scenarios/${r.scenario.id}`);
    } catch (e) {
      setError(e instanceof ApiRequestError && e.fields.name ? e.fields.name.join(" ") : errorMessage(e, "Could not duplicate the scenario."));
      setBusy(false);
    }
  }

  const savedNote = unsaved ? " (copies the saved version, not your unsaved changes)" : "";
  return (
    <div className={`no-print flex flex-wrap items-center gap-2 ${compact ? "text-xs" : ""}`}>
      <Button
        variant={compact ? "ghost" : "secondary"}
        className={compact ? "px-1.5! py-0.5! text-xs" : ""}
        onClick={() => void duplicate()}
        disabled={busy}
        aria-label={`Duplicate ${name}`}
        title={`A copy of this scenario on the same baseline${savedNote}`}
      >
        Duplicate
      </Button>
      {asking ? (
        <form
          className="flex flex-wrap items-center gap-1"
          onSubmit={(e) => {
            e.preventDefault();
            void duplicate({ name: newName.trim() });
          }}
        >
          <input
            aria-label="Name of the new scenario"
            className={`${inputClass} w-56 py-1 text-sm`}
            value={newName}
            onChange={(e) => setNewName(e.target.value)}
            autoFocus
          />
          <Button type="submit" disabled={busy || !newName.trim()} className={compact ? "px-1.5! py-0.5! text-xs" : ""}>
            Create
          </Button>
          <Button variant="ghost" onClick={() => setAsking(false)} disabled={busy} className={compact ? "px-1.5! py-0.5! text-xs" : ""}>
            Cancel
          </Button>
        </form>
      ) : (
        <Button
          variant={compact ? "ghost" : "secondary"}
          className={compact ? "px-1.5! py-0.5! text-xs" : ""}
          onClick={() => setAsking(true)}
          disabled={busy}
          title={`A new scenario with these settings under a name you choose${savedNote}`}
        >
          New scenario from this one
        </Button>
      )}
      {error ? (
        <p role="alert" className="w-full text-xs text-bad">
          {error}
        </p>
      ) : null}
    </div>
  );
}

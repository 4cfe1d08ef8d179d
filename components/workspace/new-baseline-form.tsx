"use client";
import { useState } from "react";
import { SelectField } from "@/components/ui/field";
import type { BaselineWithClasses } from "@/db/queries/baselines";
import { apiSend } from "@/lib/api-client";
import { NewItemForm } from "./new-item-form";

/** New baseline: empty, or a copy of an existing one (the demo baseline is a good start). */
export function NewBaselineForm({ teamId, baselines }: { teamId: string; baselines: { id: string; name: string }[] }) {
  const [from, setFrom] = useState("");
  return (
    <NewItemForm
      nameLabel="Baseline name"
      placeholder="e.g. Tile A, N5 wiring"
      submitLabel="New baseline"
      create={async (name) => {
        const r = from
          ? await apiSend<{ baseline: BaselineWithClasses }>("POST", `/api/baselines/${from}/duplicate`, { name })
          : await apiSend<{ baseline: BaselineWithClasses }>("POST", `/api/teams/${teamId}/baselines`, { name });
        return `/teams/${teamId}/baselines/${r.baseline.id}`;
      }}
    >
      {() => (
        <SelectField label="Start from" name="from" value={from} onChange={(e) => setFrom(e.target.value)}>
          <option value="">An empty class table</option>
          {baselines.map((b) => (
            <option key={b.id} value={b.id}>
              A copy of {b.name}
            </option>
          ))}
        </SelectField>
      )}
    </NewItemForm>
  );
}

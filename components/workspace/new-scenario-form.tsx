"use client";
import { useState } from "react";
import { SelectField } from "@/components/ui/field";
import type { Scenario } from "@/db/queries/scenarios";
import { apiSend } from "@/lib/api-client";
import { NewItemForm } from "./new-item-form";

/** Create a scenario on one of the team's baselines, then open it in the editor. */
export function NewScenarioForm({
  teamId,
  baselines,
  defaultBaselineId,
}: {
  teamId: string;
  baselines: { id: string; name: string }[];
  defaultBaselineId?: string;
}) {
  const [baselineId, setBaselineId] = useState(defaultBaselineId ?? baselines[0]?.id ?? "");
  return (
    <NewItemForm
      nameLabel="Scenario name"
      placeholder="e.g. 0.7× pitch shrink"
      submitLabel="New scenario"
      ready={Boolean(baselineId)}
      create={async (name) => {
        const r = await apiSend<{ scenario: Scenario }>("POST", `/api/teams/${teamId}/scenarios`, { baselineId, name });
        return `/teams/${teamId}/scenarios/${r.scenario.id}`;
      }}
    >
      {(errors) => (
        <SelectField label="Baseline" name="baselineId" value={baselineId} onChange={(e) => setBaselineId(e.target.value)} errors={errors.baselineId}>
          {baselines.map((b) => (
            <option key={b.id} value={b.id}>
              {b.name}
            </option>
          ))}
        </SelectField>
      )}
    </NewItemForm>
  );
}

"use client";
import { useState } from "react";
import { SelectField } from "@/components/ui/field";
import type { Roadmap } from "@/db/queries/roadmaps";
import { apiSend } from "@/lib/api-client";
import { NewItemForm } from "./new-item-form";

/**
 * Create a roadmap on one of the team's baselines: its first step N1 empty (S = 1, nothing changed yet) or copied
 * from a scenario of that baseline (the step keeps the scenario's id); then open it.
 */
export function NewRoadmapForm({
  teamId,
  baselines,
  scenarios,
  defaultBaselineId,
}: {
  teamId: string;
  baselines: { id: string; name: string }[];
  scenarios: { id: string; name: string; baselineId: string }[];
  defaultBaselineId?: string;
}) {
  const [baselineId, setBaselineId] = useState(defaultBaselineId ?? baselines[0]?.id ?? "");
  const [from, setFrom] = useState("");
  const own = scenarios.filter((s) => s.baselineId === baselineId);
  return (
    <NewItemForm
      nameLabel="Roadmap name"
      placeholder="e.g. Cu with air gaps, three nodes"
      submitLabel="New roadmap"
      ready={Boolean(baselineId)}
      create={async (name) => {
        const step = from ? { name: "N1", settings: {}, fromScenarioId: from } : { name: "N1", settings: {} };
        const r = await apiSend<{ roadmap: Roadmap }>("POST", `/api/teams/${teamId}/roadmaps`, { baselineId, name, steps: [step] });
        return `/teams/${teamId}/roadmaps/${r.roadmap.id}`;
      }}
    >
      {(errors) => (
        <>
          <SelectField
            label="Baseline (N0)"
            name="baselineId"
            value={baselineId}
            onChange={(e) => {
              setBaselineId(e.target.value);
              setFrom("");
            }}
            errors={errors.baselineId}
          >
            {baselines.map((b) => (
              <option key={b.id} value={b.id}>
                {b.name}
              </option>
            ))}
          </SelectField>
          <SelectField
            label="First step N1"
            name="fromScenarioId"
            value={from}
            onChange={(e) => setFrom(e.target.value)}
            errors={errors["steps.0.fromScenarioId"]}
          >
            <option value="">Empty (S = 1; set it on the roadmap)</option>
            {own.map((s) => (
              <option key={s.id} value={s.id}>
                From scenario: {s.name}
              </option>
            ))}
          </SelectField>
        </>
      )}
    </NewItemForm>
  );
}

"use client";
import { useRouter } from "next/navigation";
import { useState } from "react";
import { Button } from "@/components/ui/button";
import { SelectField, TextField } from "@/components/ui/field";
import { Notice } from "@/components/ui/card";
import type { Scenario } from "@/db/queries/scenarios";
import { useApiForm } from "@/components/ui/use-api-form";
import { apiSend } from "@/lib/api-client";

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
  const router = useRouter();
  const [name, setName] = useState("");
  const [baselineId, setBaselineId] = useState(defaultBaselineId ?? baselines[0]?.id ?? "");
  const { fields: errors, message: msg, busy, run } = useApiForm();
  return (
    <form
      className="flex flex-wrap items-end gap-3"
      onSubmit={(e) => {
        e.preventDefault();
        void run(async () => {
          const r = await apiSend<{ scenario: Scenario }>("POST", `/api/teams/${teamId}/scenarios`, { baselineId, name });
          router.push(`/teams/${teamId}/scenarios/${r.scenario.id}`);
        });
      }}
    >
      <TextField
        label="Scenario name"
        name="name"
        value={name}
        onChange={(e) => setName(e.target.value)}
        errors={errors.name}
        placeholder="e.g. 0.7× pitch shrink"
        className="min-w-64"
        required
      />
      <SelectField label="Baseline" name="baselineId" value={baselineId} onChange={(e) => setBaselineId(e.target.value)} errors={errors.baselineId}>
        {baselines.map((b) => (
          <option key={b.id} value={b.id}>
            {b.name}
          </option>
        ))}
      </SelectField>
      <Button type="submit" disabled={busy || !baselineId}>
        {busy ? "Creating…" : "New scenario"}
      </Button>
      {msg ? <Notice tone="bad">{msg}</Notice> : null}
    </form>
  );
}

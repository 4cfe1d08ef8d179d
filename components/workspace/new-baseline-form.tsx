"use client";
import { useRouter } from "next/navigation";
import { useState } from "react";
import { Button } from "@/components/ui/button";
import { SelectField, TextField } from "@/components/ui/field";
import { Notice } from "@/components/ui/card";
import type { BaselineWithClasses } from "@/db/queries/baselines";
import { useApiForm } from "@/components/ui/use-api-form";
import { apiSend } from "@/lib/api-client";

/** New baseline: empty, or a copy of an existing one (the demo baseline is a good start). */
export function NewBaselineForm({ teamId, baselines }: { teamId: string; baselines: { id: string; name: string }[] }) {
  const router = useRouter();
  const [name, setName] = useState("");
  const [from, setFrom] = useState("");
  const { fields: errors, message: msg, busy, run } = useApiForm();
  return (
    <form
      className="flex flex-wrap items-end gap-3"
      onSubmit={(e) => {
        e.preventDefault();
        void run(async () => {
          const r = from
            ? await apiSend<{ baseline: BaselineWithClasses }>("POST", `/api/baselines/${from}/duplicate`, { name })
            : await apiSend<{ baseline: BaselineWithClasses }>("POST", `/api/teams/${teamId}/baselines`, { name });
          router.push(`/teams/${teamId}/baselines/${r.baseline.id}`);
        });
      }}
    >
      <TextField
        label="Baseline name"
        name="name"
        value={name}
        onChange={(e) => setName(e.target.value)}
        errors={errors.name}
        placeholder="e.g. Tile A, N5 wiring"
        className="min-w-64"
        required
      />
      <SelectField label="Start from" name="from" value={from} onChange={(e) => setFrom(e.target.value)}>
        <option value="">An empty class table</option>
        {baselines.map((b) => (
          <option key={b.id} value={b.id}>
            A copy of {b.name}
          </option>
        ))}
      </SelectField>
      <Button type="submit" disabled={busy}>
        {busy ? "Creating…" : "New baseline"}
      </Button>
      {msg ? <Notice tone="bad">{msg}</Notice> : null}
    </form>
  );
}

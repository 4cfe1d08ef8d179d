"use client";
import { useRouter } from "next/navigation";
import { useState } from "react";
import { Button } from "@/components/ui/button";
import { SelectField, TextField } from "@/components/ui/field";
import { Notice } from "@/components/ui/card";
import { ApiFailure, api } from "./api";

/** New baseline: empty, or a copy of an existing one (the demo baseline is a good start). */
export function NewBaselineForm({ teamId, baselines }: { teamId: string; baselines: { id: string; name: string }[] }) {
  const router = useRouter();
  const [name, setName] = useState("");
  const [from, setFrom] = useState("");
  const [errors, setErrors] = useState<Record<string, string[]>>({});
  const [msg, setMsg] = useState<string | null>(null);
  const [busy, setBusy] = useState(false);
  return (
    <form
      className="flex flex-wrap items-end gap-3"
      onSubmit={async (e) => {
        e.preventDefault();
        setBusy(true);
        setErrors({});
        setMsg(null);
        try {
          const r = from
            ? await api<{ baseline: { id: string } }>("POST", `/api/baselines/${from}/duplicate`, { name })
            : await api<{ baseline: { id: string } }>("POST", `/api/teams/${teamId}/baselines`, { name });
          router.push(`/teams/${teamId}/baselines/${r.baseline.id}`);
        } catch (err) {
          if (err instanceof ApiFailure) {
            setErrors(err.fields);
            setMsg(err.message);
          } else setMsg("Could not reach the server.");
          setBusy(false);
        }
      }}
    >
      <TextField label="Baseline name" name="name" value={name} onChange={(e) => setName(e.target.value)} errors={errors.name} placeholder="e.g. Tile A, N5 wiring" className="min-w-64" required />
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
      {msg && !Object.keys(errors).length ? <Notice tone="bad">{msg}</Notice> : null}
    </form>
  );
}

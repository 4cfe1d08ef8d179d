"use client";
import { useRouter } from "next/navigation";
import { useState, type FormEvent } from "react";
import { Notice } from "@/components/ui/card";
import { TextField } from "@/components/ui/field";
import { buttonClass } from "@/components/ui/button";
import { ApiRequestError, apiSend } from "@/lib/api-client";

export function CreateTeamForm() {
  const router = useRouter();
  const [fields, setFields] = useState<Record<string, string[]>>({});
  const [message, setMessage] = useState<string | null>(null);
  const [busy, setBusy] = useState(false);

  async function onSubmit(e: FormEvent<HTMLFormElement>) {
    e.preventDefault();
    const name = String(new FormData(e.currentTarget).get("name") ?? "");
    setBusy(true);
    setFields({});
    setMessage(null);
    try {
      const r = await apiSend<{ team: { id: string } }>("POST", "/api/teams", { name });
      router.push(`/teams/${r.team.id}`);
      router.refresh();
    } catch (err) {
      if (err instanceof ApiRequestError) {
        setFields(err.failure.fields);
        if (!Object.keys(err.failure.fields).length) setMessage(err.failure.message);
      } else setMessage("Something went wrong.");
      setBusy(false);
    }
  }

  return (
    <form onSubmit={onSubmit} noValidate className="flex flex-col gap-3 sm:flex-row sm:items-start">
      <TextField label="Team name" name="name" required maxLength={80} placeholder="e.g. Back-end-of-line planning" errors={fields.name} className="sm:w-80" />
      <button type="submit" disabled={busy} className={buttonClass("primary", "sm:mt-6")}>
        {busy ? "Creating…" : "Create team"}
      </button>
      {message ? <Notice tone="bad">{message}</Notice> : null}
    </form>
  );
}

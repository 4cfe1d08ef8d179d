"use client";
import { useRouter } from "next/navigation";
import type { FormEvent } from "react";
import { Notice } from "@/components/ui/card";
import { TextField } from "@/components/ui/field";
import { buttonClass } from "@/components/ui/button";
import { useApiForm } from "@/components/ui/use-api-form";
import { apiSend } from "@/lib/api-client";

export function CreateTeamForm() {
  const router = useRouter();
  const { fields, message, busy, run } = useApiForm();

  function onSubmit(e: FormEvent<HTMLFormElement>) {
    e.preventDefault();
    const name = String(new FormData(e.currentTarget).get("name") ?? "");
    void run(async () => {
      const r = await apiSend<{ team: { id: string } }>("POST", "/api/teams", { name });
      router.push(`/teams/${r.team.id}`);
      router.refresh();
    });
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

"use client";
import { useRouter } from "next/navigation";
import { useState, type ReactNode } from "react";
import { Button } from "@/components/ui/button";
import { Notice } from "@/components/ui/card";
import { TextField } from "@/components/ui/field";
import { useApiForm } from "@/components/ui/use-api-form";
import type { FieldErrors } from "@/lib/api-client";

/**
 * The one-line "new baseline" / "new scenario" form: a name, what to start from (`children`, given the field
 * errors) and a submit button. `create(name)` posts and answers the page to open; failures show at the fields.
 */
export function NewItemForm({
  nameLabel,
  placeholder,
  submitLabel,
  ready = true,
  create,
  children,
}: {
  nameLabel: string;
  placeholder: string;
  submitLabel: string;
  ready?: boolean;
  create: (name: string) => Promise<string>;
  children: (errors: FieldErrors) => ReactNode;
}) {
  const router = useRouter();
  const [name, setName] = useState("");
  const { fields: errors, message: msg, busy, run } = useApiForm();
  return (
    <form
      className="flex flex-wrap items-end gap-3"
      onSubmit={(e) => {
        e.preventDefault();
        void run(async () => router.push(await create(name)));
      }}
    >
      <TextField
        label={nameLabel}
        name="name"
        value={name}
        onChange={(e) => setName(e.target.value)}
        errors={errors.name}
        placeholder={placeholder}
        className="min-w-64"
        required
      />
      {children(errors)}
      <Button type="submit" disabled={busy || !ready}>
        {busy ? "Creating…" : submitLabel}
      </Button>
      {msg ? <Notice tone="bad">{msg}</Notice> : null}
    </form>
  );
}

"use client";
import Link from "next/link";
import { useRouter } from "next/navigation";
import type { FormEvent } from "react";
import { Notice } from "@/components/ui/card";
import { TextField } from "@/components/ui/field";
import { useApiForm } from "@/components/ui/use-api-form";
import { apiSend } from "@/lib/api-client";

type Mode = "sign-in" | "sign-up";

export function AuthForm({ mode, next, email: initialEmail = "" }: { mode: Mode; next: string; email?: string }) {
  const router = useRouter();
  // Field errors are shown at their fields; the notice carries the rest.
  const { fields, message, busy, run } = useApiForm({ fieldsMessage: "Check the highlighted fields." });

  function onSubmit(e: FormEvent<HTMLFormElement>) {
    e.preventDefault();
    const data = Object.fromEntries(new FormData(e.currentTarget)) as Record<string, string>;
    void run(async () => {
      await apiSend("POST", mode === "sign-in" ? "/api/auth/sign-in" : "/api/auth/sign-up", data);
      // "/teams?landing=1" lets the teams page go straight to the only team a member has.
      router.replace(next === "/teams" ? "/teams?landing=1" : next);
      router.refresh();
    });
  }

  const q = next !== "/teams" ? `?next=${encodeURIComponent(next)}` : "";
  return (
    <form onSubmit={onSubmit} noValidate className="space-y-4" aria-describedby={message ? "form-message" : undefined}>
      {message ? (
        <div id="form-message">
          <Notice tone="bad">{message}</Notice>
        </div>
      ) : null}
      {mode === "sign-up" ? <TextField label="Name" name="name" autoComplete="name" required maxLength={100} errors={fields.name} /> : null}
      <TextField label="E-mail" name="email" type="email" autoComplete="email" required defaultValue={initialEmail} errors={fields.email} />
      <TextField
        label="Password"
        name="password"
        type="password"
        autoComplete={mode === "sign-up" ? "new-password" : "current-password"}
        required
        maxLength={128}
        hint={mode === "sign-up" ? "10 to 128 characters, not a common password. A few unrelated words work well." : undefined}
        errors={fields.password}
      />
      {mode === "sign-in" ? (
        <p className="-mt-2 text-right text-sm">
          <Link className="text-copper-dark underline" href="/forgot-password">
            Forgot password?
          </Link>
        </p>
      ) : null}
      <button
        type="submit"
        disabled={busy}
        className="inline-flex w-full items-center justify-center rounded-md bg-copper px-3 py-2 text-sm font-medium text-white hover:bg-copper-dark disabled:opacity-50"
      >
        {busy ? "Please wait…" : mode === "sign-in" ? "Sign in" : "Create account"}
      </button>
      <p className="text-center text-sm text-muted">
        {mode === "sign-in" ? (
          <>
            New to Plateau?{" "}
            <Link className="text-copper-dark underline" href={`/sign-up${q}`}>
              Create an account
            </Link>
          </>
        ) : (
          <>
            Already have an account?{" "}
            <Link className="text-copper-dark underline" href={`/sign-in${q}`}>
              Sign in
            </Link>
          </>
        )}
      </p>
    </form>
  );
}

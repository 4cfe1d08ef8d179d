"use client";
import Link from "next/link";
import { useRouter } from "next/navigation";
import { useState, type FormEvent } from "react";
import { Button } from "@/components/ui/button";
import { Notice } from "@/components/ui/card";
import { TextField } from "@/components/ui/field";
import { useApiForm } from "@/components/ui/use-api-form";
import { apiSend } from "@/lib/api-client";

const PASSWORD_HINT = "10 to 128 characters, not a common password. A few unrelated words work well.";

function formData(e: FormEvent<HTMLFormElement>): Record<string, string> {
  e.preventDefault();
  return Object.fromEntries(new FormData(e.currentTarget)) as Record<string, string>;
}

/** Change password: the other sessions end, this one stays. After a change the form starts afresh (a new key). */
export function ChangePasswordForm() {
  const [done, setDone] = useState<{ n: number; text: string } | null>(null);
  return (
    <div className="max-w-sm space-y-4">
      {done ? (
        <Notice tone="good" role="status">
          {done.text}
        </Notice>
      ) : null}
      <ChangePasswordFields
        key={done?.n ?? 0}
        onDone={(ended) =>
          setDone((d) => ({
            n: (d?.n ?? 0) + 1,
            text: `Password changed. ${ended === 0 ? "No other session was open." : `${ended} other session${ended === 1 ? " was" : "s were"} signed out.`}`,
          }))
        }
      />
    </div>
  );
}

function ChangePasswordFields({ onDone }: { onDone: (endedSessions: number) => void }) {
  const { fields, message, busy, run } = useApiForm({ fieldsMessage: "Check the highlighted fields." });
  function onSubmit(e: FormEvent<HTMLFormElement>) {
    const data = formData(e);
    void run(async () => {
      const r = await apiSend<{ endedSessions: number }>("POST", "/api/auth/password", data);
      onDone(r.endedSessions);
    });
  }
  return (
    <form onSubmit={onSubmit} noValidate className="space-y-4" aria-describedby={message ? "password-message" : undefined}>
      {message ? (
        <div id="password-message">
          <Notice tone="bad">{message}</Notice>
        </div>
      ) : null}
      <TextField
        label="Current password"
        name="currentPassword"
        type="password"
        autoComplete="current-password"
        required
        maxLength={128}
        errors={fields.currentPassword}
      />
      <TextField
        label="New password"
        name="newPassword"
        type="password"
        autoComplete="new-password"
        required
        maxLength={128}
        hint={PASSWORD_HINT}
        errors={fields.newPassword}
      />
      <Button type="submit" disabled={busy}>
        {busy ? "Please wait…" : "Change password"}
      </Button>
    </form>
  );
}

/** Sign out of every browser and device, this one included. */
export function SignOutEverywhere() {
  const router = useRouter();
  const { message, busy, run } = useApiForm();
  return (
    <div className="space-y-3">
      {message ? <Notice tone="bad">{message}</Notice> : null}
      <Button
        variant="secondary"
        disabled={busy}
        onClick={() =>
          void run(async () => {
            await apiSend("POST", "/api/auth/sign-out-everywhere", {});
            router.replace("/sign-in");
            router.refresh();
          })
        }
      >
        {busy ? "Signing out…" : "Sign out everywhere"}
      </Button>
    </div>
  );
}

/** Ask for a reset link; the answer is the same whether or not the address has an account. */
export function ForgotPasswordForm({ email = "" }: { email?: string }) {
  const { fields, message, busy, run } = useApiForm({ fieldsMessage: "Check the highlighted field." });
  const [sent, setSent] = useState<string | null>(null);
  function onSubmit(e: FormEvent<HTMLFormElement>) {
    const data = formData(e);
    void run(async () => {
      const r = await apiSend<{ message: string }>("POST", "/api/auth/password-reset", data);
      setSent(r.message);
    });
  }
  if (sent) {
    return (
      <div className="space-y-4">
        <Notice tone="good" role="status">
          {sent}
        </Notice>
        <p className="text-center text-sm text-muted">
          <Link className="text-copper-dark underline" href="/sign-in">
            Back to sign in
          </Link>
        </p>
      </div>
    );
  }
  return (
    <form onSubmit={onSubmit} noValidate className="space-y-4" aria-describedby={message ? "form-message" : undefined}>
      {message ? (
        <div id="form-message">
          <Notice tone="bad">{message}</Notice>
        </div>
      ) : null}
      <TextField label="E-mail" name="email" type="email" autoComplete="email" required defaultValue={email} errors={fields.email} />
      <button
        type="submit"
        disabled={busy}
        className="inline-flex w-full items-center justify-center rounded-md bg-copper px-3 py-2 text-sm font-medium text-white hover:bg-copper-dark disabled:opacity-50"
      >
        {busy ? "Please wait…" : "Send reset link"}
      </button>
      <p className="text-center text-sm text-muted">
        <Link className="text-copper-dark underline" href="/sign-in">
          Back to sign in
        </Link>
      </p>
    </form>
  );
}

/** Choose a new password with the token from the e-mailed link. */
export function ResetPasswordForm({ token }: { token: string }) {
  const router = useRouter();
  const { fields, message, busy, run } = useApiForm({ fieldsMessage: "Check the highlighted field." });
  function onSubmit(e: FormEvent<HTMLFormElement>) {
    const data = formData(e);
    void run(async () => {
      await apiSend("POST", "/api/auth/password-reset/confirm", { token, password: data.password });
      router.replace("/sign-in?reset=1");
    });
  }
  const tokenProblem = fields.token?.[0];
  return (
    <form onSubmit={onSubmit} noValidate className="space-y-4" aria-describedby={message || tokenProblem ? "form-message" : undefined}>
      {message || tokenProblem ? (
        <div id="form-message">
          <Notice tone="bad">
            {tokenProblem ?? message}{" "}
            {tokenProblem ? (
              <Link className="text-copper-dark underline" href="/forgot-password">
                Ask for a new link
              </Link>
            ) : null}
          </Notice>
        </div>
      ) : null}
      <TextField
        label="New password"
        name="password"
        type="password"
        autoComplete="new-password"
        required
        maxLength={128}
        hint={PASSWORD_HINT}
        errors={fields.password}
      />
      <button
        type="submit"
        disabled={busy}
        className="inline-flex w-full items-center justify-center rounded-md bg-copper px-3 py-2 text-sm font-medium text-white hover:bg-copper-dark disabled:opacity-50"
      >
        {busy ? "Please wait…" : "Set new password"}
      </button>
    </form>
  );
}

"use client";
import { useRouter } from "next/navigation";
import { useState } from "react";
import { Button, ButtonLink } from "@/components/ui/button";
import { Notice } from "@/components/ui/card";
import { apiSend, errorMessage } from "@/lib/api-client";

/** The button of a confirmation link's page: posts the token, then says so (or why not). */
export function ConfirmEmail({ token }: { token: string }) {
  const router = useRouter();
  const [busy, setBusy] = useState(false);
  const [done, setDone] = useState<string | null>(null);
  const [error, setError] = useState<string | null>(null);
  async function confirm() {
    setBusy(true);
    setError(null);
    try {
      const r = await apiSend<{ email: string }>("POST", "/api/auth/verify-email", { token });
      setDone(r.email);
      router.refresh();
    } catch (e) {
      setError(errorMessage(e));
    } finally {
      setBusy(false);
    }
  }
  if (done) {
    return (
      <div className="space-y-4">
        <Notice tone="good">{done} is confirmed. You can now send invites and report e-mails.</Notice>
        <ButtonLink href="/teams">Go to your teams</ButtonLink>
      </div>
    );
  }
  return (
    <div className="space-y-3">
      {error ? <Notice tone="bad">{error}</Notice> : null}
      <Button onClick={confirm} disabled={busy} className="w-full">
        {busy ? "Confirming…" : "Confirm my address"}
      </Button>
    </div>
  );
}

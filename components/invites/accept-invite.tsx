"use client";
import { useRouter } from "next/navigation";
import { useState } from "react";
import { Notice } from "@/components/ui/card";
import { Button } from "@/components/ui/button";
import { apiSend, errorMessage } from "@/lib/api-client";

export function AcceptInvite({ token, teamName }: { token: string; teamName: string }) {
  const router = useRouter();
  const [busy, setBusy] = useState(false);
  const [error, setError] = useState<string | null>(null);
  async function accept() {
    setBusy(true);
    setError(null);
    try {
      const r = await apiSend<{ team: { id: string } }>("POST", "/api/invites/accept", { token });
      router.push(`/teams/${r.team.id}`);
      router.refresh();
    } catch (err) {
      setError(errorMessage(err));
      setBusy(false);
    }
  }
  return (
    <div className="space-y-3">
      {error ? <Notice tone="bad">{error}</Notice> : null}
      <Button onClick={accept} disabled={busy} className="w-full">
        {busy ? "Joining…" : `Join ${teamName}`}
      </Button>
    </div>
  );
}

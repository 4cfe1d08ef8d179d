"use client";
import Link from "next/link";
import { useState } from "react";
import { apiSend, errorMessage } from "@/lib/api-client";

/**
 * Shown on every app page while the account's address is unconfirmed: what is held back, and a way to get a new
 * link (the server paces it: one a minute, five a day).
 */
export function VerifyEmailBanner({ email, showOutbox }: { email: string; showOutbox: boolean }) {
  const [state, setState] = useState<{ tone: "neutral" | "good" | "bad"; text: string } | null>(null);
  const [busy, setBusy] = useState(false);
  async function resend() {
    setBusy(true);
    try {
      const r = await apiSend<{ mail: { status: string } }>("POST", "/api/auth/verify-email/resend");
      setState(
        r.mail.status === "sent"
          ? { tone: "good", text: `A new link is on its way to ${email}.` }
          : { tone: "bad", text: "The link could not be sent. Try again in a minute." },
      );
    } catch (e) {
      setState({ tone: "bad", text: errorMessage(e) });
    } finally {
      setBusy(false);
    }
  }
  return (
    <div role="region" aria-label="Confirm your e-mail address" className="no-print border-b border-warn/30 bg-warn-soft">
      <div className="mx-auto flex max-w-7xl flex-wrap items-center gap-x-3 gap-y-1 px-4 py-2 text-sm text-warn">
        <p>
          <strong>Confirm your e-mail address.</strong> We sent a link to {email}. Until you open it you can use Plateau, but not send invites or report
          e-mails.
          {showOutbox ? (
            <>
              {" "}
              This server keeps its mail: read it in the{" "}
              <Link href="/dev/outbox" className="underline">
                Outbox
              </Link>
              .
            </>
          ) : null}
        </p>
        <button
          type="button"
          onClick={resend}
          disabled={busy}
          className="rounded border border-warn/40 px-2 py-0.5 font-medium hover:bg-panel/60 disabled:opacity-60"
        >
          {busy ? "Sending…" : "Send the link again"}
        </button>
        {state ? (
          <p role={state.tone === "bad" ? "alert" : "status"} className={state.tone === "bad" ? "text-bad" : "text-good"}>
            {state.text}
          </p>
        ) : null}
      </div>
    </div>
  );
}

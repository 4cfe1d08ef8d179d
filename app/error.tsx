"use client";
import Link from "next/link";
import { useEffect } from "react";

export default function ErrorPage({ error, reset }: { error: Error & { digest?: string }; reset: () => void }) {
  useEffect(() => {
    console.error(error);
  }, [error]);
  return (
    <main className="mx-auto max-w-lg px-4 py-16">
      <h1 className="text-xl font-semibold text-ink">Something went wrong</h1>
      <p className="mt-2 text-sm text-muted">
        The page could not be shown. The error was logged{error.digest ? ` (reference ${error.digest})` : ""}. Try again, or go back to your teams.
      </p>
      <div className="mt-6 flex gap-2">
        <button type="button" onClick={reset} className="rounded-md bg-copper px-3 py-1.5 text-sm font-medium text-white hover:bg-copper-dark">
          Try again
        </button>
        <Link href="/teams" className="rounded-md border border-rule-strong bg-panel px-3 py-1.5 text-sm font-medium text-ink hover:bg-ground">
          Your teams
        </Link>
      </div>
    </main>
  );
}

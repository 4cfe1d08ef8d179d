import Link from "next/link";
import { Button } from "@/components/ui/button";
import { EmptyState, Notice } from "@/components/ui/card";

/** The not-found and error states of the baseline and scenario routes (their not-found.tsx and error.tsx). */
export function ItemNotFound({ what }: { what: string }) {
  return (
    <EmptyState
      title={`${what} not found`}
      action={
        <Link href="/teams" className="text-copper hover:underline">
          Back to your teams
        </Link>
      }
    >
      It may have been deleted, or it belongs to a team you are not a member of.
    </EmptyState>
  );
}

export function ItemLoadError({ what, reset }: { what: string; reset: () => void }) {
  return (
    <div className="space-y-3">
      <Notice tone="bad">The {what} could not be loaded. The error was logged.</Notice>
      <Button variant="secondary" onClick={reset}>
        Try again
      </Button>
    </div>
  );
}

"use client";
import { Notice } from "@/components/ui/card";
import { Button } from "@/components/ui/button";

export default function BaselinesError({ reset }: { error: Error; reset: () => void }) {
  return (
    <div className="space-y-3">
      <Notice tone="bad">The baseline could not be loaded. The error was logged.</Notice>
      <Button variant="secondary" onClick={reset}>
        Try again
      </Button>
    </div>
  );
}

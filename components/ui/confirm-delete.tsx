"use client";
import { useState } from "react";
import { Button } from "./button";

/** "Delete…" that asks once more, saying what goes with it, before calling `onDelete`. */
export function ConfirmDelete({ question, onDelete, busy }: { question: string; onDelete: () => void; busy?: boolean }) {
  const [asking, setAsking] = useState(false);
  if (!asking) {
    return (
      <Button variant="ghost" onClick={() => setAsking(true)}>
        Delete…
      </Button>
    );
  }
  return (
    <span className="flex items-center gap-1 text-xs">
      {question}
      <Button variant="danger" onClick={onDelete} disabled={busy}>
        Delete
      </Button>
      <Button variant="ghost" onClick={() => setAsking(false)}>
        Keep
      </Button>
    </span>
  );
}

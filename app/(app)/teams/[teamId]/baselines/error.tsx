"use client";
import { ItemLoadError } from "@/components/workspace/route-states";

export default function BaselinesError({ reset }: { error: Error; reset: () => void }) {
  return <ItemLoadError what="baseline" reset={reset} />;
}

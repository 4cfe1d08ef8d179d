"use client";
import { ItemLoadError } from "@/components/workspace/route-states";

export default function ScenariosError({ reset }: { error: Error; reset: () => void }) {
  return <ItemLoadError what="scenario" reset={reset} />;
}

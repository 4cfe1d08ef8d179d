"use client";
import { ItemLoadError } from "@/components/workspace/route-states";

export default function RoadmapsError({ reset }: { error: Error; reset: () => void }) {
  return <ItemLoadError what="roadmap" reset={reset} />;
}

import type { ShapingArgs, ShapingResult, ShapingStage } from "@/lib/workspace/shaping";

export type { ShapingArgs, ShapingResult, ShapingStage };

/** One request to the shaping worker: a class's whole shaping computation. */
export type DesignRequest = { id: number; kind: "shape"; args: ShapingArgs };

export type DesignResponse =
  | { id: number; kind: "progress"; stage: ShapingStage; fraction: number }
  | { id: number; kind: "shape"; result: ShapingResult; elapsedMs: number }
  | { id: number; kind: "error"; message: string; isRange: boolean };

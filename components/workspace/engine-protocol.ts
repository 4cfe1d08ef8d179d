import type { FieldSolveInput, FieldSolveResult, SweepCurve, sweep } from "@/lib/scaling";

/** What the worker sweeps: the engine's `sweep` input, plus one x to compute every curve at. */
export type SweepArgs = Parameters<typeof sweep>[0] & {
  /** Also compute every curve at this one x (e.g. S = 1, the reference of relative curves). */
  referenceX?: number;
};

export type FieldArgs = Omit<FieldSolveInput, "onProgress">;

export type WorkerRequest = { id: number; kind: "sweep"; args: SweepArgs } | { id: number; kind: "field"; args: FieldArgs };

export type WorkerResponse =
  | { id: number; kind: "sweep"; curves: SweepCurve[]; reference?: SweepCurve[]; elapsedMs: number }
  | { id: number; kind: "field"; result: FieldSolveResult }
  | { id: number; kind: "progress"; fraction: number }
  | { id: number; kind: "superseded" }
  | { id: number; kind: "error"; message: string };

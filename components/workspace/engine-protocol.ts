import type { Evaluation, FieldSolveInput, FieldSolveResult, LineCapacitanceInput, SweepCurve, evaluateScenario, lineCapacitance, sweep } from "@/lib/scaling";

/** What the worker sweeps: the engine's `sweep` input, plus one x to compute every curve at. */
export type SweepArgs = Parameters<typeof sweep>[0] & {
  /** Also compute every curve at this one x (e.g. S = 1, the reference of relative curves). */
  referenceX?: number;
};

export type FieldArgs = Omit<FieldSolveInput, "onProgress">;

/** What the worker evaluates: the engine's `evaluateScenario` input. */
export type EvaluateArgs = Parameters<typeof evaluateScenario>[0];

/** The closed-form and table models on one cross-section (the field check's comparison). */
export type CapacitanceArgs = Omit<LineCapacitanceInput, "model">;
export type CapacitanceModels = { accurate: ReturnType<typeof lineCapacitance>; published: ReturnType<typeof lineCapacitance> };

export type { RoadmapArgs, RoadmapEvaluation, RoadmapResults } from "@/lib/workspace/roadmap-evaluate";
import type { RoadmapArgs, RoadmapResults } from "@/lib/workspace/roadmap-evaluate";

export type WorkerRequest =
  | { id: number; kind: "sweep"; args: SweepArgs }
  | { id: number; kind: "field"; args: FieldArgs }
  | { id: number; kind: "evaluate"; args: EvaluateArgs }
  | { id: number; kind: "capacitance"; args: CapacitanceArgs }
  | { id: number; kind: "roadmap"; args: RoadmapArgs };

export type WorkerResponse =
  | { id: number; kind: "sweep"; curves: SweepCurve[]; reference?: SweepCurve[]; elapsedMs: number }
  | { id: number; kind: "field"; result: FieldSolveResult }
  | { id: number; kind: "evaluate"; evaluation: Evaluation; elapsedMs: number }
  | { id: number; kind: "capacitance"; models: CapacitanceModels }
  | { id: number; kind: "roadmap"; results: RoadmapResults; elapsedMs: number }
  | { id: number; kind: "progress"; fraction: number }
  | { id: number; kind: "superseded" }
  | { id: number; kind: "error"; message: string };

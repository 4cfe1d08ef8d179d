import type {
  FieldSolveInput,
  FieldSolveResult,
  ModelLevel,
  ScenarioSettings,
  SweepCurve,
  SweepMetric,
  SweepVariable,
  Technology,
  WireClass,
} from "@/lib/scaling";

export interface SweepArgs {
  classes: WireClass[];
  technology: Technology;
  settings: ScenarioSettings;
  variable: SweepVariable;
  metric: SweepMetric;
  from: number;
  to: number;
  points: number;
  levels?: ModelLevel[];
  spacing?: "linear" | "log";
  classNames?: string[];
  /** S sweeps: S_L follows S, is fixed at 1, or is the scenario's (see lib/scaling/sweep.ts). */
  lengthMode?: "scenario" | "follow" | "fixed";
  /** Also compute every curve at this one x (e.g. S = 1, the reference of relative curves). */
  referenceX?: number;
}

export type FieldArgs = Omit<FieldSolveInput, "onProgress">;

export type WorkerRequest = { id: number; kind: "sweep"; args: SweepArgs } | { id: number; kind: "field"; args: FieldArgs };

export type WorkerResponse =
  | { id: number; kind: "sweep"; curves: SweepCurve[]; reference?: SweepCurve[]; elapsedMs: number }
  | { id: number; kind: "field"; result: FieldSolveResult }
  | { id: number; kind: "progress"; fraction: number }
  | { id: number; kind: "superseded" }
  | { id: number; kind: "error"; message: string };

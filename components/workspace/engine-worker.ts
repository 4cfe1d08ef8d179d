/// <reference lib="webworker" />
// The engine off the main thread: evaluations, sweeps and the field check (the main thread's bundle carries no engine).
import { evaluateScenario, fieldSolve, lineCapacitance, sweep, type FieldSolveInput } from "@/lib/scaling";
import { roadmapResults } from "@/lib/workspace/roadmap-evaluate";
import type { WorkerRequest, WorkerResponse } from "./engine-protocol";

const scope = self as unknown as DedicatedWorkerGlobalScope;
let pendingSweep: Extract<WorkerRequest, { kind: "sweep" }> | null = null;
let pendingEval: Extract<WorkerRequest, { kind: "evaluate" }> | null = null;
let scheduled = false;
let scheduledEval = false;
let pendingRoadmap: Extract<WorkerRequest, { kind: "roadmap" }> | null = null;
let scheduledRoadmap = false;

function post(msg: WorkerResponse) {
  scope.postMessage(msg);
}

// Sweeps coalesce: while a slider moves, only the newest queued request is computed.
function runPendingSweep() {
  scheduled = false;
  const req = pendingSweep;
  pendingSweep = null;
  if (!req) return;
  try {
    const t0 = performance.now();
    const { referenceX, ...args } = req.args;
    const curves = sweep(args);
    const reference = referenceX !== undefined ? sweep({ ...args, from: referenceX, to: referenceX, points: 1 }) : undefined;
    post({ id: req.id, kind: "sweep", curves, reference, elapsedMs: performance.now() - t0 });
  } catch (e) {
    post({ id: req.id, kind: "error", message: e instanceof Error ? e.message : String(e) });
  }
}

// Evaluations coalesce too: while a slider moves, only the newest queued one is computed.
function runPendingEval() {
  scheduledEval = false;
  const req = pendingEval;
  pendingEval = null;
  if (!req) return;
  try {
    const t0 = performance.now();
    const evaluation = evaluateScenario(req.args);
    post({ id: req.id, kind: "evaluate", evaluation, elapsedMs: performance.now() - t0 });
  } catch (e) {
    post({ id: req.id, kind: "error", message: e instanceof Error ? e.message : String(e) });
  }
}

// Roadmaps coalesce like evaluations: while a step is edited, only the newest queued request is computed.
function runPendingRoadmap() {
  scheduledRoadmap = false;
  const req = pendingRoadmap;
  pendingRoadmap = null;
  if (!req) return;
  try {
    const t0 = performance.now();
    const results = roadmapResults(req.args);
    post({ id: req.id, kind: "roadmap", results, elapsedMs: performance.now() - t0 });
  } catch (e) {
    post({ id: req.id, kind: "error", message: e instanceof Error ? e.message : String(e) });
  }
}

scope.onmessage = (ev: MessageEvent<WorkerRequest>) => {
  const req = ev.data;
  if (req.kind === "roadmap") {
    if (pendingRoadmap) post({ id: pendingRoadmap.id, kind: "superseded" });
    pendingRoadmap = req;
    if (!scheduledRoadmap) {
      scheduledRoadmap = true;
      setTimeout(runPendingRoadmap, 0);
    }
    return;
  }
  if (req.kind === "evaluate") {
    if (pendingEval) post({ id: pendingEval.id, kind: "superseded" });
    pendingEval = req;
    if (!scheduledEval) {
      scheduledEval = true;
      setTimeout(runPendingEval, 0);
    }
    return;
  }
  if (req.kind === "capacitance") {
    try {
      const models = { accurate: lineCapacitance({ ...req.args, model: "accurate" }), published: lineCapacitance({ ...req.args, model: "coupled" }) };
      post({ id: req.id, kind: "capacitance", models });
    } catch (e) {
      post({ id: req.id, kind: "error", message: e instanceof Error ? e.message : String(e) });
    }
    return;
  }
  if (req.kind === "sweep") {
    if (pendingSweep) post({ id: pendingSweep.id, kind: "superseded" });
    pendingSweep = req;
    if (!scheduled) {
      scheduled = true;
      setTimeout(runPendingSweep, 0);
    }
    return;
  }
  if (req.kind === "field") {
    try {
      let last = 0;
      const input: FieldSolveInput = {
        ...req.args,
        onProgress: (fraction: number) => {
          const now = performance.now();
          if (now - last > 50 || fraction >= 1) {
            last = now;
            post({ id: req.id, kind: "progress", fraction });
          }
        },
      };
      const result = fieldSolve(input);
      post({ id: req.id, kind: "field", result });
    } catch (e) {
      post({ id: req.id, kind: "error", message: e instanceof Error ? e.message : String(e) });
    }
  }
};

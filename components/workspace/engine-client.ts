"use client";
import type { Evaluation, FieldSolveResult, SweepCurve } from "@/lib/scaling";
import type {
  CapacitanceArgs,
  CapacitanceModels,
  EvaluateArgs,
  FieldArgs,
  RoadmapArgs,
  RoadmapResults,
  SweepArgs,
  WorkerRequest,
  WorkerResponse,
} from "./engine-protocol";

type Pending = {
  resolve: (v: unknown) => void;
  reject: (e: Error) => void;
  onProgress?: (f: number) => void;
  withReference?: boolean;
};

/** Superseded by a newer sweep while queued: callers ignore it. */
export class Superseded extends Error {}

/**
 * One Web Worker running the engine; requests are answered in order, sweeps and evaluations coalesce (a newer one
 * supersedes a queued one of the same kind). The engine (and its capacitance tables) loads only in workers: the
 * main thread's bundle carries none of it.
 */
export class EngineWorker {
  private worker: Worker;
  private next = 1;
  private pending = new Map<number, Pending>();

  constructor() {
    this.worker = new Worker(new URL("./engine-worker.ts", import.meta.url), { type: "module" });
    this.worker.onmessage = (ev: MessageEvent<WorkerResponse>) => {
      const msg = ev.data;
      const p = this.pending.get(msg.id);
      if (!p) return;
      if (msg.kind === "progress") return p.onProgress?.(msg.fraction);
      this.pending.delete(msg.id);
      if (msg.kind === "sweep") p.resolve(p.withReference ? { curves: msg.curves, reference: msg.reference ?? [] } : msg.curves);
      else if (msg.kind === "field") p.resolve(msg.result);
      else if (msg.kind === "evaluate") p.resolve(msg.evaluation);
      else if (msg.kind === "capacitance") p.resolve(msg.models);
      else if (msg.kind === "roadmap") p.resolve(msg.results);
      else if (msg.kind === "superseded") p.reject(new Superseded("superseded"));
      else p.reject(new Error(msg.message));
    };
    this.worker.onerror = (ev) => {
      for (const p of this.pending.values()) p.reject(new Error(ev.message || "The engine worker failed."));
      this.pending.clear();
    };
  }

  private send<T>(req: Omit<WorkerRequest, "id">, onProgress?: (f: number) => void, withReference = false): Promise<T> {
    const id = this.next++;
    return new Promise<T>((resolve, reject) => {
      this.pending.set(id, { resolve: resolve as (v: unknown) => void, reject, onProgress, withReference });
      this.worker.postMessage({ ...req, id } as WorkerRequest);
    });
  }

  sweep(args: SweepArgs): Promise<SweepCurve[]> {
    return this.send({ kind: "sweep", args } as Omit<WorkerRequest, "id">);
  }

  /** A sweep plus every curve's value at `args.referenceX` (the x of "relative to"). */
  sweepWithReference(args: SweepArgs & { referenceX: number }): Promise<{ curves: SweepCurve[]; reference: SweepCurve[] }> {
    return this.send({ kind: "sweep", args } as Omit<WorkerRequest, "id">, undefined, true);
  }

  /** evaluateScenario in the worker; a newer call supersedes a queued one (it rejects with Superseded). */
  evaluate(args: EvaluateArgs): Promise<Evaluation> {
    return this.send({ kind: "evaluate", args } as Omit<WorkerRequest, "id">);
  }

  /** evaluateRoadmap of each chain at each level in the worker; a newer call supersedes a queued one. */
  roadmap(args: RoadmapArgs): Promise<RoadmapResults> {
    return this.send({ kind: "roadmap", args } as Omit<WorkerRequest, "id">);
  }

  /** The accurate tables and the published closed forms on one cross-section. */
  capacitance(args: CapacitanceArgs): Promise<CapacitanceModels> {
    return this.send({ kind: "capacitance", args } as Omit<WorkerRequest, "id">);
  }

  field(args: FieldArgs, onProgress?: (f: number) => void): Promise<FieldSolveResult> {
    return this.send({ kind: "field", args } as Omit<WorkerRequest, "id">, onProgress);
  }

  terminate(): void {
    this.worker.terminate();
    for (const p of this.pending.values()) p.reject(new Superseded("terminated"));
    this.pending.clear();
  }
}

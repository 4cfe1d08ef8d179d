"use client";
import type { DesignRequest, DesignResponse, ShapingArgs, ShapingResult, ShapingStage } from "./design-protocol";

/** A request that was cancelled or replaced by a newer one before it finished: callers ignore it. */
export class ShapingCancelled extends Error {}

/** The engine's answer for bad limits or inputs (a RangeError in the worker), as opposed to a worker failure. */
export class ShapingInputError extends Error {}

/**
 * The shaping screen's Web Worker. Newest request wins: a request sent while another is still computing ends the
 * worker (the engine is synchronous, so a running computation cannot be interrupted any other way) and starts a fresh
 * one for the new request; `cancel()` does the same without a new request. The superseded promise rejects with
 * ShapingCancelled.
 */
export class DesignWorker {
  private worker: Worker | null = null;
  private next = 1;
  private running: { id: number; reject: (e: Error) => void; resolve: (r: ShapingResult) => void; onProgress?: (s: ShapingStage, f: number) => void } | null =
    null;

  private start(): Worker {
    const w = new Worker(new URL("./design-worker.ts", import.meta.url), { type: "module" });
    w.onmessage = (ev: MessageEvent<DesignResponse>) => {
      const msg = ev.data;
      const r = this.running;
      if (!r || r.id !== msg.id) return;
      if (msg.kind === "progress") return r.onProgress?.(msg.stage, msg.fraction);
      this.running = null;
      if (msg.kind === "shape") r.resolve(msg.result);
      else r.reject(msg.isRange ? new ShapingInputError(msg.message) : new Error(msg.message));
    };
    w.onerror = (ev) => {
      const r = this.running;
      this.running = null;
      this.stop();
      r?.reject(new Error(ev.message || "The shaping worker failed."));
    };
    return w;
  }

  private stop() {
    this.worker?.terminate();
    this.worker = null;
  }

  /** Whether a request is computing now. */
  get busy(): boolean {
    return this.running !== null;
  }

  shape(args: ShapingArgs, onProgress?: (stage: ShapingStage, fraction: number) => void): Promise<ShapingResult> {
    if (this.running) this.cancel();
    this.worker ??= this.start();
    const id = this.next++;
    return new Promise<ShapingResult>((resolve, reject) => {
      this.running = { id, resolve, reject, onProgress };
      this.worker!.postMessage({ id, kind: "shape", args } satisfies DesignRequest);
    });
  }

  /** Ends the running request at once (the worker is ended; the next request starts a new one). */
  cancel(): void {
    const r = this.running;
    this.running = null;
    this.stop();
    r?.reject(new ShapingCancelled("cancelled"));
  }

  terminate(): void {
    this.cancel();
    this.stop();
  }
}

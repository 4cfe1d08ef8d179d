/// <reference lib="webworker" />
// The "Layer shaping" screen's engine, off the main thread: heat map, optimum, delay parts and tornado of one class.
// One request at a time; the main thread (design-client.ts) ends this worker to cancel or to replace a running request.
import { shapeClass } from "@/lib/workspace/shaping";
import type { DesignRequest, DesignResponse } from "./design-protocol";

const scope = self as unknown as DedicatedWorkerGlobalScope;

function post(msg: DesignResponse) {
  scope.postMessage(msg);
}

scope.onmessage = (ev: MessageEvent<DesignRequest>) => {
  const req = ev.data;
  const t0 = performance.now();
  try {
    const result = shapeClass(req.args, (stage, fraction) => post({ id: req.id, kind: "progress", stage, fraction }));
    post({ id: req.id, kind: "shape", result, elapsedMs: performance.now() - t0 });
  } catch (e) {
    post({ id: req.id, kind: "error", message: e instanceof Error ? e.message : String(e), isRange: e instanceof RangeError });
  }
};

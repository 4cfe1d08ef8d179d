import "server-only";
import { Worker } from "node:worker_threads";
import type { HistogramParse } from "./histograms";
import type { ThreadBins, ThreadReply, ThreadRequest } from "./thread-protocol";
import { ImportFatalError } from "./types";
import type { WireClassParse } from "./wire-classes";

/** Chunks sent to the import thread and not yet taken by its reader: the upload waits beyond this (flow control). */
const MAX_CHUNKS_IN_FLIGHT = 16;

/**
 * Parse and validate an upload in a worker thread (lib/import/parse-thread.ts) while this thread only moves the
 * body's bytes: the event loop stays free for other requests however large the file (issue 12 finding 13). The
 * thread is started per import and ended when it answers, when the upload fails (the source's error is rethrown:
 * 413, upload_incomplete) or on any error. Results and fatal file problems are the same as the in-process reader's.
 */
function runThread<T>(
  start: Extract<ThreadRequest, { type: "start" }>,
  source: AsyncIterable<Uint8Array>,
  pick: (r: ThreadReply) => T | undefined,
): Promise<T> {
  // Turbopack bundles the entry and its imports into its own chunk for `new Worker(new URL(…, import.meta.url))`.
  const worker = new Worker(new URL("./parse-thread.ts", import.meta.url));
  return new Promise<T>((resolve, reject) => {
    let settled = false;
    let inFlight = 0;
    let resume: (() => void) | null = null;
    const finish = (f: () => void) => {
      if (settled) return;
      settled = true;
      const r = resume;
      resume = null;
      r?.();
      void worker.terminate();
      f();
    };
    worker.on("message", (m: ThreadReply) => {
      if (m.type === "ack") {
        inFlight -= 1;
        const r = resume;
        resume = null;
        r?.();
        return;
      }
      if (m.type === "fatal") return finish(() => reject(new ImportFatalError(m.issue, m.status, m.code)));
      if (m.type === "error") return finish(() => reject(new Error(`CSV import thread: ${m.message}`)));
      const value = pick(m);
      if (value !== undefined) finish(() => resolve(value));
    });
    worker.on("error", (e) => finish(() => reject(e)));
    worker.on("exit", (code) => finish(() => reject(new Error(`CSV import thread ended (exit ${code}) before answering`))));
    worker.postMessage(start satisfies ThreadRequest);
    void (async () => {
      try {
        for await (const chunk of source) {
          if (settled) return; // answered already (e.g. a fatal header problem): stop reading the upload
          // a copy in its own buffer, transferred: the platform may reuse the chunk's memory
          const bytes = chunk.slice();
          inFlight += 1;
          worker.postMessage({ type: "chunk", bytes } satisfies ThreadRequest, [bytes.buffer as ArrayBuffer]);
          while (inFlight >= MAX_CHUNKS_IN_FLIGHT && !settled) await new Promise<void>((r) => (resume = r));
        }
        if (!settled) worker.postMessage({ type: "end" } satisfies ThreadRequest);
      } catch (e) {
        finish(() => reject(e));
      }
    })();
  });
}

/** parseWireClassStream, in the import thread. */
export function parseWireClassesOffThread(source: AsyncIterable<Uint8Array>, maxBytes: number): Promise<WireClassParse> {
  return runThread({ type: "start", kind: "classes", maxBytes }, source, (m) => (m.type === "classes" ? m.result : undefined));
}

/** parseHistogramCsv into an accumulator, in the import thread: the parse and, when valid, each class's sorted bins. */
export function parseHistogramsOffThread(
  source: AsyncIterable<Uint8Array>,
  classNames: string[],
  maxBytes: number,
): Promise<{ parsed: Omit<HistogramParse, "sink">; bins: ThreadBins[] }> {
  return runThread({ type: "start", kind: "histograms", classNames, maxBytes }, source, (m) =>
    m.type === "histograms" ? { parsed: m.result, bins: m.bins } : undefined,
  );
}

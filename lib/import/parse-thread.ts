// Worker-thread entry (node:worker_threads) of the server's CSV imports: the streaming reader and the row rules run
// here, off the server's one event loop, so a large upload being parsed and validated does not stall every other
// request (issue 12 finding 13). lib/import/off-thread.ts starts it (one per import) and streams the body to it.
// The same functions as everywhere else (parseWireClassStream, parseHistogramCsv): one reader, one set of rules.
import os from "node:os";
import { parentPort } from "node:worker_threads";
import { HistogramAccumulator } from "./histogram-accumulator";
import { parseHistogramCsv } from "./histograms";
import { nodeUtf8Decoder } from "./node-utf8";
import type { ThreadReply, ThreadRequest } from "./thread-protocol";
import { ImportFatalError } from "./types";
import { parseWireClassStream } from "./wire-classes";

const port = parentPort!;

// Linux keeps a nice value per thread (getpriority/setpriority on pid 0 act on the calling thread): 10 steps below the
// server's own priority leaves the event loop the CPU it needs when imports run on every core.
try {
  os.setPriority(Math.min(19, os.getPriority() + 10));
} catch {
  /* not permitted: run at normal priority */
}

/** The upload's chunks as they arrive from the main thread; each taken chunk is acknowledged (flow control). */
const chunks: Uint8Array[] = [];
let ended = false;
let wake: (() => void) | null = null;

async function* body(): AsyncGenerator<Uint8Array> {
  for (;;) {
    const c = chunks.shift();
    if (c) {
      port.postMessage({ type: "ack" } satisfies ThreadReply);
      yield c;
      continue;
    }
    if (ended) return;
    await new Promise<void>((r) => (wake = r));
  }
}

function send(reply: ThreadReply, transfer: ArrayBuffer[] = []): void {
  port.postMessage(reply, transfer);
}

async function run(req: Extract<ThreadRequest, { type: "start" }>): Promise<void> {
  try {
    if (req.kind === "classes") {
      const r = await parseWireClassStream(body(), { maxBytes: req.maxBytes, utf8: nodeUtf8Decoder });
      send({ type: "classes", result: r });
      return;
    }
    const acc = new HistogramAccumulator(req.classNames.length);
    try {
      const r = await parseHistogramCsv(body(), req.classNames, { maxBytes: req.maxBytes, utf8: nodeUtf8Decoder, sink: acc });
      // the bins leave as copies in their own buffers, transferred (not copied again) to the main thread
      const bins = r.ok
        ? acc.classIndices().map((classIndex) => {
            const s = acc.sorted(classIndex);
            return { classIndex, lengthsM: s.lengthsM.slice(), counts: s.counts.slice() };
          })
        : [];
      const { sink: _sink, ...parse } = r;
      send(
        { type: "histograms", result: parse, bins },
        bins.flatMap((b) => [b.lengthsM.buffer as ArrayBuffer, b.counts.buffer as ArrayBuffer]),
      );
    } finally {
      acc.release();
    }
  } catch (e) {
    if (e instanceof ImportFatalError) send({ type: "fatal", issue: e.issue, status: e.status, code: e.code });
    else send({ type: "error", message: e instanceof Error ? e.message : String(e) });
  }
}

port.on("message", (m: ThreadRequest) => {
  if (m.type === "start") void run(m);
  else if (m.type === "chunk") chunks.push(m.bytes);
  else ended = true;
  const w = wake;
  wake = null;
  w?.();
});

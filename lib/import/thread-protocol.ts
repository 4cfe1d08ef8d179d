import type { HistogramParse } from "./histograms";
import type { ImportIssue } from "./types";
import type { WireClassParse } from "./wire-classes";

/** Main thread → import thread: what to parse, then the body's chunks (transferred), then the end. */
export type ThreadRequest =
  | { type: "start"; kind: "classes"; maxBytes: number }
  | { type: "start"; kind: "histograms"; classNames: string[]; maxBytes: number }
  | { type: "chunk"; bytes: Uint8Array }
  | { type: "end" };

/** Histogram bins of one class, ascending by length, as the store takes them. */
export interface ThreadBins {
  classIndex: number;
  lengthsM: Float64Array;
  counts: Float64Array;
}

/** Import thread → main thread: a chunk taken (flow control), the result, or the file's fatal problem. */
export type ThreadReply =
  | { type: "ack" }
  | { type: "classes"; result: WireClassParse }
  | { type: "histograms"; result: Omit<HistogramParse, "sink">; bins: ThreadBins[] }
  | { type: "fatal"; issue: ImportIssue; status: number; code: string }
  | { type: "error"; message: string };

/// <reference lib="webworker" />
// Parses the chosen CSV off the main thread with the same pipelines as the server and the command line
// (lib/import's one reader; column definitions, header rules and row validation from lib/scaling/formats.ts),
// so the preview shows exactly the errors the upload would get.
import { HISTOGRAM_FORMAT, WIRE_CLASS_FORMAT } from "@/lib/scaling/formats";
import { convertDecimalCommas } from "@/lib/import/decimal-comma";
import { HistogramAccumulator } from "@/lib/import/histogram-accumulator";
import { parseHistogramCsv } from "@/lib/import/histograms";
import { MAX_IMPORT_BYTES, MAX_LISTED_ERRORS } from "@/lib/import/limits";
import { ImportFatalError } from "@/lib/import/types";
import { parseWireClassStream } from "@/lib/import/wire-classes";
import type { WorkerRequest, WorkerMessage } from "./protocol";

const PREVIEW_ROWS = 8;

const post = (m: WorkerMessage) => (self as unknown as DedicatedWorkerGlobalScope).postMessage(m);

self.onmessage = async (ev: MessageEvent<WorkerRequest>) => {
  const { kind, classNames } = ev.data;
  let file = ev.data.file;
  let converted: File | undefined;
  let header: string[] = [];
  const preview: { line: number; cells: string[] }[] = [];
  let last = 0;
  async function* bytes(): AsyncGenerator<Uint8Array> {
    const reader = file.stream().getReader();
    let n = 0;
    for (;;) {
      const r = await reader.read();
      if (r.done) break;
      n += r.value.byteLength;
      yield r.value;
      const now = performance.now();
      if (now - last > 60) {
        last = now;
        post({ type: "progress", bytes: n, total: file.size });
      }
    }
    post({ type: "progress", bytes: n, total: file.size });
  }
  const opts = {
    maxBytes: MAX_IMPORT_BYTES,
    maxErrors: MAX_LISTED_ERRORS,
    tap: {
      header: (h: { fields: string[] }) => (header = h.fields),
      row: (cells: string[], line: number) => {
        if (preview.length < PREVIEW_ROWS) preview.push({ line, cells });
      },
    },
  };
  try {
    if (ev.data.convertDecimalCommas) {
      // string rewriting of the cells (no number is parsed, so nothing is rounded), then the converted file is checked
      const text = convertDecimalCommas(await file.text(), kind === "histograms" ? HISTOGRAM_FORMAT : WIRE_CLASS_FORMAT);
      converted = new File([text], file.name.replace(/(\.csv)?$/i, "-decimal-points.csv"), { type: "text/csv" });
      file = converted;
    }
    if (kind === "histograms") {
      // the same collector as the server (20 bytes per bin), so repeats in unsorted files are found here too
      const acc = new HistogramAccumulator(classNames.length);
      const r = await parseHistogramCsv(bytes(), classNames, { ...opts, sink: acc });
      acc.release();
      post({
        type: "done",
        header,
        preview,
        rows: r.rows,
        bytes: r.bytes,
        delimiter: r.delimiter,
        errors: r.errors,
        errorCount: r.errorCount,
        totals: r.perClass.map((c) => ({ name: c.name, bins: c.bins, nets: c.nets, minLengthM: c.minLengthM, maxLengthM: c.maxLengthM })),
        decimalCommas: r.decimalCommas,
        converted,
      });
    } else {
      const r = await parseWireClassStream(bytes(), opts);
      post({
        type: "done",
        header,
        preview,
        rows: r.rows,
        bytes: r.bytes,
        delimiter: r.delimiter,
        errors: r.errors,
        errorCount: r.errorCount,
        totals: r.classes.map((c) => ({ name: c.name, tier: c.tier, nets: c.netCount })),
        decimalCommas: r.decimalCommas,
        converted,
      });
    }
  } catch (e) {
    if (e instanceof ImportFatalError) post({ type: "fatal", issue: e.issue });
    else
      post({
        type: "fatal",
        issue: {
          line: null,
          column: null,
          value: null,
          message: `The file could not be read: ${e instanceof Error ? e.message : String(e)}`,
        },
      });
  }
};

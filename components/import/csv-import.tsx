"use client";

import Link from "next/link";
import { useRouter } from "next/navigation";
import { useSWRConfig } from "swr";
import { useCallback, useEffect, useId, useRef, useState, type DragEvent } from "react";
import { Button, buttonClass } from "@/components/ui/button";
import { Card } from "@/components/ui/card";
import { Notice } from "@/components/ui/card";
import { TextField } from "@/components/ui/field";
import { TableHead } from "@/components/ui/table";
import { ApiRequestError, apiUpload, errorMessage, isAbortError } from "@/lib/api-client";
import { csvLine } from "@/lib/csv-safe";
import { swrKeys } from "@/lib/swr-keys";
import type { ImportIssue } from "@/lib/import/types";
import type { ClassTotalRow, ImportKind, WorkerMessage, WorkerRequest } from "./protocol";

/** Where the file goes; an existing baseline's `version` (as loaded) is sent with the upload: a newer one answers 409. */
type Target =
  | { kind: "classes"; baselineId: string; version: number }
  | { kind: "histograms"; baselineId: string; version: number }
  | { kind: "new-baseline"; teamId: string };

type Preview = Extract<WorkerMessage, { type: "done" }>;

type State =
  | { step: "pick" }
  | { step: "parsing"; file: File; bytes: number }
  | { step: "preview"; file: File; preview: Preview }
  | { step: "fatal"; file: File; issue: ImportIssue }
  | { step: "uploading"; file: File; preview: Preview; sent: number; total: number }
  | { step: "server-error"; file: File; preview: Preview; message: string; errors: ImportIssue[]; errorCount: number }
  | { step: "done"; message: string };

const MAX_SHOWN_ERRORS = 200;

function formatBytes(n: number): string {
  if (n < 1024) return `${n} B`;
  if (n < 1024 * 1024) return `${(n / 1024).toFixed(1)} KiB`;
  return `${(n / (1024 * 1024)).toFixed(1)} MiB`;
}

const nf = new Intl.NumberFormat("en-US");
const um = (m: number | undefined) => (m === undefined ? "" : new Intl.NumberFormat("en-US", { maximumSignificantDigits: 6 }).format(m * 1e6));

function ProgressBar({ label, value, max }: { label: string; value: number; max: number }) {
  const pct = max > 0 ? Math.min(100, Math.round((value / max) * 100)) : 0;
  return (
    <div>
      <div className="mb-1 flex justify-between text-xs text-muted">
        <span>{label}</span>
        <span className="tabular">
          {formatBytes(value)} of {formatBytes(max)} · {pct}%
        </span>
      </div>
      <div role="progressbar" aria-label={label} aria-valuemin={0} aria-valuemax={100} aria-valuenow={pct} className="h-2 overflow-hidden rounded bg-rule/70">
        <div className="h-full bg-copper transition-[width] duration-100" style={{ width: `${pct}%` }} />
      </div>
    </div>
  );
}

function downloadFile(file: File) {
  const url = URL.createObjectURL(file);
  const a = document.createElement("a");
  a.href = url;
  a.download = file.name;
  a.click();
  setTimeout(() => URL.revokeObjectURL(url), 1000);
}

function ErrorTable({ errors, total, fileName }: { errors: ImportIssue[]; total: number; fileName: string }) {
  const download = () => {
    let text = csvLine(["line", "column", "value", "message"]);
    for (const e of errors) text += csvLine([e.line, e.column, e.value, e.message]);
    const url = URL.createObjectURL(new Blob([text], { type: "text/csv" }));
    const a = document.createElement("a");
    a.href = url;
    a.download = fileName.replace(/\.csv$/i, "") + "-errors.csv";
    a.click();
    setTimeout(() => URL.revokeObjectURL(url), 1000);
  };
  return (
    <div className="space-y-2" data-testid="import-errors">
      <div className="flex flex-wrap items-center justify-between gap-2">
        <p className="text-sm font-medium text-bad">
          {nf.format(total)} error{total === 1 ? "" : "s"}
          {total > errors.length ? ` (the first ${errors.length} are listed)` : ""}. Nothing will be stored until the file is fixed.
        </p>
        <Button variant="secondary" onClick={download}>
          Download errors (CSV)
        </Button>
      </div>
      <div className="max-h-80 overflow-auto rounded border border-rule">
        <table className="num w-full text-sm">
          <TableHead
            className="sticky top-0 bg-ground text-left text-xs text-muted"
            cell="px-2 py-1.5"
            columns={[{ label: "line", className: "text-right" }, "column", "value", "reason"]}
          />
          <tbody>
            {errors.slice(0, MAX_SHOWN_ERRORS).map((e, i) => (
              <tr key={i} className="border-t border-rule">
                <td className="num px-2 py-1 text-right tabular">{e.line ?? "—"}</td>
                <td className="px-2 py-1 font-mono text-xs">{e.column ?? "—"}</td>
                <td className="px-2 py-1 font-mono text-xs">{e.value === null ? "—" : JSON.stringify(e.value)}</td>
                <td className="px-2 py-1">{e.message}</td>
              </tr>
            ))}
          </tbody>
        </table>
      </div>
    </div>
  );
}

function PreviewTables({ preview, kind }: { preview: Preview; kind: ImportKind }) {
  return (
    <div className="space-y-4">
      <dl className="grid grid-cols-2 gap-x-6 gap-y-1 text-sm sm:grid-cols-4">
        <div>
          <dt className="text-xs text-muted">Rows</dt>
          <dd className="tabular font-medium" data-testid="preview-rows">
            {nf.format(preview.rows)}
          </dd>
        </div>
        <div>
          <dt className="text-xs text-muted">Delimiter</dt>
          <dd className="font-medium">{preview.delimiter === ";" ? "semicolon ;" : "comma ,"}</dd>
        </div>
        <div>
          <dt className="text-xs text-muted">Size</dt>
          <dd className="tabular font-medium">{formatBytes(preview.bytes)}</dd>
        </div>
        <div>
          <dt className="text-xs text-muted">Columns</dt>
          <dd className="font-medium">{preview.header.length}</dd>
        </div>
      </dl>
      <div>
        <h3 className="mb-1 text-xs font-semibold uppercase tracking-wide text-muted">First rows</h3>
        <div className="overflow-x-auto rounded border border-rule">
          <table className="num w-full text-xs">
            <thead className="bg-ground text-left text-muted">
              <tr>
                <th className="px-2 py-1 text-right font-medium">line</th>
                {preview.header.map((h, i) => (
                  <th key={i} className="whitespace-nowrap px-2 py-1 font-mono font-medium">
                    {h}
                  </th>
                ))}
              </tr>
            </thead>
            <tbody>
              {preview.preview.map((r) => (
                <tr key={r.line} className="border-t border-rule">
                  <td className="px-2 py-1 text-right tabular text-muted">{r.line}</td>
                  {r.cells.map((c, i) => (
                    <td key={i} className={`whitespace-nowrap px-2 py-1 font-mono ${/^[-+.\d]/.test(c) ? "text-right tabular" : ""}`}>
                      {c}
                    </td>
                  ))}
                </tr>
              ))}
            </tbody>
          </table>
        </div>
      </div>
      {preview.totals.length > 0 ? (
        <div>
          <h3 className="mb-1 text-xs font-semibold uppercase tracking-wide text-muted">
            {kind === "histograms" ? "Per-class totals" : "Classes in the file"}
          </h3>
          <table className="num w-full max-w-2xl text-sm" data-testid="preview-totals">
            <TableHead
              className="text-left text-xs text-muted"
              rowClassName="border-b border-rule"
              cell="py-1 pr-3"
              lastCell="py-1"
              columns={
                kind === "histograms"
                  ? ["class", ...["bins", "nets", "shortest (µm)", "longest (µm)"].map((label) => ({ label, className: "text-right" }))]
                  : ["class", "tier", { label: "nets", className: "text-right" }]
              }
            />
            <tbody>
              {preview.totals.map((t: ClassTotalRow) => (
                <tr key={t.name} className="border-b border-rule/60">
                  <td className="py-1 pr-3 font-medium">{t.name}</td>
                  {kind === "histograms" ? (
                    <>
                      <td className="py-1 pr-3 text-right tabular">{nf.format(t.bins ?? 0)}</td>
                      <td className="py-1 pr-3 text-right tabular">{nf.format(t.nets)}</td>
                      <td className="py-1 pr-3 text-right tabular">{um(t.minLengthM)}</td>
                      <td className="py-1 text-right tabular">{um(t.maxLengthM)}</td>
                    </>
                  ) : (
                    <>
                      <td className="py-1 pr-3">{t.tier}</td>
                      <td className="py-1 text-right tabular">{nf.format(t.nets)}</td>
                    </>
                  )}
                </tr>
              ))}
            </tbody>
          </table>
        </div>
      ) : null}
    </div>
  );
}

/**
 * CSV import: pick or drop a file → parsed in a Web Worker with progress and cancel → preview with
 * errors → explicit mode (or a name for a new baseline) → upload with progress and cancel.
 */
export function CsvImport({
  target,
  classNames,
  existingClassCount,
  doneHref,
  templateHref,
}: {
  target: Target;
  classNames: string[];
  existingClassCount: number;
  doneHref: string | null;
  templateHref: string;
}) {
  const router = useRouter();
  const { mutate } = useSWRConfig();
  const kind: ImportKind = target.kind === "histograms" ? "histograms" : "classes";
  const [state, setState] = useState<State>({ step: "pick" });
  const [mode, setMode] = useState<"replace" | "merge" | null>(null);
  const [name, setName] = useState("");
  const [dragging, setDragging] = useState(false);
  const workerRef = useRef<Worker | null>(null);
  const uploadRef = useRef<AbortController | null>(null);
  const inputId = useId();

  const stopWorker = () => {
    workerRef.current?.terminate();
    workerRef.current = null;
  };
  useEffect(
    () => () => {
      stopWorker();
      uploadRef.current?.abort();
    },
    [],
  );

  const start = useCallback(
    (file: File, convertDecimalCommas = false) => {
      stopWorker();
      setState({ step: "parsing", file, bytes: 0 });
      if (target.kind === "new-baseline" && !name) setName(file.name.replace(/\.csv$/i, "").slice(0, 100));
      const w = new Worker(new URL("./parse-worker.ts", import.meta.url), { type: "module" });
      workerRef.current = w;
      w.onmessage = (ev: MessageEvent<WorkerMessage>) => {
        const m = ev.data;
        if (m.type === "progress") setState((s) => (s.step === "parsing" ? { ...s, bytes: m.bytes } : s));
        else if (m.type === "done") {
          stopWorker();
          // a converted file replaces the chosen one: it is what the preview shows and what gets uploaded
          setState({ step: "preview", file: m.converted ?? file, preview: m });
        } else {
          stopWorker();
          setState({ step: "fatal", file, issue: m.issue });
        }
      };
      w.onerror = (e) => {
        stopWorker();
        setState({
          step: "fatal",
          file,
          issue: { line: null, column: null, value: null, message: `The file could not be read in the browser (${e.message}).` },
        });
      };
      const req: WorkerRequest = { kind, file, classNames, convertDecimalCommas };
      w.postMessage(req);
    },
    [kind, classNames, target.kind, name],
  );

  const onDrop = (e: DragEvent<HTMLDivElement>) => {
    e.preventDefault();
    setDragging(false);
    const f = e.dataTransfer.files[0];
    if (f) start(f);
  };

  const uploadUrl = (): string => {
    if (target.kind === "new-baseline") return `/api/teams/${target.teamId}/baselines/import?name=${encodeURIComponent(name.trim())}`;
    const path = target.kind === "classes" ? "import" : "histograms";
    return `/api/baselines/${target.baselineId}/${path}?mode=${mode}&version=${target.version}`;
  };

  const upload = async () => {
    if (state.step !== "preview" && state.step !== "server-error") return;
    const { file, preview } = state;
    const ctl = new AbortController();
    uploadRef.current = ctl;
    setState({ step: "uploading", file, preview, sent: 0, total: file.size });
    try {
      const body = await apiUpload<{ baseline?: { id: string }; rows?: number; warnings?: string[] } | undefined>(uploadUrl(), file, {
        contentType: "text/csv",
        signal: ctl.signal,
        onProgress: (sent, total) => setState((s) => (s.step === "uploading" ? { ...s, sent, total } : s)),
      });
      const href = target.kind === "new-baseline" && body?.baseline ? `/teams/${target.teamId}/baselines/${body.baseline.id}` : doneHref;
      const warned = body?.warnings?.length ?? 0;
      setState({
        step: "done",
        message: `Stored ${nf.format(body?.rows ?? preview.rows)} rows.${warned ? ` ${warned === 1 ? "1 warning is" : `${warned} warnings are`} kept on the baseline until dismissed.` : ""}`,
      });
      // the baseline page lists the stored warnings: drop any copy SWR cached on an earlier visit
      if (target.kind !== "new-baseline") await mutate(swrKeys.baselineWarnings(target.baselineId));
      if (href) {
        router.push(href);
        router.refresh();
      }
    } catch (err) {
      if (isAbortError(err)) setState({ step: "preview", file, preview });
      else if (err instanceof ApiRequestError && err.isNetworkError) {
        setState({
          step: "server-error",
          file,
          preview,
          message: `${err.message} The upload did not finish; nothing was stored.`,
          errors: [],
          errorCount: 0,
        });
      } else {
        // An invalid file answers 400 with the first issues and their total in the error object.
        const extra = err instanceof ApiRequestError ? err.body : {};
        const errors = Array.isArray(extra.errors) ? (extra.errors as ImportIssue[]) : [];
        const errorCount = typeof extra.errorCount === "number" ? extra.errorCount : errors.length;
        setState({ step: "server-error", file, preview, message: errorMessage(err), errors, errorCount });
      }
    } finally {
      if (uploadRef.current === ctl) uploadRef.current = null;
    }
  };

  const reset = () => {
    stopWorker();
    setState({ step: "pick" });
  };

  const ready =
    (state.step === "preview" || state.step === "server-error") &&
    state.preview.errorCount === 0 &&
    (target.kind === "new-baseline" ? name.trim().length > 0 : mode !== null);

  return (
    <div className="space-y-4">
      {state.step === "pick" ? (
        <Card title="1. Choose a CSV file">
          <div
            onDragOver={(e) => {
              e.preventDefault();
              setDragging(true);
            }}
            onDragLeave={() => setDragging(false)}
            onDrop={onDrop}
            data-testid="drop-zone"
            className={`flex flex-col items-center justify-center gap-2 rounded-lg border-2 border-dashed px-6 py-10 text-center ${dragging ? "border-copper bg-copper-soft" : "border-rule-strong bg-ground/60"}`}
          >
            <p className="text-sm text-ink">Drop a .csv file here, or</p>
            <label
              htmlFor={inputId}
              className={buttonClass("secondary", "cursor-pointer focus-within:outline focus-within:outline-2 focus-within:outline-copper")}
            >
              Choose a file…
              <input
                id={inputId}
                type="file"
                accept=".csv,text/csv,text/plain"
                className="sr-only"
                data-testid="file-input"
                onChange={(e) => {
                  const f = e.target.files?.[0];
                  if (f) start(f);
                  e.target.value = "";
                }}
              />
            </label>
            <p className="text-xs text-muted">
              UTF-8, comma- or semicolon-separated, up to 64 MiB. The file is checked in your browser first; nothing is stored before you confirm.{" "}
              <a className="text-copper-dark underline" href={templateHref} download>
                Download the template
              </a>{" "}
              ·{" "}
              <Link className="text-copper-dark underline" href="/help/csv">
                Format reference
              </Link>
            </p>
          </div>
        </Card>
      ) : null}

      {state.step === "parsing" ? (
        <Card title={`Checking ${state.file.name}`}>
          <div className="space-y-3">
            <ProgressBar label="Reading and checking" value={state.bytes} max={state.file.size} />
            <Button variant="secondary" onClick={reset}>
              Cancel
            </Button>
          </div>
        </Card>
      ) : null}

      {state.step === "fatal" ? (
        <Card title={state.file.name}>
          <div className="space-y-3">
            <Notice tone="bad">{state.issue.line ? `Line ${state.issue.line}: ${state.issue.message}` : state.issue.message}</Notice>
            <Button variant="secondary" onClick={reset}>
              Choose another file
            </Button>
          </div>
        </Card>
      ) : null}

      {state.step === "preview" || state.step === "uploading" || state.step === "server-error" ? (
        <Card
          title={`2. Preview of ${state.file.name}`}
          actions={
            state.step !== "uploading" ? (
              <Button variant="ghost" onClick={reset}>
                Choose another file
              </Button>
            ) : null
          }
        >
          <div className="space-y-4" data-testid="import-preview">
            {state.preview.converted ? (
              <Notice tone="good">
                Converted to comma-separated with decimal points: <span className="font-mono text-xs">{state.file.name}</span> is the file that will be
                uploaded.{" "}
                <button type="button" className="text-copper-dark underline" onClick={() => downloadFile(state.file)}>
                  Download it
                </button>{" "}
                to keep a copy.
              </Notice>
            ) : null}
            <PreviewTables preview={state.preview} kind={kind} />
            {state.step === "preview" && state.preview.decimalCommas?.convertible && !state.preview.converted ? (
              <div
                className="flex flex-wrap items-center gap-3 rounded-md border border-rule bg-ground/60 px-3 py-2 text-sm"
                data-testid="decimal-comma-convert"
              >
                <span className="min-w-0 flex-1">
                  The numbers in this file use decimal commas ({state.preview.decimalCommas.first.value}). Plateau can rewrite it comma-separated with decimal
                  points — digit for digit, nothing rounded — and check it again.
                </span>
                <Button variant="secondary" onClick={() => start(state.file, true)}>
                  Convert to decimal points
                </Button>
              </div>
            ) : null}
            {state.preview.errorCount > 0 ? <ErrorTable errors={state.preview.errors} total={state.preview.errorCount} fileName={state.file.name} /> : null}
          </div>
        </Card>
      ) : null}

      {(state.step === "preview" || state.step === "uploading" || state.step === "server-error") && state.preview.errorCount === 0 ? (
        <Card title="3. Store">
          <div className="space-y-4">
            {target.kind === "new-baseline" ? (
              <TextField
                label="Name of the new baseline"
                name="baseline-name"
                value={name}
                maxLength={100}
                onChange={(e) => setName(e.target.value)}
                hint="The technology starts from invented defaults; edit it on the baseline page."
              />
            ) : (
              <fieldset>
                <legend className="mb-1 text-sm font-medium text-ink">How should the file be applied?</legend>
                <div className="space-y-1.5 text-sm">
                  <label className="flex items-start gap-2">
                    <input
                      type="radio"
                      name="mode"
                      value="replace"
                      checked={mode === "replace"}
                      onChange={() => setMode("replace")}
                      className="mt-1 accent-copper"
                    />
                    <span>
                      <strong>Replace</strong> —{" "}
                      {kind === "classes"
                        ? `the file becomes the class table; classes not in the file are deleted with their histograms (the baseline has ${existingClassCount}).`
                        : "every class's histogram is replaced; classes not in the file end up with none."}
                    </span>
                  </label>
                  <label className="flex items-start gap-2">
                    <input type="radio" name="mode" value="merge" checked={mode === "merge"} onChange={() => setMode("merge")} className="mt-1 accent-copper" />
                    <span>
                      <strong>Merge</strong> —{" "}
                      {kind === "classes"
                        ? "classes of the same name are updated, new ones added, the others kept."
                        : "only the classes in the file get new histograms; the others keep theirs."}
                    </span>
                  </label>
                </div>
              </fieldset>
            )}
            {state.step === "uploading" ? (
              <div className="space-y-3">
                <ProgressBar
                  label={state.sent >= state.total ? "Uploaded; the server is checking and storing…" : "Uploading"}
                  value={state.sent}
                  max={state.total}
                />
                <Button variant="secondary" onClick={() => uploadRef.current?.abort()}>
                  Cancel upload
                </Button>
              </div>
            ) : (
              <div className="flex items-center gap-3">
                <Button onClick={upload} disabled={!ready}>
                  {target.kind === "new-baseline" ? "Create baseline" : "Import"} {nf.format(state.preview.rows)} rows
                </Button>
                {!ready && target.kind !== "new-baseline" ? <span className="text-xs text-muted">Choose replace or merge first.</span> : null}
              </div>
            )}
            {state.step === "server-error" ? (
              <div className="space-y-2">
                <Notice tone="bad">{state.message}</Notice>
                {state.errors.length ? <ErrorTable errors={state.errors} total={state.errorCount} fileName={state.file.name} /> : null}
              </div>
            ) : null}
          </div>
        </Card>
      ) : null}

      {state.step === "done" ? <Notice tone="good">{state.message} Opening the baseline…</Notice> : null}
    </div>
  );
}

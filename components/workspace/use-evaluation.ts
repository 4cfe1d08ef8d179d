"use client";
import { useEffect, useRef, useState } from "react";
import type { Evaluation, ScenarioSettings, Technology, WireClass } from "@/lib/scaling";
import { EngineWorker, Superseded } from "./engine-client";

/** An evaluation of some settings (`key`: keyOf those settings), or why they cannot be evaluated. */
export type EvaluationState = ({ ok: true; e: Evaluation } | { ok: false; message: string }) & { key: string };

/**
 * The scenario's evaluation, computed in a Web Worker (the engine and its capacitance tables stay out of the main
 * thread's bundle). Starts from `initial`, which the server computed for the inputs the page was rendered with;
 * every later change of classes, technology or settings is evaluated in the worker, and a newer change supersedes
 * a queued one (a slider drag evaluates only the newest position). The state keeps the last answer until the next.
 */
export function useEvaluation(
  classes: WireClass[],
  technology: Technology,
  settings: ScenarioSettings,
  key: string,
  initial: EvaluationState,
): EvaluationState {
  const [state, setState] = useState<EvaluationState>(initial);
  const worker = useRef<EngineWorker | null>(null);
  // the inputs `initial` was computed for: the first render needs no worker round trip
  const first = useRef<{ classes: WireClass[]; technology: Technology; key: string } | null>({ classes, technology, key: initial.key });
  // answers are shown in request order: an older answer arriving after a newer one is dropped
  const sent = useRef(0);
  const shown = useRef(0);
  useEffect(() => () => worker.current?.terminate(), []);
  useEffect(() => {
    const f = first.current;
    first.current = null;
    if (f && f.classes === classes && f.technology === technology && f.key === key) return;
    worker.current ??= new EngineWorker();
    const seq = ++sent.current;
    const show = (s: EvaluationState) => {
      if (seq <= shown.current) return;
      shown.current = seq;
      setState(s);
    };
    worker.current.evaluate({ classes, technology, settings }).then(
      (e) => show({ ok: true, e, key }),
      (err: unknown) => {
        if (!(err instanceof Superseded)) show({ ok: false, message: err instanceof Error ? err.message : String(err), key });
      },
    );
  }, [classes, technology, settings, key]);
  return state;
}

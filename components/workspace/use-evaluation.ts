"use client";
import { useEffect, useMemo, useRef, useState } from "react";
import type { Evaluation, ScenarioSettings, Technology, WireClass } from "@/lib/scaling";
import { EngineWorker, Superseded } from "./engine-client";
import type * as MainEngineModule from "./engine-main";

/** An evaluation of some settings (`key`: keyOf those settings), or why they cannot be evaluated. */
export type EvaluationState = ({ ok: true; e: Evaluation } | { ok: false; message: string }) & { key: string };

type MainEngine = typeof MainEngineModule;
let mainEngineLoading: Promise<MainEngine> | null = null;
function loadMainEngine(): Promise<MainEngine> {
  mainEngineLoading ??= import("./engine-main");
  return mainEngineLoading;
}

/**
 * The longest a main-thread evaluation may take (best of up to MAIN_THREAD_TRIALS, timed once when the engine has
 * loaded, in idle time; the first runs of cold code are slow, hence the best): about three quarters of a frame. A
 * bigger baseline (many classes with long histograms) stays in the worker, where a drag keeps the thumb smooth and
 * the results follow a frame later.
 */
const MAIN_THREAD_BUDGET_MS = 12;
const MAIN_THREAD_TRIALS = 5;

/**
 * The scenario's evaluation. Starts from `initial`, which the server computed for the inputs the page was rendered
 * with. Every later change of classes, technology or settings is evaluated:
 *  - on the main thread, during the render that shows it, once the engine's evaluating half (engine-main.ts, with its
 *    tables) has loaded: it loads in idle time after the first paint, never in first-load JS. An evaluation of the
 *    demo takes 1–2 ms, so a slider step's results paint in the same frame as the thumb (issue 13, item 14;
 *    `npm run bench:ui`). Only when this baseline's evaluation fits MAIN_THREAD_BUDGET_MS, timed once on load;
 *  - otherwise, and until then, in a Web Worker: a newer change supersedes a queued one (a slider drag evaluates only the newest
 *    position) and the state keeps the last answer until the next.
 */
export function useEvaluation(
  classes: WireClass[],
  technology: Technology,
  settings: ScenarioSettings,
  key: string,
  initial: EvaluationState,
): EvaluationState {
  const [state, setState] = useState<EvaluationState>(initial);
  const [engine, setEngine] = useState<MainEngine | null>(null);
  // the newest inputs, for timing the main-thread engine on them when it has loaded
  const latest = useRef({ classes, technology, settings });
  useEffect(() => {
    latest.current = { classes, technology, settings };
  });
  // the inputs `initial` was computed for: no evaluation needed while they are shown
  const [first] = useState(() => ({ classes, technology, key: initial.key }));
  const isInitial = classes === first.classes && technology === first.technology && key === first.key;
  const worker = useRef<EngineWorker | null>(null);
  // answers are shown in request order: an older answer arriving after a newer one is dropped
  const sent = useRef(0);
  const shown = useRef(0);

  // the main thread's engine, in idle time after the first paint
  useEffect(() => {
    if (engine) return;
    let live = true;
    const load = () => {
      loadMainEngine().then(
        (m) => {
          if (!live) return;
          let best = Infinity;
          for (let i = 0; i < MAIN_THREAD_TRIALS && best > MAIN_THREAD_BUDGET_MS; i++) {
            const t0 = performance.now();
            try {
              m.evaluateScenario(latest.current);
            } catch {
              /* settings that cannot be evaluated fail fast: the timing still counts */
            }
            best = Math.min(best, performance.now() - t0);
          }
          if (best <= MAIN_THREAD_BUDGET_MS) setEngine(m);
        },
        () => {
          /* not loaded (e.g. offline): evaluations stay in the worker */
        },
      );
    };
    const idle = typeof window.requestIdleCallback === "function";
    const handle = idle ? window.requestIdleCallback(load, { timeout: 2000 }) : window.setTimeout(load, 300);
    return () => {
      live = false;
      if (idle) window.cancelIdleCallback(handle);
      else window.clearTimeout(handle);
    };
  }, [engine]);

  const direct = useMemo((): EvaluationState | null => {
    if (!engine) return null;
    if (isInitial) return initial;
    try {
      return { ok: true, e: engine.evaluateScenario({ classes, technology, settings }), key };
    } catch (err) {
      return { ok: false, message: err instanceof Error ? err.message : String(err), key };
    }
  }, [engine, classes, technology, settings, key, isInitial, initial]);

  useEffect(() => () => worker.current?.terminate(), []);
  useEffect(() => {
    if (engine || isInitial) return;
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
  }, [engine, classes, technology, settings, key, isInitial]);

  if (direct) return direct;
  // back on the inputs the server evaluated before the engine loaded (e.g. Discard): the server's answer
  return isInitial ? initial : state;
}

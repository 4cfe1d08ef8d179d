"use client";
import dynamic from "next/dynamic";
import { useEffect, useMemo, useRef, useState } from "react";
import { ownEntry } from "@/lib/scaling/client";
import type { ModelLevel, ScenarioSettings, SweepCurve, SweepMetric, SweepPoint, Technology, WireClass } from "@/lib/scaling";
import type { SweepChartData } from "@/components/charts/sweep-chart";
import { LevelLegend, SWEEP_METRIC } from "@/components/charts/sweep-meta";
import { inputClass } from "@/components/ui/field";
import { explainEngineError } from "@/lib/workspace/engine-errors";
import { readSweep, type SweepReading } from "@/lib/workspace/sweep-reading";
import { SWEEP_LENGTHS, type SweepLength, type SweepScale } from "@/lib/workspace/sweep-view";
import { EngineWorker, Superseded } from "./engine-client";
import { keyOf } from "./settings-key";
import { useWidth } from "./use-width";

// visx is loaded only in the browser, after the first paint: the table and the controls come without it.
const SweepChart = dynamic(() => import("@/components/charts/sweep-chart").then((m) => m.SweepChart), {
  ssr: false,
  loading: () => <div style={{ height: 244 }} className="animate-pulse rounded bg-rule/40" aria-label="Loading chart" />,
});

export type { SweepLength, SweepScale };

export interface SweepView {
  metric: SweepMetric;
  from: number;
  to: number;
  classes: string[];
  /** Each curve divided by its own value at S = 1 (default), or absolute values. */
  scale: SweepScale;
  /** What wire length does while S moves: follows S (S_L = S), fixed (S_L = 1) or the scenario's S_L. */
  length: SweepLength;
}

const LENGTH_LABEL: Record<SweepLength, string> = {
  follow: "follows S (S_L = S, local-style)",
  fixed: "fixed (S_L = 1, global-style)",
  scenario: "scenario's S_L",
};

const METRIC_WORD: Record<SweepMetric, string> = { delay: "Delay", rc: "RC", r: "Resistance", c: "Capacitance" };

type ClassCurves = { className: string; curves: { level: ModelLevel; points: SweepPoint[] }[]; at1: Partial<Record<ModelLevel, number>> };

/** The sweep: metric against S per selected class, one curve per model level, computed in a Web Worker. */
export function SweepPanel({
  classes,
  technology,
  settings,
  view,
  onView,
  settingsKey,
}: {
  classes: WireClass[];
  technology: Technology;
  settings: ScenarioSettings;
  view: SweepView;
  onView: (v: SweepView) => void;
  settingsKey: string;
}) {
  const worker = useRef<EngineWorker | null>(null);
  const [curves, setCurves] = useState<{ key: string; curves: SweepCurve[]; reference: SweepCurve[] } | null>(null);
  const [error, setError] = useState<string | null>(null);
  const [ref, width] = useWidth<HTMLDivElement>(800);
  const selected = view.classes.length ? view.classes.filter((n) => classes.some((c) => c.name === n)) : classes.slice(0, 4).map((c) => c.name);
  const rangeOk = view.from > 0 && view.to > view.from;
  // The curves do not depend on the scenario's S (the sweep sets S, and per-class S overrides, at every point): a new S
  // only moves the marker, so dragging S recomputes nothing and the charts follow the hand in the same frame.
  const curveSettings = useMemo(() => withoutS(settings), [settings]);
  const curveKey = keyOf(curveSettings);
  const key = `${curveKey}|${view.metric}|${view.from}|${view.to}|${view.length}|${selected.join(",")}`;

  useEffect(() => () => worker.current?.terminate(), []);
  useEffect(() => {
    if (!rangeOk || selected.length === 0) return;
    worker.current ??= new EngineWorker();
    let live = true;
    worker.current
      .sweepWithReference({
        classes,
        technology,
        settings: curveSettings,
        variable: "s",
        metric: view.metric,
        from: view.from,
        to: view.to,
        points: 36,
        spacing: "log",
        classNames: selected,
        lengthMode: view.length,
        // each curve adds one effect to the previous: the ideal line gets the same driver, load and vias
        idealWithDevices: true,
        referenceX: 1,
      })
      .then((r) => {
        if (!live) return;
        setError(null);
        setCurves({ key, ...r });
      })
      .catch((e) => {
        if (live && !(e instanceof Superseded)) setError(e instanceof Error ? e.message : String(e));
      });
    return () => {
      live = false;
    };
    // eslint-disable-next-line react-hooks/exhaustive-deps
  }, [key]);

  const byClass = useMemo(() => {
    const m = new Map<string, ClassCurves>();
    const at1 = new Map<string, number>();
    for (const c of curves?.reference ?? []) if (c.points[0]) at1.set(`${c.className}|${c.level}`, c.points[0].y);
    for (const c of curves?.curves ?? []) {
      const e = m.get(c.className) ?? { className: c.className, curves: [], at1: {} };
      e.curves.push({ level: c.level, points: c.points });
      const y1 = at1.get(`${c.className}|${c.level}`);
      if (y1 !== undefined) e.at1[c.level] = y1;
      m.set(c.className, e);
    }
    return m;
  }, [curves]);
  const sOf = (n: string) => ownEntry(settings.overrides, n)?.s ?? settings.s;
  const readings = useMemo(() => {
    const out: SweepReading[] = [];
    for (const n of selected) {
      const d = byClass.get(n);
      if (!d) continue;
      out.push(
        readSweep(
          { className: n, curves: Object.fromEntries(d.curves.map((c) => [c.level, c.points])), at1: d.at1 },
          { scenarioS: sOf(n), metricLabel: METRIC_WORD[view.metric] },
        ),
      );
    }
    return out;
    // eslint-disable-next-line react-hooks/exhaustive-deps
  }, [byClass, view.metric, settings]);
  const relative = view.scale === "relative";
  // any drawn point where a model is outside its validity range (engine 2 flags every sweep point)
  const anyOutside = selected.some((n) => byClass.get(n)?.curves.some((c) => c.points.some((p) => (p.flags?.length ?? 0) > 0)));
  // one object per class and curves (the charts are memoised: a new S must not hand them new data)
  const chartData = useMemo(() => {
    const m = new Map<string, SweepChartData>();
    for (const [n, d] of byClass)
      m.set(
        n,
        relative
          ? {
              className: d.className,
              curves: d.curves
                .filter((c) => (d.at1[c.level] ?? 0) > 0)
                .map((c) => ({ level: c.level, points: c.points.map((p) => ({ ...p, y: p.y / d.at1[c.level]! })) })),
            }
          : d,
      );
    return m;
  }, [byClass, relative]);
  // Dots on the curves only where they are this scenario's own (same S_L rule); otherwise just a line at its S.
  const dotsFor = (n: string) => {
    const sL = ownEntry(settings.overrides, n)?.sL ?? settings.sL;
    return view.length === "scenario" || (view.length === "fixed" && sL === 1) || (view.length === "follow" && Math.abs(sL - sOf(n)) < 1e-9);
  };
  const xLabel = view.length === "follow" ? "S = S_L (section and length)" : view.length === "fixed" ? "S (S_L = 1, length kept)" : "S (scenario's S_L)";
  const cols = width > 900 ? 3 : width > 560 ? 2 : 1;
  const chartW = Math.floor((width - (cols - 1) * 16) / cols);

  return (
    <div>
      <div className="no-print mb-3 flex flex-wrap items-end gap-3 text-xs">
        <label>
          <span className="mb-1 block font-medium">Metric</span>
          <select
            className={`${inputClass} py-1 text-xs`}
            value={view.metric}
            onChange={(e) => onView({ ...view, metric: e.target.value as SweepMetric })}
            name="metric"
          >
            {(Object.keys(SWEEP_METRIC) as SweepMetric[]).map((m) => (
              <option key={m} value={m}>
                {SWEEP_METRIC[m].label} ({SWEEP_METRIC[m].unit})
              </option>
            ))}
          </select>
        </label>
        <label>
          <span className="mb-1 block font-medium">Scale</span>
          <select
            className={`${inputClass} py-1 text-xs`}
            value={view.scale}
            onChange={(e) => onView({ ...view, scale: e.target.value as SweepScale })}
            name="scale"
          >
            <option value="relative">relative to S = 1</option>
            <option value="absolute">absolute ({SWEEP_METRIC[view.metric].unit})</option>
          </select>
        </label>
        <label>
          <span className="mb-1 block font-medium">Wire length</span>
          <select
            className={`${inputClass} py-1 text-xs`}
            value={view.length}
            onChange={(e) => onView({ ...view, length: e.target.value as SweepLength })}
            name="length"
          >
            {SWEEP_LENGTHS.map((l) => (
              <option key={l} value={l}>
                {LENGTH_LABEL[l]}
              </option>
            ))}
          </select>
        </label>
        <RangeInput label="S from" value={view.from} onChange={(from) => onView({ ...view, from })} />
        <RangeInput label="S to" value={view.to} onChange={(to) => onView({ ...view, to })} />
        <fieldset className="flex flex-wrap items-center gap-x-3 gap-y-1">
          <legend className="mb-1 font-medium">Classes</legend>
          {classes.map((c) => (
            <label key={c.name} className="flex items-center gap-1">
              <input
                type="checkbox"
                checked={selected.includes(c.name)}
                onChange={(e) =>
                  onView({
                    ...view,
                    classes: e.target.checked
                      ? classes.map((x) => x.name).filter((n) => n === c.name || selected.includes(n))
                      : selected.filter((n) => n !== c.name),
                  })
                }
              />
              {c.name}
            </label>
          ))}
        </fieldset>
      </div>
      {!rangeOk ? <p className="text-xs text-bad">The sweep range needs 0 &lt; from &lt; to.</p> : null}
      {error ? <p className="text-xs text-bad">The sweep could not be computed: {explainEngineError(error, settings).text}</p> : null}
      <div ref={ref} className="w-full" data-sweep-key={curves?.key === key ? settingsKey : "pending"} data-testid="sweep">
        <div className="grid gap-4" style={{ gridTemplateColumns: `repeat(${cols}, minmax(0, 1fr))` }}>
          {selected.map((n) => {
            const d = chartData.get(n);
            return d ? (
              <SweepChart
                key={n}
                data={d}
                width={chartW}
                height={220}
                metric={view.metric}
                relative={relative}
                xLabel={xLabel}
                markerX={sOf(n)}
                markerDots={dotsFor(n)}
              />
            ) : (
              <div key={n} style={{ height: 244 }} className="animate-pulse rounded bg-rule/40" />
            );
          })}
        </div>
        <div className="mt-2 flex flex-wrap items-center justify-between gap-2">
          <LevelLegend outsideRange={anyOutside} />
          <p className="text-[11px] text-muted">
            {relative ? "Each curve ÷ its own value at S = 1 (this scenario's options, no shrink). " : ""}Log S axis; the delay axis fits the curves (log only
            when they span more than 4×). Dashed line: this scenario&apos;s S; ▲ each curve&apos;s minimum; a dashed amber band marks where a model is outside
            its validity range. Every curve has the same driver, load and vias, and each adds one effect to the one before (ideal plate and bulk resistivity → +
            fringing → + coupling → + size effects), so the gap between two curves is what that effect adds; copper is the full model.
          </p>
        </div>
        {readings.length > 0 ? (
          <div className="mt-3 rounded border border-rule bg-ground/60 px-3 py-2" data-testid="sweep-reading">
            <h3 className="mb-1 text-xs font-semibold text-ink">Reading the full model (copper), wire length {LENGTH_LABEL[view.length]}</h3>
            <ul className="space-y-0.5 text-xs text-ink">
              {readings.map((r) => (
                <li key={r.className} data-class={r.className}>
                  <span className="font-semibold">{r.className}:</span> {r.text}
                </li>
              ))}
            </ul>
          </div>
        ) : null}
      </div>
    </div>
  );
}

/** The settings a sweep of S depends on: S itself (global and per class) left out. */
function withoutS(s: ScenarioSettings): ScenarioSettings {
  const overrides: ScenarioSettings["overrides"] = {};
  for (const [n, o] of Object.entries(s.overrides)) {
    const { s: _s, ...rest } = o;
    overrides[n] = rest;
  }
  return { ...s, s: 1, overrides };
}

function RangeInput({ label, value, onChange }: { label: string; value: number; onChange: (v: number) => void }) {
  const [text, setText] = useState(String(value));
  const [shown, setShown] = useState(value);
  if (!Object.is(shown, value)) {
    setShown(value);
    setText(String(value));
  }
  const bad = !(Number(text) > 0);
  return (
    <label className="w-16">
      <span className="mb-1 block font-medium">{label}</span>
      <input
        className={`${inputClass} w-16 py-1 text-right text-xs`}
        value={text}
        inputMode="decimal"
        aria-invalid={bad || undefined}
        onChange={(e) => {
          setText(e.target.value);
          const v = Number(e.target.value);
          if (v > 0 && v <= 20) onChange(v);
        }}
      />
    </label>
  );
}

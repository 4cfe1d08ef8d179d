"use client";
import { useEffect, useMemo, useRef, useState } from "react";
import type { ScenarioSettings, SweepCurve, SweepMetric, Technology, WireClass } from "@/lib/scaling";
import { LevelLegend, SWEEP_METRIC, SweepChart } from "@/components/charts/sweep-chart";
import { inputClass } from "@/components/ui/field";
import { EngineWorker, Superseded } from "./engine-client";
import { useWidth } from "./use-width";

export interface SweepView {
  metric: SweepMetric;
  from: number;
  to: number;
  classes: string[];
}

/** The sweep: metric against S per selected class, one curve per model level, computed in a Web Worker. */
export function SweepPanel({ classes, technology, settings, view, onView, settingsKey }: { classes: WireClass[]; technology: Technology; settings: ScenarioSettings; view: SweepView; onView: (v: SweepView) => void; settingsKey: string }) {
  const worker = useRef<EngineWorker | null>(null);
  const [curves, setCurves] = useState<{ key: string; curves: SweepCurve[] } | null>(null);
  const [error, setError] = useState<string | null>(null);
  const [ref, width] = useWidth<HTMLDivElement>(800);
  const selected = view.classes.length ? view.classes.filter((n) => classes.some((c) => c.name === n)) : classes.slice(0, 4).map((c) => c.name);
  const rangeOk = view.from > 0 && view.to > view.from;
  const key = `${settingsKey}|${view.metric}|${view.from}|${view.to}|${selected.join(",")}`;

  useEffect(() => () => worker.current?.terminate(), []);
  useEffect(() => {
    if (!rangeOk || selected.length === 0) return;
    worker.current ??= new EngineWorker();
    let live = true;
    worker.current
      .sweep({ classes, technology, settings, variable: "s", metric: view.metric, from: view.from, to: view.to, points: 36, spacing: "log", classNames: selected })
      .then((c) => {
        if (!live) return;
        setError(null);
        setCurves({ key, curves: c });
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
    const m = new Map<string, { className: string; curves: { level: SweepCurve["level"]; points: SweepCurve["points"] }[] }>();
    for (const c of curves?.curves ?? []) {
      const e = m.get(c.className) ?? { className: c.className, curves: [] };
      e.curves.push({ level: c.level, points: c.points });
      m.set(c.className, e);
    }
    return m;
  }, [curves]);
  const cols = width > 900 ? 3 : width > 560 ? 2 : 1;
  const chartW = Math.floor((width - (cols - 1) * 16) / cols);

  return (
    <div>
      <div className="no-print mb-3 flex flex-wrap items-end gap-3 text-xs">
        <label>
          <span className="mb-1 block font-medium">Metric</span>
          <select className={`${inputClass} py-1 text-xs`} value={view.metric} onChange={(e) => onView({ ...view, metric: e.target.value as SweepMetric })} name="metric">
            {(Object.keys(SWEEP_METRIC) as SweepMetric[]).map((m) => (
              <option key={m} value={m}>
                {SWEEP_METRIC[m].label} ({SWEEP_METRIC[m].unit})
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
                onChange={(e) => onView({ ...view, classes: e.target.checked ? classes.map((x) => x.name).filter((n) => n === c.name || selected.includes(n)) : selected.filter((n) => n !== c.name) })}
              />
              {c.name}
            </label>
          ))}
        </fieldset>
      </div>
      {!rangeOk ? <p className="text-xs text-bad">The sweep range needs 0 &lt; from &lt; to.</p> : null}
      {error ? <p className="text-xs text-bad">Sweep failed: {error}</p> : null}
      <div ref={ref} className="w-full" data-sweep-key={curves?.key === key ? settingsKey : "pending"} data-testid="sweep">
        <div className="grid gap-4" style={{ gridTemplateColumns: `repeat(${cols}, minmax(0, 1fr))` }}>
          {selected.map((n) => {
            const d = byClass.get(n);
            return d ? <SweepChart key={n} data={d} width={chartW} height={220} metric={view.metric} markerX={settings.overrides[n]?.s ?? settings.s} /> : <div key={n} style={{ height: 240 }} className="animate-pulse rounded bg-rule/40" />;
          })}
        </div>
        <div className="mt-2 flex flex-wrap items-center justify-between gap-2">
          <LevelLegend />
          <p className="text-[11px] text-muted">Dots: this scenario. Log axes. The gap between two curves is what that effect adds; copper is the full model.</p>
        </div>
      </div>
    </div>
  );
}

function RangeInput({ label, value, onChange }: { label: string; value: number; onChange: (v: number) => void }) {
  const [text, setText] = useState(String(value));
  useEffect(() => setText(String(value)), [value]);
  const bad = !(Number(text) > 0);
  return (
    <label>
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

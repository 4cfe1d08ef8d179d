"use client";
import dynamic from "next/dynamic";
import Link from "next/link";
import { useCallback, useEffect, useMemo, useRef, useState } from "react";
import type { Scenario } from "@/db/queries/scenarios";
import type { Role } from "@/lib/access";
import type { DesignObjective, Technology, ValidityFlag, WireClass } from "@/lib/scaling";
import { apiSend, errorMessage, staleVersionOf } from "@/lib/api-client";
import { swrKeys } from "@/lib/swr-keys";
import {
  applyShaping,
  checkShapingLimits,
  DEFAULT_SHAPING_LIMITS,
  explainShapingError,
  OBJECTIVE_LABEL,
  percentChange,
  SHAPING_OBJECTIVES,
  type ShapingLimits,
} from "@/lib/workspace/shaping-view";
import type { ShapingDrawing, ShapingResult, ShapingStage } from "@/lib/workspace/shaping";
import { Caution } from "@/components/caution";
import { Button } from "@/components/ui/button";
import { Badge, Card, Notice } from "@/components/ui/card";
import { SelectField, TextField } from "@/components/ui/field";
import { useWidth } from "@/components/workspace/use-width";
import { DesignWorker, ShapingCancelled, ShapingInputError } from "./design-client";
import { HeatMap } from "./heat-map";
import { DelayPartsBar, TornadoChart } from "./delay-drivers";

const ParetoChart = dynamic(() => import("./pareto-chart").then((m) => m.ParetoChart), {
  ssr: false,
  loading: () => <div className="h-[240px] animate-pulse rounded border border-rule bg-panel" aria-label="Loading the chart" />,
});

type LimitText = Record<keyof ShapingLimits, string>;
const LIMIT_FIELDS: { key: keyof ShapingLimits; label: string; hint?: string }[] = [
  { key: "minWidthNm", label: "Minimum width (nm)" },
  { key: "minSpaceNm", label: "Minimum space (nm)" },
  { key: "minFraction", label: "Line fraction from", hint: "W/pitch" },
  { key: "maxFraction", label: "Line fraction to" },
  { key: "maxAspect", label: "Maximum aspect ratio", hint: "T/W, from 1" },
];

const STAGE_TEXT: Record<ShapingStage, string> = {
  map: "Computing the heat map…",
  optimum: "Searching for the optimum…",
  drivers: "Splitting the delay…",
};

type Run =
  | { state: "idle" }
  | { state: "computing"; stage: ShapingStage; fraction: number }
  | { state: "done"; result: ShapingResult }
  | { state: "cancelled" }
  | { state: "error"; message: string };

export function ShapingScreen(props: {
  teamId: string;
  role: Role;
  initialScenario: Scenario;
  baseline: { id: string; name: string; technology: Technology };
  classes: WireClass[];
  initialClass: string;
}) {
  const { teamId, role, classes, baseline } = props;
  const readOnly = role === "viewer";
  const [scenario, setScenario] = useState(props.initialScenario);
  const [className, setClassName] = useState(props.initialClass);
  const [objective, setObjective] = useState<DesignObjective>("delay");
  const [text, setText] = useState<LimitText>(() => {
    const d = DEFAULT_SHAPING_LIMITS;
    return {
      minWidthNm: String(d.minWidthNm),
      minSpaceNm: String(d.minSpaceNm),
      minFraction: String(d.minFraction),
      maxFraction: String(d.maxFraction),
      maxAspect: String(d.maxAspect),
    };
  });
  const limits: ShapingLimits = useMemo(
    () => ({
      minWidthNm: text.minWidthNm.trim() === "" ? NaN : Number(text.minWidthNm),
      minSpaceNm: text.minSpaceNm.trim() === "" ? NaN : Number(text.minSpaceNm),
      minFraction: text.minFraction.trim() === "" ? NaN : Number(text.minFraction),
      maxFraction: text.maxFraction.trim() === "" ? NaN : Number(text.maxFraction),
      maxAspect: text.maxAspect.trim() === "" ? NaN : Number(text.maxAspect),
    }),
    [text],
  );
  const limitErrors = checkShapingLimits(limits);
  const limitsOk = Object.keys(limitErrors).length === 0;

  const [run, setRun] = useState<Run>({ state: "idle" });
  const [elapsed, setElapsed] = useState<number | null>(null);
  const workerRef = useRef<DesignWorker | null>(null);
  useEffect(() => {
    workerRef.current = new DesignWorker();
    return () => workerRef.current?.terminate();
  }, []);

  const compute = useCallback(() => {
    const w = workerRef.current;
    if (!w || !className) return;
    setRun({ state: "computing", stage: "map", fraction: 0 });
    const t0 = performance.now();
    w.shape({ classes, technology: baseline.technology, settings: scenario.settings, className, objective, limits }, (stage, fraction) =>
      setRun((r) => (r.state === "computing" ? { state: "computing", stage, fraction } : r)),
    ).then(
      (result) => {
        setElapsed(performance.now() - t0);
        setRun({ state: "done", result });
      },
      (e: unknown) => {
        if (e instanceof ShapingCancelled) return;
        if (e instanceof ShapingInputError)
          setRun({ state: "error", message: explainShapingError(e.message) ?? `These inputs cannot be shaped: ${e.message}` });
        else setRun({ state: "error", message: errorMessage(e, "The computation failed.") });
      },
    );
  }, [classes, baseline.technology, scenario.settings, className, objective, limits]);

  // every change of class, objective, limits or the scenario computes again (newest request wins in the worker)
  useEffect(() => {
    if (!limitsOk) return;
    const t = setTimeout(compute, 150);
    return () => clearTimeout(t);
  }, [compute, limitsOk]);

  function cancel() {
    workerRef.current?.cancel();
    setRun({ state: "cancelled" });
  }

  // apply to scenario
  const [applying, setApplying] = useState(false);
  const [applied, setApplied] = useState<{ version: number } | null>(null);
  const [applyError, setApplyError] = useState<string | null>(null);
  const [conflict, setConflict] = useState<number | null>(null);
  async function apply(r: ShapingResult) {
    setApplying(true);
    setApplyError(null);
    setApplied(null);
    try {
      const res = await apiSend<{ scenario: Scenario }>("PATCH", swrKeys.scenario(scenario.id), {
        version: scenario.version,
        settings: applyShaping(scenario.settings, r.className, r.optimum.lineFraction, r.optimum.aspectRatio),
      });
      setScenario(res.scenario);
      setApplied({ version: res.scenario.version });
    } catch (e) {
      const stale = staleVersionOf(e);
      if (stale !== null) setConflict(stale);
      else setApplyError(errorMessage(e, "Could not save the scenario."));
    } finally {
      setApplying(false);
    }
  }
  async function reload() {
    const res = await apiSend<{ scenario: Scenario }>("GET", swrKeys.scenario(scenario.id));
    setConflict(null);
    setApplied(null);
    setScenario(res.scenario);
  }

  const editorHref = `/teams/${teamId}/scenarios/${scenario.id}`;
  const result = run.state === "done" ? run.result : null;
  const obj = OBJECTIVE_LABEL[objective];
  const existing = Object.prototype.hasOwnProperty.call(scenario.settings.overrides, className) ? scenario.settings.overrides[className] : undefined;

  return (
    <div className="space-y-4">
      <header className="flex flex-wrap items-start justify-between gap-3">
        <div className="min-w-0">
          <p className="text-xs text-muted">
            <Link href={editorHref} className="text-copper-dark hover:underline">
              ← {scenario.name}
            </Link>{" "}
            · baseline {baseline.name} · version {scenario.version} {scenario.isDemo ? <Badge>Demo data</Badge> : null}
          </p>
          <h1 className="mt-1 text-xl font-semibold text-ink">Layer shaping</h1>
          <p className="max-w-prose text-sm text-muted">
            How to draw one class at this scenario&apos;s pitch: the line fraction (width over pitch) and aspect ratio (thickness over width) that minimise an
            objective for the class&apos;s net, with its driver, load and repeaters; and what its delay is made of.
          </p>
        </div>
        {readOnly ? <Badge>Read only — you are a viewer</Badge> : null}
      </header>

      <Card title="Class, objective and limits">
        <div className="grid gap-3 sm:grid-cols-2 lg:grid-cols-4 xl:grid-cols-7">
          <SelectField label="Class" name="shaping-class" value={className} onChange={(e) => setClassName(e.target.value)}>
            {classes.map((c) => (
              <option key={c.name} value={c.name}>
                {c.name}
              </option>
            ))}
          </SelectField>
          <SelectField label="Objective" name="shaping-objective" value={objective} onChange={(e) => setObjective(e.target.value as DesignObjective)}>
            {SHAPING_OBJECTIVES.map((o) => (
              <option key={o} value={o}>
                {OBJECTIVE_LABEL[o].short} ({OBJECTIVE_LABEL[o].unit})
              </option>
            ))}
          </SelectField>
          {LIMIT_FIELDS.map((f) => (
            <TextField
              key={f.key}
              label={f.label}
              name={`shaping-${f.key}`}
              inputMode="decimal"
              value={text[f.key]}
              hint={f.hint}
              errors={limitErrors[f.key] ? [limitErrors[f.key]!] : undefined}
              onChange={(e) => setText((t) => ({ ...t, [f.key]: e.target.value }))}
            />
          ))}
        </div>
        <div className="mt-3 flex flex-wrap items-center gap-3 text-sm" aria-live="polite">
          {run.state === "computing" ? (
            <>
              <span className="inline-flex items-center gap-2 text-muted" data-testid="shaping-progress">
                <span className="inline-block h-2 w-24 overflow-hidden rounded bg-rule">
                  <span className="block h-full bg-copper transition-all" style={{ width: `${Math.round(Math.max(0.05, run.fraction) * 100)}%` }} />
                </span>
                {STAGE_TEXT[run.stage]}
              </span>
              <Button variant="secondary" onClick={cancel} data-testid="shaping-cancel">
                Cancel
              </Button>
            </>
          ) : run.state === "cancelled" ? (
            <>
              <span className="text-muted" data-testid="shaping-cancelled">
                Cancelled.
              </span>
              <Button variant="secondary" onClick={compute} disabled={!limitsOk} data-testid="shaping-compute">
                Compute again
              </Button>
            </>
          ) : (
            <>
              <Button variant="secondary" onClick={compute} disabled={!limitsOk} data-testid="shaping-compute">
                Compute again
              </Button>
              {run.state === "done" && elapsed !== null ? <span className="text-xs text-muted">computed in {Math.round(elapsed)} ms</span> : null}
            </>
          )}
          {existing && (existing.lineFraction !== undefined || existing.aspectRatio !== undefined) ? (
            <span className="text-xs text-muted">
              The scenario already draws {className} with
              {existing.lineFraction !== undefined ? ` line fraction ${existing.lineFraction.toFixed(3)}` : ""}
              {existing.aspectRatio !== undefined ? ` aspect ratio ${existing.aspectRatio.toFixed(2)}` : ""}.
            </span>
          ) : null}
        </div>
        {!limitsOk ? (
          <Notice tone="bad" role="alert">
            Fix the limits to compute: {Object.values(limitErrors).join(" ")}
          </Notice>
        ) : null}
        {run.state === "error" ? (
          <div className="mt-3">
            <Notice tone="bad" role="alert">
              <span data-testid="shaping-error">{run.message}</span>
            </Notice>
          </div>
        ) : null}
      </Card>

      {result ? (
        <>
          <div className="grid gap-4 xl:grid-cols-2 [&>*]:min-w-0">
            <Card title={`${obj.short} over the drawing — ${result.className}`}>
              {result.grid ? (
                <HeatMap grid={result.grid} optimum={result.optimum} current={result.current} unit={obj.unit} unitSI={obj.unitSI} label={obj.short} />
              ) : null}
            </Card>
            <Card title="Delay against energy: the Pareto front">
              <ParetoBox result={result} />
              <p className="mt-1 text-xs text-muted">
                Drawings of the map that no other drawing beats in both delay and energy; the optimum of {obj.short.toLowerCase()} and the current drawing
                marked.
              </p>
            </Card>
          </div>
          <Card
            title="Current drawing and the optimum"
            actions={
              readOnly ? (
                <span className="text-xs text-muted" title="Viewers cannot change scenarios">
                  <Button disabled data-testid="shaping-apply">
                    Apply to scenario
                  </Button>{" "}
                  Only editors can apply it.
                </span>
              ) : (
                <Button onClick={() => apply(result)} disabled={applying || run.state !== "done"} data-testid="shaping-apply">
                  {applying ? "Applying…" : "Apply to scenario"}
                </Button>
              )
            }
          >
            {conflict !== null ? (
              <Notice tone="warn" role="alert">
                Someone saved this scenario since it was loaded here (now version {conflict}); nothing was written.{" "}
                <Button variant="secondary" onClick={reload}>
                  Reload the scenario
                </Button>
              </Notice>
            ) : null}
            {applied ? (
              <Notice tone="good" role="status">
                <span data-testid="shaping-applied">
                  Saved as version {applied.version}: {result.className} now has line fraction {result.optimum.lineFraction.toFixed(3)} and aspect ratio{" "}
                  {result.optimum.aspectRatio.toFixed(2)}.{" "}
                  <Link href={editorHref} className="font-medium text-copper-dark underline">
                    Back to the scenario
                  </Link>
                </span>
              </Notice>
            ) : null}
            {applyError ? <Notice tone="bad">{applyError}</Notice> : null}
            <Summary result={result} />
          </Card>
          <div className="grid gap-4 xl:grid-cols-2 [&>*]:min-w-0">
            <Card title={`What drives delay — ${result.className}, current drawing`}>
              <DelayPartsBar parts={result.parts} />
              <p className="mt-2 text-xs text-muted">
                Elmore split of the unrepeated net (driver → line → load) scaled to the engine&apos;s 50% delay; &quot;Repeaters&quot; is what inserting them
                changes.
              </p>
            </Card>
            <Card title={`Sensitivity: each input ±${Math.round(result.tornado.step * 100)}%`}>
              <TornadoChart nominalS={result.tornado.nominalS} step={result.tornado.step} bars={result.tornado.bars} />
            </Card>
          </div>
        </>
      ) : null}
      <Caution />
    </div>
  );
}

function ParetoBox({ result }: { result: ShapingResult }) {
  const [ref, width] = useWidth<HTMLDivElement>(320);
  return (
    <div ref={ref} className="w-full min-w-0">
      {result.grid ? <ParetoChart front={result.grid.pareto} optimum={result.optimum} current={result.current} width={width} /> : null}
    </div>
  );
}

function Flags({ flags }: { flags: ValidityFlag[] }) {
  if (flags.length === 0) return <span className="text-good">inside every model&apos;s range</span>;
  return (
    <ul className="list-disc pl-4 text-warn">
      {flags.map((f, i) => (
        <li key={i}>{f.message}</li>
      ))}
    </ul>
  );
}

/** Current vs optimum: geometry in nm, the two ratios, the objective and the net's figures, with the change in %. */
export function Summary({ result }: { result: ShapingResult }) {
  const obj = OBJECTIVE_LABEL[result.objective];
  const c = result.current;
  const o = result.optimum;
  const nm = (v: number) => Number((v * 1e9).toPrecision(4)).toString();
  const p4 = (v: number) => Number(v.toPrecision(4)).toString();
  const rows: { label: string; get: (d: ShapingDrawing) => number; show: (v: number) => string }[] = [
    { label: "Width (nm)", get: (d) => d.widthM, show: nm },
    { label: "Spacing (nm)", get: (d) => d.spacingM, show: nm },
    { label: "Thickness (nm)", get: (d) => d.thicknessM, show: nm },
    { label: "Line fraction W/pitch", get: (d) => d.lineFraction, show: (v) => v.toFixed(3) },
    { label: "Aspect ratio T/W", get: (d) => d.aspectRatio, show: (v) => v.toFixed(2) },
    { label: `${obj.short} (${obj.unit}) — objective`, get: (d) => d.objectiveValue, show: (v) => p4(v / obj.unitSI) },
    { label: "50% delay (ps)", get: (d) => d.delayS, show: (v) => p4(v * 1e12) },
    { label: "Energy per transition (fJ)", get: (d) => d.energyJ, show: (v) => p4(v * 1e15) },
    { label: "Inserted repeaters", get: (d) => d.repeaters, show: (v) => String(v) },
  ];
  return (
    <div className="overflow-x-auto">
      <table className="w-full min-w-[19rem] text-xs sm:text-sm" data-testid="shaping-summary">
        <thead>
          <tr className="border-b border-rule text-left text-xs text-muted">
            <th className="py-1 font-medium">At pitch {nm(c.pitchM)} nm</th>
            <th className="py-1 text-right font-medium">Current</th>
            <th className="py-1 text-right font-medium">Optimum</th>
            <th className="py-1 text-right font-medium">Change</th>
          </tr>
        </thead>
        <tbody>
          {rows.map((r) => {
            const a = r.get(c);
            const b = r.get(o);
            const ch = r.label === "Inserted repeaters" ? (b - a === 0 ? "0" : `${b - a > 0 ? "+" : ""}${b - a}`) : pctText(percentChange(a, b));
            return (
              <tr key={r.label} className={`border-b border-rule/60 ${r.label.includes("objective") ? "font-semibold" : ""}`}>
                <td className="py-1">{r.label}</td>
                <td className="py-1 text-right tabular-nums">{r.show(a)}</td>
                <td className="py-1 text-right tabular-nums">{r.show(b)}</td>
                <td className="py-1 text-right tabular-nums">{ch}</td>
              </tr>
            );
          })}
          <tr>
            <td className="py-1 align-top text-xs text-muted">Validity</td>
            <td className="py-1 text-right align-top text-xs">
              <Flags flags={c.flags} />
            </td>
            <td className="py-1 text-right align-top text-xs" colSpan={2}>
              <Flags flags={o.flags} />
            </td>
          </tr>
        </tbody>
      </table>
    </div>
  );
}

function pctText(v: number): string {
  if (!Number.isFinite(v)) return "—";
  const r = Number(v.toPrecision(3));
  return `${r > 0 ? "+" : r < 0 ? "−" : ""}${Math.abs(r)}%`;
}

"use client";
import dynamic from "next/dynamic";
import { useRouter } from "next/navigation";
import { useEffect, useMemo, useRef, useState } from "react";
import useSWR from "swr";
import type { Roadmap, RoadmapRevision } from "@/db/queries/roadmaps";
import type { Scenario } from "@/db/queries/scenarios";
import type { Role } from "@/lib/access";
import { MAX_ROADMAP_STEPS, type ModelLevel, type RoadmapStep, type Technology, type WireClass } from "@/lib/scaling/client";
import { ApiRequestError, apiSend, errorMessage, fetchJson, staleVersionOf } from "@/lib/api-client";
import { swrKeys } from "@/lib/swr-keys";
import type { RoadmapResults } from "@/lib/workspace/roadmap-evaluate";
import {
  CHART_LEVELS,
  PLATEAU_SHARE,
  ROADMAP_METRIC,
  ROADMAP_METRICS,
  classResults,
  metricSeries,
  readingOf,
  signedPercent,
  type RoadmapMetric,
} from "@/lib/workspace/roadmap-view";
import { CHART, LEVEL_STYLE } from "@/components/charts/palette";
import type { RoadmapSeries } from "@/components/charts/roadmap-chart";
import { Caution } from "@/components/caution";
import { Button } from "@/components/ui/button";
import { Badge, Card, Notice } from "@/components/ui/card";
import { inputClass } from "@/components/ui/field";
import { ConfirmDelete } from "@/components/ui/confirm-delete";
import type { RevisionHistory as HistoryList } from "./revision-history";
import { EngineWorker, Superseded } from "./engine-client";
import { RoadmapStepFields } from "./roadmap-step-fields";
import { LEVEL_LABEL } from "./settings-panel";
import { useWidth } from "./use-width";
import { ItemTrail } from "./item-trail";

const RevisionHistory = dynamic(() => import("./revision-history").then((m) => m.RevisionHistory), {
  ssr: false,
  loading: () => <p className="text-xs text-muted">Loading history…</p>,
}) as unknown as typeof HistoryList; // dynamic drops the type parameter

const RoadmapChart = dynamic(() => import("@/components/charts/roadmap-chart").then((m) => m.RoadmapChart), {
  ssr: false,
  loading: () => <div style={{ height: 240 }} className="animate-pulse rounded-lg border border-rule bg-panel" aria-label="Loading the chart" />,
});

/** Another roadmap on the same baseline, drawn beside this one. */
export interface BranchChoice {
  id: string;
  name: string;
  steps: RoadmapStep[];
}

type Draft = { name: string; steps: RoadmapStep[] };
const MAIN = "main";
const BRANCH_STYLE = [
  { color: CHART.slate, dash: "5 3", marker: "square" as const },
  { color: CHART.moss, dash: "2 2", marker: "diamond" as const },
];
const n3 = (v: number) => String(Number(v.toPrecision(3)));
const nm = (m: number) => `${Number((m * 1e9).toPrecision(3))}`;

/** Every chain's evaluation at every level, in the engine worker; a newer edit supersedes a queued one. */
function useRoadmapResults(classes: WireClass[], technology: Technology, chains: { key: string; steps: RoadmapStep[] }[], initial: RoadmapResults) {
  const key = JSON.stringify(chains);
  // `initial` is the server's answer for the chains of the first render
  const [state, setState] = useState<{ results: RoadmapResults; key: string }>(() => ({ results: initial, key }));
  const worker = useRef<EngineWorker | null>(null);
  const first = useRef<string | null>(key);
  const sent = useRef(0);
  useEffect(() => () => worker.current?.terminate(), []);
  useEffect(() => {
    if (first.current === key) {
      first.current = null;
      return;
    }
    first.current = null;
    worker.current ??= new EngineWorker();
    const seq = ++sent.current;
    worker.current.roadmap({ classes, technology, chains: JSON.parse(key) as typeof chains, levels: [...CHART_LEVELS] }).then(
      (results) => {
        if (seq === sent.current) setState({ results, key });
      },
      (e: unknown) => {
        if (!(e instanceof Superseded) && seq === sent.current)
          setState({ results: [{ key: MAIN, byLevel: {}, error: e instanceof Error ? e.message : String(e) }], key });
      },
    );
  }, [classes, technology, key]);
  return { results: state.results, fresh: state.key === key };
}

export function RoadmapEditor(props: {
  teamId: string;
  userId: string;
  role: Role;
  initialRoadmap: Roadmap;
  baseline: { id: string; name: string; isDemo: boolean; technology: Technology };
  classes: WireClass[];
  scenarios: { id: string; name: string }[];
  branches: BranchChoice[];
  initialResults: RoadmapResults;
}) {
  const { teamId, role, classes, baseline } = props;
  const router = useRouter();
  const readOnly = role === "viewer";
  const url = swrKeys.roadmap(props.initialRoadmap.id);
  const { data, mutate } = useSWR<{ roadmap: Roadmap }>(url, fetchJson, { fallbackData: { roadmap: props.initialRoadmap }, revalidateOnFocus: false });
  const roadmap = data!.roadmap;
  const [draft, setDraft] = useState<Draft>({ name: roadmap.name, steps: roadmap.steps });
  const [baseVersion, setBaseVersion] = useState(roadmap.version);
  const dirty = JSON.stringify(draft) !== JSON.stringify({ name: roadmap.name, steps: roadmap.steps }) || baseVersion !== roadmap.version;
  const [open, setOpen] = useState(0);
  const [busy, setBusy] = useState(false);
  const [message, setMessage] = useState<{ tone: "good" | "bad" | "warn"; text: string } | null>(null);
  const [fieldErrors, setFieldErrors] = useState<Record<string, string[]>>({});
  const [conflict, setConflict] = useState<number | null>(null);
  const [metric, setMetric] = useState<RoadmapMetric>("delay");
  const [level, setLevel] = useState<ModelLevel>("full");
  const [relative, setRelative] = useState(true);
  const [picked, setPicked] = useState<string[]>([]);
  const [fromScenario, setFromScenario] = useState("");

  const branches = props.branches.filter((b) => picked.includes(b.id));
  const chains = useMemo(() => [{ key: MAIN, steps: draft.steps }, ...branches.map((b) => ({ key: b.id, steps: b.steps }))], [draft.steps, branches]);
  const { results, fresh } = useRoadmapResults(classes, baseline.technology, chains, props.initialResults);
  const main = results.find((r) => r.key === MAIN);
  const mainAt = main?.byLevel[level];
  const stepNames = ["N0", ...draft.steps.map((s) => s.name)];

  const setStep = (i: number, patch: Partial<RoadmapStep>) => setDraft((d) => ({ ...d, steps: d.steps.map((s, j) => (j === i ? { ...s, ...patch } : s)) }));
  const freeStepName = (steps: RoadmapStep[]) => {
    const names = new Set(steps.map((s) => s.name.toLowerCase()));
    let n = steps.length + 1;
    while (names.has(`n${n}`)) n++;
    return `N${n}`;
  };
  const addStep = (step?: Partial<RoadmapStep>) =>
    setDraft((d) => {
      if (d.steps.length >= MAX_ROADMAP_STEPS) return d;
      setOpen(d.steps.length);
      return { ...d, steps: [...d.steps, { name: freeStepName(d.steps), settings: {}, ...step }] };
    });
  const removeStep = (i: number) => {
    setDraft((d) => ({ ...d, steps: d.steps.filter((_, j) => j !== i) }));
    setOpen((o) => Math.max(0, o >= i ? o - 1 : o));
  };
  const moveStep = (i: number, d: -1 | 1) => {
    const j = i + d;
    if (j < 0 || j >= draft.steps.length) return;
    setDraft((dr) => {
      const steps = [...dr.steps];
      [steps[i], steps[j]] = [steps[j]!, steps[i]!];
      return { ...dr, steps };
    });
    setOpen(j);
  };

  async function stepFromScenario(id: string) {
    try {
      const r = await apiSend<{ scenario: Scenario }>("GET", swrKeys.scenario(id));
      const before = draft.steps.at(-1);
      addStep({ name: freeStepName(draft.steps), settings: r.scenario.settings, fromScenarioId: id });
      setMessage(
        before
          ? {
              tone: "warn",
              text: `Added a step with the settings of "${r.scenario.name}". A scenario's settings are relative to the baseline; a roadmap step's are relative to the step before it (${before.name}), so its S, S_L and factors now multiply ${before.name}'s. Check the step's settings.`,
            }
          : { tone: "good", text: `Added a step with the settings of "${r.scenario.name}" (relative to the baseline, as in the scenario).` },
      );
    } catch (e) {
      setMessage({ tone: "bad", text: errorMessage(e, "Could not read the scenario.") });
    }
  }

  async function save() {
    setBusy(true);
    setMessage(null);
    setFieldErrors({});
    try {
      const r = await apiSend<{ roadmap: Roadmap }>("PATCH", url, { version: baseVersion, name: draft.name, steps: draft.steps });
      setBaseVersion(r.roadmap.version);
      await mutate({ roadmap: r.roadmap }, { revalidate: false });
      setDraft({ name: r.roadmap.name, steps: r.roadmap.steps });
      setMessage({ tone: "good", text: `Saved as version ${r.roadmap.version}.` });
    } catch (e) {
      const stale = staleVersionOf(e);
      if (stale !== null) setConflict(stale);
      else if (e instanceof ApiRequestError && e.isNetworkError) setMessage({ tone: "bad", text: "Could not reach the server; your changes are still here." });
      else if (e instanceof ApiRequestError) {
        setFieldErrors(e.fields);
        setMessage({ tone: "bad", text: e.message + (e.hasFields ? " " + Object.values(e.fields).flat().join(" ") : "") });
      } else setMessage({ tone: "bad", text: errorMessage(e) });
    } finally {
      setBusy(false);
    }
  }

  async function reloadTheirs() {
    const fresh = await mutate();
    if (fresh) {
      setDraft({ name: fresh.roadmap.name, steps: fresh.roadmap.steps });
      setBaseVersion(fresh.roadmap.version);
      setOpen(0);
    }
    setConflict(null);
    setMessage({ tone: "warn", text: "Loaded the newer version; your unsaved changes were discarded." });
  }

  async function remove() {
    setBusy(true);
    try {
      await apiSend("DELETE", url);
      router.push(`/teams/${teamId}/roadmaps`);
    } catch (e) {
      setMessage({ tone: "bad", text: errorMessage(e, "Delete failed.") });
      setBusy(false);
    }
  }

  // Each class's pitch at the step before the open one (N0: the baseline's), for the target-pitch column.
  const previousPitchM: Record<string, number | undefined> = {};
  const fullChain = main?.byLevel.full;
  for (const c of classes)
    previousPitchM[c.name] =
      open === 0 ? c.widthM + c.spacingM : fullChain?.steps[open - 1]?.evaluation.classes.find((x) => x.name === c.name)?.scenario.pitchM;

  const canDelete = role === "owner" || (role === "editor" && roadmap.createdBy === props.userId);
  const step = draft.steps[open];
  // validity flags per step (at the table's level), over all classes
  const flagsPerStep = mainAt ? mainAt.steps.map((s) => s.evaluation.classes.reduce((n, c) => n + c.scenario.validity.length, 0)) : [];

  return (
    <div className="space-y-4">
      <header className="flex flex-wrap items-start justify-between gap-3">
        <div className="w-full min-w-0 sm:w-auto sm:flex-1">
          <ItemTrail
            teamId={teamId}
            list={{ segment: "roadmaps", label: "Roadmaps" }}
            baseline={baseline}
            classCount={classes.length}
            version={roadmap.version}
            isDemo={roadmap.isDemo}
          />
          {readOnly ? (
            <h1 className="mt-1 text-xl font-semibold text-ink">{roadmap.name}</h1>
          ) : (
            <label className="mt-1 block">
              <span className="sr-only">Roadmap name</span>
              <input
                className="block w-full min-w-0 rounded border border-transparent bg-transparent px-1 text-xl font-semibold text-ink hover:border-rule focus:border-copper focus:outline-none"
                value={draft.name}
                name="roadmap-name"
                onChange={(e) => setDraft((d) => ({ ...d, name: e.target.value }))}
                aria-invalid={fieldErrors.name ? true : undefined}
              />
              {fieldErrors.name ? <span className="text-xs text-bad">{fieldErrors.name.join(" ")}</span> : null}
            </label>
          )}
        </div>
        <div className="no-print flex items-center gap-2">
          {readOnly ? (
            <Badge>Read only — you are a viewer</Badge>
          ) : (
            <>
              <span className="text-xs text-muted" aria-live="polite" data-testid="save-state">
                {dirty ? "Unsaved changes" : "All changes saved"}
              </span>
              {dirty ? (
                <Button variant="ghost" onClick={() => setDraft({ name: roadmap.name, steps: roadmap.steps })} disabled={busy}>
                  Discard
                </Button>
              ) : null}
              <Button onClick={save} disabled={busy || !dirty} data-testid="save-roadmap">
                {busy ? "Saving…" : "Save"}
              </Button>
              {canDelete ? <ConfirmDelete question="Delete this roadmap and its history?" onDelete={remove} busy={busy} /> : null}
            </>
          )}
        </div>
      </header>

      {conflict !== null ? (
        <Notice tone="warn" role="alert">
          <p className="font-medium">Someone saved this roadmap while you were editing (now version {conflict}). Nothing was overwritten.</p>
          <div className="mt-2 flex gap-2">
            <Button variant="secondary" onClick={reloadTheirs} disabled={busy}>
              Reload theirs
            </Button>
            <Button variant="ghost" onClick={() => setConflict(null)} disabled={busy}>
              Keep editing mine
            </Button>
          </div>
        </Notice>
      ) : null}
      {message ? <Notice tone={message.tone}>{message.text}</Notice> : null}

      <Card title="Steps — each relative to the one before">
        <ol className="mb-3 flex flex-wrap items-center gap-1 text-sm" aria-label="Node steps" data-testid="roadmap-steps">
          <li className="rounded border border-rule bg-ground px-2 py-1 text-xs text-muted" title="The baseline: N0">
            N0 · baseline
          </li>
          {draft.steps.map((s, i) => (
            <li key={i} className="flex items-center gap-1">
              <span aria-hidden="true" className="text-faint">
                →
              </span>
              <button
                type="button"
                onClick={() => setOpen(i)}
                aria-pressed={open === i}
                className={`rounded border px-2 py-1 text-xs ${open === i ? "border-copper bg-copper-soft text-copper-dark" : "border-rule bg-panel text-ink hover:bg-ground"}`}
              >
                {s.name || `step ${i + 1}`}
                {flagsPerStep[i] ? (
                  <span className="ml-1 text-warn" title={`${flagsPerStep[i]} validity flag(s) at this step`}>
                    ⚑{flagsPerStep[i]}
                  </span>
                ) : null}
              </button>
            </li>
          ))}
        </ol>
        {!readOnly ? (
          <div className="no-print mb-3 flex flex-wrap items-center gap-2">
            <Button variant="secondary" onClick={() => addStep()} disabled={draft.steps.length >= MAX_ROADMAP_STEPS} data-testid="add-step">
              Add a step
            </Button>
            <label className="flex min-w-0 max-w-full flex-wrap items-center gap-1 text-xs">
              <span className="text-muted">New step from a scenario:</span>
              <select
                aria-label="New step from a scenario"
                className={`${inputClass} w-auto min-w-0 max-w-full py-1 text-xs`}
                value={fromScenario}
                onChange={(e) => setFromScenario(e.target.value)}
              >
                <option value="">choose…</option>
                {props.scenarios.map((s) => (
                  <option key={s.id} value={s.id}>
                    {s.name}
                  </option>
                ))}
              </select>
            </label>
            <Button
              variant="ghost"
              disabled={!fromScenario || draft.steps.length >= MAX_ROADMAP_STEPS}
              onClick={() => {
                void stepFromScenario(fromScenario);
                setFromScenario("");
              }}
            >
              Add
            </Button>
            <span className="text-xs text-muted">
              {draft.steps.length} of {MAX_ROADMAP_STEPS} steps
            </span>
          </div>
        ) : null}
        {step ? (
          <div className="rounded-md border border-rule p-3" data-testid="step-editor">
            <div className="mb-3 flex flex-wrap items-end gap-2">
              <label className="text-xs">
                <span className="mb-1 block font-medium text-ink">Step name</span>
                <input
                  className={`${inputClass} w-40`}
                  value={step.name}
                  onChange={(e) => setStep(open, { name: e.target.value })}
                  disabled={readOnly}
                  aria-label={`Name of step ${open + 1}`}
                />
              </label>
              {!readOnly ? (
                <>
                  <Button variant="ghost" onClick={() => moveStep(open, -1)} disabled={open === 0} aria-label={`Move ${step.name} earlier`}>
                    ← Earlier
                  </Button>
                  <Button variant="ghost" onClick={() => moveStep(open, 1)} disabled={open === draft.steps.length - 1} aria-label={`Move ${step.name} later`}>
                    Later →
                  </Button>
                  <Button variant="danger" onClick={() => removeStep(open)} disabled={draft.steps.length <= 1} aria-label={`Remove ${step.name}`}>
                    Remove step
                  </Button>
                </>
              ) : null}
              {step.fromScenarioId ? (
                <span className="text-xs text-muted" data-testid="from-scenario-note">
                  {open === 0
                    ? "started from a scenario"
                    : `started from a scenario: its settings apply relative to ${draft.steps[open - 1]!.name}, not to the baseline`}
                </span>
              ) : null}
            </div>
            <RoadmapStepFields
              key={open}
              index={open}
              settings={step.settings}
              onChange={(settings) => setStep(open, { settings })}
              classes={classes}
              previousPitchM={previousPitchM}
              errors={fieldErrors}
              readOnly={readOnly}
            />
          </div>
        ) : null}
      </Card>

      <Card title="Across the steps">
        <div className="mb-3 flex flex-wrap items-end gap-3">
          <label className="text-xs">
            <span className="mb-1 block font-medium text-ink">Metric</span>
            <select className={`${inputClass} w-auto`} value={metric} onChange={(e) => setMetric(e.target.value as RoadmapMetric)} data-testid="roadmap-metric">
              {ROADMAP_METRICS.map((k) => (
                <option key={k} value={k}>
                  {ROADMAP_METRIC[k].label}
                </option>
              ))}
            </select>
          </label>
          <label className="text-xs">
            <span className="mb-1 block font-medium text-ink">Table, reading and branches at</span>
            <select className={`${inputClass} w-auto`} value={level} onChange={(e) => setLevel(e.target.value as ModelLevel)}>
              {CHART_LEVELS.map((l) => (
                <option key={l} value={l}>
                  {LEVEL_LABEL[l]}
                </option>
              ))}
            </select>
          </label>
          <label className="inline-flex items-center gap-1 self-center text-xs text-ink">
            <input type="checkbox" checked={relative} onChange={(e) => setRelative(e.target.checked)} data-testid="roadmap-relative" />
            Chart relative to N0
          </label>
          <fieldset className="text-xs">
            <legend className="mb-1 font-medium text-ink">Compare with (same baseline, up to two)</legend>
            {props.branches.length === 0 ? (
              <span className="text-muted">No other roadmap on this baseline yet.</span>
            ) : (
              <div className="flex flex-wrap gap-x-3">
                {props.branches.map((b) => (
                  <label key={b.id} className="inline-flex items-center gap-1">
                    <input
                      type="checkbox"
                      checked={picked.includes(b.id)}
                      disabled={!picked.includes(b.id) && picked.length >= 2}
                      onChange={(e) => setPicked((p) => (e.target.checked ? [...p, b.id] : p.filter((x) => x !== b.id)))}
                    />
                    {b.name}
                  </label>
                ))}
              </div>
            )}
          </fieldset>
          <span className="text-xs text-muted" aria-live="polite" data-testid="roadmap-fresh" data-fresh={fresh ? "1" : "0"}>
            {fresh ? "" : "Computing…"}
          </span>
        </div>
        {main?.error ? (
          <Notice tone="bad" role="alert">
            This chain does not compose: {main.error}
          </Notice>
        ) : null}
        {results
          .filter((r) => r.key !== MAIN && r.error)
          .map((r) => (
            <Notice key={r.key} tone="warn">
              {props.branches.find((b) => b.id === r.key)?.name}: {r.error}
            </Notice>
          ))}
        <p className="mb-3 text-xs text-muted">
          One chart per class: a line per model level of this roadmap (N0 = the baseline, each step evaluated against it); compared roadmaps dashed with their
          own marker, at the level chosen above. A step that changes the metric by less than {Math.round(PLATEAU_SHARE * 100)}% counts as no longer improving.
        </p>
        <div className="grid gap-4 xl:grid-cols-2">
          {main && !main.error
            ? classes.map((c) => (
                <ClassResultsPanel
                  key={c.name}
                  className={c.name}
                  results={results}
                  branches={branches}
                  stepNames={stepNames}
                  metric={metric}
                  level={level}
                  relative={relative}
                />
              ))
            : null}
        </div>
      </Card>
      <Card title="History">
        <RevisionHistory<RoadmapRevision>
          url={swrKeys.roadmapRevisions(roadmap.id, roadmap.version)}
          currentVersion={roadmap.version}
          canRestore={!readOnly}
          busy={busy}
          restoreLabel="Load into editor"
          onRestore={(r) => {
            if (dirty && !window.confirm("Discard your unsaved changes and load this version into the editor?")) return;
            setDraft({ name: r.name, steps: r.steps });
            setOpen(0);
            setMessage({ tone: "warn", text: `Loaded version ${r.version} into the editor. Save to make it the current version (${roadmap.version + 1}).` });
          }}
        />
      </Card>
      <Caution />
    </div>
  );
}

/** One class: the chart across the steps, the plain-words reading and the table with ratios to N0 and flags. */
function ClassResultsPanel({
  className,
  results,
  branches,
  stepNames,
  metric,
  level,
  relative,
}: {
  className: string;
  results: RoadmapResults;
  branches: BranchChoice[];
  stepNames: string[];
  metric: RoadmapMetric;
  level: ModelLevel;
  /** Each line divided by its own N0 value: the levels on one scale, a plateau as a flat stretch. */
  relative: boolean;
}) {
  const [ref, width] = useWidth<HTMLDivElement>(560);
  const m = ROADMAP_METRIC[metric];
  const main = results.find((r) => r.key === MAIN)!;
  const series: RoadmapSeries[] = [];
  const shown = (vs: number[] | null) => (vs && relative ? vs.map((v) => (vs[0]! > 0 ? v / vs[0]! : Number.NaN)) : vs);
  for (const l of CHART_LEVELS) {
    const ev = main.byLevel[l];
    const values = ev ? shown(metricSeries(ev.steps, className, metric)) : null;
    if (values)
      series.push({
        key: `main:${l}`,
        label: LEVEL_STYLE[l].label,
        color: LEVEL_STYLE[l].color,
        dash: LEVEL_STYLE[l].dash,
        width: LEVEL_STYLE[l].width,
        marker: "circle",
        values,
      });
  }
  branches.forEach((b, i) => {
    const ev = results.find((r) => r.key === b.id)?.byLevel[level];
    const values = ev ? shown(metricSeries(ev.steps, className, metric)) : null;
    const st = BRANCH_STYLE[i % BRANCH_STYLE.length]!;
    if (values)
      series.push({
        key: `branch:${b.id}`,
        label: `${b.name} (${LEVEL_STYLE[level].label.replace(/^\+ /, "")})`,
        color: st.color,
        dash: st.dash,
        width: 1.75,
        marker: st.marker,
        values,
      });
  });
  const ev = main.byLevel[level];
  const rs = ev ? classResults(ev.steps, className) : null;
  const values = ev ? metricSeries(ev.steps, className, metric) : null;
  const unit = m.unit;
  return (
    <section className="min-w-0 rounded-md border border-rule p-3" data-testid="roadmap-class" data-class={className}>
      <h3 className="text-sm font-semibold text-ink">
        {className} <span className="font-normal text-muted">· {m.label}</span>
      </h3>
      {values ? (
        <p className="mb-1 text-xs text-ink" data-testid="roadmap-reading">
          {readingOf(className, metric, stepNames, values)}
        </p>
      ) : null}
      <div ref={ref}>
        <RoadmapChart
          title={`${m.label} of ${className} across the steps${relative ? ", relative to N0" : ""}`}
          stepNames={stepNames}
          series={series}
          unit={relative ? "×" : unit}
          metricLabel={relative ? `${m.label} ÷ N0` : m.label}
          width={width}
          height={220}
        />
      </div>
      {rs && values && ev ? (
        <div className="relative mt-2 overflow-x-auto">
          <table className="num w-full text-xs" data-testid="roadmap-table">
            <caption className="sr-only">
              {className}: {m.label} at level {LEVEL_LABEL[level]} across the steps
            </caption>
            <thead className="text-left text-muted">
              <tr className="border-b border-rule">
                <th scope="col" className="py-1 pr-2 font-medium">
                  Step
                </th>
                <th scope="col" className="px-1 text-right font-medium" title="Cross-section factor against N0 (product over the steps)">
                  S
                </th>
                <th scope="col" className="px-1 text-right font-medium" title="Length factor against N0">
                  S_L
                </th>
                <th scope="col" className="px-1 text-right font-medium">
                  Pitch nm
                </th>
                <th scope="col" className="px-1 text-right font-medium">
                  {m.label}
                  {unit ? ` ${unit}` : ""}
                </th>
                <th scope="col" className="px-1 text-right font-medium">
                  ÷ N0
                </th>
                <th scope="col" className="px-1 text-right font-medium">
                  vs step before
                </th>
                {branches.map((b) => (
                  <th key={b.id} scope="col" className="px-1 text-right font-medium">
                    {b.name}
                  </th>
                ))}
                <th scope="col" className="px-1 font-medium">
                  Flags
                </th>
              </tr>
            </thead>
            <tbody>
              {rs.map((r, i) => {
                const settings = i === 0 ? null : ev.steps[i - 1]!.settings;
                const o = settings?.overrides[className];
                const s = settings ? (o?.s ?? settings.s) : 1;
                const sL = settings ? (o?.sL ?? settings.sL) : 1;
                const v = values[i]!;
                const branchVals = branches.map((b) => {
                  const be = results.find((x) => x.key === b.id)?.byLevel[level];
                  return be ? metricSeries(be.steps, className, metric)?.[i] : undefined;
                });
                return (
                  <tr key={i} className="border-b border-rule/60" data-step={stepNames[i]}>
                    <th scope="row" className="py-1 pr-2 text-left font-medium">
                      {stepNames[i]}
                    </th>
                    <td className="tabular px-1 text-right">{n3(s)}</td>
                    <td className="tabular px-1 text-right">{n3(sL)}</td>
                    <td className="tabular px-1 text-right">{nm(r.pitchM)}</td>
                    <td className="tabular px-1 text-right font-medium" data-testid="roadmap-value" data-value={v}>
                      {n3(v)}
                    </td>
                    <td className="tabular px-1 text-right">{values[0]! > 0 ? `${n3(v / values[0]!)}×` : "—"}</td>
                    <td className="tabular px-1 text-right">{i === 0 ? "—" : values[i - 1]! > 0 ? signedPercent(v / values[i - 1]!) : "—"}</td>
                    {branchVals.map((bv, j) => (
                      <td key={j} className="tabular px-1 text-right">
                        {bv === undefined || !Number.isFinite(bv) ? "—" : n3(bv)}
                      </td>
                    ))}
                    <td className="px-1">
                      {r.validity.length ? (
                        <span className="whitespace-nowrap text-warn" title={r.validity.map((f) => f.message).join("\n")}>
                          ⚑ {[...new Set(r.validity.map((f) => f.quantity))].join(", ")}
                        </span>
                      ) : (
                        <span className="text-faint">—</span>
                      )}
                    </td>
                  </tr>
                );
              })}
            </tbody>
          </table>
          {rs.some((r) => r.validity.length) ? (
            <details className="mt-1 text-[11px] text-muted" data-testid="roadmap-flags">
              <summary className="cursor-pointer text-warn">Validity flags: {rs.reduce((n, r) => n + r.validity.length, 0)} (⚑ in the table)</summary>
              <ul className="mt-1 list-disc space-y-0.5 pl-4">
                {rs.flatMap((r, i) =>
                  r.validity.map((f, j) => (
                    <li key={`${i}:${j}`}>
                      <span className="font-medium text-ink">{stepNames[i]}</span>: {f.message}
                    </li>
                  )),
                )}
              </ul>
            </details>
          ) : null}
        </div>
      ) : null}
    </section>
  );
}

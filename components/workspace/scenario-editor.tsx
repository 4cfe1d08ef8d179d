"use client";
import { useRouter } from "next/navigation";
import dynamic from "next/dynamic";
import { memo, useCallback, useDeferredValue, useEffect, useLayoutEffect, useMemo, useRef, useState } from "react";
import useSWR from "swr";
import type { BaselineWithClasses } from "@/db/queries/baselines";
import type { Role } from "@/lib/access";
import type { Scenario, ScenarioRevision, ScenarioSummary } from "@/db/queries/scenarios";
import { DEFAULT_TEMPERATURE_C, type Evaluation, type ScenarioSettings, type WireClass } from "@/lib/scaling/client";
import { apiSend, errorMessage, fetchJson, staleVersionOf, ApiRequestError } from "@/lib/api-client";
import { swrKeys } from "@/lib/swr-keys";
import type { RevisionHistory as HistoryList } from "./revision-history";
import { Caution } from "@/components/caution";
import { Button } from "@/components/ui/button";
import { Badge, Card, Notice } from "@/components/ui/card";
import { inputClass } from "@/components/ui/field";
import { ResultsTable } from "./results-table";
import { LEVEL_LABEL, SettingsPanel } from "./settings-panel";
import type { SweepView } from "./sweep-panel";
import { fmt, U } from "./units";
import { keyOf } from "./settings-key";
import { useEvaluation, type EvaluationState } from "./use-evaluation";
import { explainEngineError } from "@/lib/workspace/engine-errors";
import { countChange, FIGURE_DEFINITION, FIGURE_LABEL, worstClassDelay } from "@/lib/figures";
import { ConfirmDelete } from "@/components/ui/confirm-delete";
import { DuplicateScenario } from "./duplicate-scenario";
import { ItemTrail } from "./item-trail";
import { describeLengthRule } from "@/lib/workspace/roadmap-view";

// Charts (visx) and the field check load in the browser after the first paint: the settings and the results
// table do not wait for them (first-load JS without visx).
const chartSlot = (h: number) =>
  function ChartSlot() {
    return <div style={{ height: h }} className="animate-pulse rounded-lg border border-rule bg-panel" aria-label="Loading charts" />;
  };
const RatioCharts = dynamic(() => import("./result-charts").then((m) => m.RatioCharts), { ssr: false, loading: chartSlot(260) });
const Distributions = dynamic(() => import("./result-charts").then((m) => m.Distributions), { ssr: false, loading: chartSlot(300) });
// memo: while S is dragged the editor renders on every step; these keep their props and are skipped
const FieldCheck = memo(
  dynamic(() => import("./field-check").then((m) => m.FieldCheck), {
    ssr: false,
    loading: () => <p className="text-sm text-muted">Loading the field check…</p>,
  }),
);
// Also after the first paint (first-load JS, issue 13 item 14): the sweep (its curves come from the worker anyway),
// the per-class overrides (collapsed unless a class has one) and the history (fetched by the browser).
const SweepPanel = dynamic(() => import("./sweep-panel").then((m) => m.SweepPanel), { ssr: false, loading: chartSlot(330) });
const ClassOverrides = dynamic(() => import("./class-overrides").then((m) => m.ClassOverrides), {
  ssr: false,
  loading: () => <p className="text-xs text-muted">Loading the overrides…</p>,
});
// memo and dynamic drop the component's type parameter: restored here
const RevisionHistory = memo(
  dynamic(() => import("./revision-history").then((m) => m.RevisionHistory), {
    ssr: false,
    loading: () => <p className="text-xs text-muted">Loading history…</p>,
  }),
) as unknown as typeof HistoryList;

type Draft = { name: string; notes: string; settings: ScenarioSettings };

/** How long an evaluation must stay the newest before the secondary charts show it (a drag's steps come faster). */
const SETTLE_MS = 200;

/** `value` once it has been the newest for `ms` (the first value at once). */
function useSettled<T>(value: T, ms: number): T {
  const [settled, setSettled] = useState(value);
  useEffect(() => {
    if (Object.is(value, settled)) return;
    const t = setTimeout(() => setSettled(value), ms);
    return () => clearTimeout(t);
  }, [value, settled, ms]);
  return settled;
}

export function ScenarioEditor(props: {
  teamId: string;
  userId: string;
  role: Role;
  initialScenario: Scenario;
  initialBaseline: BaselineWithClasses;
  initialView: SweepView;
  /** The server's evaluation of the saved settings (the worker evaluates every later change). */
  initialEvaluation: EvaluationState;
}) {
  const { teamId, role } = props;
  const router = useRouter();
  const readOnly = role === "viewer";
  const sUrl = swrKeys.scenario(props.initialScenario.id);
  const { data: sData, mutate: mutateScenario } = useSWR<{ scenario: Scenario }>(sUrl, fetchJson, {
    fallbackData: { scenario: props.initialScenario },
    revalidateOnFocus: false,
  });
  const scenario = sData!.scenario;
  const { data: bData } = useSWR<{ baseline: BaselineWithClasses }>(swrKeys.baselineWithHistograms(scenario.baselineId), fetchJson, {
    fallbackData: { baseline: props.initialBaseline },
    revalidateOnFocus: false,
  });
  const baseline = bData!.baseline;
  const classes: WireClass[] = useMemo(() => baseline.classes.map(({ id: _i, position: _p, histogramBins: _h, ...c }): WireClass => c), [baseline]);

  const [draft, setDraft] = useState<Draft>({ name: scenario.name, notes: scenario.notes, settings: scenario.settings });
  const [baseVersion, setBaseVersion] = useState(scenario.version);
  const saved: Draft = { name: scenario.name, notes: scenario.notes, settings: scenario.settings };
  const dirty = JSON.stringify(draft) !== JSON.stringify(saved) || baseVersion !== scenario.version;
  // Follow the server when nothing is edited locally (e.g. after a restore or a reload); adjusted while rendering.
  const [seenVersion, setSeenVersion] = useState(scenario.version);
  if (seenVersion !== scenario.version) {
    setSeenVersion(scenario.version);
    setDraft((d) =>
      baseVersion === scenario.version && JSON.stringify(d) !== JSON.stringify(saved)
        ? d
        : { name: scenario.name, notes: scenario.notes, settings: scenario.settings },
    );
    setBaseVersion(scenario.version);
  }

  const [view, setViewState] = useState<SweepView>(props.initialView);
  const setView = useCallback((v: SweepView) => {
    setViewState(v);
    const q = new URLSearchParams(window.location.search);
    q.set("metric", v.metric);
    q.set("from", String(v.from));
    q.set("to", String(v.to));
    q.set("scale", v.scale);
    q.set("length", v.length);
    if (v.classes.length) q.set("classes", v.classes.join(","));
    else q.delete("classes");
    window.history.replaceState(null, "", `${window.location.pathname}?${q.toString()}`);
  }, []);

  const settingsKey = keyOf(draft.settings);
  const evalResult = useEvaluation(classes, baseline.technology, draft.settings, settingsKey, props.initialEvaluation);

  const [busy, setBusy] = useState(false);
  const [fieldErrors, setFieldErrors] = useState<Record<string, string[]>>({});
  const [message, setMessage] = useState<{ tone: "good" | "bad" | "warn"; text: string } | null>(null);
  const [conflict, setConflict] = useState<{ currentVersion: number } | null>(null);

  async function save() {
    setBusy(true);
    setMessage(null);
    setFieldErrors({});
    try {
      const r = await apiSend<{ scenario: Scenario }>("PATCH", sUrl, {
        version: baseVersion,
        name: draft.name,
        notes: draft.notes,
        settings: draft.settings,
      });
      setBaseVersion(r.scenario.version);
      await mutateScenario({ scenario: r.scenario }, { revalidate: false });
      setDraft({ name: r.scenario.name, notes: r.scenario.notes, settings: r.scenario.settings });
      setMessage({ tone: "good", text: `Saved as version ${r.scenario.version}.` });
    } catch (e) {
      const stale = staleVersionOf(e);
      if (stale !== null) setConflict({ currentVersion: stale });
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
    setConflict(null);
    const fresh = await mutateScenario();
    if (fresh) {
      setDraft({ name: fresh.scenario.name, notes: fresh.scenario.notes, settings: fresh.scenario.settings });
      setBaseVersion(fresh.scenario.version);
    }
    setMessage({ tone: "warn", text: "Loaded the newer version; your unsaved changes were discarded." });
  }

  async function saveAsCopy() {
    setBusy(true);
    try {
      const list = await apiSend<{ scenarios: ScenarioSummary[] }>("GET", `/api/teams/${teamId}/scenarios?baselineId=${scenario.baselineId}`);
      const names = new Set(list.scenarios.map((s) => s.name.toLowerCase()));
      let name = `${draft.name} (my copy)`;
      for (let i = 2; names.has(name.toLowerCase()); i++) name = `${draft.name} (my copy ${i})`;
      const r = await apiSend<{ scenario: Scenario }>("POST", `/api/teams/${teamId}/scenarios`, {
        baselineId: scenario.baselineId,
        name,
        notes: draft.notes,
        settings: draft.settings,
      });
      setConflict(null);
      router.push(`/teams/${teamId}/scenarios/${r.scenario.id}`);
    } catch (e) {
      setMessage({ tone: "bad", text: errorMessage(e, "Could not save a copy.") });
    } finally {
      setBusy(false);
    }
  }

  async function restoreNow(r: ScenarioRevision) {
    if (dirty && !window.confirm("Discard your unsaved changes and restore this revision?")) return;
    setBusy(true);
    try {
      const res = await apiSend<{ scenario: Scenario }>("POST", `${sUrl}/restore`, { revisionId: r.id, version: scenario.version });
      await mutateScenario({ scenario: res.scenario }, { revalidate: false });
      setDraft({ name: res.scenario.name, notes: res.scenario.notes, settings: res.scenario.settings });
      setBaseVersion(res.scenario.version);
      setMessage({ tone: "good", text: `Restored version ${r.version} as version ${res.scenario.version}.` });
    } catch (e) {
      const stale = staleVersionOf(e);
      if (stale !== null) setConflict({ currentVersion: stale });
      else setMessage({ tone: "bad", text: errorMessage(e, "Restore failed.") });
    } finally {
      setBusy(false);
    }
  }

  // one function for the memoised history that always calls the newest restoreNow
  const restoreRef = useRef(restoreNow);
  useLayoutEffect(() => {
    restoreRef.current = restoreNow;
  });
  const restore = useCallback((r: ScenarioRevision) => void restoreRef.current(r), []);

  async function remove() {
    setBusy(true);
    try {
      await apiSend("DELETE", sUrl);
      router.push(`/teams/${teamId}/scenarios`);
    } catch (e) {
      setMessage({ tone: "bad", text: errorMessage(e, "Delete failed.") });
      setBusy(false);
    }
  }

  // an engine error in the user's words, with the fields it is about marked (lib/workspace/engine-errors.ts)
  const explained = evalResult.ok ? null : explainEngineError(evalResult.message, draft.settings);
  const shownErrors = useMemo(() => {
    if (!explained) return fieldErrors;
    const out = { ...fieldErrors };
    for (const [k, v] of Object.entries(explained.fields)) out[k] = [...(out[k] ?? []), ...v];
    return out;
  }, [explained, fieldErrors]);
  const setSettings = useCallback((settings: ScenarioSettings) => setDraft((d) => ({ ...d, settings })), []);
  const setOverrides = useCallback((overrides: ScenarioSettings["overrides"]) => setDraft((d) => ({ ...d, settings: { ...d.settings, overrides } })), []);
  const evaluation = evalResult.ok ? evalResult.e : null;
  // The table and the sweep are urgent; the secondary charts (ratios, distributions, field check) follow once the
  // hand rests (SETTLE_MS without a new evaluation), then when the main thread is free: a slider drag renders and
  // paints only what it must (issue 13, item 14; `npm run bench:ui`).
  const deferredEval = useDeferredValue(useSettled(evaluation, SETTLE_MS));
  const fieldResults = useMemo(() => deferredEval?.classes.map((c) => c.scenario), [deferredEval]);
  const s = draft.settings;
  const canDelete = role === "owner" || (role === "editor" && scenario.createdBy === props.userId);

  return (
    <div className="space-y-4">
      <header className="flex flex-wrap items-start justify-between gap-3">
        <div className="w-full min-w-0 sm:w-auto sm:flex-1">
          <ItemTrail
            teamId={teamId}
            list={{ segment: "scenarios", label: "Scenarios" }}
            baseline={baseline}
            classCount={classes.length}
            version={scenario.version}
            isDemo={scenario.isDemo}
          />
          {readOnly ? (
            <h1 className="mt-1 text-xl font-semibold text-ink">{scenario.name}</h1>
          ) : (
            <label className="mt-1 block">
              <span className="sr-only">Scenario name</span>
              {/* a one-line name that wraps instead of being cut (a phone's 390 px): grows with its text, Enter adds no line */}
              <textarea
                className="field-sizing-content block w-full min-w-0 resize-none rounded border border-transparent bg-transparent px-1 text-xl font-semibold text-ink hover:border-rule focus:border-copper focus:outline-none"
                rows={1}
                title={draft.name}
                value={draft.name}
                name="scenario-name"
                onKeyDown={(e) => {
                  if (e.key === "Enter") e.preventDefault();
                }}
                onChange={(e) => setDraft((d) => ({ ...d, name: e.target.value.replace(/[\r\n]+/g, " ") }))}
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
                <Button variant="ghost" onClick={() => setDraft(saved)} disabled={busy}>
                  Discard
                </Button>
              ) : null}
              <Button onClick={save} disabled={busy || !dirty || !evalResult.ok} data-testid="save">
                {busy ? "Saving…" : "Save"}
              </Button>
              {canDelete ? <ConfirmDelete question="Delete this scenario and its history?" onDelete={remove} busy={busy} /> : null}
            </>
          )}
        </div>
        {!readOnly ? (
          <div className="w-full">
            <DuplicateScenario teamId={teamId} scenarioId={scenario.id} name={scenario.name} unsaved={dirty} />
          </div>
        ) : null}
      </header>

      {conflict ? (
        <Notice tone="warn" role="alert">
          <p className="font-medium">Someone saved this scenario while you were editing (now version {conflict.currentVersion}).</p>
          <p>Nothing was overwritten. Choose what to do with your changes:</p>
          <div className="mt-2 flex gap-2">
            <Button variant="secondary" onClick={reloadTheirs} disabled={busy}>
              Reload theirs
            </Button>
            <Button onClick={saveAsCopy} disabled={busy}>
              Save mine as a copy
            </Button>
          </div>
        </Notice>
      ) : null}
      {message ? <Notice tone={message.tone}>{message.text}</Notice> : null}

      <nav aria-label="On this page" className="no-print -mt-2 flex flex-wrap gap-x-3 text-xs">
        <a href="#results" className="text-copper-dark hover:underline">
          Results
        </a>
        <a href="#overrides" className="text-copper-dark hover:underline">
          Per-class overrides
        </a>
        <a href="#sweep" className="text-copper-dark hover:underline" data-testid="skip-to-sweep">
          Sweep
        </a>
        <a href="#settings" className="text-copper-dark hover:underline">
          Settings
        </a>
        <a href={`/teams/${teamId}/scenarios/${scenario.id}/shaping`} className="font-medium text-copper-dark hover:underline" data-testid="shaping-link">
          Layer shaping →
        </a>
      </nav>
      {/* On a phone the results come first, then the settings (visual order; the links above jump to each part) */}
      <div className="grid gap-4 lg:grid-cols-[19rem_minmax(0,1fr)]">
        <aside id="settings" className="order-2 space-y-4 lg:order-1">
          <Card title="Scale factors and options" className="[contain:content]">
            {readOnly ? (
              <ReadOnlySettings settings={s} />
            ) : (
              <SettingsPanel
                settings={s}
                onChange={setSettings}
                classes={classes}
                errors={shownErrors}
                technologyTemperatureC={baseline.technology.temperatureC ?? 25}
              />
            )}
          </Card>
          <Card title="Notes">
            {readOnly ? (
              <p className="whitespace-pre-wrap text-sm text-ink">{draft.notes || <span className="text-muted">No notes.</span>}</p>
            ) : (
              <textarea
                aria-label="Notes"
                className={`${inputClass} min-h-24`}
                value={draft.notes}
                onChange={(e) => setDraft((d) => ({ ...d, notes: e.target.value }))}
              />
            )}
          </Card>
          <TechnologyCard technology={baseline.technology} />
        </aside>

        <div className="order-1 min-w-0 space-y-4 lg:order-2">
          <div id="results" className="scroll-mt-16" />
          <Card
            className="[contain:content]"
            title={`Results — ${LEVEL_LABEL[s.level]}`}
            actions={
              <span className="flex items-center gap-3 text-xs text-muted">
                <a
                  href={`/api/scenarios/${scenario.id}/results.csv`}
                  download
                  className="no-print font-medium text-copper-dark hover:underline"
                  data-testid="results-csv"
                  title={dirty ? "The CSV holds the last saved version, not your unsaved changes." : "Per-class results of this scenario as CSV"}
                >
                  Results CSV{dirty ? " (saved version)" : ""}
                </a>
                {evaluation ? <span>engine {evaluation.engineVersion}</span> : null}
              </span>
            }
          >
            {evaluation ? (
              <>
                <Totals e={evaluation} />
                <ResultsTable evaluation={evaluation} dataKey={evalResult.key} />
              </>
            ) : (
              <Notice tone="bad">
                <span data-testid="engine-error">These settings cannot be evaluated. {explained?.text}</span>
              </Notice>
            )}
            <Caution className="mt-3" />
          </Card>
          <Card title="Per-class overrides" className="[contain:content]">
            {/* collapsed while no class has an override (one summary tab stop instead of 56 inputs before the sweep) */}
            <details
              id="overrides"
              className="scroll-mt-16"
              open={Object.keys(s.overrides).length > 0 || Object.keys(shownErrors).some((k) => k.startsWith("settings.overrides.")) || undefined}
              data-testid="overrides"
            >
              <summary className="cursor-pointer select-none text-xs text-muted">
                {Object.keys(s.overrides).length === 0
                  ? "No class overrides: every class follows the settings. Show the table"
                  : `${Object.keys(s.overrides).length} class${Object.keys(s.overrides).length === 1 ? "" : "es"} with overrides: ${Object.keys(s.overrides).join(", ")}`}
              </summary>
              <div className="mt-2">
                <ClassOverrides
                  overrides={s.overrides}
                  globalK={s.k}
                  globalS={s.s}
                  onOverrides={setOverrides}
                  classes={classes}
                  readOnly={readOnly}
                  errors={shownErrors}
                />
              </div>
            </details>
          </Card>
          <div id="sweep" className="scroll-mt-16" tabIndex={-1} />
          <Card title="Sweep — metric against S" className="[contain:content]">
            {evaluation ? (
              <SweepPanel classes={classes} technology={baseline.technology} settings={s} view={view} onView={setView} settingsKey={settingsKey} />
            ) : (
              <p className="text-sm text-muted">Fix the settings to see the sweep.</p>
            )}
          </Card>
          {/* layout and paint of the secondary charts stay inside this box (contain) */}
          <div className="space-y-4 [contain:content]">
            {deferredEval ? <RatioCharts e={deferredEval} /> : null}
            {deferredEval ? <Distributions e={deferredEval} budgetS={baseline.technology.delayBudgetS} /> : null}
            <Card title="Field check">{fieldResults ? <FieldCheck results={fieldResults} /> : null}</Card>
            <Card title="History">
              <RevisionHistory
                url={swrKeys.scenarioRevisions(scenario.id, scenario.version)}
                currentVersion={scenario.version}
                canRestore={!readOnly}
                onRestore={restore}
                busy={busy}
              />
            </Card>
          </div>
        </div>
      </div>
    </div>
  );
}

/** The headline figures, with the report's definitions (lib/figures.ts): worst-class delay, inserted repeaters, power. */
const Totals = memo(function Totals({ e }: { e: Evaluation }) {
  const b = e.totals.baseline;
  const s = e.totals.scenario;
  const wb = worstClassDelay(e.classes.map((c) => c.baseline));
  const ws = worstClassDelay(e.classes.map((c) => c.scenario));
  const items = [
    {
      label: `${FIGURE_LABEL.worstClassDelay} (${ws.name})`,
      title: `${FIGURE_LABEL.worstClassDelay}: ${FIGURE_DEFINITION.worstClassDelay}`,
      b: wb.delayS,
      s: ws.delayS,
      u: U.ps,
      unit: "ps",
    },
    { label: `${FIGURE_LABEL.repeaters}, all nets`, title: FIGURE_DEFINITION.repeaters, b: b.repeaters, s: s.repeaters, u: U.none, unit: "", count: true },
    { label: "Switching power", title: undefined, b: b.powerW, s: s.powerW, u: { label: "mW", unitSI: 1e-3, base: "W" as const, suffix: "mW" }, unit: "mW" },
  ];
  return (
    <dl className="mb-3 grid gap-3 text-xs sm:grid-cols-3">
      {items.map((i) => {
        const r = i.b > 0 ? i.s / i.b : NaN;
        const show = (v: number) => ("count" in i ? Math.round(v).toLocaleString("en") : fmt(v, i.u));
        return (
          <div key={i.label} className="rounded border border-rule px-2 py-1.5" title={i.title} data-testid="total">
            <dt className="text-muted">{i.label}</dt>
            <dd className="tabular text-sm font-semibold text-ink">
              {show(i.s)} {i.unit}{" "}
              <span className={`text-xs font-normal ${r < 0.995 ? "text-good" : r > 1.005 ? "text-bad" : "text-muted"}`}>
                (baseline {show(i.b)}
                {"count" in i ? `, ${countChange(i.b, i.s)}` : Number.isFinite(r) ? `, ${r.toFixed(2)}×` : ""})
              </span>
            </dd>
          </div>
        );
      })}
    </dl>
  );
});

/** The baseline's technology (read only; memoised: unchanged while the settings move). */
const TechnologyCard = memo(function TechnologyCard({ technology }: { technology: BaselineWithClasses["technology"] }) {
  return (
    <Card title="Technology (from the baseline)">
      <dl className="grid grid-cols-2 gap-x-2 gap-y-0.5 text-xs">
        <dt className="text-muted">Supply</dt>
        <dd className="tabular text-right">{fmt(technology.supplyV, U.V)} V</dd>
        <dt className="text-muted">Clock</dt>
        <dd className="tabular text-right">{fmt(technology.clockHz, U.GHz)} GHz</dd>
        <dt className="text-muted">Repeater R0</dt>
        <dd className="tabular text-right">{fmt(technology.repeaterR0Ohm, U.kohm)} kΩ</dd>
        <dt className="text-muted">Repeater C0</dt>
        <dd className="tabular text-right">{fmt(technology.repeaterC0F, U.fF)} fF</dd>
        <dt className="text-muted">Delay budget</dt>
        <dd className="tabular text-right">{fmt(technology.delayBudgetS, U.ps)} ps</dd>
        <dt className="text-muted">Temperature</dt>
        <dd className="tabular text-right">{fmt(technology.temperatureC ?? DEFAULT_TEMPERATURE_C, U.none)} °C</dd>
        <dt className="text-muted">Delay model</dt>
        <dd className="text-right">{(technology.delayModel ?? "exact") === "exact" ? "exact" : "Sakurai"}</dd>
        <dt className="text-muted">Capacitance</dt>
        <dd className="text-right">{(technology.capacitanceModel ?? "accurate") === "accurate" ? "field-solver tables" : "published forms"}</dd>
      </dl>
    </Card>
  );
});

function ReadOnlySettings({ settings: s }: { settings: ScenarioSettings }) {
  const n = (v: number) => String(Number(v.toPrecision(6)));
  const rows: [string, string][] = [
    ["S", n(s.s)],
    ["S_L", n(s.sL)],
    ...(s.lengthRule ? [["Length rule", describeLengthRule(s.lengthRule, s.s)] as [string, string]] : []),
    ["Model level", LEVEL_LABEL[s.level]],
    ["Miller factor", n(s.miller)],
    ["Barrier", s.barrierScales ? "scales with S" : "keeps its thickness"],
    ["Dielectric k", s.k === null ? "each class's own" : n(s.k)],
    ["Air gap between lines", s.airGap ? `k ${n(s.airGap.kGap)} over ${n(s.airGap.gapFraction * 100)}% of T` : "each class's own"],
    ["Metal", s.metal ?? "each class's own"],
    ["Driver R ×", n(s.deviceRFactor)],
    ["Load C ×", n(s.deviceCFactor)],
    ["Supply", `${fmt(s.supplyV, U.V)} V`],
    ...(s.temperatureC !== undefined ? [["Operating temperature", `${n(s.temperatureC)} °C`] as [string, string]] : []),
  ];
  return (
    <dl className="grid grid-cols-[auto_1fr] gap-x-3 gap-y-1 text-sm" data-testid="readonly-settings">
      {rows.map(([k, v]) => (
        <div key={k} className="contents">
          <dt className="text-muted">{k}</dt>
          <dd className="tabular text-right text-ink">{v}</dd>
        </div>
      ))}
    </dl>
  );
}

"use client";
import { useRouter } from "next/navigation";
import { useMemo, useState, type FormEvent } from "react";
import { Button } from "@/components/ui/button";
import { Notice } from "@/components/ui/card";
import { FieldErrors, SelectField, TextField, inputClass } from "@/components/ui/field";
import type { ComposeChoices } from "@/db/queries/reports";
import { ApiRequestError, apiSend, errorMessage } from "@/lib/api-client";
import type { DesignObjective } from "@/lib/scaling";
import { ShapingChoice } from "./shaping-choice";
import { DEFAULT_REPORT_METRICS, REPORT_METRICS, type ReportMetric } from "@/lib/validation/report";

const METRIC_LABELS: Record<ReportMetric, string> = {
  delay: "Delay",
  rc: "Wire RC",
  resistance: "Resistance",
  capacitance: "Capacitance",
  repeaters: "Repeaters",
  energy: "Energy per transition",
  power: "Switching power",
  overBudget: "Nets over budget",
};

/** Compose a report: baseline, 2–4 of its scenarios, title, audience note, classes and metrics. */
export function ComposeForm({ teamId, baselines }: { teamId: string; baselines: ComposeChoices }) {
  const router = useRouter();
  const usable = baselines.filter((b) => b.scenarios.length >= 2);
  const [baselineId, setBaselineId] = useState(usable[0]?.id ?? "");
  const baseline = useMemo(() => baselines.find((b) => b.id === baselineId), [baselines, baselineId]);
  const [scenarioIds, setScenarioIds] = useState<string[]>(() => usable[0]?.scenarios.slice(0, 4).map((s) => s.id) ?? []);
  const [classNames, setClassNames] = useState<string[]>(() => usable[0]?.classes.map((c) => c.name) ?? []);
  const [metrics, setMetrics] = useState<ReportMetric[]>([...DEFAULT_REPORT_METRICS]);
  const [shaping, setShaping] = useState<DesignObjective | null>(null);
  const [title, setTitle] = useState("");
  const [audienceNote, setAudienceNote] = useState("");
  const [errors, setErrors] = useState<Record<string, string[]>>({});
  const [message, setMessage] = useState<string | null>(null);
  const [busy, setBusy] = useState(false);

  if (usable.length === 0) {
    return <p className="text-sm text-muted">A report compares a baseline with 2 to 4 of its scenarios. Create at least two scenarios on a baseline first.</p>;
  }

  function pickBaseline(id: string) {
    setBaselineId(id);
    const b = baselines.find((x) => x.id === id);
    setScenarioIds(b?.scenarios.slice(0, 4).map((s) => s.id) ?? []);
    setClassNames(b?.classes.map((c) => c.name) ?? []);
  }

  const toggle = <T,>(list: T[], v: T, on: boolean) => (on ? [...list, v] : list.filter((x) => x !== v));

  async function submit(e: FormEvent) {
    e.preventDefault();
    setBusy(true);
    setErrors({});
    setMessage(null);
    try {
      const r = await apiSend<{ report: { id: string } }>("POST", `/api/teams/${encodeURIComponent(teamId)}/reports`, {
        baselineId,
        // Keep the order of the baseline's scenario list: it becomes Option A, B, ...
        scenarioIds: baseline?.scenarios.map((s) => s.id).filter((id) => scenarioIds.includes(id)) ?? scenarioIds,
        title,
        audienceNote,
        classNames: baseline?.classes.map((c) => c.name).filter((n) => classNames.includes(n)),
        metrics: REPORT_METRICS.filter((m) => metrics.includes(m)),
        ...(shaping ? { shaping: { objective: shaping } } : {}),
      });
      router.push(`/teams/${encodeURIComponent(teamId)}/reports/${encodeURIComponent(r.report.id)}`);
    } catch (err) {
      setErrors(err instanceof ApiRequestError ? err.fields : {});
      setMessage(errorMessage(err));
    } finally {
      setBusy(false);
    }
  }

  const nScen = scenarioIds.length;
  return (
    <form onSubmit={submit} className="space-y-4" aria-label="Compose a report" noValidate>
      {message ? <Notice tone="bad">{message}</Notice> : null}
      <div className="grid gap-4 md:grid-cols-2">
        <SelectField label="Baseline" name="baselineId" value={baselineId} onChange={(e) => pickBaseline(e.target.value)} errors={errors.baselineId}>
          {usable.map((b) => (
            <option key={b.id} value={b.id}>
              {b.name}
              {b.isDemo ? " (demo)" : ""}
            </option>
          ))}
        </SelectField>
        <TextField
          label="Title"
          name="title"
          value={title}
          onChange={(e) => setTitle(e.target.value)}
          errors={errors.title}
          required
          maxLength={200}
          placeholder="e.g. Skua tile: wiring options for the next node"
        />
      </div>
      <fieldset>
        <legend className="mb-1 text-sm font-medium text-ink">
          Scenarios to compare <span className="font-normal text-muted">(2 to 4; {nScen} picked)</span>
        </legend>
        <div className="flex flex-wrap gap-x-5 gap-y-1.5">
          {baseline?.scenarios.map((s) => (
            <label key={s.id} className="inline-flex items-center gap-2 text-sm text-ink">
              <input
                type="checkbox"
                name="scenarioIds"
                value={s.id}
                checked={scenarioIds.includes(s.id)}
                disabled={!scenarioIds.includes(s.id) && nScen >= 4}
                onChange={(e) => setScenarioIds(toggle(scenarioIds, s.id, e.target.checked))}
                className="accent-copper"
              />
              {s.name}
            </label>
          ))}
        </div>
        <FieldErrors id="f-scenarioIds-error" errors={errors.scenarioIds} />
      </fieldset>
      <div>
        <label htmlFor="f-audienceNote" className="mb-1 block text-sm font-medium text-ink">
          Audience note <span className="font-normal text-muted">(optional: who it is for, what to decide)</span>
        </label>
        <textarea
          id="f-audienceNote"
          name="audienceNote"
          rows={2}
          maxLength={2000}
          value={audienceNote}
          onChange={(e) => setAudienceNote(e.target.value)}
          className={inputClass}
        />
        <FieldErrors id="f-audienceNote-error" errors={errors.audienceNote} />
      </div>
      <div className="grid gap-4 md:grid-cols-2">
        <fieldset>
          <legend className="mb-1 text-sm font-medium text-ink">Classes that matter</legend>
          <div className="flex flex-wrap gap-x-5 gap-y-1.5">
            {baseline?.classes.map((c) => (
              <label key={c.name} className="inline-flex items-center gap-2 text-sm text-ink">
                <input
                  type="checkbox"
                  name="classNames"
                  value={c.name}
                  checked={classNames.includes(c.name)}
                  onChange={(e) => setClassNames(toggle(classNames, c.name, e.target.checked))}
                  className="accent-copper"
                />
                {c.name} <span className="text-xs text-muted">{c.tier}</span>
              </label>
            ))}
          </div>
          <FieldErrors id="f-classNames-error" errors={errors.classNames} />
        </fieldset>
        <fieldset>
          <legend className="mb-1 text-sm font-medium text-ink">Metrics in the table</legend>
          <div className="flex flex-wrap gap-x-5 gap-y-1.5">
            {REPORT_METRICS.map((m) => (
              <label key={m} className="inline-flex items-center gap-2 text-sm text-ink">
                <input
                  type="checkbox"
                  name="metrics"
                  value={m}
                  checked={metrics.includes(m)}
                  onChange={(e) => setMetrics(toggle(metrics, m, e.target.checked))}
                  className="accent-copper"
                />
                {METRIC_LABELS[m]}
              </label>
            ))}
          </div>
          <FieldErrors id="f-metrics-error" errors={errors.metrics} />
        </fieldset>
      </div>
      <ShapingChoice value={shaping} onChange={setShaping} />
      <div className="flex items-center gap-3">
        <Button type="submit" disabled={busy || nScen < 2 || nScen > 4 || classNames.length === 0 || metrics.length === 0}>
          {busy ? "Freezing…" : "Freeze report"}
        </Button>
        <span className="text-xs text-muted">The results are computed now and frozen: later edits to the scenarios do not change the report.</span>
      </div>
    </form>
  );
}

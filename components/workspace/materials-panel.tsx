"use client";
import Decimal from "decimal.js";
import { useId, useState } from "react";
import {
  DEFAULT_TEMPERATURE_C,
  getMetal,
  isMetalId,
  METAL_PARAMETERS,
  METALS,
  metalAt,
  ownEntry,
  type MetalOverride,
  type Technology,
  type WireClass,
} from "@/lib/scaling/client";
import type { SizeEffectFit } from "@/lib/scaling";
import { ApiRequestError, apiSend, errorMessage } from "@/lib/api-client";
import { Button } from "@/components/ui/button";
import { Notice } from "@/components/ui/card";
import { inputClass } from "@/components/ui/field";
import { formatValue } from "./units";

type Param = keyof MetalOverride;

/** A value in a display unit (SI size `unitSI`), exact and short: formatValue of the editor's units. */
const show = (si: number, unitSI: number, digits = 6) => formatValue(si, { label: "", unitSI, base: "", suffix: "" }, digits);

/** Metals the baseline uses (in class order), then any metal that only has overrides. */
function metalsOf(classes: WireClass[], technology: Technology): string[] {
  const ids: string[] = [];
  for (const c of classes) if (isMetalId(c.metal) && !ids.includes(c.metal)) ids.push(c.metal);
  for (const id of Object.keys(technology.materials ?? {})) if (!ids.includes(id)) ids.push(id);
  return ids;
}

/**
 * The baseline's materials block (per metal: ρ0, α, λ, p, R, C; blank = the catalogue's value, with its source) and
 * "Fit to measured lines": measured resistance per length of one or more classes → fitted p and R (or one scale factor
 * on ρ0 for a single line) with each line's residual, applied to the block on request. Saving is the editor's Save.
 */
export function MaterialsPanel(p: {
  baselineId: string;
  classes: WireClass[];
  technology: Technology;
  onChange: (t: Technology) => void;
  readOnly: boolean;
  /** The class table has unsaved edits: the fit runs on the saved classes. */
  classesDirty: boolean;
  errors: Record<string, string[]>;
}) {
  const ids = metalsOf(p.classes, p.technology);
  const tC = p.technology.temperatureC ?? DEFAULT_TEMPERATURE_C;
  const materials = p.technology.materials ?? {};
  const setParam = (id: string, key: Param, v: number | undefined) => {
    const cur = { ...(ownEntry(materials, id) ?? {}) };
    if (v === undefined) delete cur[key];
    else cur[key] = v;
    const next = { ...materials };
    if (Object.keys(cur).length === 0) delete next[id];
    else next[id] = cur;
    p.onChange(withMaterials(p.technology, next));
  };
  return (
    <div className="space-y-4" data-testid="materials-panel">
      <p className="text-xs text-muted">
        Per metal used by this baseline. A blank field uses the catalogue&apos;s value (shown grey, source on the right); a typed value applies to this baseline
        only and is frozen into its reports. Resistivity is given at 20 °C and follows α to the operating temperature ({show(tC, 1)} °C); the size-effect part
        keeps ρ0·λ constant (Matthiessen&apos;s rule).
      </p>
      {ids.length === 0 ? <p className="text-sm text-muted">No classes yet: the materials of their metals show here.</p> : null}
      <div className="grid gap-4 xl:grid-cols-2">
        {ids.map((id) => (
          <MetalTable key={id} id={id} override={ownEntry(materials, id)} temperatureC={tC} readOnly={p.readOnly} onParam={setParam} errors={p.errors} />
        ))}
      </div>
      <SourceField technology={p.technology} onChange={p.onChange} readOnly={p.readOnly} errors={p.errors["technology.materialsSource"]} />
      {!p.readOnly && p.classes.length > 0 ? (
        <FitToMeasured
          baselineId={p.baselineId}
          classes={p.classes}
          technology={p.technology}
          classesDirty={p.classesDirty}
          onApply={(fit, measured) => {
            const next = { ...materials };
            for (const [id, o] of Object.entries(fit.metals)) {
              // a two-line fit sets p and R; a one-line fit scales ρ0 (λ kept): drop what it replaces, keep the rest
              next[id] = { ...(next[id] ?? {}), ...o };
            }
            const day = new Date().toISOString().slice(0, 10);
            const classes = [...new Set(measured.map((m) => m.class))].join(", ");
            p.onChange({
              ...withMaterials(p.technology, next),
              materialsSource: `Fitted to ${measured.length} measured line${measured.length === 1 ? "" : "s"} (${classes}), ${day}`,
            });
          }}
        />
      ) : null}
    </div>
  );
}

function withMaterials(t: Technology, materials: Record<string, MetalOverride>): Technology {
  const { materials: _m, materialsSource, ...rest } = t;
  if (Object.keys(materials).length === 0) return rest;
  return { ...rest, materials, ...(materialsSource ? { materialsSource } : {}) };
}

function MetalTable(p: {
  id: string;
  override: MetalOverride | undefined;
  temperatureC: number;
  readOnly: boolean;
  onParam: (id: string, key: Param, v: number | undefined) => void;
  errors: Record<string, string[]>;
}) {
  const cat = getMetal(p.id);
  const at = metalAt({ metal: p.id, temperatureC: p.temperatureC, override: p.override });
  return (
    <div className="overflow-x-auto rounded border border-rule" data-testid={`materials-${p.id}`}>
      <table className="w-full text-xs">
        <caption className="border-b border-rule bg-ground/60 px-2 py-1.5 text-left font-semibold text-ink">
          {cat.name} ({cat.id})
          <span className="ml-2 font-normal text-muted">
            at {show(p.temperatureC, 1)} °C: ρ0 {show(at.resistivityOhmM, 1e-8, 4)} µΩ·cm, λ {show(at.meanFreePathM, 1e-9, 4)} nm
          </span>
        </caption>
        <thead className="text-left text-muted">
          <tr>
            <th className="px-2 py-1 font-medium">Parameter</th>
            <th className="px-2 py-1 text-right font-medium">Catalogue</th>
            <th className="px-2 py-1 text-right font-medium">This baseline</th>
            <th className="px-2 py-1 font-medium">Source</th>
          </tr>
        </thead>
        <tbody>
          {METAL_PARAMETERS.map((q) => {
            const v = p.override?.[q.key];
            const err = p.errors[`technology.materials.${p.id}.${q.key}`];
            return (
              <tr key={q.key} className="border-t border-rule align-top">
                <th scope="row" className="px-2 py-1 text-left font-normal text-ink">
                  {q.label}
                  {q.unit ? <span className="text-muted"> ({q.unit})</span> : null}
                </th>
                <td className="tabular px-2 py-1 text-right text-muted">{show(cat[q.key], q.unitSI)}</td>
                <td className="px-2 py-1 text-right">
                  {p.readOnly ? (
                    <span className={v === undefined ? "text-muted" : "tabular font-medium text-ink"}>{v === undefined ? "catalogue" : show(v, q.unitSI)}</span>
                  ) : (
                    <OverrideInput
                      label={`${cat.id} ${q.label}${q.unit ? ` (${q.unit})` : ""}`}
                      value={v}
                      placeholder={show(cat[q.key], q.unitSI)}
                      unitSI={q.unitSI}
                      min={q.min}
                      minOpen={q.minOpen}
                      max={q.max}
                      maxOpen={q.maxOpen}
                      onChange={(x) => p.onParam(p.id, q.key, x)}
                      errors={err}
                    />
                  )}
                </td>
                <td className="max-w-[16rem] truncate px-2 py-1 text-muted" title={v === undefined ? cat.sources[q.source] : "Set for this baseline"}>
                  {v === undefined ? cat.sources[q.source] : "this baseline (see its source below)"}
                </td>
              </tr>
            );
          })}
        </tbody>
      </table>
    </div>
  );
}

/** A typed override in display units: blank = the catalogue's value; keeps the text while it is invalid. */
function OverrideInput(p: {
  label: string;
  value: number | undefined;
  placeholder: string;
  unitSI: number;
  min: number;
  minOpen?: boolean;
  max: number;
  maxOpen?: boolean;
  onChange: (v: number | undefined) => void;
  errors?: string[];
}) {
  const [text, setText] = useState(p.value === undefined ? "" : show(p.value, p.unitSI, 6));
  const [msg, setMsg] = useState<string | undefined>();
  const [shown, setShown] = useState(p.value);
  if (!Object.is(shown, p.value)) {
    setShown(p.value);
    setText(p.value === undefined ? "" : show(p.value, p.unitSI, 6));
    setMsg(undefined);
  }
  const all = [...(msg ? [msg] : []), ...(p.errors ?? [])];
  return (
    <div>
      <input
        aria-label={p.label}
        inputMode="decimal"
        autoComplete="off"
        className={`${inputClass} tabular w-28 px-1.5 py-0.5 text-right text-xs`}
        placeholder={p.placeholder}
        value={text}
        aria-invalid={all.length ? true : undefined}
        onChange={(e) => {
          const t = e.target.value;
          setText(t);
          if (t.trim() === "") {
            setMsg(undefined);
            setShown(undefined);
            return p.onChange(undefined);
          }
          let d: Decimal;
          try {
            d = new Decimal(t.trim());
          } catch {
            return setMsg("Not a number.");
          }
          const n = d.toNumber();
          if ((p.minOpen ? n <= p.min : n < p.min) || (p.maxOpen ? n >= p.max : n > p.max)) {
            return setMsg(`Must be ${p.minOpen ? "above" : "at least"} ${p.min} and ${p.maxOpen ? "below" : "at most"} ${p.max}.`);
          }
          setMsg(undefined);
          const si = d.times(p.unitSI).toNumber();
          setShown(si);
          p.onChange(si);
        }}
      />
      {all.length ? <p className="mt-0.5 text-left text-[11px] text-bad">{all.join(" ")}</p> : null}
    </div>
  );
}

function SourceField(p: { technology: Technology; onChange: (t: Technology) => void; readOnly: boolean; errors?: string[] }) {
  const id = useId();
  const has = Object.keys(p.technology.materials ?? {}).length > 0;
  if (!has) return null;
  if (p.readOnly)
    return (
      <p className="text-xs text-muted">
        Source of this baseline&apos;s values: <span className="text-ink">{p.technology.materialsSource ?? "not given"}</span>
      </p>
    );
  return (
    <div>
      <label htmlFor={id} className="mb-1 block text-xs font-medium text-ink">
        Source of this baseline&apos;s values
      </label>
      <input
        id={id}
        name="materialsSource"
        className={`${inputClass} max-w-2xl text-xs`}
        maxLength={300}
        placeholder="e.g. Fitted to the 2026 line-resistance monitor, lot 12"
        value={p.technology.materialsSource ?? ""}
        onChange={(e) => {
          const { materialsSource: _s, ...rest } = p.technology;
          p.onChange(e.target.value === "" ? rest : { ...rest, materialsSource: e.target.value });
        }}
      />
      {p.errors?.length ? <p className="text-[11px] text-bad">{p.errors.join(" ")}</p> : null}
    </div>
  );
}

interface MeasuredRow {
  key: number;
  class: string;
  r: string;
  t: string;
}

type MeasuredLine = { class: string; rOhmPerUm: number; temperatureC?: number };

function FitToMeasured(p: {
  baselineId: string;
  classes: WireClass[];
  technology: Technology;
  classesDirty: boolean;
  onApply: (fit: SizeEffectFit, measured: MeasuredLine[]) => void;
}) {
  const [rows, setRows] = useState<MeasuredRow[]>(() => [{ key: 0, class: p.classes[0]!.name, r: "", t: "" }]);
  const [nextKey, setNextKey] = useState(1);
  const [busy, setBusy] = useState(false);
  const [fit, setFit] = useState<{ result: SizeEffectFit; measured: MeasuredLine[] } | null>(null);
  const [errors, setErrors] = useState<Record<string, string[]>>({});
  const [msg, setMsg] = useState<{ tone: "good" | "bad" | "warn"; text: string } | null>(null);
  const tC = p.technology.temperatureC ?? DEFAULT_TEMPERATURE_C;
  const set = (i: number, patch: Partial<MeasuredRow>) => setRows((rs) => rs.map((r, j) => (j === i ? { ...r, ...patch } : r)));

  async function run() {
    setErrors({});
    setMsg(null);
    const local: Record<string, string[]> = {};
    const measured: MeasuredLine[] = rows.map((r, i) => {
      const num = (text: string, field: string, what: string): number | undefined => {
        if (text.trim() === "") return undefined;
        try {
          return new Decimal(text.trim()).toNumber();
        } catch {
          local[`measured.${i}.${field}`] = [`${what} is not a number.`];
          return undefined;
        }
      };
      const rOhmPerUm = num(r.r, "rOhmPerUm", "Measured resistance");
      if (r.r.trim() === "") local[`measured.${i}.rOhmPerUm`] = ["Enter the measured resistance in Ω/µm."];
      const temperatureC = num(r.t, "temperatureC", "Temperature");
      return { class: r.class, rOhmPerUm: rOhmPerUm ?? Number.NaN, ...(temperatureC !== undefined ? { temperatureC } : {}) };
    });
    if (Object.keys(local).length > 0) return setErrors(local);
    setBusy(true);
    try {
      const result = await apiSend<SizeEffectFit>("POST", `/api/baselines/${p.baselineId}/fit`, { measured, technology: p.technology });
      setFit({ result, measured });
    } catch (e) {
      setFit(null);
      if (e instanceof ApiRequestError && e.hasFields) setErrors(e.fields);
      setMsg({ tone: "bad", text: errorMessage(e, "The fit failed.") });
    } finally {
      setBusy(false);
    }
  }

  const worst = fit ? Math.max(...fit.result.points.map((q) => Math.abs(q.residual))) : 0;
  return (
    <details className="rounded border border-rule px-3 py-2" data-testid="fit-to-measured">
      <summary className="cursor-pointer text-sm font-medium text-ink">Fit to measured lines</summary>
      <p className="mt-2 max-w-3xl text-xs text-muted">
        Enter the measured resistance per length of one or more classes at their baseline geometry (width, thickness and barrier as in the class table). With
        two or more lines of a metal, specularity p and grain reflection R are fitted by bounded least squares (0 ≤ p ≤ 0.95, 0.01 ≤ R ≤ 0.95); with one line,
        ρ0 is scaled by one factor. A blank temperature is the operating temperature ({show(tC, 1)} °C).
      </p>
      {p.classesDirty ? <p className="mt-1 text-xs text-warn">The class table has unsaved changes: the fit uses the saved classes. Save first.</p> : null}
      <table className="mt-2 text-xs">
        <thead className="text-left text-muted">
          <tr>
            <th className="px-1 py-1 font-medium">Class</th>
            <th className="px-1 py-1 font-medium">Measured R (Ω/µm)</th>
            <th className="px-1 py-1 font-medium">Temperature (°C)</th>
            <th />
          </tr>
        </thead>
        <tbody>
          {rows.map((r, i) => {
            const e = (f: string) => errors[`measured.${i}.${f}`];
            const rowErr = [...(e("class") ?? []), ...(e("rOhmPerUm") ?? []), ...(e("temperatureC") ?? [])];
            return (
              <tr key={r.key} className="align-top">
                <td className="px-1 py-0.5">
                  <select
                    aria-label={`Measured line ${i + 1}: class`}
                    className={`${inputClass} px-1 py-0.5 text-xs`}
                    value={r.class}
                    onChange={(ev) => set(i, { class: ev.target.value })}
                    aria-invalid={e("class") ? true : undefined}
                  >
                    {p.classes.map((c) => (
                      <option key={c.name} value={c.name}>
                        {c.name} ({c.metal}, {show(c.widthM, 1e-9, 4)} × {show(c.thicknessM, 1e-9, 4)} nm)
                      </option>
                    ))}
                  </select>
                </td>
                <td className="px-1 py-0.5">
                  <input
                    aria-label={`Measured line ${i + 1}: resistance (Ω/µm)`}
                    inputMode="decimal"
                    className={`${inputClass} tabular w-28 px-1.5 py-0.5 text-right text-xs`}
                    value={r.r}
                    onChange={(ev) => set(i, { r: ev.target.value })}
                    aria-invalid={e("rOhmPerUm") ? true : undefined}
                  />
                </td>
                <td className="px-1 py-0.5">
                  <input
                    aria-label={`Measured line ${i + 1}: temperature (°C)`}
                    inputMode="decimal"
                    placeholder={show(tC, 1)}
                    className={`${inputClass} tabular w-20 px-1.5 py-0.5 text-right text-xs`}
                    value={r.t}
                    onChange={(ev) => set(i, { t: ev.target.value })}
                    aria-invalid={e("temperatureC") ? true : undefined}
                  />
                </td>
                <td className="px-1 py-0.5">
                  {rows.length > 1 ? (
                    <button
                      type="button"
                      className="rounded px-1.5 py-0.5 text-muted hover:bg-ground hover:text-bad"
                      aria-label={`Remove measured line ${i + 1}`}
                      onClick={() => setRows((rs) => rs.filter((_, j) => j !== i))}
                    >
                      ×
                    </button>
                  ) : null}
                  {rowErr.length ? <p className="max-w-md text-[11px] text-bad">{rowErr.join(" ")}</p> : null}
                </td>
              </tr>
            );
          })}
        </tbody>
      </table>
      <div className="mt-2 flex flex-wrap gap-2">
        <Button
          variant="secondary"
          disabled={rows.length >= 50}
          onClick={() => {
            const used = new Set(rows.map((r) => r.class));
            setRows((rs) => [...rs, { key: nextKey, class: p.classes.find((c) => !used.has(c.name))?.name ?? p.classes[0]!.name, r: "", t: "" }]);
            setNextKey((k) => k + 1);
          }}
        >
          Add a line
        </Button>
        <Button onClick={run} disabled={busy} data-testid="run-fit">
          {busy ? "Fitting…" : "Fit"}
        </Button>
      </div>
      {msg ? (
        <div className="mt-2">
          <Notice tone={msg.tone}>{msg.text}</Notice>
        </div>
      ) : null}
      {fit ? (
        <div className="mt-3 space-y-2" data-testid="fit-result">
          <table className="text-xs">
            <thead className="text-left text-muted">
              <tr>
                <th className="px-2 py-1 font-medium">Class</th>
                <th className="px-2 py-1 text-right font-medium">Measured (Ω/µm)</th>
                <th className="px-2 py-1 text-right font-medium">Fitted (Ω/µm)</th>
                <th className="px-2 py-1 text-right font-medium">Residual</th>
              </tr>
            </thead>
            <tbody>
              {fit.result.points.map((q, i) => (
                <tr key={i} className="border-t border-rule">
                  <td className="px-2 py-1">{q.class}</td>
                  <td className="tabular px-2 py-1 text-right">{show(q.measuredOhmPerM, 1e6, 5)}</td>
                  <td className="tabular px-2 py-1 text-right">{show(q.fittedOhmPerM, 1e6, 5)}</td>
                  <td className={`tabular px-2 py-1 text-right ${Math.abs(q.residual) > 0.05 ? "text-warn" : ""}`}>
                    {q.residual >= 0 ? "+" : "−"}
                    {Math.abs(q.residual * 100).toFixed(2)} %
                  </td>
                </tr>
              ))}
            </tbody>
          </table>
          <ul className="text-xs text-ink">
            {Object.entries(fit.result.metals).map(([id, o]) => (
              <li key={id}>
                <strong>{id}</strong>:{" "}
                {o.specularity !== undefined
                  ? `p ${show(o.specularity, 1, 3)}, R ${show(o.grainReflection ?? 0, 1, 3)}`
                  : `ρ0 at 20 °C ${show(o.resistivityOhmM ?? 0, 1e-8, 4)} µΩ·cm (one line: catalogue ρ0 × ${show((o.resistivityOhmM ?? 0) / (ownEntry(METALS, id)?.resistivityOhmM ?? 1), 1, 4)})`}
              </li>
            ))}
          </ul>
          {Object.values(fit.result.metals).some(
            (o) =>
              o.specularity !== undefined &&
              (o.specularity >= 0.95 || o.specularity <= 0 || (o.grainReflection ?? 0.5) >= 0.95 || (o.grainReflection ?? 0.5) <= 0.01),
          ) ? (
            <p className="max-w-3xl text-xs text-muted">
              A fitted value sits at its bound: surface (p) and grain (R) scattering trade off against each other over these widths, so many pairs fit about as
              well. The pair still predicts the resistance of other widths near the fitted ones (see the residuals), but neither value alone measures the
              surface or the grains; more widths, further apart, separate them.
            </p>
          ) : null}
          {worst > 0.05 ? (
            <p className="text-xs text-warn">
              Worst residual {(worst * 100).toFixed(1)} %: the model does not follow these lines closely; check the geometry and units before applying.
            </p>
          ) : null}
          <Button
            onClick={() => {
              p.onApply(fit.result, fit.measured);
              setMsg({ tone: "good", text: "Applied to the materials above. Save the baseline to keep it." });
            }}
            data-testid="apply-fit"
          >
            Apply to this baseline&apos;s materials
          </Button>
        </div>
      ) : null}
    </details>
  );
}

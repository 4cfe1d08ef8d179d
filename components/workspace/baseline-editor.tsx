"use client";
import Link from "next/link";
import { useRouter } from "next/navigation";
import { useMemo, useState } from "react";
import useSWR from "swr";
import type { BaselineRevision, BaselineWarning, BaselineWithClasses } from "@/db/queries/baselines";
import type { StoredWireClass } from "@/db/queries/wire-classes";
import type { Role } from "@/lib/access";
import Decimal from "decimal.js";
import {
  DEFAULT_MIN_REPEATER_GAIN,
  DEFAULT_OUTPUT_C_RATIO,
  DEFAULT_REPEATER_AREA_M2,
  DEFAULT_TEMPERATURE_C,
  METALS,
  TIERS,
  type CapacitanceChoice,
  type DelayModel,
  type Technology,
  type Tier,
  type WireClass,
} from "@/lib/scaling/client";
import { ApiRequestError, apiSend, errorMessage, fetchJson, staleVersionOf } from "@/lib/api-client";
import { swrKeys } from "@/lib/swr-keys";
import { Button, ButtonLink } from "@/components/ui/button";
import { Badge, Card, Notice } from "@/components/ui/card";
import { inputClass } from "@/components/ui/field";
import { BaselineWarnings } from "./baseline-warnings";
import { MaterialsPanel } from "./materials-panel";
import { StackView } from "./stack-view";
import { NumberField } from "./number-field";
import { CAPACITANCE_CHOICE_LABEL, U, formatValue, parseValue, type DisplayUnit } from "./units";
import { ConfirmDelete } from "@/components/ui/confirm-delete";

type NumKey =
  | "widthM"
  | "thicknessM"
  | "spacingM"
  | "ildBelowM"
  | "ildAboveM"
  | "barrierM"
  | "k"
  | "netCount"
  | "meanLengthM"
  | "driverOhm"
  | "loadF"
  | "activity"
  | "viasPerNet"
  | "viaOhm"
  | "viaWidthM"
  | "viaHeightM"
  | "kGap"
  | "gapFraction";
// Input widths per column (Tailwind classes) keep the editable table within a 1280 px layout: the numeric cells are
// spaced by NUM_PAD and the optional columns' inputs are dense, so the air-gap columns fit too (measured in Chromium:
// 1207 of 1214 px); with the via columns as well the table scrolls sideways.
// `omit`: optional engine field left out when empty (vias: empty = none / the default geometry; air gap: empty = none);
// `optional`: empty = null. `group`: optional columns shown on request (or when a class uses them).
type ColGroup = "vias" | "gap";
const NUM_COLS: {
  key: NumKey;
  label: string;
  unit: DisplayUnit;
  optional?: boolean;
  omit?: boolean;
  int?: boolean;
  width: string;
  title?: string;
  group?: ColGroup;
}[] = [
  { key: "widthM", label: "Width", unit: U.nm, width: "w-14" },
  { key: "thicknessM", label: "Thickness", unit: U.nm, width: "w-14" },
  { key: "spacingM", label: "Spacing", unit: U.nm, width: "w-14" },
  { key: "ildBelowM", label: "ILD below", unit: U.nm, optional: true, width: "w-14" },
  { key: "ildAboveM", label: "ILD above", unit: U.nm, optional: true, width: "w-14" },
  { key: "barrierM", label: "Barrier", unit: U.nm, width: "w-12" },
  { key: "k", label: "k", unit: U.none, width: "w-12" },
  { key: "netCount", label: "Nets", unit: U.none, int: true, width: "w-20" },
  { key: "meanLengthM", label: "Mean length", unit: U.um, width: "w-14" },
  { key: "driverOhm", label: "Driver", unit: U.ohm, width: "w-14" },
  { key: "loadF", label: "Load", unit: U.fF, width: "w-12" },
  { key: "activity", label: "Activity", unit: U.none, width: "w-12" },
  { key: "viasPerNet", label: "Vias", unit: U.none, omit: true, group: "vias", int: true, width: "w-10", title: "Vias in series with each net (empty = none)" },
  {
    key: "viaOhm",
    label: "Via R",
    unit: U.ohm,
    omit: true,
    group: "vias",
    width: "w-12",
    title: "Measured resistance of one via (empty = from the via's size)",
  },
  { key: "viaWidthM", label: "Via width", unit: U.nm, omit: true, group: "vias", width: "w-12", title: "Square via width (empty = the line's width)" },
  { key: "viaHeightM", label: "Via height", unit: U.nm, omit: true, group: "vias", width: "w-12", title: "Via height (empty = the ILD below)" },
  {
    key: "kGap",
    label: "k gap",
    unit: U.none,
    omit: true,
    group: "gap",
    width: "w-10",
    title: "Permittivity of the air gap between neighbouring lines, 1 (air) … the class's k (empty = no gap; air when a gap fraction is given)",
  },
  {
    key: "gapFraction",
    label: "Gap fraction",
    unit: U.none,
    omit: true,
    group: "gap",
    width: "w-10",
    title: "Share of the line thickness the gap covers from the bottom of the lines, 0 … 1 (empty = no gap; 1 when k gap is given)",
  },
];

interface Row {
  key: string;
  id?: string;
  name: string;
  tier: Tier;
  metal: string;
  cells: Record<NumKey, string>;
  histogramBins: number;
}

/** A technology as text independent of key order (edited fields are added at the end; the server returns its own order). */
const techKey = (t: Technology) => JSON.stringify(Object.entries(t).sort(([a], [b]) => (a < b ? -1 : a > b ? 1 : 0)));

const hasVias = (c: WireClass) => c.viasPerNet !== undefined || c.viaOhm !== undefined || c.viaWidthM !== undefined || c.viaHeightM !== undefined;
const hasGap = (c: WireClass) => c.kGap !== undefined || c.gapFraction !== undefined;

let rowSeq = 0;
function toRow(c: StoredWireClass | (WireClass & { id?: string; histogramBins?: number })): Row {
  const cells = {} as Record<NumKey, string>;
  for (const col of NUM_COLS) cells[col.key] = formatValue(c[col.key] as number | null | undefined, col.unit);
  return { key: `r${++rowSeq}`, id: c.id, name: c.name, tier: c.tier, metal: c.metal, cells, histogramBins: c.histogramBins ?? 0 };
}

/** Parse one row: SI values or per-cell messages. */
function parseRow(r: Row): { value?: Record<string, unknown>; errors: Record<string, string> } {
  const errors: Record<string, string> = {};
  const out: Record<string, unknown> = { name: r.name.trim(), tier: r.tier, metal: r.metal };
  if (r.id) out.id = r.id;
  if (!r.name.trim()) errors.name = "Class name is required.";
  for (const col of NUM_COLS) {
    const t = r.cells[col.key].trim();
    if (col.optional && t === "") {
      out[col.key] = null;
      continue;
    }
    if (col.omit && t === "") continue;
    const p = parseValue(t, col.unit);
    if (!p.ok) {
      errors[col.key] = p.message;
      continue;
    }
    if (p.value < 0) errors[col.key] = `${col.label} must not be negative.`;
    else if (col.int && !Number.isInteger(p.value)) errors[col.key] = `${col.label} must be a whole number.`;
    else if (col.key === "k" && p.value < 1) errors[col.key] = "k must be at least 1 (vacuum).";
    else if (col.key === "activity" && p.value > 1) errors[col.key] = "Activity must be between 0 and 1.";
    else if (col.key === "kGap" && p.value < 1) errors[col.key] = "k gap must be at least 1 (air).";
    else if (col.key === "gapFraction" && p.value > 1) errors[col.key] = "Gap fraction must be between 0 and 1.";
    else if (["widthM", "thicknessM", "spacingM", "meanLengthM", "ildBelowM", "ildAboveM", "viaWidthM", "viaHeightM"].includes(col.key) && p.value === 0)
      errors[col.key] = `${col.label} must be greater than 0.`;
    out[col.key] = p.value;
  }
  if (typeof out.kGap === "number" && typeof out.k === "number" && out.kGap > out.k && !errors.kGap)
    errors.kGap = `k gap must not exceed the class's k (${formatValue(out.k, U.none)}).`;
  return { value: Object.keys(errors).length ? undefined : out, errors };
}

export function BaselineEditor({
  initial,
  role,
  userId,
  scenarios,
  warnings,
}: {
  initial: BaselineWithClasses;
  role: Role;
  userId: string;
  scenarios: { id: string; name: string }[];
  warnings: BaselineWarning[];
}) {
  const router = useRouter();
  const url = swrKeys.baseline(initial.id);
  const { data, mutate } = useSWR<{ baseline: BaselineWithClasses }>(url, fetchJson, {
    fallbackData: { baseline: initial },
    revalidateOnFocus: false,
  });
  const b = data!.baseline;
  const readOnly = role === "viewer";
  const canDelete = role === "owner" || (role === "editor" && b.createdBy === userId);

  const [rows, setRows] = useState<Row[]>(() => b.classes.map(toRow));
  // The optional via and air-gap columns show when a class uses them, or on request (they widen the table).
  const [showVias, setShowVias] = useState(() => b.classes.some(hasVias));
  const [showGap, setShowGap] = useState(() => b.classes.some(hasGap));
  const shownCols = NUM_COLS.filter((c) => !c.group || (c.group === "vias" ? showVias : showGap));
  const [meta, setMeta] = useState({ name: b.name, description: b.description, technology: b.technology });
  const [version, setVersion] = useState(b.version);
  const [serverErrors, setServerErrors] = useState<Record<string, string[]>>({});
  const [msg, setMsg] = useState<{ tone: "good" | "bad" | "warn"; text: string } | null>(null);
  const [stale, setStale] = useState<number | null>(null);
  const [busy, setBusy] = useState(false);

  const parsed = useMemo(() => rows.map(parseRow), [rows]);
  const dupNames = useMemo(() => {
    const seen = new Map<string, number>();
    const d = new Map<number, string>();
    rows.forEach((r, i) => {
      const k = r.name.trim().toLowerCase();
      if (!k) return;
      const first = seen.get(k);
      if (first !== undefined) d.set(i, `Class name "${r.name.trim()}" is used twice (rows ${first + 1} and ${i + 1}).`);
      else seen.set(k, i);
    });
    return d;
  }, [rows]);
  const clientInvalid = parsed.some((p) => !p.value) || dupNames.size > 0;
  const originalRows = useMemo(() => JSON.stringify(b.classes.map(toRow).map(({ key: _k, ...r }) => r)), [b]);
  const classesDirty = JSON.stringify(rows.map(({ key: _k, ...r }) => r)) !== originalRows;
  const metaDirty = meta.name !== b.name || meta.description !== b.description || techKey(meta.technology) !== techKey(b.technology);

  const update = (i: number, patch: Partial<Row>) => setRows((rs) => rs.map((r, j) => (j === i ? { ...r, ...patch } : r)));
  const setCell = (i: number, key: NumKey, text: string) => setRows((rs) => rs.map((r, j) => (j === i ? { ...r, cells: { ...r.cells, [key]: text } } : r)));
  const move = (i: number, d: -1 | 1) =>
    setRows((rs) => {
      const j = i + d;
      if (j < 0 || j >= rs.length) return rs;
      const copy = [...rs];
      [copy[i], copy[j]] = [copy[j]!, copy[i]!];
      return copy;
    });
  const freeName = (base: string) => {
    const names = new Set(rows.map((r) => r.name.toLowerCase()));
    let n = base;
    for (let i = 2; names.has(n.toLowerCase()); i++) n = `${base} ${i}`;
    return n;
  };

  async function save() {
    setBusy(true);
    setMsg(null);
    setServerErrors({});
    try {
      let v = version;
      if (metaDirty) {
        const r = await apiSend<{ baseline: BaselineWithClasses }>("PATCH", url, { version: v, ...meta });
        v = r.baseline.version;
      }
      if (classesDirty) {
        const r = await apiSend<{ baseline: BaselineWithClasses }>("PUT", `${url}/classes`, {
          version: v,
          classes: parsed.map((p) => p.value),
        });
        v = r.baseline.version;
        setRows(r.baseline.classes.map(toRow));
        await mutate({ baseline: r.baseline }, { revalidate: false });
      } else await mutate();
      setVersion(v);
      setMsg({ tone: "good", text: `Saved as version ${v}.` });
    } catch (e) {
      const current = staleVersionOf(e);
      if (current !== null) setStale(current);
      else if (e instanceof ApiRequestError && e.isNetworkError) setMsg({ tone: "bad", text: "Could not reach the server; your changes are still here." });
      else if (e instanceof ApiRequestError) {
        setServerErrors(e.fields);
        setMsg({ tone: "bad", text: e.message });
      } else setMsg({ tone: "bad", text: errorMessage(e) });
    } finally {
      setBusy(false);
    }
  }

  async function reloadTheirs() {
    const fresh = await mutate();
    if (fresh) {
      setRows(fresh.baseline.classes.map(toRow));
      setMeta({ name: fresh.baseline.name, description: fresh.baseline.description, technology: fresh.baseline.technology });
      setVersion(fresh.baseline.version);
    }
    setStale(null);
    setMsg({ tone: "warn", text: "Loaded the newer version; your unsaved changes were discarded." });
  }

  async function saveAsCopy() {
    setBusy(true);
    try {
      const r = await apiSend<{ baseline: BaselineWithClasses }>("POST", `/api/teams/${b.teamId}/baselines`, {
        name: `${meta.name} (my copy ${new Date().toISOString().slice(0, 16).replace("T", " ")})`,
        description: meta.description,
        technology: meta.technology,
        classes: parsed.map((p) => {
          const { id: _i, ...rest } = p.value ?? {};
          return rest;
        }),
      });
      router.push(`/teams/${b.teamId}/baselines/${r.baseline.id}`);
    } catch (e) {
      setMsg({ tone: "bad", text: errorMessage(e, "Could not save a copy.") });
      setBusy(false);
    }
  }

  async function duplicate() {
    setBusy(true);
    try {
      const r = await apiSend<{ baseline: BaselineWithClasses }>("POST", `${url}/duplicate`, {});
      router.push(`/teams/${b.teamId}/baselines/${r.baseline.id}`);
    } catch (e) {
      setMsg({ tone: "bad", text: errorMessage(e, "Could not duplicate.") });
      setBusy(false);
    }
  }

  async function remove() {
    setBusy(true);
    try {
      await apiSend("DELETE", url);
      router.push(`/teams/${b.teamId}/baselines`);
    } catch (e) {
      setMsg({ tone: "bad", text: errorMessage(e, "Delete failed.") });
      setBusy(false);
    }
  }

  const cellErr = (i: number, key: string): string[] => {
    const out: string[] = [];
    const c = parsed[i]?.errors[key];
    if (c) out.push(c);
    if (key === "name" && dupNames.has(i)) out.push(dupNames.get(i)!);
    out.push(...(serverErrors[`classes.${i}.${key}`] ?? []));
    return out;
  };
  const tech = meta.technology;
  const setTech = (k: keyof Technology, v: number | DelayModel | CapacitanceChoice) => setMeta((m) => ({ ...m, technology: { ...m.technology, [k]: v } }));
  // Engine 2 settings: absent = the engine's default, shown as such; a field is stored once it is edited.
  const gainPct = toDisplay(tech.minRepeaterGain ?? DEFAULT_MIN_REPEATER_GAIN, 0.01);
  const areaUm2 = toDisplay(tech.repeaterAreaM2 ?? DEFAULT_REPEATER_AREA_M2, 1e-12);
  const leakNW = toDisplay(tech.repeaterLeakageW ?? 0, 1e-9);
  const techErr = (k: keyof Technology) => serverErrors[`technology.${k}`];

  return (
    <div className="space-y-4">
      <header className="flex flex-wrap items-start justify-between gap-3">
        <div className="min-w-0 flex-1">
          <p className="text-xs text-muted">
            <Link href={`/teams/${b.teamId}/baselines`} className="hover:underline">
              Baselines
            </Link>{" "}
            · version {b.version} · {b.classes.length} classes {b.isDemo ? <Badge tone="warn">invented demo data</Badge> : null}
          </p>
          {readOnly ? (
            <>
              <h1 className="mt-1 text-xl font-semibold text-ink">{b.name}</h1>
              {b.description ? <p className="text-sm text-muted">{b.description}</p> : null}
            </>
          ) : (
            <div className="mt-1 space-y-1">
              <input
                aria-label="Baseline name"
                name="baseline-name"
                className="w-full max-w-xl rounded border border-transparent bg-transparent px-1 text-xl font-semibold text-ink hover:border-rule focus:border-copper focus:outline-none focus:ring-2 focus:ring-copper/25"
                title="Click to rename"
                value={meta.name}
                onChange={(e) => setMeta((m) => ({ ...m, name: e.target.value }))}
              />
              {serverErrors.name ? <p className="text-xs text-bad">{serverErrors.name.join(" ")}</p> : null}
              <input
                aria-label="Description"
                className="w-full max-w-4xl rounded border border-transparent bg-transparent px-1 text-sm text-muted hover:border-rule focus:border-copper focus:outline-none focus:ring-2 focus:ring-copper/25"
                placeholder="Add a description"
                title="Click to edit the description"
                value={meta.description}
                onChange={(e) => setMeta((m) => ({ ...m, description: e.target.value }))}
              />
            </div>
          )}
        </div>
        <div className="no-print flex flex-wrap items-center gap-2">
          <ButtonLink variant="secondary" href={`/teams/${b.teamId}/scenarios?baselineId=${b.id}`}>
            Scenarios ({scenarios.length})
          </ButtonLink>
          {!readOnly ? (
            <>
              <Button variant="secondary" onClick={duplicate} disabled={busy}>
                Duplicate baseline
              </Button>
              <Button onClick={save} disabled={busy || clientInvalid || !(classesDirty || metaDirty)} data-testid="save-baseline">
                {busy ? "Saving…" : "Save"}
              </Button>
              {canDelete ? <ConfirmDelete question={`Delete with its ${scenarios.length} scenario(s)?`} onDelete={remove} busy={busy} /> : null}
            </>
          ) : (
            <Badge>Read only — you are a viewer</Badge>
          )}
        </div>
      </header>
      <CsvLinks teamId={b.teamId} baselineId={b.id} canImport={!readOnly} />
      <BaselineWarnings baselineId={b.id} initial={warnings} canDismiss={!readOnly} />
      {stale !== null ? (
        <Notice tone="warn" role="alert">
          <p className="font-medium">Someone saved this baseline while you were editing (now version {stale}). Nothing was overwritten.</p>
          <div className="mt-2 flex gap-2">
            <Button variant="secondary" onClick={reloadTheirs}>
              Reload theirs
            </Button>
            <Button onClick={saveAsCopy} disabled={busy || clientInvalid}>
              Save mine as a copy
            </Button>
          </div>
        </Notice>
      ) : null}
      {msg ? <Notice tone={msg.tone}>{msg.text}</Notice> : null}
      {!readOnly && clientInvalid ? <Notice tone="warn">Some cells are not valid yet (marked in red); fix them to save.</Notice> : null}

      <Card title="Technology">
        <div className="grid grid-cols-2 gap-3 sm:grid-cols-5">
          {readOnly ? (
            <>
              <Fact label="Supply" value={`${formatValue(tech.supplyV, U.V)} V`} />
              <Fact label="Clock" value={`${formatValue(tech.clockHz, U.GHz)} GHz`} />
              <Fact label="Repeater R0" value={`${formatValue(tech.repeaterR0Ohm, U.ohm)} Ω`} />
              <Fact label="Repeater C0" value={`${formatValue(tech.repeaterC0F, U.fF)} fF`} />
              <Fact label="Delay budget" value={`${formatValue(tech.delayBudgetS, U.ps)} ps`} />
            </>
          ) : (
            <>
              <NumberField
                label="Supply"
                unit={U.V}
                value={tech.supplyV}
                onChange={(v) => setTech("supplyV", v)}
                check={(v) => (v <= 0 || v > 5 ? "Supply must be between 0 and 5 V." : undefined)}
                errors={serverErrors["technology.supplyV"]}
              />
              <NumberField
                label="Clock"
                unit={U.GHz}
                value={tech.clockHz}
                onChange={(v) => setTech("clockHz", v)}
                check={(v) => (v <= 0 ? "Clock must be greater than 0." : undefined)}
                errors={serverErrors["technology.clockHz"]}
              />
              <NumberField
                label="Repeater R0"
                unit={U.ohm}
                value={tech.repeaterR0Ohm}
                onChange={(v) => setTech("repeaterR0Ohm", v)}
                check={(v) => (v <= 0 ? "R0 must be greater than 0." : undefined)}
                errors={serverErrors["technology.repeaterR0Ohm"]}
              />
              <NumberField
                label="Repeater C0"
                unit={U.fF}
                value={tech.repeaterC0F}
                onChange={(v) => setTech("repeaterC0F", v)}
                check={(v) => (v <= 0 ? "C0 must be greater than 0." : undefined)}
                errors={serverErrors["technology.repeaterC0F"]}
              />
              <NumberField
                label="Delay budget"
                unit={U.ps}
                value={tech.delayBudgetS}
                onChange={(v) => setTech("delayBudgetS", v)}
                check={(v) => (v <= 0 ? "Budget must be greater than 0." : undefined)}
                errors={serverErrors["technology.delayBudgetS"]}
              />
            </>
          )}
        </div>
        <h3 className="mb-2 mt-4 text-xs font-semibold uppercase tracking-wide text-muted">Operating point and repeaters</h3>
        <div className="grid grid-cols-2 gap-3 sm:grid-cols-3 lg:grid-cols-6" data-testid="technology-engine2">
          {readOnly ? (
            <>
              <Fact label="Temperature" value={`${formatValue(tech.temperatureC ?? DEFAULT_TEMPERATURE_C, U.none)} °C`} />
              <Fact label="Delay model" value={DELAY_MODEL_LABEL[tech.delayModel ?? "exact"]} />
              <Fact label="Capacitance model" value={CAPACITANCE_CHOICE_LABEL[tech.capacitanceModel ?? "accurate"]} />
              <Fact label="Minimum repeater gain" value={`${formatValue(gainPct, U.none)} %`} />
              <Fact label="Repeater output-C ratio γ" value={formatValue(tech.repeaterOutputCRatio ?? DEFAULT_OUTPUT_C_RATIO, U.none)} />
              <Fact label="Minimum repeater area" value={`${formatValue(areaUm2, U.none)} µm²`} />
              <Fact label="Leakage per repeater" value={`${formatValue(leakNW, U.none)} nW`} />
            </>
          ) : (
            <>
              <NumberField
                label="Operating temperature"
                unit={DEG_C}
                name="temperatureC"
                value={tech.temperatureC ?? DEFAULT_TEMPERATURE_C}
                onChange={(v) => setTech("temperatureC", v)}
                check={(v) => (v <= -273.15 || v > 400 ? "Temperature must be above −273.15 °C and at most 400 °C." : undefined)}
                hint="Of the wiring; sets the metals' resistivity (default 25 °C)."
                errors={techErr("temperatureC")}
              />
              <div>
                <label htmlFor="delay-model" className="mb-1 block text-xs font-medium text-ink">
                  Delay model
                </label>
                <select
                  id="delay-model"
                  name="delayModel"
                  aria-describedby="delay-model-hint"
                  className={inputClass}
                  value={tech.delayModel ?? "exact"}
                  onChange={(e) => setTech("delayModel", e.target.value as DelayModel)}
                >
                  <option value="exact">{DELAY_MODEL_LABEL.exact}</option>
                  <option value="sakurai">{DELAY_MODEL_LABEL.sakurai}</option>
                </select>
                <p id="delay-model-hint" className="mt-0.5 text-[11px] text-muted">
                  Exact distributed line, or Sakurai&apos;s closed form (0–3% lower).
                </p>
                {techErr("delayModel") ? <p className="text-[11px] text-bad">{techErr("delayModel")!.join(" ")}</p> : null}
              </div>
              <div>
                <label htmlFor="capacitance-model" className="mb-1 block text-xs font-medium text-ink">
                  Capacitance model
                </label>
                <select
                  id="capacitance-model"
                  name="capacitanceModel"
                  aria-describedby="capacitance-model-hint"
                  className={inputClass}
                  value={tech.capacitanceModel ?? "accurate"}
                  onChange={(e) => setTech("capacitanceModel", e.target.value as CapacitanceChoice)}
                >
                  <option value="accurate">{CAPACITANCE_CHOICE_LABEL.accurate}</option>
                  <option value="published">{CAPACITANCE_CHOICE_LABEL.published}</option>
                </select>
                <p id="capacitance-model-hint" className="mt-0.5 text-[11px] text-muted">
                  At the coupled and full levels. Tables: within 1% of our field solver; published forms: 2–15% off. Air-gapped classes always use the tables.
                </p>
                {techErr("capacitanceModel") ? <p className="text-[11px] text-bad">{techErr("capacitanceModel")!.join(" ")}</p> : null}
              </div>
              <NumberField
                label="Minimum repeater gain"
                unit={PERCENT}
                name="minRepeaterGain"
                value={gainPct}
                onChange={(v) => setTech("minRepeaterGain", toSI(v, 0.01))}
                check={(v) => (v < 0 || v >= 100 ? "Gain must be from 0 to less than 100 %." : undefined)}
                hint="Repeaters only where they cut a net's delay by this much (default 10 %)."
                errors={techErr("minRepeaterGain")}
              />
              <NumberField
                label="Repeater output-C ratio γ"
                name="repeaterOutputCRatio"
                value={tech.repeaterOutputCRatio ?? DEFAULT_OUTPUT_C_RATIO}
                onChange={(v) => setTech("repeaterOutputCRatio", v)}
                check={(v) => (v < 0 || v > 10 ? "γ must be between 0 and 10." : undefined)}
                hint="Output (diffusion) capacitance ÷ input capacitance (default 0.5)."
                errors={techErr("repeaterOutputCRatio")}
              />
              <NumberField
                label="Minimum repeater area"
                unit={UM2}
                name="repeaterAreaM2"
                value={areaUm2}
                onChange={(v) => setTech("repeaterAreaM2", toSI(v, 1e-12))}
                check={(v) => (v < 0 || v > 1e6 ? "Area must be between 0 and 10⁶ µm²." : undefined)}
                hint="Layout area of a minimum-size repeater; size h takes h times it (default 0.1 µm²)."
                errors={techErr("repeaterAreaM2")}
              />
              <NumberField
                label="Leakage per repeater"
                unit={NW}
                name="repeaterLeakageW"
                value={leakNW}
                onChange={(v) => setTech("repeaterLeakageW", toSI(v, 1e-9))}
                check={(v) => (v < 0 || v > 1e9 ? "Leakage must be between 0 and 1 W." : undefined)}
                hint="Of a minimum-size repeater, added to power (default 0 nW)."
                errors={techErr("repeaterLeakageW")}
              />
            </>
          )}
        </div>
        <h3 className="mb-2 mt-5 text-xs font-semibold uppercase tracking-wide text-muted">Materials and calibration</h3>
        <MaterialsPanel
          baselineId={b.id}
          classes={b.classes}
          technology={tech}
          onChange={(t) => setMeta((m) => ({ ...m, technology: t }))}
          readOnly={readOnly}
          classesDirty={classesDirty}
          errors={serverErrors}
        />
      </Card>

      <Card
        title="Wire classes"
        actions={
          !readOnly ? (
            <Button
              variant="secondary"
              onClick={() =>
                setRows((rs) => [
                  ...rs,
                  toRow({
                    name: freeName("New class"),
                    tier: "intermediate",
                    widthM: 40e-9,
                    thicknessM: 80e-9,
                    spacingM: 40e-9,
                    ildBelowM: 80e-9,
                    ildAboveM: 80e-9,
                    barrierM: 2e-9,
                    metal: "Cu",
                    k: 2.7,
                    netCount: 1000,
                    meanLengthM: 50e-6,
                    driverOhm: 2000,
                    loadF: 1e-15,
                    activity: 0.1,
                  }),
                ])
              }
            >
              Add class
            </Button>
          ) : null
        }
      >
        <p className="mb-2 text-xs text-muted">
          {readOnly
            ? "Values in the unit under each column heading."
            : "Type values in the unit under each column heading, or with any SI prefix (“0.02 µm” in a nm column)."}{" "}
          Empty ILD = no plane on that side.{" "}
          {showVias
            ? "Vias are optional: empty = no vias; empty via R = computed from the via's width and height (empty = the line's width and the ILD below). "
            : ""}
          {showGap
            ? "Air gap between neighbouring lines (optional): k gap from the bottom of the lines up to the gap fraction of the thickness; the ILD below and above keeps k. Both empty = no gap; only a fraction = air (k gap 1); only k gap = the whole thickness. "
            : ""}
          <label className="no-print ml-1 inline-flex items-center gap-1 text-ink">
            <input type="checkbox" checked={showVias} onChange={(e) => setShowVias(e.target.checked)} data-testid="show-vias" />
            Via columns
          </label>
          <label className="no-print ml-3 inline-flex items-center gap-1 text-ink">
            <input type="checkbox" checked={showGap} onChange={(e) => setShowGap(e.target.checked)} data-testid="show-air-gap" />
            Air-gap columns
          </label>
        </p>
        {/* Scrolls sideways only on narrow screens; the class name stays pinned on the left. */}
        <div className="relative overflow-x-auto" role="region" aria-label="Wire class table" tabIndex={-1}>
          <table className="num w-full text-xs" data-testid="class-table">
            <thead className="text-muted">
              <tr className="border-b border-rule-strong align-bottom">
                <th scope="col" className={`${STICKY} py-1 pr-1 text-left font-medium`}>
                  Class
                </th>
                <th scope="col" className="px-1 py-1 text-left font-medium">
                  Tier
                </th>
                <th scope="col" className="px-1 py-1 text-left font-medium">
                  Metal
                </th>
                {shownCols.map((c) => (
                  <th key={c.key} scope="col" className={`${NUM_PAD} py-1 text-right font-medium leading-tight`} title={c.title}>
                    {c.label}
                    <span className="block text-[10px] font-normal text-faint">{c.unit.label || "\u00a0"}</span>
                  </th>
                ))}
                <th scope="col" className="px-1 py-1 text-right font-medium leading-tight" title="Imported length-histogram bins">
                  Hist.
                  <span className="block text-[10px] font-normal text-faint">bins</span>
                </th>
                {!readOnly ? (
                  <th scope="col" className="py-1 pl-1 font-medium">
                    <span className="sr-only">Row actions</span>
                  </th>
                ) : null}
              </tr>
            </thead>
            <tbody>
              {rows.map((r, i) => (
                <tr key={r.key} className="border-b border-rule/60 align-top">
                  {readOnly ? (
                    <>
                      <th scope="row" className={`${STICKY} py-1 pr-1 text-left font-medium`}>
                        {r.name}
                      </th>
                      <td className="px-1 py-1">{r.tier}</td>
                      <td className="px-1 py-1">{r.metal}</td>
                      {shownCols.map((c) => (
                        <td key={c.key} className={`tabular ${NUM_PAD} py-1 text-right`}>
                          {r.cells[c.key] || "—"}
                        </td>
                      ))}
                      <td className="tabular px-1 py-1 text-right">{r.histogramBins || "—"}</td>
                    </>
                  ) : (
                    <>
                      <td className={`${STICKY} py-0.5 pr-1`}>
                        <Cell label={`Name of row ${i + 1}`} value={r.name} onChange={(v) => update(i, { name: v })} errors={cellErr(i, "name")} width="w-24" />
                      </td>
                      <td className="px-1 py-0.5">
                        <div className="w-[7.25rem]">
                          <select
                            aria-label={`Tier of ${r.name}`}
                            className={`${inputClass} px-1 py-1 text-xs`}
                            value={r.tier}
                            onChange={(e) => update(i, { tier: e.target.value as Tier })}
                          >
                            {TIERS.map((t) => (
                              <option key={t} value={t}>
                                {t}
                              </option>
                            ))}
                          </select>
                        </div>
                      </td>
                      <td className="px-1 py-0.5">
                        <div className="w-16">
                          <select
                            aria-label={`Metal of ${r.name}`}
                            className={`${inputClass} px-1 py-1 text-xs`}
                            value={r.metal}
                            onChange={(e) => update(i, { metal: e.target.value })}
                          >
                            {Object.keys(METALS).map((m) => (
                              <option key={m} value={m}>
                                {m}
                              </option>
                            ))}
                          </select>
                        </div>
                        {cellErr(i, "metal").length ? <p className="text-[11px] text-bad">{cellErr(i, "metal").join(" ")}</p> : null}
                      </td>
                      {shownCols.map((c) => (
                        <td key={c.key} className={`${NUM_PAD} py-0.5`}>
                          <Cell
                            label={`${c.label} of ${r.name}${c.unit.label ? ` (${c.unit.label})` : ""}`}
                            value={r.cells[c.key]}
                            onChange={(v) => setCell(i, c.key, v)}
                            errors={cellErr(i, c.key)}
                            numeric
                            placeholder={c.optional ? "none" : c.omit ? "—" : ""}
                            width={c.width}
                            dense={c.group !== undefined}
                          />
                        </td>
                      ))}
                      <td
                        className="tabular px-1 py-1.5 text-right text-muted"
                        title={r.histogramBins ? "Kept while the class keeps its row (renames included)" : undefined}
                      >
                        {r.histogramBins || "—"}
                      </td>
                      <td className="whitespace-nowrap py-0.5 pl-1">
                        <IconButton label={`Move ${r.name} up`} onClick={() => move(i, -1)} disabled={i === 0}>
                          ↑
                        </IconButton>
                        <IconButton label={`Move ${r.name} down`} onClick={() => move(i, 1)} disabled={i === rows.length - 1}>
                          ↓
                        </IconButton>
                        <IconButton
                          label={`Duplicate ${r.name}`}
                          onClick={() =>
                            setRows((rs) => [
                              ...rs.slice(0, i + 1),
                              { ...r, key: `r${++rowSeq}`, id: undefined, name: freeName(`${r.name} copy`), histogramBins: 0 },
                              ...rs.slice(i + 1),
                            ])
                          }
                        >
                          +
                        </IconButton>
                        <IconButton label={`Delete ${r.name}`} onClick={() => setRows((rs) => rs.filter((_, j) => j !== i))}>
                          ✕
                        </IconButton>
                      </td>
                    </>
                  )}
                </tr>
              ))}
            </tbody>
          </table>
          {rows.length === 0 ? <p className="py-4 text-center text-sm text-muted">No classes yet.{readOnly ? "" : " Add one, or import a CSV."}</p> : null}
        </div>
      </Card>
      <StackView
        baseline={b}
        version={version}
        readOnly={readOnly}
        locked={classesDirty}
        onSaved={(nb) => {
          setRows(nb.classes.map(toRow));
          setVersion(nb.version);
          void mutate({ baseline: nb }, { revalidate: false });
        }}
        onStale={(v) => setStale(v)}
      />
      <BaselineHistory id={b.id} version={b.version} />
    </div>
  );
}

/** CSV import (editors and owners) and export (everyone) of this baseline. */
function CsvLinks({ teamId, baselineId, canImport }: { teamId: string; baselineId: string; canImport: boolean }) {
  const link = "text-copper-dark underline-offset-2 hover:underline";
  const importBase = `/teams/${teamId}/baselines/${baselineId}/import`;
  return (
    <nav aria-label="CSV import and export" className="no-print flex flex-wrap items-center gap-x-4 gap-y-1 text-xs" data-testid="baseline-csv-links">
      {canImport ? (
        <span className="flex flex-wrap items-center gap-x-2">
          <span className="text-muted">Import CSV:</span>
          <Link className={link} href={importBase}>
            wire classes
          </Link>
          <span className="text-faint" aria-hidden="true">
            ·
          </span>
          <Link className={link} href={`${importBase}?kind=histograms`}>
            length histograms
          </Link>
          <span className="text-faint" aria-hidden="true">
            ·
          </span>
          <Link className={link} href="/help/csv">
            format reference
          </Link>
        </span>
      ) : null}
      <span className="flex flex-wrap items-center gap-x-2">
        <span className="text-muted">Export CSV:</span>
        <a className={link} href={`/api/baselines/${baselineId}/export.csv`} download>
          wire classes
        </a>
        <span className="text-faint" aria-hidden="true">
          ·
        </span>
        <a className={link} href={`/api/baselines/${baselineId}/histograms/export.csv`} download>
          length histograms
        </a>
      </span>
    </nav>
  );
}

/** Horizontal padding of the numeric columns (4 px between the inputs; inputs keep their own padding). */
const NUM_PAD = "px-0.5";

/** The class-name column stays in view when the table scrolls sideways on narrow screens. */
const STICKY = "sticky left-0 z-[1] bg-panel shadow-[1px_0_0_var(--color-rule)]";

const DELAY_MODEL_LABEL: Record<DelayModel, string> = { exact: "Exact (distributed line)", sakurai: "Sakurai's closed form" };
// Display units whose numbers the editor converts itself (exactly, with decimal.js): the field works in these units.
const DEG_C: DisplayUnit = { label: "°C", unitSI: 1, base: "", suffix: "" };
const PERCENT: DisplayUnit = { label: "%", unitSI: 1, base: "", suffix: "" };
const UM2: DisplayUnit = { label: "µm²", unitSI: 1, base: "", suffix: "" };
const NW: DisplayUnit = { label: "nW", unitSI: 1, base: "", suffix: "" };
const toDisplay = (si: number, unitSI: number) => new Decimal(si).div(unitSI).toNumber();
const toSI = (shown: number, unitSI: number) => new Decimal(shown).times(unitSI).toNumber();

function Fact({ label, value }: { label: string; value: string }) {
  return (
    <div>
      <div className="text-xs text-muted">{label}</div>
      <div className="tabular text-sm text-ink">{value}</div>
    </div>
  );
}

function Cell({
  label,
  value,
  onChange,
  errors,
  numeric,
  placeholder,
  width,
  dense,
}: {
  label: string;
  value: string;
  onChange: (v: string) => void;
  errors: string[];
  numeric?: boolean;
  placeholder?: string;
  width: string;
  /** Narrow inner padding (the optional columns: more digits in less width). */
  dense?: boolean;
}) {
  return (
    <div className={width}>
      <input
        aria-label={label}
        value={value}
        placeholder={placeholder}
        onChange={(e) => onChange(e.target.value)}
        aria-invalid={errors.length ? true : undefined}
        inputMode={numeric ? "decimal" : undefined}
        className={`${inputClass} ${dense ? "px-1!" : "px-1"} py-1 text-xs ${numeric ? "tabular text-right" : ""}`}
      />
      {errors.length ? <p className="mt-0.5 text-[11px] leading-tight text-bad">{errors.join(" ")}</p> : null}
    </div>
  );
}

function IconButton({ label, children, ...props }: { label: string; children: React.ReactNode; onClick: () => void; disabled?: boolean }) {
  return (
    <button
      type="button"
      aria-label={label}
      title={label}
      className="rounded px-1 py-0.5 text-muted hover:bg-rule/60 hover:text-ink disabled:opacity-30"
      {...props}
    >
      {children}
    </button>
  );
}

function BaselineHistory({ id, version }: { id: string; version: number }) {
  const { data } = useSWR<{ revisions: BaselineRevision[] }>(swrKeys.baselineRevisions(id, version), fetchJson);
  return (
    <Card title="History">
      {!data ? (
        <p className="text-xs text-muted">Loading…</p>
      ) : (
        <ol className="divide-y divide-rule text-xs">
          {data.revisions.map((r) => (
            <li key={r.id} className="flex gap-3 py-1.5">
              <span className="tabular w-8 font-semibold">v{r.version}</span>
              <span className="flex-1">{r.summary}</span>
              <span className="text-muted">
                {r.userName ?? "someone"} · {new Date(r.at).toLocaleString("en-GB", { dateStyle: "medium", timeStyle: "short" })}
              </span>
            </li>
          ))}
        </ol>
      )}
    </Card>
  );
}

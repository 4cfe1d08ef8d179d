"use client";
import Link from "next/link";
import { useRouter } from "next/navigation";
import { useMemo, useState } from "react";
import useSWR from "swr";
import type { BaselineRevision, BaselineWithClasses } from "@/db/queries/baselines";
import type { StoredWireClass } from "@/db/queries/wire-classes";
import type { Role } from "@/lib/access";
import { METALS, TIERS, type Technology, type Tier, type WireClass } from "@/lib/scaling";
import { ApiRequestError, apiSend, errorMessage, fetchJson, staleVersionOf } from "@/lib/api-client";
import { swrKeys } from "@/lib/swr-keys";
import { Button, ButtonLink } from "@/components/ui/button";
import { Badge, Card, Notice } from "@/components/ui/card";
import { inputClass } from "@/components/ui/field";
import { NumberField } from "./number-field";
import { U, formatValue, parseValue, type DisplayUnit } from "./units";
import { ConfirmDelete } from "@/components/ui/confirm-delete";

type NumKey =
  "widthM" | "thicknessM" | "spacingM" | "ildBelowM" | "ildAboveM" | "barrierM" | "k" | "netCount" | "meanLengthM" | "driverOhm" | "loadF" | "activity";
// Input widths per column (Tailwind classes) keep the editable table within a 1280 px layout.
const NUM_COLS: { key: NumKey; label: string; unit: DisplayUnit; optional?: boolean; int?: boolean; width: string }[] = [
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

let rowSeq = 0;
function toRow(c: StoredWireClass | (WireClass & { id?: string; histogramBins?: number })): Row {
  const cells = {} as Record<NumKey, string>;
  for (const col of NUM_COLS) cells[col.key] = formatValue(c[col.key] as number | null, col.unit);
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
    const p = parseValue(t, col.unit);
    if (!p.ok) {
      errors[col.key] = p.message;
      continue;
    }
    if (p.value < 0) errors[col.key] = `${col.label} must not be negative.`;
    else if (col.int && !Number.isInteger(p.value)) errors[col.key] = `${col.label} must be a whole number.`;
    else if (col.key === "k" && p.value < 1) errors[col.key] = "k must be at least 1 (vacuum).";
    else if (col.key === "activity" && p.value > 1) errors[col.key] = "Activity must be between 0 and 1.";
    else if (["widthM", "thicknessM", "spacingM", "meanLengthM", "ildBelowM", "ildAboveM"].includes(col.key) && p.value === 0)
      errors[col.key] = `${col.label} must be greater than 0.`;
    out[col.key] = p.value;
  }
  return { value: Object.keys(errors).length ? undefined : out, errors };
}

export function BaselineEditor({
  initial,
  role,
  userId,
  scenarios,
}: {
  initial: BaselineWithClasses;
  role: Role;
  userId: string;
  scenarios: { id: string; name: string }[];
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
  const metaDirty = meta.name !== b.name || meta.description !== b.description || JSON.stringify(meta.technology) !== JSON.stringify(b.technology);

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
  const setTech = (k: keyof Technology, v: number) => setMeta((m) => ({ ...m, technology: { ...m.technology, [k]: v } }));

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
          Empty ILD = no plane on that side.
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
                {NUM_COLS.map((c) => (
                  <th key={c.key} scope="col" className="px-1 py-1 text-right font-medium leading-tight">
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
                      {NUM_COLS.map((c) => (
                        <td key={c.key} className="tabular px-1 py-1 text-right">
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
                      {NUM_COLS.map((c) => (
                        <td key={c.key} className="px-1 py-0.5">
                          <Cell
                            label={`${c.label} of ${r.name}${c.unit.label ? ` (${c.unit.label})` : ""}`}
                            value={r.cells[c.key]}
                            onChange={(v) => setCell(i, c.key, v)}
                            errors={cellErr(i, c.key)}
                            numeric
                            placeholder={c.optional ? "none" : ""}
                            width={c.width}
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

/** The class-name column stays in view when the table scrolls sideways on narrow screens. */
const STICKY = "sticky left-0 z-[1] bg-panel shadow-[1px_0_0_var(--color-rule)]";

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
}: {
  label: string;
  value: string;
  onChange: (v: string) => void;
  errors: string[];
  numeric?: boolean;
  placeholder?: string;
  width: string;
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
        className={`${inputClass} px-1 py-1 text-xs ${numeric ? "tabular text-right" : ""}`}
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

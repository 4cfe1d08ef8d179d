"use client";
import { memo, useState } from "react";
import { METALS, ownEntry, type AirGap, type ClassOverride, type ScenarioSettings, type WireClass } from "@/lib/scaling/client";
import { inputClass } from "@/components/ui/field";
import { DEFAULT_AIR_GAP, DielectricField, gapFractionCheck, kGapCheck } from "./settings-panel";
import { formatValue, parseValue, U, type DisplayUnit } from "./units";

type NumKey = "s" | "sL" | "aspectRatio" | "miller" | "barrierM";
const CHECK: Record<NumKey, (v: number) => string | undefined> = {
  s: (v) => (v <= 0 ? "S must be greater than 0." : v > 20 ? "S must be at most 20." : undefined),
  sL: (v) => (v <= 0 ? "S_L must be greater than 0." : v > 20 ? "S_L must be at most 20." : undefined),
  aspectRatio: (v) => (v <= 0 ? "Aspect ratio must be greater than 0." : v > 10 ? "Aspect ratio must be at most 10." : undefined),
  miller: (v) => (v < 0 || v > 2 ? "Miller factor must be between 0 and 2." : undefined),
  barrierM: (v) => (v < 0 ? "Barrier must not be negative." : v > 1e-6 ? "Barrier must be at most 1 µm." : undefined),
};

/**
 * Per-class overrides of the global settings; an empty cell inherits. Memoised on the overrides and the global k: a drag
 * of S or another global setting does not render its inputs again.
 */
export const ClassOverrides = memo(function ClassOverrides({
  overrides: current,
  globalK,
  onOverrides,
  classes,
  readOnly,
  errors,
}: {
  overrides: ScenarioSettings["overrides"];
  globalK: ScenarioSettings["k"];
  /** The new overrides (the rest of the settings unchanged). */
  onOverrides: (o: ScenarioSettings["overrides"]) => void;
  classes: WireClass[];
  readOnly: boolean;
  errors: Record<string, string[]>;
}) {
  const setO = (name: string, patch: Partial<ClassOverride>) => {
    const next: ClassOverride = { ...(ownEntry(current, name) ?? {}), ...patch };
    for (const k of Object.keys(next) as (keyof ClassOverride)[]) if (next[k] === undefined) delete next[k];
    const overrides = { ...current };
    if (Object.keys(next).length === 0) delete overrides[name];
    else overrides[name] = next;
    onOverrides(overrides);
  };
  const show = (v: unknown) => (v === undefined ? <span className="text-faint">—</span> : String(v));
  return (
    <div className="overflow-x-auto">
      <table className="num w-full text-xs">
        <caption className="sr-only">Per-class overrides</caption>
        <thead className="text-left text-muted">
          <tr className="border-b border-rule">
            <th className="py-1 pr-2 font-medium">Class</th>
            <th className="px-1 text-right font-medium">S</th>
            <th className="px-1 text-right font-medium">S_L</th>
            <th className="px-1 font-medium">k</th>
            <th className="px-1 font-medium">Metal</th>
            <th className="px-1 font-medium">Barrier</th>
            <th className="px-1 text-right font-medium">Barrier nm</th>
            <th className="px-1 text-right font-medium">T/W</th>
            <th className="px-1 text-right font-medium">Miller</th>
            <th
              className="px-1 font-medium"
              title="Air gap between the lines: — follows the global setting (or the baseline class), none = no gap, custom = k gap and fraction"
            >
              Air gap
            </th>
          </tr>
        </thead>
        <tbody>
          {classes.map((c) => {
            const o = ownEntry(current, c.name) ?? {};
            const e = (k: string) => errors[`settings.overrides.${c.name}.${k}`];
            if (readOnly)
              return (
                <tr key={c.name} className="border-b border-rule/60">
                  <th scope="row" className="py-1 pr-2 text-left font-medium">
                    {c.name}
                  </th>
                  <td className="px-1 text-right">{show(o.s)}</td>
                  <td className="px-1 text-right">{show(o.sL)}</td>
                  <td className="px-1">{show(o.k)}</td>
                  <td className="px-1">{show(o.metal)}</td>
                  <td className="px-1">{o.barrierScales === undefined ? show(undefined) : o.barrierScales ? "scales" : "fixed"}</td>
                  <td className="px-1 text-right">{o.barrierM === undefined ? show(undefined) : formatValue(o.barrierM, U.nm)}</td>
                  <td className="px-1 text-right">{show(o.aspectRatio)}</td>
                  <td className="px-1 text-right">{show(o.miller)}</td>
                  <td className="px-1">{showGap(o.airGap)}</td>
                </tr>
              );
            return (
              <tr key={c.name} className="border-b border-rule/60 align-top">
                <th scope="row" className="pb-1 pr-2 pt-2.5 text-left font-medium">
                  {c.name}
                </th>
                {(["s", "sL"] as const).map((k) => (
                  <td key={k} className="px-1 py-0.5">
                    <OptionalNumber
                      label={`${k === "s" ? "S" : "S_L"} for ${c.name}`}
                      fit
                      value={o[k]}
                      onChange={(v) => setO(c.name, { [k]: v })}
                      check={CHECK[k]}
                      errors={e(k)}
                    />
                  </td>
                ))}
                <td className="px-1 py-0.5">
                  <DielectricField
                    compact
                    label={`k for ${c.name}`}
                    value={o.k ?? null}
                    onChange={(k) => setO(c.name, { k: k ?? undefined })}
                    errors={e("k")}
                  />
                </td>
                <td className="px-1 py-0.5">
                  <select
                    aria-label={`Metal for ${c.name}`}
                    className={`${inputClass} px-1 py-1 text-xs`}
                    value={o.metal ?? ""}
                    onChange={(ev) => setO(c.name, { metal: ev.target.value || undefined })}
                  >
                    <option value="">—</option>
                    {Object.keys(METALS).map((m) => (
                      <option key={m} value={m}>
                        {m}
                      </option>
                    ))}
                  </select>
                </td>
                <td className="px-1 py-0.5">
                  <select
                    aria-label={`Barrier for ${c.name}`}
                    className={`${inputClass} px-1 py-1 text-xs`}
                    value={o.barrierScales === undefined ? "" : o.barrierScales ? "scales" : "fixed"}
                    onChange={(ev) => setO(c.name, { barrierScales: ev.target.value === "" ? undefined : ev.target.value === "scales" })}
                  >
                    <option value="">—</option>
                    <option value="fixed">fixed</option>
                    <option value="scales">scales</option>
                  </select>
                </td>
                <td className="px-1 py-0.5">
                  <OptionalNumber
                    label={`Barrier thickness for ${c.name} (nm)`}
                    unit={U.nm}
                    value={o.barrierM}
                    onChange={(v) => setO(c.name, { barrierM: v })}
                    check={CHECK.barrierM}
                    errors={e("barrierM")}
                  />
                </td>
                {(["aspectRatio", "miller"] as const).map((k) => (
                  <td key={k} className="px-1 py-0.5">
                    <OptionalNumber
                      label={`${k === "miller" ? "Miller factor" : "Aspect ratio"} for ${c.name}`}
                      value={o[k]}
                      onChange={(v) => setO(c.name, { [k]: v })}
                      check={CHECK[k]}
                      errors={e(k)}
                    />
                  </td>
                ))}
                <td className="px-1 py-0.5">
                  <AirGapOverride
                    name={c.name}
                    value={o.airGap}
                    classK={o.k ?? globalK ?? c.k}
                    onChange={(airGap) => setO(c.name, { airGap })}
                    errors={e("airGap")}
                    fieldErrors={(k) => e(`airGap.${k}`)}
                  />
                </td>
              </tr>
            );
          })}
        </tbody>
      </table>
      <p className="mt-1 text-[11px] text-muted">
        Empty cells follow the global settings. Barrier nm replaces the barrier thickness (0 = barrier-free fill). k accepts an effective value for air gaps
        (first-order); Air gap puts the gap between the lines as geometry: none = no gap for this class, custom = the gap&apos;s k (1 = air) and the share of
        the line thickness it covers from the bottom (empty = 1).
      </p>
    </div>
  );
});

const num = (v: number) => String(Number(v.toPrecision(6)));
function showGap(g: AirGap | null | undefined) {
  if (g === undefined) return <span className="text-faint">—</span>;
  if (g === null) return "none";
  return `k ${num(g.kGap)} × ${num(g.gapFraction)} T`;
}

/** Per-class air gap: follow (absent), none (null) or custom (k gap and fraction; an empty field is its default, 1). */
function AirGapOverride({
  name,
  value,
  classK,
  onChange,
  errors,
  fieldErrors,
}: {
  name: string;
  value: AirGap | null | undefined;
  classK: number;
  onChange: (g: AirGap | null | undefined) => void;
  errors?: string[];
  fieldErrors: (k: "kGap" | "gapFraction") => string[] | undefined;
}) {
  const mode = value === undefined ? "" : value === null ? "none" : "custom";
  // a default shows as an empty field (placeholder 1), so clearing a field means its default
  const shown = (v: number, d: number) => (v === d ? undefined : v);
  return (
    <div className="w-[5.5rem]">
      <select
        aria-label={`Air gap for ${name}`}
        className={`${inputClass} px-1 py-1 text-xs`}
        value={mode}
        onChange={(ev) => onChange(ev.target.value === "" ? undefined : ev.target.value === "none" ? null : (value ?? DEFAULT_AIR_GAP))}
      >
        <option value="">—</option>
        <option value="none">none</option>
        <option value="custom">custom</option>
      </select>
      {value ? (
        <div className="mt-0.5 flex gap-1">
          <OptionalNumber
            label={`Air-gap k for ${name}`}
            className="w-10"
            placeholder="1"
            value={shown(value.kGap, DEFAULT_AIR_GAP.kGap)}
            onChange={(v) => onChange({ ...value, kGap: v ?? DEFAULT_AIR_GAP.kGap })}
            check={(v) => kGapCheck(v) ?? (v > classK ? `Air-gap k must not exceed this class's k (${num(classK)}).` : undefined)}
            errors={fieldErrors("kGap")}
          />
          <OptionalNumber
            label={`Gap fraction for ${name}`}
            className="w-10"
            placeholder="1"
            value={shown(value.gapFraction, DEFAULT_AIR_GAP.gapFraction)}
            onChange={(v) => onChange({ ...value, gapFraction: v ?? DEFAULT_AIR_GAP.gapFraction })}
            check={gapFractionCheck}
            errors={fieldErrors("gapFraction")}
          />
        </div>
      ) : null}
      {errors?.length ? <p className="text-[11px] text-bad">{errors.join(" ")}</p> : null}
    </div>
  );
}

function OptionalNumber({
  label,
  value,
  onChange,
  check,
  errors,
  unit = U.none,
  className = "w-16",
  placeholder = "—",
  fit = false,
}: {
  /** Grow with the text (at least the class's width), so a derived 1.428571429 shows whole instead of "1.4285". */
  fit?: boolean;
  unit?: DisplayUnit;
  className?: string;
  placeholder?: string;
  label: string;
  value: number | undefined;
  onChange: (v: number | undefined) => void;
  check: (v: number) => string | undefined;
  errors?: string[];
}) {
  const [text, setText] = useState(value === undefined ? "" : formatValue(value, unit));
  const [msg, setMsg] = useState<string | undefined>();
  // Follow a new value from outside (adjusted while rendering, not in an effect): keep the text when it already says it.
  const [shown, setShown] = useState(value);
  if (!Object.is(shown, value)) {
    setShown(value);
    const p = parseValue(text, unit);
    if ((value === undefined && text.trim() !== "") || (value !== undefined && (!p.ok || p.value !== value))) {
      setText(value === undefined ? "" : formatValue(value, unit));
      setMsg(undefined);
    }
  }
  const all = [...(msg ? [msg] : []), ...(errors ?? [])];
  return (
    <div className={fit ? "min-w-16" : className}>
      <input
        aria-label={label}
        title={text || undefined}
        // the width in the input's own ch (its font), so a derived value shows whole
        style={fit ? { width: `calc(${Math.max(5, text.length) + 1}ch + 1rem)` } : undefined}
        inputMode="decimal"
        value={text}
        placeholder={placeholder}
        aria-invalid={all.length ? true : undefined}
        className={`${inputClass} tabular px-1 py-1 text-right text-xs`}
        onChange={(e) => {
          setText(e.target.value);
          if (e.target.value.trim() === "") {
            setMsg(undefined);
            return onChange(undefined);
          }
          const p = parseValue(e.target.value, unit);
          if (!p.ok) return setMsg(p.message);
          const m = check(p.value);
          if (m) return setMsg(m);
          setMsg(undefined);
          onChange(p.value);
        }}
      />
      {all.length ? <p className="text-[11px] text-bad">{all.join(" ")}</p> : null}
    </div>
  );
}

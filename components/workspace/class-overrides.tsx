"use client";
import { memo } from "react";
import { METALS, ownEntry, type AirGap, type ClassOverride, type ScenarioSettings, type WireClass } from "@/lib/scaling/client";
import { LengthRuleField } from "./length-rule-field";
import { OptionalNumber } from "./optional-number";
import { describeLengthRule } from "@/lib/workspace/roadmap-view";
import { inputClass } from "@/components/ui/field";
import { DEFAULT_AIR_GAP, DielectricField, gapFractionCheck, kGapCheck } from "./settings-panel";
import { formatValue, U } from "./units";

type NumKey = "s" | "sL" | "aspectRatio" | "miller" | "barrierM" | "targetPitchM";
/** A class's entry with the roadmap step's target pitch (lib/scaling RoadmapClassStep); scenarios have none. */
type Entry = ClassOverride & { targetPitchM?: number };
const CHECK: Record<NumKey, (v: number) => string | undefined> = {
  s: (v) => (v <= 0 ? "S must be greater than 0." : v > 20 ? "S must be at most 20." : undefined),
  sL: (v) => (v <= 0 ? "S_L must be greater than 0." : v > 20 ? "S_L must be at most 20." : undefined),
  aspectRatio: (v) => (v <= 0 ? "Aspect ratio must be greater than 0." : v > 10 ? "Aspect ratio must be at most 10." : undefined),
  miller: (v) => (v < 0 || v > 2 ? "Miller factor must be between 0 and 2." : undefined),
  barrierM: (v) => (v < 0 ? "Barrier must not be negative." : v > 1e-6 ? "Barrier must be at most 1 µm." : undefined),
  targetPitchM: (v) => (v <= 0 ? "Target pitch must be greater than 0." : v > 1e-4 ? "Target pitch must be at most 100 µm." : undefined),
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
  globalS,
  pitch,
  errorPrefix = "settings",
}: {
  overrides: Record<string, Entry>;
  globalK: ScenarioSettings["k"];
  /** The new overrides (the rest of the settings unchanged). */
  onOverrides: (o: Record<string, Entry>) => void;
  classes: WireClass[];
  readOnly: boolean;
  errors: Record<string, string[]>;
  /** The S the length-rule sentence uses for classes without their own. */
  globalS: number;
  /** A roadmap step: the target pitch column (S of the class = its previous pitch ÷ target; exclusive with S). */
  pitch?: { previousM: Record<string, number | undefined> };
  /** Where the server's field messages of these overrides start (`settings`, or `steps.N.settings`). */
  errorPrefix?: string;
}) {
  const setO = (name: string, patch: Partial<Entry>) => {
    const next: Entry = { ...(ownEntry(current, name) ?? {}), ...patch };
    for (const k of Object.keys(next) as (keyof Entry)[]) if (next[k] === undefined) delete next[k];
    const overrides = { ...current };
    if (Object.keys(next).length === 0) delete overrides[name];
    else overrides[name] = next;
    onOverrides(overrides);
  };
  const show = (v: unknown) => (v === undefined ? <span className="text-faint">—</span> : String(v));
  return (
    <div className="relative overflow-x-auto">
      <table className="num w-full text-xs">
        <caption className="sr-only">Per-class overrides</caption>
        <thead className="text-left text-muted">
          <tr className="border-b border-rule">
            <th className="py-1 pr-2 font-medium">Class</th>
            {pitch ? (
              <th className="px-1 text-right font-medium" title="Pitch this class reaches at this step; S of the class = its previous pitch ÷ the target">
                Target pitch nm
              </th>
            ) : null}
            <th className="px-1 text-right font-medium">S</th>
            <th className="px-1 text-right font-medium">S_L</th>
            <th className="px-1 font-medium" title="How the class's wire lengths follow the shrink (wins over S_L)">
              Length rule
            </th>
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
            const o: Entry = ownEntry(current, c.name) ?? {};
            const e = (k: string) => errors[`${errorPrefix}.overrides.${c.name}.${k}`];
            const prev = pitch?.previousM[c.name];
            if (readOnly)
              return (
                <tr key={c.name} className="border-b border-rule/60">
                  <th scope="row" className="py-1 pr-2 text-left font-medium">
                    {c.name}
                  </th>
                  {pitch ? <td className="px-1 text-right">{o.targetPitchM === undefined ? show(undefined) : formatValue(o.targetPitchM, U.nm)}</td> : null}
                  <td className="px-1 text-right">{show(o.s)}</td>
                  <td className="px-1 text-right">{show(o.sL)}</td>
                  <td className="px-1">{o.lengthRule ? describeLengthRule(o.lengthRule, o.s ?? globalS) : show(undefined)}</td>
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
                {pitch ? (
                  <td className="px-1 py-0.5">
                    <OptionalNumber
                      label={`Target pitch for ${c.name} (nm)`}
                      unit={U.nm}
                      value={o.targetPitchM}
                      onChange={(v) => setO(c.name, v === undefined ? { targetPitchM: undefined } : { targetPitchM: v, s: undefined })}
                      check={CHECK.targetPitchM}
                      errors={e("targetPitchM")}
                    />
                    {prev !== undefined ? (
                      <p className="text-[10px] leading-tight text-muted">
                        from {Number((prev * 1e9).toPrecision(3))} nm
                        {o.targetPitchM ? ` · S ${Number((prev / o.targetPitchM).toPrecision(3))}` : ""}
                      </p>
                    ) : null}
                  </td>
                ) : null}
                {(["s", "sL"] as const).map((k) => (
                  <td key={k} className="px-1 py-0.5">
                    <OptionalNumber
                      label={`${k === "s" ? "S" : "S_L"} for ${c.name}`}
                      fit
                      value={o[k]}
                      onChange={(v) => setO(c.name, k === "s" && v !== undefined ? { s: v, targetPitchM: undefined } : { [k]: v })}
                      check={CHECK[k]}
                      errors={e(k)}
                    />
                  </td>
                ))}
                <td className="px-1 py-0.5">
                  <LengthRuleField
                    compact
                    label={`Length rule for ${c.name}`}
                    emptyLabel="—"
                    value={o.lengthRule}
                    onChange={(lengthRule) => setO(c.name, { lengthRule })}
                    s={o.s ?? (o.targetPitchM && prev ? prev / o.targetPitchM : globalS)}
                    errors={e("lengthRule")}
                  />
                </td>
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
      {/* the line fraction comes from the Layer shaping screen's "Apply to scenario" (shown here, cleared here) */}
      {classes.some((c) => ownEntry(current, c.name)?.lineFraction !== undefined) ? (
        <p className="mt-1 text-xs text-ink" data-testid="line-fraction-overrides">
          Line fraction W/pitch, from Layer shaping:{" "}
          {classes
            .filter((c) => ownEntry(current, c.name)?.lineFraction !== undefined)
            .map((c) => (
              <span key={c.name} className="mr-3">
                {c.name} {num(ownEntry(current, c.name)!.lineFraction!)}
                {readOnly ? null : (
                  <button type="button" className="ml-1 text-copper-dark underline" onClick={() => setO(c.name, { lineFraction: undefined })}>
                    clear
                  </button>
                )}
              </span>
            ))}
        </p>
      ) : null}
      <p className="mt-1 text-[11px] text-muted">
        Empty cells follow the global settings.{pitch ? " A target pitch sets the class's S for this step (its previous pitch ÷ the target) instead of S." : ""}{" "}
        A length rule says how the class&apos;s wire lengths follow the shrink and wins over S_L. Barrier nm replaces the barrier thickness (0 = barrier-free
        fill). k accepts an effective value for air gaps (first-order); Air gap puts the gap between the lines as geometry: none = no gap for this class, custom
        = the gap&apos;s k (1 = air) and the share of the line thickness it covers from the bottom (empty = 1).
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

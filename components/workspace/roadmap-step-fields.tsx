"use client";
import { useId } from "react";
import { METALS, type AirGap, type RoadmapStepSettings, type WireClass } from "@/lib/scaling/client";
import { inputClass } from "@/components/ui/field";
import { ClassOverrides } from "./class-overrides";
import { LengthRuleField } from "./length-rule-field";
import { OptionalNumber } from "./optional-number";
import { DEFAULT_AIR_GAP, DielectricField, gapFractionCheck, kGapCheck, temperatureCheck } from "./settings-panel";
import { U, type DisplayUnit } from "./units";

const sCheck = (label: string) => (v: number) => (v <= 0 ? `${label} must be greater than 0.` : v > 20 ? `${label} must be at most 20.` : undefined);
const millerCheck = (v: number) => (v < 0 || v > 2 ? "Miller factor must be between 0 and 2." : undefined);
const factorCheck = (label: string) => (v: number) => (v <= 0 ? `${label} must be greater than 0.` : v > 10 ? `${label} must be at most 10.` : undefined);

/**
 * The settings of one roadmap step, relative to the step before: an empty field changes nothing at this step (S = 1,
 * options carried from the step before, device factors × 1); per class a target pitch or S, a length rule and every
 * per-class option (the scenario editor's overrides table).
 */
export function RoadmapStepFields({
  index,
  settings,
  onChange,
  classes,
  previousPitchM,
  errors,
  readOnly,
}: {
  index: number;
  settings: RoadmapStepSettings;
  onChange: (s: RoadmapStepSettings) => void;
  classes: WireClass[];
  /** Each class's pitch at the step before (N0: the baseline's), for the target-pitch column. */
  previousPitchM: Record<string, number | undefined>;
  errors: Record<string, string[]>;
  readOnly: boolean;
}) {
  const id = useId();
  const pre = `steps.${index}.settings`;
  const err = (k: string) => errors[`${pre}.${k}`];
  /** Set (or, with undefined, clear) one field. */
  const set = <K extends keyof RoadmapStepSettings>(k: K, v: RoadmapStepSettings[K] | undefined) => {
    const next = { ...settings };
    if (v === undefined) delete next[k];
    else next[k] = v;
    onChange(next);
  };
  const carried = index === 0 ? "as the baseline" : "carried from the step before";
  const gap = settings.airGap;
  /** One labelled number of the step (empty = carried, or the given placeholder). */
  const stepNumber = (
    k: "s" | "miller" | "deviceRFactor" | "deviceCFactor" | "temperatureC" | "supplyV",
    title: string,
    label: string,
    check: (v: number) => string | undefined,
    o: { placeholder?: string; unit?: DisplayUnit; hint?: string } = {},
  ) => (
    <div>
      <span className="mb-1 block text-xs font-medium text-ink">{title}</span>
      <OptionalNumber
        label={label}
        className="w-full"
        unit={o.unit}
        placeholder={o.placeholder ?? carried}
        value={settings[k]}
        onChange={(v) => set(k, v)}
        check={check}
        errors={err(k)}
      />
      {o.hint ? <p className="mt-0.5 text-[11px] text-muted">{o.hint}</p> : null}
    </div>
  );
  return (
    <fieldset disabled={readOnly} className="min-w-0 space-y-3">
      <legend className="sr-only">Settings of step {index + 1}</legend>
      <div className="grid grid-cols-1 gap-3 min-[480px]:grid-cols-2 lg:grid-cols-4 [&>*]:min-w-0">
        {stepNumber("s", "S — cross-section factor", "S for this step", sCheck("S"), {
          placeholder: "1",
          hint: "this step's shrink of every class (empty = 1); per class below",
        })}
        <LengthRuleField
          label="Length rule"
          emptyLabel={index === 0 ? "fixed (S_L = 1)" : "carried from the step before"}
          value={settings.lengthRule}
          onChange={(r) => set("lengthRule", r)}
          s={settings.s ?? 1}
          errors={err("lengthRule")}
        />
        <div>
          <label className="mb-1 block text-xs font-medium text-ink" htmlFor={`${id}-metal`}>
            Metal
          </label>
          <select
            id={`${id}-metal`}
            className={inputClass}
            value={settings.metal === undefined ? "" : settings.metal === null ? "own" : settings.metal}
            onChange={(e) => set("metal", e.target.value === "" ? undefined : e.target.value === "own" ? null : e.target.value)}
          >
            <option value="">{carried}</option>
            <option value="own">each class&apos;s own</option>
            {Object.values(METALS).map((m) => (
              <option key={m.id} value={m.id}>
                {m.id} — {m.name}
              </option>
            ))}
          </select>
        </div>
        <div>
          <label className="mb-1 block text-xs font-medium text-ink" htmlFor={`${id}-barrier`}>
            Barrier / liner
          </label>
          <select
            id={`${id}-barrier`}
            className={inputClass}
            value={settings.barrierScales === undefined ? "" : settings.barrierScales ? "scales" : "fixed"}
            onChange={(e) => set("barrierScales", e.target.value === "" ? undefined : e.target.value === "scales")}
          >
            <option value="">{carried}</option>
            <option value="fixed">keeps its thickness</option>
            <option value="scales">scales with S</option>
          </select>
        </div>
        <div>
          <label className="flex items-center gap-1.5 text-xs font-medium text-ink">
            <input type="checkbox" checked={settings.k !== undefined} onChange={(e) => set("k", e.target.checked ? null : undefined)} />
            Change the dielectric here
          </label>
          {settings.k !== undefined ? (
            <div className="mt-1">
              <DielectricField compact label="Dielectric k at this step" value={settings.k} onChange={(k) => set("k", k)} errors={err("k")} />
            </div>
          ) : (
            <p className="mt-1 text-[11px] text-muted">k {carried}</p>
          )}
        </div>
        <div>
          <label className="mb-1 block text-xs font-medium text-ink" htmlFor={`${id}-gap`}>
            Air gap between lines
          </label>
          <select
            id={`${id}-gap`}
            className={inputClass}
            value={gap === undefined ? "" : gap === null ? "none" : "custom"}
            onChange={(e) => set("airGap", e.target.value === "" ? undefined : e.target.value === "none" ? null : (gap ?? DEFAULT_AIR_GAP))}
          >
            <option value="">{carried}</option>
            <option value="none">none (each class&apos;s own)</option>
            <option value="custom">all classes: k gap and fraction</option>
          </select>
          {gap ? (
            <div className="mt-1 flex gap-1">
              <OptionalNumber
                label="Air-gap k at this step"
                className="w-16"
                placeholder="1"
                value={gap.kGap}
                onChange={(v) => set("airGap", { ...gap, kGap: v ?? 1 } satisfies AirGap)}
                check={kGapCheck}
                errors={err("airGap.kGap")}
              />
              <OptionalNumber
                label="Gap fraction at this step"
                className="w-16"
                placeholder="1"
                value={gap.gapFraction}
                onChange={(v) => set("airGap", { ...gap, gapFraction: v ?? 1 } satisfies AirGap)}
                check={gapFractionCheck}
                errors={err("airGap.gapFraction")}
              />
            </div>
          ) : null}
        </div>
        {stepNumber("miller", "Miller factor", "Miller factor at this step", millerCheck)}
        <div className="grid grid-cols-2 gap-1">
          {stepNumber("deviceRFactor", "Driver R ×", "Driver R factor of this step", factorCheck("Driver R factor"), { placeholder: "1" })}
          {stepNumber("deviceCFactor", "Load C ×", "Load C factor of this step", factorCheck("Load C factor"), { placeholder: "1" })}
          <p className="col-span-2 text-[11px] text-muted">device factors multiply along the chain</p>
        </div>
        {stepNumber("temperatureC", "Temperature (°C)", "Operating temperature at this step (°C)", temperatureCheck, { unit: U.degC })}
        {stepNumber("supplyV", "Supply (V)", "Supply voltage at this step (V)", (v) => (v <= 0 || v > 5 ? "Supply must be between 0 and 5 V." : undefined), {
          unit: U.V,
        })}
      </div>
      <details open={Object.keys(settings.overrides ?? {}).length > 0}>
        <summary className="cursor-pointer text-xs font-semibold text-ink">Per class: target pitch, S, length rule and options</summary>
        <div className="mt-2">
          <ClassOverrides
            overrides={settings.overrides ?? {}}
            globalK={settings.k ?? null}
            globalS={settings.s ?? 1}
            onOverrides={(o) => set("overrides", Object.keys(o).length ? o : undefined)}
            classes={classes}
            readOnly={readOnly}
            errors={errors}
            pitch={{ previousM: previousPitchM }}
            errorPrefix={pre}
          />
        </div>
      </details>
    </fieldset>
  );
}

"use client";
import Decimal from "decimal.js";
import { useId, useState } from "react";
import { DIELECTRICS, getDielectric, METALS, MODEL_LEVELS, type AirGap, type ModelLevel, type ScenarioSettings, type WireClass } from "@/lib/scaling/client";
import { inputClass } from "@/components/ui/field";
import { pitchExact, sFromPitchExact } from "@/lib/workspace/pitch";
import { NumberField } from "./number-field";
import { LengthRuleField } from "./length-rule-field";
import { OptionalNumber } from "./optional-number";
import { U, formatValue, parseValue } from "./units";

// Short enough to show whole in the select; LEVEL_HINT says the rest under it.
export const LEVEL_LABEL: Record<ModelLevel, string> = {
  ideal: "Ideal (plate, bulk ρ)",
  fringe: "+ fringing",
  coupled: "+ neighbour coupling",
  full: "Full: + size effects",
};

const LEVEL_HINT: Record<ModelLevel, string> = {
  ideal: "Parallel plate, bulk resistivity, no driver or load.",
  fringe: "Adds single-line fringing to the plate capacitance.",
  coupled: "Adds neighbour coupling (Miller factor below).",
  full: "Coupling plus size-effect resistivity; barrier as set below.",
};

const positive =
  (label: string, max = 20) =>
  (v: number) =>
    v <= 0 ? `${label} must be greater than 0.` : v > max ? `${label} must be at most ${max}.` : undefined;
const kCheck = (v: number) => (v < 1 ? "k must be at least 1 (vacuum); use an effective k for air gaps." : v > 30 ? "k must be at most 30." : undefined);
const millerCheck = (v: number) => (v < 0 || v > 2 ? "Miller factor must be between 0 and 2." : undefined);
export const kGapCheck = (v: number) => (v < 1 ? "Air-gap k must be at least 1 (air)." : v > 30 ? "Air-gap k must be at most 30." : undefined);
export const gapFractionCheck = (v: number) => (v < 0 || v > 1 ? "Gap fraction must be between 0 and 1." : undefined);
/** A new air gap: air over the whole line thickness. */
export const DEFAULT_AIR_GAP: AirGap = { kGap: 1, gapFraction: 1 };
const AIR_GAP_HINT =
  "Gap between neighbouring lines only; the ILD below and above keeps its k. Ground and coupling are computed separately, so the Miller factor acts on the coupling part.";

interface Props {
  settings: ScenarioSettings;
  onChange: (s: ScenarioSettings) => void;
  classes: WireClass[];
  errors: Record<string, string[]>;
  /** The baseline's operating temperature (°C), shown while the scenario keeps it. */
  technologyTemperatureC: number;
}

export const temperatureCheck = (v: number) => (v <= -273.15 || v > 400 ? "Temperature must be above −273.15 °C and at most 400 °C." : undefined);

/** Global scenario settings with sliders and typed inputs (editors only). */
export function SettingsPanel({ settings, onChange, classes, errors, technologyTemperatureC }: Props) {
  const set = <K extends keyof ScenarioSettings>(k: K, v: ScenarioSettings[K]) => onChange({ ...settings, [k]: v });
  const err = (k: string) => errors[`settings.${k}`];
  return (
    <div className="space-y-4">
      <SliderField
        label="S — cross-section factor"
        hint="S = old ÷ new size: width, thickness, spacing and ILD are divided by S. S > 1 shrinks the wires (a 0.7× pitch is S = 1/0.7 = 1.43); S < 1 makes them grow."
        min={0.5}
        max={4}
        step={0.01}
        value={settings.s}
        onChange={(v) => set("s", v)}
        check={positive("S")}
        errors={err("s")}
        name="s"
      />
      {settings.s < 1 && settings.s > 0 ? <GrowthHint s={settings.s} onUse={(v) => set("s", v)} /> : null}
      <PitchDerive classes={classes} onS={(s) => set("s", s)} />
      <SliderField
        label="S_L — length factor"
        hint="wire lengths ÷ S_L (S_L > 1: shorter wires)"
        min={0.5}
        max={4}
        step={0.01}
        value={settings.sL}
        onChange={(v) => set("sL", v)}
        check={positive("S_L")}
        errors={err("sL")}
        name="sL"
      />
      <LengthRuleField
        label="Length rule (all classes)"
        emptyLabel="S_L as set above"
        value={settings.lengthRule}
        onChange={(r) => {
          // none = the key left out, so switching back is no change
          const { lengthRule: _old, ...rest } = settings;
          onChange(r ? { ...rest, lengthRule: r } : rest);
        }}
        s={settings.s}
        errors={err("lengthRule")}
      />
      <div>
        <label className="mb-1 block text-xs font-medium text-ink" htmlFor="level">
          Model level
        </label>
        <select
          id="level"
          className={inputClass}
          value={settings.level}
          onChange={(e) =>
            onChange({
              ...settings,
              level: e.target.value as ModelLevel,
              barrierScales: e.target.value === "full" ? settings.barrierScales : true,
            })
          }
        >
          {MODEL_LEVELS.map((l) => (
            <option key={l} value={l}>
              {LEVEL_LABEL[l]}
            </option>
          ))}
        </select>
        <p className="mt-1 text-[11px] text-muted">{LEVEL_HINT[settings.level]}</p>
      </div>
      <SliderField
        label="Miller factor"
        hint="0 = neighbours switch with the victim, 1 = quiet, 2 = opposite"
        min={0}
        max={2}
        step={0.05}
        value={settings.miller}
        onChange={(v) => set("miller", v)}
        check={millerCheck}
        errors={err("miller")}
        name="miller"
      />
      <fieldset>
        <legend className="mb-1 text-xs font-medium text-ink">Barrier / liner</legend>
        <div className="flex gap-4 text-sm">
          <label className="flex items-center gap-1.5">
            <input type="radio" name="barrier" checked={!settings.barrierScales} onChange={() => set("barrierScales", false)} /> keeps its thickness
          </label>
          <label className="flex items-center gap-1.5">
            <input type="radio" name="barrier" checked={settings.barrierScales} onChange={() => set("barrierScales", true)} /> scales with S
          </label>
        </div>
      </fieldset>
      <DielectricField value={settings.k} onChange={(k) => set("k", k)} errors={err("k")} />
      <AirGapField
        value={settings.airGap ?? null}
        onChange={(g) => {
          // off = no global gap: the key is left out (null and absent mean the same), so toggling back is no change
          const { airGap: _old, ...rest } = settings;
          onChange(g ? { ...rest, airGap: g } : rest);
        }}
        errors={errors}
      />
      <div>
        <label className="mb-1 block text-xs font-medium text-ink" htmlFor="metal">
          Metal (all classes)
        </label>
        <select id="metal" className={inputClass} value={settings.metal ?? ""} onChange={(e) => set("metal", e.target.value || null)}>
          <option value="">Keep each class&apos;s metal</option>
          {Object.values(METALS).map((m) => (
            <option key={m.id} value={m.id}>
              {m.id} — {m.name}
            </option>
          ))}
        </select>
      </div>
      <div className="grid grid-cols-3 gap-2">
        <NumberField
          label="Driver R ×"
          value={settings.deviceRFactor}
          onChange={(v) => set("deviceRFactor", v)}
          check={positive("Device R factor", 10)}
          errors={err("deviceRFactor")}
          hint="0.8 = 20% stronger"
          name="deviceRFactor"
        />
        <NumberField
          label="Load C ×"
          value={settings.deviceCFactor}
          onChange={(v) => set("deviceCFactor", v)}
          check={positive("Device C factor", 10)}
          errors={err("deviceCFactor")}
          name="deviceCFactor"
        />
        <NumberField
          label="Supply"
          unit={U.V}
          value={settings.supplyV}
          onChange={(v) => set("supplyV", v)}
          check={positive("Supply voltage", 5)}
          errors={err("supplyV")}
          name="supplyV"
        />
      </div>
      <div>
        <span className="mb-1 block text-xs font-medium text-ink">Operating temperature</span>
        <OptionalNumber
          label="Operating temperature of this scenario (°C)"
          className="w-28"
          unit={U.degC}
          placeholder={`${technologyTemperatureC} (baseline)`}
          value={settings.temperatureC}
          onChange={(v) => set("temperatureC", v)}
          check={temperatureCheck}
          errors={err("temperatureC")}
        />
        <p className="mt-1 text-[11px] text-muted">°C; empty = the baseline&apos;s. Sets the metals&apos; resistivity for this scenario only.</p>
      </div>
    </div>
  );
}

/** Slider plus typed input on one value; the slider covers the usual range, the input accepts anything valid. */
export function SliderField(p: {
  label: string;
  hint?: string;
  min: number;
  max: number;
  step: number;
  value: number;
  onChange: (v: number) => void;
  check?: (v: number) => string | undefined;
  errors?: string[];
  name: string;
}) {
  const id = useId();
  return (
    <div>
      <div className="flex items-end gap-2">
        <div className="flex-1">
          <label htmlFor={id} className="mb-1 block text-xs font-medium text-ink">
            {p.label}
          </label>
          <input
            id={id}
            type="range"
            name={`${p.name}-slider`}
            data-testid={`${p.name}-slider`}
            min={p.min}
            max={p.max}
            // "any": the browser never snaps the current value (a derived 1.55556 stays 1.55556); drags round to `step`
            step="any"
            value={Math.min(p.max, Math.max(p.min, p.value))}
            aria-valuetext={formatValue(p.value, U.none)}
            aria-describedby={`${id}-range${p.hint ? ` ${id}-hint` : ""}`}
            onChange={(e) => {
              const v = roundToStep(Number(e.target.value), p.step);
              if (p.check?.(v) === undefined) p.onChange(v);
            }}
            onKeyDown={(e) => {
              const v = sliderKey(e.key, p.value, p);
              if (v === null) return;
              e.preventDefault();
              if (v !== p.value && p.check?.(v) === undefined) p.onChange(v);
            }}
            className="w-full accent-[var(--color-copper)]"
          />
          <div
            id={`${id}-range`}
            className="flex justify-between text-[10px] text-faint"
            aria-label={`Slider range ${p.min} to ${p.max}; type any other value in the box`}
          >
            <span aria-hidden>{p.min}</span>
            <span aria-hidden>{p.max}</span>
          </div>
        </div>
        <NumberField label={`${p.label} value`} compact value={p.value} onChange={p.onChange} check={p.check} className="w-28" name={p.name} />
      </div>
      {p.hint ? (
        <p id={`${id}-hint`} className="mt-0.5 text-[11px] text-muted">
          {p.hint}
        </p>
      ) : null}
      {p.errors?.length ? <p className="text-xs text-bad">{p.errors.join(" ")}</p> : null}
    </div>
  );
}

/** `v` rounded to the step's decimals (exact in decimal: 1.5 + 0.01 is 1.51, not 1.5100000000000002). */
function roundToStep(v: number, step: number): number {
  return new Decimal(v).toNearest(step).toNumber();
}

/**
 * The value a key gives on a slider, stepping from the current value (not from the nearest slider notch): arrows ± step,
 * Page Up/Down ± 10 steps, Home/End the slider's labelled ends. Null: not a slider key. Exact in decimal.
 */
export function sliderKey(key: string, value: number, p: { min: number; max: number; step: number }): number | null {
  const d = new Decimal(value);
  switch (key) {
    case "ArrowRight":
    case "ArrowUp":
      return d.plus(p.step).toNumber();
    case "ArrowLeft":
    case "ArrowDown":
      return d.minus(p.step).toNumber();
    case "PageUp":
      return d.plus(new Decimal(p.step).times(10)).toNumber();
    case "PageDown":
      return d.minus(new Decimal(p.step).times(10)).toNumber();
    case "Home":
      return p.min;
    case "End":
      return p.max;
    default:
      return null;
  }
}

/** S < 1 makes every wire grow: say so, with the reciprocal most people meant (a pitch factor typed as S). */
function GrowthHint({ s, onUse }: { s: number; onUse: (s: number) => void }) {
  const inverse = new Decimal(1).div(new Decimal(s).toSignificantDigits(15));
  const shown = inverse.toSignificantDigits(3).toFixed();
  const typed = formatValue(s, U.none);
  return (
    <div role="status" className="rounded-md border border-warn/30 bg-warn-soft px-2 py-1.5 text-xs text-warn" data-testid="s-growth-hint">
      <p>
        S = {typed} &lt; 1 — wires grow: did you mean S = 1/{typed} = {shown}?
      </p>
      <button type="button" className="mt-1 font-medium underline" onClick={() => onUse(inverse.toNumber())}>
        Use S = 1/{typed} = {shown}
      </button>
    </div>
  );
}

/** Global air gap between the lines of every class (geometry, not an effective k): off, or kGap and gap fraction. */
function AirGapField({ value, onChange, errors }: { value: AirGap | null; onChange: (g: AirGap | null) => void; errors: Record<string, string[]> }) {
  const id = useId();
  const err = (k: string) => [...(errors["settings.airGap"] ?? []), ...(errors[`settings.airGap.${k}`] ?? [])];
  return (
    <fieldset data-testid="air-gap">
      <legend className="mb-1 text-xs font-medium text-ink">Air gap between lines</legend>
      <label className="flex items-center gap-1.5 text-sm" htmlFor={id}>
        <input id={id} type="checkbox" name="airGap" checked={value !== null} onChange={(e) => onChange(e.target.checked ? DEFAULT_AIR_GAP : null)} />
        All classes: air gap between lines
      </label>
      {value !== null ? (
        <div className="mt-2 grid grid-cols-2 gap-2">
          <NumberField
            label="Air-gap k"
            name="airGapK"
            value={value.kGap}
            onChange={(v) => onChange({ ...value, kGap: v })}
            check={kGapCheck}
            errors={err("kGap")}
            hint="1 = air; at most each class's k"
          />
          <NumberField
            label="Gap fraction"
            name="gapFraction"
            value={value.gapFraction}
            onChange={(v) => onChange({ ...value, gapFraction: v })}
            check={gapFractionCheck}
            errors={err("gapFraction")}
            hint="of the line thickness, from its bottom"
          />
        </div>
      ) : null}
      <p className="mt-1 text-[11px] text-muted">{value !== null ? AIR_GAP_HINT : "Off: each class keeps its own air gap from the baseline, if any."}</p>
    </fieldset>
  );
}

/** The dielectric catalogue's air-gap entry is one effective k for the whole class: labelled so, beside the geometric air gap. */
const AIR_GAP_PRESET = "air-gap";
const presetLabel = (d: { id: string; name: string; k: number }, compact?: boolean) =>
  d.id === AIR_GAP_PRESET
    ? compact
      ? `air-gap eff. (${d.k})`
      : `Air gap, effective k (first-order): k ${d.k}`
    : compact
      ? `${d.id} (${d.k})`
      : `${d.name} (k ${d.k})`;

/** Dielectric: keep per-class k, a catalogue preset (air gap = effective k, first-order) or a typed k. */
export function DielectricField({
  value,
  onChange,
  errors,
  label = "Dielectric k (all classes)",
  compact,
}: {
  value: number | null;
  onChange: (k: number | null) => void;
  errors?: string[];
  label?: string;
  compact?: boolean;
}) {
  const id = useId();
  const preset = value === null ? "" : (Object.values(DIELECTRICS).find((d) => d.k === value)?.id ?? "custom");
  return (
    <div>
      <label htmlFor={id} className={compact ? "sr-only" : "mb-1 block text-xs font-medium text-ink"}>
        {label}
      </label>
      <div className="flex gap-2">
        <div className={compact ? "w-28 shrink-0" : "min-w-0 flex-1"}>
          <select
            id={id}
            className={`${inputClass} ${compact ? "px-1 py-1 text-xs" : ""}`}
            value={preset}
            onChange={(e) => {
              const d = getDielectric(e.target.value);
              onChange(e.target.value === "" ? null : d ? d.k : (value ?? 2.7));
            }}
          >
            <option value="">{compact ? "—" : "Keep each class's k"}</option>
            {Object.values(DIELECTRICS).map((d) => (
              <option key={d.id} value={d.id}>
                {presetLabel(d, compact)}
              </option>
            ))}
            <option value="custom">{compact ? "other" : "Other k…"}</option>
          </select>
        </div>
        {value !== null ? <NumberField label={`${label} value`} compact value={value} onChange={onChange} check={kCheck} className="w-16" name="k" /> : null}
      </div>
      {!compact && preset === AIR_GAP_PRESET ? (
        <p className="mt-1 text-[11px] text-muted">
          Effective k (first-order): one k for the whole class, ground and coupling alike. For the gap between the lines as geometry, use the air gap below.
        </p>
      ) : null}
      {errors?.length ? <p className="text-xs text-bad">{errors.join(" ")}</p> : null}
    </div>
  );
}

/** Derive S from a target pitch for one class: S = (W + spacing) / target pitch (the engine's in decimal). */
function PitchDerive({ classes, onS }: { classes: WireClass[]; onS: (s: number) => void }) {
  const [cls, setCls] = useState(classes[0]?.name ?? "");
  const [text, setText] = useState("");
  const [msg, setMsg] = useState<string | undefined>();
  const wc = classes.find((c) => c.name === cls);
  return (
    <details className="rounded border border-rule px-2 py-1.5 text-xs">
      <summary className="cursor-pointer text-muted">Derive S from a target pitch</summary>
      <label className="mt-2 block">
        <span className="mb-1 block">Class (its pitch today)</span>
        <select className={`${inputClass} px-1 py-1 text-xs`} value={cls} onChange={(e) => setCls(e.target.value)} name="pitch-class">
          {classes.map((c) => (
            <option key={c.name} value={c.name}>
              {c.name} — pitch {formatValue(pitchExact(c), U.nm)} nm
            </option>
          ))}
        </select>
      </label>
      <div className="mt-2 flex items-end gap-2">
        <label className="flex-1">
          <span className="mb-1 block">Target pitch (nm)</span>
          <input
            className={`${inputClass} px-1 py-1 text-right text-xs`}
            value={text}
            name="target-pitch"
            onChange={(e) => setText(e.target.value)}
            aria-invalid={msg ? true : undefined}
          />
        </label>
        <button
          type="button"
          className="rounded border border-rule-strong bg-panel px-2 py-1 hover:bg-ground"
          onClick={() => {
            const p = parseValue(text, U.nm);
            if (!p.ok) return setMsg(p.message);
            if (p.value <= 0 || !wc) return setMsg("Target pitch must be greater than 0.");
            setMsg(undefined);
            // exact in decimal and not rounded: the scaled pitch is the target (18 nm, never 17.9999 nm)
            onS(sFromPitchExact(wc, p.value));
          }}
        >
          Set S
        </button>
      </div>
      {msg ? <p className="mt-1 text-bad">{msg}</p> : null}
    </details>
  );
}

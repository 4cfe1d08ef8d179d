"use client";
import { useId, useState } from "react";
import {
  DIELECTRICS,
  getDielectric,
  METALS,
  MODEL_LEVELS,
  sFromTargetPitch,
  type AirGap,
  type ModelLevel,
  type ScenarioSettings,
  type WireClass,
} from "@/lib/scaling";
import { inputClass } from "@/components/ui/field";
import { NumberField } from "./number-field";
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
}

/** Global scenario settings with sliders and typed inputs (editors only). */
export function SettingsPanel({ settings, onChange, classes, errors }: Props) {
  const set = <K extends keyof ScenarioSettings>(k: K, v: ScenarioSettings[K]) => onChange({ ...settings, [k]: v });
  const err = (k: string) => errors[`settings.${k}`];
  return (
    <div className="space-y-4">
      <SliderField
        label="S — cross-section factor"
        hint="W, T, spacing and ILD ÷ S"
        min={0.5}
        max={4}
        step={0.01}
        value={settings.s}
        onChange={(v) => set("s", v)}
        check={positive("S")}
        errors={err("s")}
        name="s"
      />
      <PitchDerive classes={classes} onS={(s) => set("s", s)} />
      <SliderField
        label="S_L — length factor"
        hint="wire lengths ÷ S_L"
        min={0.5}
        max={4}
        step={0.01}
        value={settings.sL}
        onChange={(v) => set("sL", v)}
        check={positive("S_L")}
        errors={err("sL")}
        name="sL"
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
            step={p.step}
            value={Math.min(p.max, Math.max(p.min, p.value))}
            onChange={(e) => p.onChange(Number(e.target.value))}
            className="w-full accent-[var(--color-copper)]"
          />
        </div>
        <NumberField label={`${p.label} value`} compact value={p.value} onChange={p.onChange} check={p.check} className="w-20" name={p.name} />
      </div>
      {p.hint ? <p className="mt-0.5 text-[11px] text-muted">{p.hint}</p> : null}
      {p.errors?.length ? <p className="text-xs text-bad">{p.errors.join(" ")}</p> : null}
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

/** Derive S from a target pitch for one class: S = (W + spacing) / target pitch. */
function PitchDerive({ classes, onS }: { classes: WireClass[]; onS: (s: number) => void }) {
  const [cls, setCls] = useState(classes[0]?.name ?? "");
  const [text, setText] = useState("");
  const [msg, setMsg] = useState<string | undefined>();
  const wc = classes.find((c) => c.name === cls);
  return (
    <details className="rounded border border-rule px-2 py-1.5 text-xs">
      <summary className="cursor-pointer text-muted">Derive S from a target pitch</summary>
      <div className="mt-2 flex items-end gap-2">
        <label className="flex-1">
          <span className="mb-1 block">Class</span>
          <select className={`${inputClass} px-1 py-1 text-xs`} value={cls} onChange={(e) => setCls(e.target.value)}>
            {classes.map((c) => (
              <option key={c.name} value={c.name}>
                {c.name} (pitch {formatValue(c.widthM + c.spacingM, U.nm)} nm)
              </option>
            ))}
          </select>
        </label>
        <label className="w-24">
          <span className="mb-1 block">Target pitch (nm)</span>
          <input
            className={`${inputClass} px-1 py-1 text-right text-xs`}
            value={text}
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
            onS(Number(sFromTargetPitch({ wireClass: wc, targetPitchM: p.value }).toPrecision(6)));
          }}
        >
          Set S
        </button>
      </div>
      {msg ? <p className="mt-1 text-bad">{msg}</p> : null}
    </details>
  );
}

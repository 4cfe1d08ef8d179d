import type { ClassOverride, ScenarioSettings, Technology } from "@/lib/scaling";
import type { ScenarioSettingsInput } from "@/lib/validation/scenario";

/** Settings of a new scenario: nothing scaled yet, full model, the baseline's supply. */
export function defaultScenarioSettings(tech: Technology): ScenarioSettings {
  return { s: 1, sL: 1, level: "full", barrierScales: false, miller: 1, deviceRFactor: 1, deviceCFactor: 1, supplyV: tech.supplyV, k: null, metal: null, overrides: {} };
}

/** Validated input → complete ScenarioSettings (supply defaults to the technology's); empty overrides are dropped. */
export function normalizeSettings(input: ScenarioSettingsInput, tech: Technology): ScenarioSettings {
  const overrides: Record<string, ClassOverride> = {};
  for (const [name, o] of Object.entries(input.overrides ?? {})) {
    const clean = Object.fromEntries(Object.entries(o).filter(([, v]) => v !== undefined)) as ClassOverride;
    if (Object.keys(clean).length > 0) overrides[name] = clean;
  }
  return {
    s: input.s,
    sL: input.sL,
    level: input.level,
    barrierScales: input.barrierScales,
    miller: input.miller,
    deviceRFactor: input.deviceRFactor,
    deviceCFactor: input.deviceCFactor,
    supplyV: input.supplyV ?? tech.supplyV,
    k: input.k,
    metal: input.metal,
    overrides,
  };
}

/** Override keys that name no class of the baseline, as field errors. */
export function unknownOverrideFields(settings: { overrides: Record<string, unknown> }, classNames: string[]): Record<string, string[]> | undefined {
  const known = new Set(classNames);
  const bad = Object.keys(settings.overrides).filter((n) => !known.has(n));
  if (bad.length === 0) return undefined;
  return Object.fromEntries(bad.map((n) => [`settings.overrides.${n}`, [`No class named "${n}" in this baseline.`]]));
}

const LABELS: Record<string, string> = {
  s: "S",
  sL: "S_L",
  level: "model level",
  barrierScales: "barrier scaling",
  miller: "Miller factor",
  deviceRFactor: "device R factor",
  deviceCFactor: "device C factor",
  supplyV: "supply",
  k: "k",
  metal: "metal",
  aspectRatio: "aspect ratio",
};

function show(v: unknown): string {
  if (v === null || v === undefined) return "—";
  if (typeof v === "boolean") return v ? "scales" : "fixed";
  if (typeof v === "number") return String(Number(v.toPrecision(6)));
  return String(v);
}

/** Human summary of what changed between two settings: ["S 1 → 0.7", "M2: k 2.7 → 1.9"]. */
export function describeSettingsChange(a: ScenarioSettings, b: ScenarioSettings): string[] {
  const out: string[] = [];
  for (const key of Object.keys(LABELS) as (keyof ScenarioSettings)[]) {
    if (key === "overrides" || !(key in b || key in a)) continue;
    if (a[key] !== b[key]) out.push(`${LABELS[key]} ${show(a[key])} → ${show(b[key])}`);
  }
  const names = new Set([...Object.keys(a.overrides ?? {}), ...Object.keys(b.overrides ?? {})]);
  for (const n of names) {
    const oa = (a.overrides?.[n] ?? {}) as Record<string, unknown>;
    const ob = (b.overrides?.[n] ?? {}) as Record<string, unknown>;
    const keys = new Set([...Object.keys(oa), ...Object.keys(ob)]);
    const parts: string[] = [];
    for (const k of keys) if (oa[k] !== ob[k]) parts.push(`${LABELS[k] ?? k} ${show(oa[k])} → ${show(ob[k])}`);
    if (parts.length) out.push(`${n}: ${parts.join(", ")}`);
  }
  return out;
}

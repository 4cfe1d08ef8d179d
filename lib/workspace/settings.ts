import type { ClassOverride, ScenarioSettings, Technology } from "@/lib/scaling";
import { scenarioSettingsSchema, type ScenarioSettingsInput } from "@/lib/validation/scenario";

/** Settings of a new scenario: the schema's defaults (nothing scaled yet, full model) and the baseline's supply. */
export function defaultScenarioSettings(tech: Technology): ScenarioSettings {
  return normalizeSettings(scenarioSettingsSchema.parse({}), tech);
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
    // a global air gap only when one is set: null and absent both mean "each class keeps its own"
    ...(input.airGap ? { airGap: input.airGap } : {}),
    // a length rule and a temperature only when set, so settings stored before them keep their exact shape
    ...(input.lengthRule !== undefined ? { lengthRule: input.lengthRule } : {}),
    ...(input.temperatureC !== undefined ? { temperatureC: input.temperatureC } : {}),
    overrides,
  };
}

/** Override keys that name no class of the baseline, as field errors (the scenario writes enforce the same rule). */

import { describe, expect, it } from "vitest";
import { baselineSettings, DEFAULT_TECHNOLOGY, type ScenarioSettings } from "@/lib/scaling";
import { optionAssumptions } from "@/lib/reports/assumptions";
import type { FrozenOption, FrozenReport } from "@/lib/validation/report";

// The report's plain-words assumptions name the length rules and the scenario's temperature (issue 14).
const technology = { ...DEFAULT_TECHNOLOGY, temperatureC: 85 };
const report = { baseline: { technology, classes: [{ name: "M2", tier: "intermediate", k: 2.7, metal: "Cu" }] } } as unknown as FrozenReport;
const words = (over: Partial<ScenarioSettings>) =>
  optionAssumptions(report, { settings: { ...baselineSettings("full", technology), s: 1.5, ...over } } as unknown as FrozenOption);

describe("optionAssumptions with length rules and temperature", () => {
  it("a global rule replaces the S_L sentence", () => {
    const w = words({ sL: 1.3, lengthRule: { kind: "power", exponent: 0.5 } });
    expect(w).toContain("Wire lengths ÷ S_L, by the rule S_L = S^0.5 (power law), on every class without its own.");
    expect(w.join(" ")).not.toMatch(/S_L = 1\.3/);
    expect(words({ sL: 1.3 }).some((x) => x.startsWith("Wire lengths ÷ S_L = 1.3 "))).toBe(true);
  });
  it("a per-class rule and a scenario temperature are named", () => {
    const w = words({ temperatureC: 105, overrides: { M2: { sL: 2, lengthRule: { kind: "fixed" } } } });
    expect(w).toContain("Wiring at 105 °C (baseline 85 °C).");
    expect(w.find((x) => x.startsWith("Class M2"))).toBe("Class M2 (intermediate): lengths by the rule S_L = 1 (lengths kept).");
    expect(words({ temperatureC: 85 }).join(" ")).not.toMatch(/°C/);
  });
});

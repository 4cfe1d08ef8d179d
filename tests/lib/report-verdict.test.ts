import { describe, expect, it } from "vitest";
import { classVerdict } from "@/lib/reports/summary";
import type { FrozenReport } from "@/lib/validation/report";

// Only the fields classVerdict reads; the rest of a frozen report does not matter here.
function report(delays: Record<string, number>, baselineDelayS = 10e-12): FrozenReport {
  return {
    options: Object.entries(delays).map(([key, delayS]) => ({
      key,
      name: `Option ${key}`,
      evaluation: {
        classes: [{ name: "semi-global", baseline: { delayS: baselineDelayS, tier: "semi-global" }, scenario: { delayS, tier: "semi-global" } }],
      },
    })),
  } as unknown as FrozenReport;
}

describe("classVerdict(report, className)", () => {
  it("names the single fastest option", () => {
    expect(classVerdict(report({ A: 12e-12, B: 11e-12, C: 12.5e-12 }), "semi-global")?.sentence).toMatch(
      /^Semi-global wires: Option B is fastest, delay 10% higher than the baseline/,
    );
  });
  it("calls a tie a tie instead of naming the first option", () => {
    const s = classVerdict(report({ A: 12.6e-12, B: 12.6e-12, C: 12.6e-12 }), "semi-global")?.sentence;
    expect(s).toBe("Semi-global wires: all options about the same, delay 26% higher than the baseline.");
  });
  it("names every option that shares the lead", () => {
    const s = classVerdict(report({ A: 11e-12, B: 11e-12, C: 13e-12 }), "semi-global")?.sentence;
    expect(s).toMatch(
      /^Semi-global wires: Options A and B are equally fastest, delay 10% higher than the baseline \(Option C: 30% higher than the baseline\)\.$/,
    );
  });
});

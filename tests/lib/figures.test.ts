import { describe, expect, it } from "vitest";
import { countChange, FIGURE_LABEL, leaders, listWords, optionsWords, worstClassDelay } from "@/lib/figures";
import { classVerdict, summarizeReport } from "@/lib/reports/summary";
import { accuracyStatements } from "@/lib/reports/models";
import type { FrozenReport } from "@/lib/validation/report";

// Issue 13 items 4 and 5: one definition per figure and one wording rule for ties and lists.

describe("one meaning per figure (lib/figures.ts)", () => {
  it("worst-class delay is the slowest class at its mean length, named", () => {
    expect(
      worstClassDelay([
        { name: "M1", delayS: 3e-12 },
        { name: "M5", delayS: 40e-12 },
        { name: "M3", delayS: 12e-12 },
      ]),
    ).toEqual({ name: "M5", delayS: 40e-12 });
    expect(worstClassDelay([])).toEqual({ name: "", delayS: 0 });
  });

  it("a repeater count changes by a difference, never a ratio: 0 → 1 is +1 (the stage ratio said 2×)", () => {
    expect(countChange(0, 1)).toBe("+1");
    expect(countChange(3, 1)).toBe("−2");
    expect(countChange(2, 2)).toBe("±0");
    expect(countChange(999, 12_345)).toBe("+11,346");
  });

  it("labels say what the figure is", () => {
    expect(FIGURE_LABEL.meanNetDelay).toBe("Mean net delay (weighted by net count)");
    expect(FIGURE_LABEL.repeaters).toBe("Inserted repeaters");
  });
});

describe("wording: lists and ties", () => {
  it("joins lists grammatically", () => {
    expect(listWords([])).toBe("");
    expect(listWords(["A"])).toBe("A");
    expect(listWords(["A", "B"])).toBe("A and B");
    expect(listWords(["A", "B", "C"])).toBe("A, B and C");
    expect(optionsWords(["B"])).toBe("Option B");
    expect(optionsWords(["A", "B", "C"])).toBe("Options A, B and C");
  });

  it("a tie is every item within 0.1% of the lowest, in order", () => {
    const v = (x: { v: number }) => x.v;
    expect(leaders([{ v: 10 }, { v: 10.005 }, { v: 10.02 }, { v: 9.999 }], v)).toEqual([{ v: 10 }, { v: 10.005 }, { v: 9.999 }]);
    expect(leaders([{ v: 10 }, { v: 11 }], v)).toEqual([{ v: 10 }]);
    expect(leaders([], v)).toEqual([]);
  });
});

// A frozen report with only the fields the summary reads: one class, the options' delays.
function report(delays: Record<string, number>, baselineDelayS = 10e-12): FrozenReport {
  const classResult = (delayS: number) => ({ name: "semi-global", tier: "semi-global", delayS });
  const totals = (meanDelayS: number) => ({ meanDelayS, capacitanceF: 1e-9, energyJ: 1e-12, powerW: 1e-3, repeaters: 10 });
  return {
    classNames: ["semi-global"],
    options: Object.entries(delays).map(([key, delayS]) => ({
      key,
      name: `Scenario ${key}`,
      settings: { miller: 1 },
      evaluation: {
        level: "full",
        classes: [{ name: "semi-global", baseline: classResult(baselineDelayS), scenario: classResult(delayS) }],
        totals: { baseline: totals(baselineDelayS), scenario: totals(delayS) },
      },
    })),
  } as unknown as FrozenReport;
}

describe("one rule for ties in the report's sentences", () => {
  it("names all three options that share the lead in a four-option report, in the verdict and the overall lines alike", () => {
    const r = report({ A: 11e-12, B: 11.005e-12, C: 11e-12, D: 13e-12 });
    expect(classVerdict(r, "semi-global")?.sentence).toBe(
      "Semi-global wires: Options A, B and C are equally fastest, delay 10% higher than the baseline (Option D: 30% higher than the baseline).",
    );
    const overall = summarizeReport(r).overall;
    expect(overall[0]).toBe("Lowest worst-class delay: Options A, B and C equally (Scenario A, Scenario B and Scenario C), +10% against the baseline.");
    expect(overall[1]).toBe("Lowest mean net delay: Options A, B and C equally (Scenario A, Scenario B and Scenario C), +10% against the baseline.");
  });

  it("a tie of every option reads the same in both places", () => {
    const r = report({ A: 12.6e-12, B: 12.6e-12, C: 12.6e-12 });
    expect(classVerdict(r, "semi-global")?.sentence).toBe("Semi-global wires: all options about the same, delay 26% higher than the baseline.");
    expect(summarizeReport(r).overall[0]).toBe("Lowest worst-class delay: all options about the same, +26% against the baseline.");
  });

  it("a single leader is named alone", () => {
    const r = report({ A: 12e-12, B: 11e-12 });
    expect(summarizeReport(r).overall[0]).toBe("Lowest worst-class delay: Option B (Scenario B), +10% against the baseline.");
  });
});

describe("accuracy statements print separately", () => {
  it("splits at top-level semicolons only", () => {
    expect(accuracyStatements("one plane: within 6% (C1; fitted); two planes (H2/H ≤ 2; S/H ≤ 4): within 2.9%")).toEqual([
      "one plane: within 6% (C1; fitted)",
      "two planes (H2/H ≤ 2; S/H ≤ 4): within 2.9%",
    ]);
    expect(accuracyStatements("exact")).toEqual(["exact"]);
  });
});

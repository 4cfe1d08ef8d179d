import { describe, expect, it } from "vitest";
import { describeLengthRule, lengthRuleSL, readingOf, signedPercent } from "@/lib/workspace/roadmap-view";

// The roadmap page's words (common practice, no source): a step that improves a lower-is-better metric by less than
// 2% counts as no longer improving; the length rules as the issue 14 contract defines them (S_L = S, 1, a factor, S^a).
describe("readingOf", () => {
  const names = ["N0", "N1", "N2", "N3"];

  it("names the step after which the metric stops improving, with the change to the next step", () => {
    expect(readingOf("M2", "delay", names, [100, 80, 70, 72.1])).toBe("M2 delay stops improving after N2: +3% from N2 to N3. Overall ×0.721 from N0 to N3.");
  });

  it("says so when every step improves, and when the first does not", () => {
    expect(readingOf("M1", "rc", names, [100, 90, 80, 70])).toBe("M1 RC improves at every step (by 2% or more). Overall ×0.7 from N0 to N3.");
    expect(readingOf("M1", "delay", names, [100, 99, 99.5, 101])).toBe(
      "M1 delay does not improve on N0 at any step: −1% from N0 to N1. Overall ×1.01 from N0 to N3.",
    );
  });

  it("reads past a step that gets worse when later steps improve (the plateau is the first step nothing later beats by 2%)", () => {
    expect(readingOf("local", "delay", names, [100, 103, 94.9, 91.9])).toBe(
      "local delay still improves at N3: −3.2% from N2 to N3. Overall ×0.919 from N0 to N3.",
    );
    expect(readingOf("M3", "delay", names, [100, 90, 80, 79.5])).toBe("M3 delay stops improving after N2: −0.62% from N2 to N3. Overall ×0.795 from N0 to N3.");
    expect(readingOf("M4", "delay", names, [100, 110, 95, 120])).toBe("M4 delay stops improving after N2: +26% from N2 to N3. Overall ×1.2 from N0 to N3.");
  });

  it("handles zero repeater counts without dividing by zero", () => {
    expect(readingOf("global", "repeaters", names, [0, 0, 0, 0])).toBe("global repeater count is zero at every step.");
  });
});

describe("signedPercent", () => {
  it("rounds to whole percent from 10% and to 2 significant digits below", () => {
    expect(signedPercent(1.034)).toBe("+3.4%");
    expect(signedPercent(0.876)).toBe("−12%");
    expect(signedPercent(1)).toBe("±0%");
  });
});

describe("length rules in words", () => {
  it("gives S_L of each rule", () => {
    expect(lengthRuleSL({ kind: "follows-s" }, 1.5)).toBe(1.5);
    expect(lengthRuleSL({ kind: "fixed" }, 1.5)).toBe(1);
    expect(lengthRuleSL({ kind: "factor", sL: 1.2 }, 1.5)).toBe(1.2);
    expect(lengthRuleSL({ kind: "power", exponent: 0.5 }, 1.5)).toBeCloseTo(Math.sqrt(1.5), 15);
  });

  it("says what the rule does at the given S", () => {
    expect(describeLengthRule({ kind: "power", exponent: 0.5 }, 1.5)).toBe("lengths shrink as S^0.5: S_L = 1.22 at S = 1.5");
    expect(describeLengthRule({ kind: "factor", sL: 0.8 }, 1.5)).toBe("lengths grow by a fixed factor: S_L = 0.8 at any S");
    expect(describeLengthRule({ kind: "fixed" }, 2)).toBe("lengths keep their size: S_L = 1 at any S");
  });
});

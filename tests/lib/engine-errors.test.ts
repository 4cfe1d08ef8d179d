import { describe, expect, it } from "vitest";
import { baselineSettings, evaluateScenario, scaleClass, DEFAULT_TECHNOLOGY, type WireClass } from "@/lib/scaling";
import { explainEngineError } from "@/lib/workspace/engine-errors";
import { sFromPitchExact } from "@/lib/workspace/pitch";
import { formatValue, U } from "@/components/workspace/units";

// Issue 13 item 7: engine errors in the user's words and units, with the field named; "Set S from a target pitch" exact.

const m0: WireClass = {
  name: "M0",
  tier: "local",
  widthM: 14e-9,
  thicknessM: 28e-9,
  spacingM: 14e-9,
  ildBelowM: 20e-9,
  ildAboveM: 20e-9,
  barrierM: 2e-9,
  metal: "Cu",
  k: 2.7,
  netCount: 1000,
  meanLengthM: 5e-6,
  driverOhm: 5000,
  loadF: 0.5e-15,
  activity: 0.1,
};

function engineMessage(run: () => unknown): string {
  try {
    run();
  } catch (e) {
    return (e as Error).message;
  }
  throw new Error("the engine accepted the input");
}

describe("explainEngineError", () => {
  it("says what a barrier that fills the scaled line means, in nm, and marks S and the class's barrier", () => {
    const settings = { ...baselineSettings("full", DEFAULT_TECHNOLOGY), s: 1.555556, barrierScales: false };
    const raw = engineMessage(() => evaluateScenario({ classes: [{ ...m0, widthM: 6e-9 }], technology: DEFAULT_TECHNOLOGY, settings }));
    expect(raw).toMatch(/^barrierM must be < widthM\/2/); // the engine's own words
    const e = explainEngineError(raw, settings);
    expect(e.text).toMatch(
      /^Class M0: the barrier \(2 nm on each side\) leaves no metal in a [\d.]+ nm wide, [\d.]+ nm thick line \(the class's sizes ÷ S = 1\.56\)\./,
    );
    expect(e.text).not.toMatch(/e-9|barrierM|widthM/);
    expect(Object.keys(e.fields)).toEqual(["settings.s", "settings.overrides.M0.barrierM"]);
  });

  it("reads the S limits of the settings in words", () => {
    expect(explainEngineError("s must be > 0 (got -1)")).toEqual({
      text: "S (cross-section factor) must be greater than 0 (it is -1).",
      fields: { "settings.s": ["S (cross-section factor) must be greater than 0 (it is -1)."] },
    });
    expect(explainEngineError("miller must be between 0 and 2 (got 3)").fields).toEqual({
      "settings.miller": ["The Miller factor must be between 0 and 2 (it is 3)."],
    });
  });

  it("passes an unknown message through unchanged", () => {
    expect(explainEngineError("something else")).toEqual({ text: "something else", fields: {} });
  });
});

describe("S from a target pitch", () => {
  it("an 18 nm target on a 28 nm pitch scales the pitch to exactly 18 nm (not 17.9999 nm)", () => {
    const s = sFromPitchExact(m0, 18e-9);
    const g = scaleClass(m0, { ...baselineSettings("full", DEFAULT_TECHNOLOGY), s });
    expect(formatValue(g.widthM + g.spacingM, U.nm)).toBe("18");
    // the former rounding to 6 digits missed it
    const rounded = Number((28 / 18).toPrecision(6));
    expect(Number(((28e-9 / rounded) * 1e9).toPrecision(6))).toBe(17.9999);
  });
});

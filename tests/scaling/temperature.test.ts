import { describe, expect, it } from "vitest";
import { DEFAULT_TECHNOLOGY } from "@/lib/scaling/technology";
import { baselineSettings, evaluateClass } from "@/lib/scaling/evaluate";
import { getMetal } from "@/lib/scaling/materials";
import { bulkResistivityAtOhmM, metalAt, sizeEffectFactor } from "@/lib/scaling/resistance";
import { expectClose } from "./close";
import { testClass } from "./fixtures";

// CRC Handbook of Chemistry and Physics, "Electrical resistivity of pure metals", Cu against T (docs/models.md, "Added for
// the second round", numbers from memory): 1.543 µΩ·cm at 273 K, 1.678 at 293 K, 1.725 at 300 K, 2.063 at 350 K, 2.402 at 400 K.
const CU_TABLE: [number, number][] = [
  [273, 1.543],
  [293, 1.678],
  [300, 1.725],
  [350, 2.063],
  [400, 2.402],
];

describe("operating temperature", () => {
  const cu = getMetal("Cu");
  it.each(CU_TABLE)("Cu bulk ρ(%d K)/ρ(273 K) within 1% of the Handbook's ratio", (k, rho) => {
    const ratio = bulkResistivityAtOhmM(cu, k - 273.15) / bulkResistivityAtOhmM(cu, 0);
    expectClose(ratio, rho / 1.543, 0.01);
  });
  it("Cu bulk at 20 °C is the catalogue's value and the absolute values match the table within 1%", () => {
    expect(bulkResistivityAtOhmM(cu, 20)).toBe(cu.resistivityOhmM);
    for (const [k, rho] of CU_TABLE) expectClose(bulkResistivityAtOhmM(cu, k - 273.15), rho * 1e-8, 0.01);
  });
  it("Matthiessen: ρ0·λ stays constant (λ(T) = λ(20 °C)·ρ0(20 °C)/ρ0(T); docs/models.md)", () => {
    const hot = metalAt({ metal: "Cu", temperatureC: 105 });
    expectClose(hot.resistivityOhmM * hot.meanFreePathM, cu.resistivityOhmM * cu.meanFreePathM, 1e-12);
    // so the size-effect excess ρ0·(F − 1) changes far less than ρ0 itself
    const w = 30e-9;
    const excess = (m: typeof cu) => m.resistivityOhmM * (sizeEffectFactor(m, w, 2 * w) - 1);
    expect(Math.abs(excess(hot) / excess(cu) - 1)).toBeLessThan(0.25 * (hot.resistivityOhmM / cu.resistivityOhmM - 1));
  });
  it("results carry temperatureC (default 25 °C) and a hotter line has more resistance", () => {
    const st = baselineSettings("full", DEFAULT_TECHNOLOGY);
    const r25 = evaluateClass({ wireClass: testClass(), technology: DEFAULT_TECHNOLOGY, settings: st });
    const r105 = evaluateClass({ wireClass: testClass(), technology: { ...DEFAULT_TECHNOLOGY, temperatureC: 105 }, settings: st });
    expect(r25.temperatureC).toBe(25);
    expect(r105.temperatureC).toBe(105);
    expect(r105.rOhm).toBeGreaterThan(r25.rOhm);
    // at level coupled (bulk only) R follows ρ0(T) exactly
    const c = (t: number) =>
      evaluateClass({
        wireClass: testClass(),
        technology: { ...DEFAULT_TECHNOLOGY, temperatureC: t },
        settings: baselineSettings("coupled", DEFAULT_TECHNOLOGY),
      });
    expectClose(c(105).rOhm / c(25).rOhm, bulkResistivityAtOhmM(cu, 105) / bulkResistivityAtOhmM(cu, 25), 1e-12);
  });
  it("rejects temperatures below −273.15 °C or above 400 °C, naming the field", () => {
    const st = baselineSettings("full", DEFAULT_TECHNOLOGY);
    for (const t of [-274, 401, Number.NaN]) {
      expect(() => evaluateClass({ wireClass: testClass(), technology: { ...DEFAULT_TECHNOLOGY, temperatureC: t }, settings: st })).toThrow(
        /^temperatureC must be between -273.15 and 400/,
      );
    }
    expect(() => metalAt({ metal: "Cu", temperatureC: 500 })).toThrow(RangeError);
  });
  it("a cryogenic temperature is flagged (linear coefficient below 200 K) and stays positive", () => {
    const r = evaluateClass({
      wireClass: testClass(),
      technology: { ...DEFAULT_TECHNOLOGY, temperatureC: -269 },
      settings: baselineSettings("full", DEFAULT_TECHNOLOGY),
    });
    expect(r.rOhm).toBeGreaterThan(0);
    expect(r.validity.some((f) => f.model === "temperature")).toBe(true);
  });
});

import { describe, expect, it } from "vitest";
import { DEFAULT_TECHNOLOGY } from "@/lib/scaling/technology";
import { baselineSettings, evaluateClass } from "@/lib/scaling/evaluate";
import { fitSizeEffect } from "@/lib/scaling/fit";
import { expectClose } from "./close";
import { testClass } from "./fixtures";

/**
 * Resistance per length written out (not the engine's call): Cu bulk 1.678 µΩ·cm at 20 °C with α = 0.00405/K (CRC
 * Handbook slope, docs/models.md), λ = 39.9 nm·ρ0(20)/ρ0(T) (D. Gall 2016; Matthiessen), C = 1.2; Mayadas–Shatzkes
 * ρ/ρ0 = 1/(3[1/3 − α/2 + α² − α³·ln(1 + 1/α)]), α = (λ/d)·R/(1 − R), d = min(w, h) (Phys. Rev. B 1, 1382, 1970) plus
 * Fuchs–Sondheimer 3/8·C·(1 − p)·λ·(1/w + 1/h), additive (Steinhögl et al., Phys. Rev. B 66, 075414, 2002 [memory]).
 */
function rPerM(wNm: number, tNm: number, barNm: number, p: number, R: number, tempC = 20): number {
  const w = (wNm - 2 * barNm) * 1e-9;
  const h = (tNm - barNm) * 1e-9;
  const rho0 = 1.678e-8 * (1 + 0.00405 * (tempC - 20));
  const lambda = (39.9e-9 * 1.678e-8) / rho0;
  const a = (lambda / Math.min(w, h)) * (R / (1 - R));
  const ms = 1 / (3 * (1 / 3 - a / 2 + a * a - a * a * a * Math.log(1 + 1 / a)));
  const fs = 0.375 * 1.2 * (1 - p) * lambda * (1 / w + 1 / h);
  return (rho0 * (ms + fs)) / (w * h);
}

const widths = [12, 16, 22, 30, 45, 70, 110];
const classes = widths.map((w) => testClass({ name: `w${w}`, widthM: w * 1e-9, thicknessM: 2 * w * 1e-9, barrierM: 1e-9 }));
const technology = { ...DEFAULT_TECHNOLOGY, temperatureC: 20 };

describe("fitSizeEffect", () => {
  it("recovers known p and R from resistances at several widths and temperatures (written-out formula)", () => {
    const measured = widths.map((w, i) => ({ className: `w${w}`, rOhmPerM: rPerM(w, 2 * w, 1, 0.3, 0.25, i % 2 ? 85 : 20), temperatureC: i % 2 ? 85 : 20 }));
    const f = fitSizeEffect({ classes, measured, technology });
    expect(Math.abs(f.metals.Cu!.specularity! - 0.3)).toBeLessThan(0.01);
    expect(Math.abs(f.metals.Cu!.grainReflection! - 0.25)).toBeLessThan(0.01);
    for (const pt of f.points) expect(Math.abs(pt.residual)).toBeLessThan(1e-5);
  });
  it("held-out widths are predicted within 0.5% by the engine with the fitted metals (technology.materials)", () => {
    const train = [12, 22, 45, 110];
    const measured = train.map((w) => ({ className: `w${w}`, rOhmPerM: rPerM(w, 2 * w, 1, 0.1, 0.45) }));
    const f = fitSizeEffect({ classes, measured, technology });
    const t = { ...technology, materials: f.metals };
    for (const w of [16, 30, 70]) {
      const r = evaluateClass({ wireClass: classes[widths.indexOf(w)]!, technology: t, settings: baselineSettings("full", t) });
      expectClose(r.rOhmPerM, rPerM(w, 2 * w, 1, 0.1, 0.45), 0.005);
    }
  });
  it("one point: one scale factor on the bulk resistivity, exact at that point", () => {
    const meas = 1.3 * rPerM(22, 44, 1, 0, 0.4);
    const f = fitSizeEffect({ classes, measured: [{ className: "w22", rOhmPerM: meas }], technology });
    expectClose(f.metals.Cu!.resistivityOhmM!, 1.3 * 1.678e-8, 1e-9);
    expectClose(f.points[0]!.fittedOhmPerM, meas, 1e-12);
    expect(f.points[0]!.residual).toBeCloseTo(0, 12);
  });
  it("rejects impossible measurements naming the point", () => {
    const bulk = 1.678e-8 / (20e-9 * 43e-9); // ρ0/A of w22 (conducting 20 × 43 nm) at 20 °C
    expect(() => fitSizeEffect({ classes, measured: [{ className: "w22", rOhmPerM: 0 }], technology })).toThrow(
      /^measured\[0\] \(class w22\)\.rOhmPerM must be > 0/,
    );
    expect(() => fitSizeEffect({ classes, measured: [{ className: "w22", rOhmPerM: Number.NaN }], technology })).toThrow(RangeError);
    expect(() =>
      fitSizeEffect({
        classes,
        measured: [
          { className: "w22", rOhmPerM: 2e9 },
          { className: "w22", rOhmPerM: 0.99 * bulk },
        ],
        technology,
      }),
    ).toThrow(/^measured\[1\] \(class w22\)\.rOhmPerM must be >= the bulk resistance/);
    expect(() => fitSizeEffect({ classes, measured: [{ className: "nope", rOhmPerM: 1e9 }], technology })).toThrow(/className/);
  });
  it("technology.materials overrides the catalogue, and bad overrides are RangeErrors naming the field", () => {
    const st = baselineSettings("full", technology);
    const a = evaluateClass({ wireClass: classes[0]!, technology, settings: st });
    const b = evaluateClass({ wireClass: classes[0]!, technology: { ...technology, materials: { Cu: { specularity: 0.5 } } }, settings: st });
    expect(b.rOhmPerM).toBeLessThan(a.rOhmPerM);
    expectClose(b.rOhmPerM, rPerM(12, 24, 1, 0.5, 0.4), 1e-9);
    expect(() => evaluateClass({ wireClass: classes[0]!, technology: { ...technology, materials: { Cu: { specularity: 1.2 } } }, settings: st })).toThrow(
      /^materials\.Cu\.specularity must be/,
    );
    expect(() => evaluateClass({ wireClass: classes[0]!, technology: { ...technology, materials: { Xx: {} } }, settings: st })).toThrow(
      /^materials\.Xx must name a metal/,
    );
  });
});

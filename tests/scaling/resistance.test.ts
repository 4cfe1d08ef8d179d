import { describe, expect, it } from "vitest";
import { conductingAreaM2, mayadasShatzkesRatio, resistivityOhmM, sizeEffectFactor } from "@/lib/scaling/resistance";
import { getMetal, METALS } from "@/lib/scaling/materials";
import { expectClose } from "./close";

describe("materials: bulk resistivity", () => {
  // CRC Handbook of Chemistry and Physics, "Electrical resistivity of pure metals", 20 °C, in µΩ·cm
  // (Cu, Al secondary; W, Co, Ru from memory — see docs/models.md). Ru is quoted as 7.1–7.6.
  it.each([
    ["Cu", 1.678],
    ["Al", 2.65],
    ["W", 5.28],
    ["Co", 6.24],
  ] as const)("%s = %d µΩ·cm", (id, muOhmCm) => {
    expectClose(resistivityOhmM({ metal: id, widthM: 1e-3, heightM: 1e-3, sizeEffects: false }), muOhmCm * 1e-8, 1e-12);
  });
  it("Ru lies in 7.1–7.6 µΩ·cm", () => {
    const r = getMetal("Ru").resistivityOhmM * 1e8;
    expect(r).toBeGreaterThanOrEqual(7.1);
    expect(r).toBeLessThanOrEqual(7.6);
  });
  it("every value carries a source", () => {
    for (const m of Object.values(METALS)) for (const s of Object.values(m.sources)) expect(s.length).toBeGreaterThan(10);
  });
  it("unknown metal is a RangeError naming the known ones", () => {
    expect(() => getMetal("Xx")).toThrow(/Cu, Al, W, Co, Ru/);
  });
});

describe("conductingAreaM2({ widthM, thicknessM, barrierM })", () => {
  it("(W − 2t_b)(T − t_b) (geometry, common practice, no source)", () => {
    expectClose(conductingAreaM2({ widthM: 24e-9, thicknessM: 48e-9, barrierM: 2e-9 }), 20e-9 * 46e-9, 1e-12);
  });
  it("throws when the barrier fills the line", () => {
    expect(() => conductingAreaM2({ widthM: 4e-9, thicknessM: 48e-9, barrierM: 2e-9 })).toThrow(RangeError);
    expect(() => conductingAreaM2({ widthM: -1, thicknessM: 48e-9, barrierM: 0 })).toThrow("widthM must be > 0 (got -1)");
  });
});

describe("size effect (Fuchs–Sondheimer + Mayadas–Shatzkes, Steinhögl additive form)", () => {
  const cu = getMetal("Cu");
  it("tends to bulk for wide lines (Fuchs 1938 / Sondheimer 1952 thick-film limit: correction ∝ λ/d → 0)", () => {
    const f = sizeEffectFactor(cu, 100e-6, 100e-6);
    expect(f).toBeGreaterThan(1);
    expect(f - 1).toBeLessThan(1e-3);
  });
  it("grows monotonically as the width nears the mean free path (MS: ρ/ρ0 rises with α ∝ λ/d)", () => {
    const widths = [1000, 400, 200, 100, 60, 40, 30, 20, 15, 10].map((x) => x * 1e-9);
    const f = widths.map((w) => sizeEffectFactor(cu, w, 2 * w));
    for (let i = 1; i < f.length; i++) expect(f[i]!).toBeGreaterThan(f[i - 1]!);
    expect(f[f.length - 1]!).toBeGreaterThan(2); // at d ≈ λ/4 the increase is large (order of 2× or more)
  });
  it("MS series branch joins the closed form (α = 2) and matches its small-α expansion 1 + 1.5α (Mayadas–Shatzkes 1970)", () => {
    const lo = mayadasShatzkesRatio(2 - 1e-9);
    const hi = mayadasShatzkesRatio(2 + 1e-9);
    expectClose(lo, hi, 1e-7);
    expectClose(mayadasShatzkesRatio(1e-4), 1 + 1.5e-4, 1e-7);
    // large α: ρ/ρ0 → (4/3)·α (leading term of the series, bracket ≈ 1/(4α))
    expectClose(mayadasShatzkesRatio(1e4), (4 / 3) * 1e4, 1e-3);
  });
  it("surface term is (3/8)·C·(1 − p)·λ·(1/w + 1/h) (Steinhögl et al. 2002)", () => {
    const noGrain = { ...cu, grainReflection: 0 };
    expectClose(sizeEffectFactor(noGrain, 50e-9, 100e-9), 1 + 0.375 * 1.2 * 39.9e-9 * (1 / 50e-9 + 1 / 100e-9), 1e-12);
    expectClose(sizeEffectFactor({ ...noGrain, specularity: 1 }, 50e-9, 100e-9), 1, 1e-12);
  });
});

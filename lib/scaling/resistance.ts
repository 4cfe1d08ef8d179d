/**
 * Resistance of a line: conducting cross-section inside the barrier/liner, bulk resistivity, and
 * size-effect resistivity (Fuchs–Sondheimer surface + Mayadas–Shatzkes grain-boundary scattering,
 * combined additively as Steinhögl et al. do). SI units: m, m², Ω·m, Ω/m.
 */
import { getMetal, type Metal } from "./materials";
import { nonNegative, positive } from "./check";
import type { ValidityFlag } from "./types";

/**
 * Conducting area of a damascene trench W × T lined on both sidewalls and the bottom with a barrier t_b:
 * A = (W − 2·t_b)·(T − t_b). The barrier's own conduction is neglected (geometry, common practice, no source).
 * Throws RangeError when the barrier leaves no conducting cross-section.
 * @returns m²
 */
export function conductingAreaM2(p: { widthM: number; thicknessM: number; barrierM: number }): number {
  positive("widthM", p.widthM);
  positive("thicknessM", p.thicknessM);
  nonNegative("barrierM", p.barrierM);
  const w = p.widthM - 2 * p.barrierM;
  const h = p.thicknessM - p.barrierM;
  if (!(w > 0 && h > 0)) {
    throw new RangeError(`barrierM must be < widthM/2 and < thicknessM (got barrier ${p.barrierM}, width ${p.widthM}, thickness ${p.thicknessM})`);
  }
  return w * h;
}

/**
 * Mayadas–Shatzkes grain-boundary factor ρ/ρ0 = 1 / (3·[1/3 − α/2 + α² − α³·ln(1 + 1/α)]),
 * α = (λ/d)·R/(1 − R). For α ≥ 2 the bracket is summed as its series Σ_{n≥4} (−1)ⁿ/(n·α^(n−3)) to avoid cancellation.
 * @see A. F. Mayadas and M. Shatzkes, Phys. Rev. B 1, 1382 (1970) [secondary, docs/models.md]
 */
export function mayadasShatzkesRatio(alpha: number): number {
  if (alpha <= 0) return 1;
  let bracket: number;
  if (alpha < 2) {
    bracket = 1 / 3 - alpha / 2 + alpha * alpha - alpha * alpha * alpha * Math.log1p(1 / alpha);
  } else {
    const x = 1 / alpha;
    let term = x; // x^(n-3) for n = 4
    bracket = 0;
    for (let n = 4; n < 80; n++) {
      const add = ((n % 2 === 0 ? 1 : -1) * term) / n;
      bracket += add;
      if (Math.abs(add) < 1e-17 * Math.abs(bracket)) break;
      term *= x;
    }
  }
  return 1 / (3 * bracket);
}

/**
 * Size-effect factor ρ/ρ0 of a rectangular conductor w × h (conducting dimensions), additive combination:
 * ρ/ρ0 = MS(α) + (3/8)·C·(1 − p)·λ·(1/w + 1/h), α = (λ/d)·R/(1 − R), grain size d = min(w, h).
 * Additive (Steinhögl) rather than multiplicative (MS × FS): the two differ by about 10% near 40 nm.
 * @see W. Steinhögl et al., Phys. Rev. B 66, 075414 (2002) [memory]; K. Fuchs (1938), E. H. Sondheimer (1952)
 */
export function sizeEffectFactor(metal: Metal, widthM: number, heightM: number): number {
  const lambda = metal.meanFreePathM;
  const d = Math.min(widthM, heightM);
  const R = metal.grainReflection;
  const alpha = (lambda / d) * (R / (1 - R));
  return mayadasShatzkesRatio(alpha) + 0.375 * metal.steinhoglC * (1 - metal.specularity) * lambda * (1 / widthM + 1 / heightM);
}

/**
 * Effective resistivity (Ω·m) of a conductor of conducting width × height: bulk ρ0 from the materials catalogue
 * (CRC Handbook values, see lib/scaling/materials.ts), times sizeEffectFactor when sizeEffects is true.
 * Valid for the thick-film approximation, min(w, h) ≳ λ/2 (threshold from memory; flagged in evaluations).
 */
export function resistivityOhmM(p: { metal: string; widthM: number; heightM: number; sizeEffects: boolean }): number {
  positive("widthM", p.widthM);
  positive("heightM", p.heightM);
  const metal = getMetal(p.metal);
  return p.sizeEffects ? metal.resistivityOhmM * sizeEffectFactor(metal, p.widthM, p.heightM) : metal.resistivityOhmM;
}

/** Pushes the size-effect validity flag: thick-film approximation used below min(w, h) = λ/2. */
export function sizeEffectFlags(metal: Metal, widthM: number, heightM: number, out: ValidityFlag[]): void {
  const kappa = Math.min(widthM, heightM) / metal.meanFreePathM;
  if (kappa < 0.5) {
    out.push({
      model: "size-effect",
      quantity: "d/λ",
      value: kappa,
      min: 0.5,
      max: null,
      message: `smallest conducting dimension is ${kappa.toPrecision(3)}× the mean free path of ${metal.id}; the thick-film Fuchs–Sondheimer form is used below its range (d ≳ λ/2, from memory)`,
    });
  }
}

export const RESISTIVITY_ACCURACY = {
  bulk: "bulk resistivity (CRC Handbook, 20 °C); ignores size effects, a lower bound for narrow lines",
  sizeEffect: "Fuchs–Sondheimer + Mayadas–Shatzkes, additive (Steinhögl); parameters p, R, C are typical fits, ±20% or worse for a given process",
} as const;

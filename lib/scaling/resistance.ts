/**
 * Resistance of a line: conducting cross-section inside the barrier/liner, bulk resistivity, and
 * size-effect resistivity (Fuchs–Sondheimer surface + Mayadas–Shatzkes grain-boundary scattering,
 * combined additively as Steinhögl et al. do). SI units: m, m², Ω·m, Ω/m.
 */
import { getMetal, type Metal } from "./materials";
import { inRange, nonNegative, positive } from "./check";
import type { MetalOverride, ValidityFlag } from "./types";

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
 * (CRC Handbook values, see lib/scaling/materials.ts) at `temperatureC` (default 20 °C, the catalogue's own; the
 * evaluation uses the technology's temperature, default 25 °C; see metalAt), times sizeEffectFactor when sizeEffects
 * is true. Valid for the thick-film approximation, min(w, h) ≳ λ/2 (threshold from memory; flagged in evaluations).
 */
export function resistivityOhmM(p: { metal: string; widthM: number; heightM: number; sizeEffects: boolean; temperatureC?: number }): number {
  positive("widthM", p.widthM);
  positive("heightM", p.heightM);
  const metal = p.temperatureC === undefined ? getMetal(p.metal) : metalAt({ metal: p.metal, temperatureC: p.temperatureC });
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
  bulk: "bulk resistivity (CRC Handbook, at the operating temperature by its linear coefficient); ignores size effects, a lower bound for narrow lines",
  sizeEffect: "Fuchs–Sondheimer + Mayadas–Shatzkes, additive (Steinhögl); parameters p, R, C are typical fits, ±20% or worse for a given process",
} as const;

// ---------------------------------------------------------------------------------------------------------------
// Engine 2: operating temperature, per-metal overrides, vias.

/** Reference temperature of the catalogue's bulk resistivities and mean free paths, °C. */
export const REFERENCE_TEMPERATURE_C = 20;
/** Default operating temperature, °C (common practice, no source: room temperature). */
export const DEFAULT_TEMPERATURE_C = 25;
/** Floor of ρ0(T)/ρ0(20 °C): the linear coefficient would go negative near 0 K (residual resistivity; invented). */
const RESIDUAL_RATIO = 0.02;

/**
 * Bulk resistivity at temperature T (°C), Ω·m: ρ0(T) = ρ0(20 °C)·max(0.02, 1 + α·(T − 20 °C)), α = the metal's
 * temperature coefficient (CRC Handbook of Chemistry and Physics, "Electrical resistivity of pure metals" [memory]).
 * For Cu within 0.3% of the Handbook's table from 273 K to 400 K (tests/scaling/temperature.test.ts); below about
 * 200 K the linear law overestimates the fall (flagged in evaluations).
 */
export function bulkResistivityAtOhmM(metal: Metal, temperatureC: number): number {
  const f = 1 + metal.tempCoeffPerK * (temperatureC - REFERENCE_TEMPERATURE_C);
  return metal.resistivityOhmM * (f > RESIDUAL_RATIO ? f : RESIDUAL_RATIO);
}

/**
 * The metal at temperature T with per-metal overrides applied, into `out` (no allocation): resistivityOhmM = ρ0(T)
 * (bulkResistivityAtOhmM) and meanFreePathM = λ(20 °C)·ρ0(20 °C)/ρ0(T) (Matthiessen: ρ0·λ stays constant, so the
 * size-effect excess does not scale with ρ0; docs/models.md "Temperature"). Other fields from the override or the catalogue.
 */
export function metalAtInto(base: Metal, override: MetalOverride | undefined, temperatureC: number, out: Metal): Metal {
  out.id = base.id;
  out.name = base.name;
  out.sources = base.sources;
  out.resistivityOhmM = override?.resistivityOhmM ?? base.resistivityOhmM;
  out.tempCoeffPerK = override?.tempCoeffPerK ?? base.tempCoeffPerK;
  out.meanFreePathM = override?.meanFreePathM ?? base.meanFreePathM;
  out.specularity = override?.specularity ?? base.specularity;
  out.grainReflection = override?.grainReflection ?? base.grainReflection;
  out.steinhoglC = override?.steinhoglC ?? base.steinhoglC;
  const rho20 = out.resistivityOhmM;
  const rhoT = bulkResistivityAtOhmM(out, temperatureC);
  out.resistivityOhmM = rhoT;
  out.meanFreePathM = (out.meanFreePathM * rho20) / rhoT;
  return out;
}

/** A blank Metal to be filled by metalAtInto. */
export function newMetal(): Metal {
  return {
    id: "",
    name: "",
    resistivityOhmM: 0,
    meanFreePathM: 0,
    specularity: 0,
    grainReflection: 0,
    steinhoglC: 0,
    tempCoeffPerK: 0,
    sources: { resistivity: "", meanFreePath: "", specularity: "", grainReflection: "", steinhoglC: "", tempCoeff: "" },
  };
}

/**
 * The metal `id` of the catalogue at temperature T (°C, default 25) with an optional override (a Technology's
 * `materials[id]`): see metalAtInto. Throws RangeError on an unknown metal or a temperature outside −273.15…400 °C.
 */
export function metalAt(p: { metal: string; temperatureC?: number; override?: MetalOverride }): Metal {
  const t = p.temperatureC ?? DEFAULT_TEMPERATURE_C;
  inRange("temperatureC", t, -273.15, 400);
  if (p.override) checkMetalOverride(`override`, p.override);
  return metalAtInto(getMetal(p.metal), p.override, t, newMetal());
}

/** Throws RangeError naming `${prefix}.${field}` for an override value outside its range. */
export function checkMetalOverride(prefix: string, o: MetalOverride): void {
  if (o.resistivityOhmM !== undefined && !(o.resistivityOhmM > 0 && o.resistivityOhmM < 1e-4)) {
    throw new RangeError(`${prefix}.resistivityOhmM must be > 0 and < 1e-4 Ω·m (got ${o.resistivityOhmM})`);
  }
  if (o.tempCoeffPerK !== undefined) inRange(`${prefix}.tempCoeffPerK`, o.tempCoeffPerK, 0, 0.02);
  if (o.meanFreePathM !== undefined && !(o.meanFreePathM > 0 && o.meanFreePathM <= 1e-6)) {
    throw new RangeError(`${prefix}.meanFreePathM must be > 0 and <= 1e-6 m (got ${o.meanFreePathM})`);
  }
  if (o.specularity !== undefined && !(o.specularity >= 0 && o.specularity < 1))
    throw new RangeError(`${prefix}.specularity must be >= 0 and < 1 (got ${o.specularity})`);
  if (o.grainReflection !== undefined && !(o.grainReflection >= 0 && o.grainReflection < 1))
    throw new RangeError(`${prefix}.grainReflection must be >= 0 and < 1 (got ${o.grainReflection})`);
  if (o.steinhoglC !== undefined) inRange(`${prefix}.steinhoglC`, o.steinhoglC, 0, 10);
  for (const k of Object.keys(o)) {
    if (!["resistivityOhmM", "tempCoeffPerK", "meanFreePathM", "specularity", "grainReflection", "steinhoglC"].includes(k)) {
      throw new RangeError(
        `${prefix}.${k} must be one of resistivityOhmM, tempCoeffPerK, meanFreePathM, specularity, grainReflection, steinhoglC (got an unknown field)`,
      );
    }
  }
}

/** Pushes the temperature flag: the linear temperature coefficient is used below 200 K (−73.15 °C). */
export function temperatureFlags(temperatureC: number, out: ValidityFlag[]): void {
  if (temperatureC < -73.15) {
    out.push({
      model: "temperature",
      quantity: "T (°C)",
      value: temperatureC,
      min: -73.15,
      max: 400,
      message: `operating temperature ${temperatureC} °C is below 200 K, where the linear temperature coefficient of the bulk resistivity overestimates its fall (from memory)`,
    });
  }
}

/** Resistivity of a barrier/liner (nitride), Ω·m: 200 µΩ·cm, middle of the 100–300 µΩ·cm quoted in docs/models.md [memory]. */
export const BARRIER_RESISTIVITY_OHM_M = 2e-6;

/**
 * Resistance (Ω) of one square via of width w and height h lined with a barrier t_b on its sides and bottom:
 * R = ρ_eff(w − 2t_b)·h/(w − 2t_b)² + ρ_barrier·t_b/w² (docs/models.md "Via resistance": the fill in series with the bottom
 * barrier; geometry, common practice, no source). ρ_eff = the metal's bulk ρ (× sizeEffectFactor of the square
 * conducting core when sizeEffects). Throws RangeError when the barrier fills the via.
 */
export function viaResistanceOhm(p: {
  metal: Metal;
  widthM: number;
  heightM: number;
  barrierM: number;
  sizeEffects: boolean;
  barrierResistivityOhmM?: number;
}): number {
  positive("viaWidthM", p.widthM);
  positive("viaHeightM", p.heightM);
  nonNegative("barrierM", p.barrierM);
  const core = p.widthM - 2 * p.barrierM;
  if (!(core > 0)) throw new RangeError(`viaWidthM must be > 2·barrierM (got width ${p.widthM}, barrier ${p.barrierM})`);
  return viaOhmUnchecked(p.metal, p.widthM, p.heightM, p.barrierM, p.sizeEffects, p.barrierResistivityOhmM ?? BARRIER_RESISTIVITY_OHM_M);
}

/** viaResistanceOhm without input checks. */
export function viaOhmUnchecked(metal: Metal, w: number, h: number, tb: number, sizeEffects: boolean, rhoBarrier: number): number {
  const core = w - 2 * tb;
  const rho = sizeEffects ? metal.resistivityOhmM * sizeEffectFactor(metal, core, core) : metal.resistivityOhmM;
  return (rho * h) / (core * core) + (rhoBarrier * tb) / (w * w);
}

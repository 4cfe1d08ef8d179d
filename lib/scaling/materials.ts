import { hasOwnKey, ownEntry } from "./own";

/**
 * Materials catalogue of the scaling engine: metals and dielectrics, each value with its source.
 * Provenance words follow docs/models.md: "from memory" = recalled, not confirmed in a stored
 * source; "common practice, no source" = a value used everywhere without one citable origin.
 * Pure data: part of the engine (browser and Node); the command line and the CSV help page read it through the engine's index.
 */

export interface Metal {
  id: string;
  name: string;
  /** Bulk resistivity near 20 °C, Ω·m. */
  resistivityOhmM: number;
  /** Electron mean free path at room temperature, m. */
  meanFreePathM: number;
  /** Fuchs–Sondheimer specularity p, 0 = fully diffuse surface scattering. */
  specularity: number;
  /** Mayadas–Shatzkes grain-boundary reflection coefficient R, 0 ≤ R < 1. */
  grainReflection: number;
  /** Steinhögl C factor of the surface term (≈ 1.2). */
  steinhoglC: number;
  /**
   * Temperature coefficient α of the bulk resistivity near 20 °C, 1/K: ρ0(T) = ρ0(20 °C)·(1 + α·(T − 20 °C))
   * (resistance.ts, bulkResistivityAt).
   */
  tempCoeffPerK: number;
  sources: { resistivity: string; meanFreePath: string; specularity: string; grainReflection: string; steinhoglC: string; tempCoeff: string };
}

/**
 * The per-metal parameters a baseline may override (Technology.materials), with their display: label, short label,
 * display unit and its size in SI, the catalogue's source key and the accepted range in display units (the engine's,
 * resistance.ts checkMetalOverride; open ends where marked). One list for the Technology panel and the report.
 */
export const METAL_PARAMETERS: readonly {
  key: "resistivityOhmM" | "tempCoeffPerK" | "meanFreePathM" | "specularity" | "grainReflection" | "steinhoglC";
  label: string;
  short: string;
  unit: string;
  unitSI: number;
  source: keyof Metal["sources"];
  min: number;
  minOpen?: boolean;
  max: number;
  maxOpen?: boolean;
}[] = [
  {
    key: "resistivityOhmM",
    label: "Bulk resistivity ρ0 at 20 °C",
    short: "ρ0 at 20 °C",
    unit: "µΩ·cm",
    unitSI: 1e-8,
    source: "resistivity",
    min: 0,
    minOpen: true,
    max: 1e4,
    maxOpen: true,
  },
  { key: "tempCoeffPerK", label: "Temperature coefficient α", short: "α", unit: "10⁻³/K", unitSI: 1e-3, source: "tempCoeff", min: 0, max: 20 },
  { key: "meanFreePathM", label: "Mean free path λ at 20 °C", short: "λ", unit: "nm", unitSI: 1e-9, source: "meanFreePath", min: 0, minOpen: true, max: 1000 },
  { key: "specularity", label: "Specularity p (Fuchs–Sondheimer)", short: "p", unit: "", unitSI: 1, source: "specularity", min: 0, max: 1, maxOpen: true },
  {
    key: "grainReflection",
    label: "Grain reflection R (Mayadas–Shatzkes)",
    short: "R",
    unit: "",
    unitSI: 1,
    source: "grainReflection",
    min: 0,
    max: 1,
    maxOpen: true,
  },
  { key: "steinhoglC", label: "Surface factor C (Steinhögl)", short: "C", unit: "", unitSI: 1, source: "steinhoglC", min: 0, max: 10 },
];

export interface Dielectric {
  id: string;
  name: string;
  k: number;
  source: string;
}

const CRC = 'CRC Handbook of Chemistry and Physics, "Electrical resistivity of pure metals", 20 °C';
const CRC_T = 'CRC Handbook of Chemistry and Physics, "Electrical resistivity of pure metals" (ρ against T), slope near 20 °C';
const GALL = 'D. Gall, "Electron mean free path in elemental metals", J. Appl. Phys. 119, 085101 (2016)';
const STEINHOGL = "W. Steinhögl et al., Phys. Rev. B 66, 075414 (2002); J. Appl. Phys. 97, 023706 (2005)";
const P_DEFAULT = "p = 0 (fully diffuse), the conservative end of the typical Cu fit range p ≈ 0–0.6 (secondary, docs/models.md); assumed for this metal";
const R_DEFAULT = "R = 0.4, middle of the typical Cu fit range R ≈ 0.3–0.5 (secondary, docs/models.md); assumed for this metal";

/** Metals by id. Resistivity in Ω·m (1 µΩ·cm = 1e-8 Ω·m), mean free path in m. */
export const METALS: Readonly<Record<string, Metal>> = {
  Cu: {
    id: "Cu",
    name: "copper",
    resistivityOhmM: 1.678e-8,
    meanFreePathM: 39.9e-9,
    specularity: 0,
    grainReflection: 0.4,
    steinhoglC: 1.2,
    tempCoeffPerK: 0.00405,
    sources: {
      resistivity: `${CRC} (secondary)`,
      meanFreePath: `${GALL} (secondary)`,
      specularity: P_DEFAULT,
      grainReflection: R_DEFAULT,
      steinhoglC: `${STEINHOGL}, C ≈ 1.2 (from memory)`,
      tempCoeff: `${CRC_T}: dρ/dT ≈ 0.0068 µΩ·cm/K over 1.678 µΩ·cm (docs/models.md; from memory); reproduces the table 273–400 K within 0.3%`,
    },
  },
  Al: {
    id: "Al",
    name: "aluminium",
    resistivityOhmM: 2.65e-8,
    meanFreePathM: 18.9e-9,
    specularity: 0,
    grainReflection: 0.4,
    steinhoglC: 1.2,
    tempCoeffPerK: 0.00429,
    sources: {
      resistivity: `${CRC} (secondary)`,
      meanFreePath: `${GALL} (from memory)`,
      specularity: P_DEFAULT,
      grainReflection: R_DEFAULT,
      steinhoglC: `${STEINHOGL}, Cu value reused (from memory)`,
      tempCoeff: `${CRC_T} (from memory)`,
    },
  },
  W: {
    id: "W",
    name: "tungsten",
    resistivityOhmM: 5.28e-8,
    meanFreePathM: 15.5e-9,
    specularity: 0,
    grainReflection: 0.4,
    steinhoglC: 1.2,
    tempCoeffPerK: 0.0045,
    sources: {
      resistivity: `${CRC} (from memory)`,
      meanFreePath: `${GALL} (from memory)`,
      specularity: P_DEFAULT,
      grainReflection: R_DEFAULT,
      steinhoglC: `${STEINHOGL}, Cu value reused (from memory)`,
      tempCoeff: `${CRC_T} (from memory)`,
    },
  },
  Co: {
    id: "Co",
    name: "cobalt",
    resistivityOhmM: 6.24e-8,
    meanFreePathM: 7.8e-9,
    specularity: 0,
    grainReflection: 0.4,
    steinhoglC: 1.2,
    tempCoeffPerK: 0.006,
    sources: {
      resistivity: `${CRC} (from memory)`,
      meanFreePath: `${GALL} (from memory)`,
      specularity: P_DEFAULT,
      grainReflection: R_DEFAULT,
      steinhoglC: `${STEINHOGL}, Cu value reused (from memory)`,
      tempCoeff: `${CRC_T} (from memory; ferromagnetic, the coefficient varies with the source)`,
    },
  },
  Ru: {
    id: "Ru",
    name: "ruthenium",
    resistivityOhmM: 7.1e-8,
    meanFreePathM: 6.6e-9,
    specularity: 0,
    grainReflection: 0.4,
    steinhoglC: 1.2,
    tempCoeffPerK: 0.0042,
    sources: {
      resistivity: `${CRC}, 7.1 from the quoted range 7.1–7.6 µΩ·cm (from memory)`,
      meanFreePath: `${GALL} (secondary)`,
      specularity: P_DEFAULT,
      grainReflection: R_DEFAULT,
      steinhoglC: `${STEINHOGL}, Cu value reused (from memory)`,
      tempCoeff: `${CRC_T} (from memory)`,
    },
  },
};

/** Dielectrics by id (relative permittivity k). */
export const DIELECTRICS: Readonly<Record<string, Dielectric>> = {
  SiO2: { id: "SiO2", name: "silicon dioxide", k: 3.9, source: "common practice, no source" },
  "low-k": { id: "low-k", name: "low-k film (carbon-doped oxide)", k: 2.7, source: "common practice, no source (low-k films are roughly 2.2–3.0)" },
  "ultra-low-k": { id: "ultra-low-k", name: "porous ultra-low-k film", k: 2.4, source: "common practice, no source (low-k films are roughly 2.2–3.0)" },
  "air-gap": {
    id: "air-gap",
    name: "air gap between lines (effective k)",
    k: 1.9,
    source: "illustrative effective k between air and the film, common practice, no source; a true value needs a field solve",
  },
  air: { id: "air", name: "air / vacuum", k: 1.0, source: "definition (vacuum k = 1; air 1.0006 is taken as 1)" },
};

/** True when `id` is exactly the id of a catalogue metal (own entries only: "constructor" or "__proto__" are not metals). */
export function isMetalId(id: string): boolean {
  return hasOwnKey(METALS, id);
}

/** A dielectric of the catalogue by id, or undefined (own entries only). */
export function getDielectric(id: string): Dielectric | undefined {
  return ownEntry(DIELECTRICS, id);
}

/**
 * Looks up a metal by id (case-insensitive: "cu" and "Cu" both work).
 * Throws RangeError naming the known ids when the metal is unknown.
 */
export function getMetal(id: string): Metal {
  const direct = ownEntry(METALS, id);
  if (direct) return direct;
  const lower = id.toLowerCase();
  for (const m of Object.values(METALS)) if (m.id.toLowerCase() === lower || m.name === lower) return m;
  throw new RangeError(`metal must be one of ${Object.keys(METALS).join(", ")} (got "${id}")`);
}

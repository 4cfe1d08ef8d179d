/**
 * Physical constants and model coefficients of the scaling engine (SI units).
 */

/** Vacuum permittivity ε0 in F/m, CODATA 2022 recommended value. (CODATA 2018: 8.8541878128e-12; the difference is irrelevant here.) */
export const EPSILON_0_F_PER_M = 8.8541878188e-12;

/** ln 2: 50% point of a lumped RC step response, t50 = ln2·RC (exact). */
export const LN2 = Math.LN2;

/**
 * 0.377: the RC coefficient of the 50% delay of a uniform distributed RC line in
 * T. Sakurai, "Approximation of wiring delay in MOSFET LSI", IEEE JSSC SC-18(4), 1983 [memory].
 * The exact open-ended step response gives 0.3787 (series solution, see tests/scaling/delay.test.ts).
 */
export const SAKURAI_DISTRIBUTED_COEFF = 0.377;

/**
 * Bakoglu–Meindl repeater coefficients. Bakoglu and Meindl ("Optimal interconnection circuits for VLSI",
 * IEEE TED ED-32(5), 1985 [memory]) round them to a = 0.7 and b = 0.4; the engine uses the unrounded
 * ln2 and 0.377 so that a single stage with k = 1 reproduces the Sakurai driver + line + load delay exactly.
 */
export const REPEATER_A = LN2;
export const REPEATER_B = SAKURAI_DISTRIBUTED_COEFF;

/**
 * Version of the engine's models and result shapes; frozen into reports.
 * 1.1.0: two-plane ground/coupling split refitted so that the total can only rise as neighbours approach;
 * repeaters.count = 1 reports the class's own delay, and stages are inserted only where they beat it.
 * 2.0.0: exact (tabulated) stage delay by default; repeated nets keep their real driver and load (k inserted
 * repeaters with input, output and diffusion capacitance, minimum gain); repeaters cost energy, power, area and
 * leakage; operating temperature; per-metal overrides; vias; validity flags on sweep points.
 * 2.1.0: one name per coupling part: couplingEachFPerM (Maxwell, one neighbour) and couplingMillerFPerM (Miller ×
 * both neighbours); couplingFPerM and couplingPerNeighbourFPerM are gone (old reports read with the new names).
 * 2.2.0: levels coupled and full take the accurate capacitance tables (our field solver, within 1%) unless the
 * technology's capacitanceModel is "published"; air gaps as geometry; capacitance.effectiveK at Miller 0, 1 and 2.
 */
export const ENGINE_VERSION = "2.2.0";

/** Default γ: a repeater's output (diffusion) capacitance is half its input capacitance (common practice, no source). */
export const DEFAULT_OUTPUT_C_RATIO = 0.5;
/** Default minimum gain: repeaters must cut a net's delay by at least 10% (common practice, no source). */
export const DEFAULT_MIN_REPEATER_GAIN = 0.1;
/** Default area of a minimum repeater, m²: 0.1 µm² (invented, no source). */
export const DEFAULT_REPEATER_AREA_M2 = 0.1e-12;

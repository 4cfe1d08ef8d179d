/**
 * The one default technology of Plateau: the demo's figures, used by new baselines, the demo seeder, the command
 * line and the engine tests. Invented (no process): 0.75 V supply, 1.5 GHz clock, minimum repeater R0 = 6 kΩ and
 * C0 = 0.25 fF (R0·C0 = 1.5 ps), delay budget 100 ps.
 */
import type { Technology } from "./types";

export const DEFAULT_TECHNOLOGY: Readonly<Technology> = Object.freeze({
  supplyV: 0.75,
  clockHz: 1.5e9,
  repeaterR0Ohm: 6000,
  repeaterC0F: 0.25e-15,
  delayBudgetS: 100e-12,
});

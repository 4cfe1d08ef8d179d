/**
 * Switching energy and power. Convention (ours, used everywhere in Plateau):
 * - energyJ = (C_line + C_load)·V² is the energy drawn from the supply by one rising (0→1) transition,
 *   equal to the energy dissipated over one full charge–discharge cycle;
 * - activity = transitions (either direction) per clock cycle, 0..1, so each transition dissipates ½·C·V² on average;
 * - powerW = ½ · activity · clockHz · netCount · energyJ.
 * Repeater input capacitance is not included (common practice, no source).
 */
import { nonNegative, inRange } from "./check";

/** (cF + loadF)·supplyV², J. */
export function energyPerTransitionJ(p: { cF: number; loadF: number; supplyV: number }): number {
  nonNegative("cF", p.cF);
  nonNegative("loadF", p.loadF);
  nonNegative("supplyV", p.supplyV);
  return (p.cF + p.loadF) * p.supplyV * p.supplyV;
}

/** ½·activity·clockHz·netCount·energyJ, W (see the module convention). */
export function switchingPowerW(p: { energyJ: number; activity: number; clockHz: number; netCount: number }): number {
  nonNegative("energyJ", p.energyJ);
  inRange("activity", p.activity, 0, 1);
  nonNegative("clockHz", p.clockHz);
  nonNegative("netCount", p.netCount);
  return 0.5 * p.activity * p.clockHz * p.netCount * p.energyJ;
}

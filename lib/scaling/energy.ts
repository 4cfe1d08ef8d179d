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
  return energyUnchecked(p.cF, p.loadF, p.supplyV);
}

/** ½·activity·clockHz·netCount·energyJ, W (see the module convention). */
export function switchingPowerW(p: { energyJ: number; activity: number; clockHz: number; netCount: number }): number {
  nonNegative("energyJ", p.energyJ);
  inRange("activity", p.activity, 0, 1);
  nonNegative("clockHz", p.clockHz);
  nonNegative("netCount", p.netCount);
  return powerUnchecked(p.netCount * p.energyJ, p.activity, p.clockHz);
}

/** energyPerTransitionJ without input checks: (c + cl)·V², J, for one net or summed over nets (c = Σ C, cl = Σ CL). */
export function energyUnchecked(c: number, cl: number, supplyV: number): number {
  return (c + cl) * (supplyV * supplyV);
}

/** Power of `totalEnergyJ` (energy per transition summed over the nets) at `activity` and `clockHz`: ½·activity·f·E, W. */
export function powerUnchecked(totalEnergyJ: number, activity: number, clockHz: number): number {
  return 0.5 * activity * clockHz * totalEnergyJ;
}

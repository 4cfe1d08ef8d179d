/**
 * Public types of the scaling engine. SI base units everywhere: every numeric field name
 * carries its unit (M = metre, F = farad, Ohm = ohm, S = second, J = joule, W = watt, V = volt, Hz).
 * This file is the contract between the engine and the app: change it only additively.
 */

/** Wiring tier, as the trade names them. */
export type Tier = "local" | "intermediate" | "semi-global" | "global";
export const TIERS: readonly Tier[] = ["local", "intermediate", "semi-global", "global"];

/** Capacitance model of one line. `field` is the numeric 2D solve. */
export type CapacitanceModel = "ideal" | "fringe" | "coupled" | "field";

/**
 * Model level of a whole evaluation.
 * - ideal: parallel plate, bulk resistivity, barrier scaled with S (the textbook scaling laws)
 * - fringe: + single-line fringing (Yuan–Trick)
 * - coupled: + neighbour coupling with the ground part split (Sakurai–Tamaru), Miller factor applied
 * - full: coupled + size-effect resistivity + barrier that keeps its thickness (unless told otherwise)
 */
export type ModelLevel = "ideal" | "fringe" | "coupled" | "full";
export const MODEL_LEVELS: readonly ModelLevel[] = ["ideal", "fringe", "coupled", "full"];

/** One bin of a wire-length histogram. */
export interface LengthBin {
  lengthM: number;
  count: number;
}

/** One wire class of a baseline (today's wiring). */
export interface WireClass {
  name: string;
  tier: Tier;
  widthM: number;
  thicknessM: number;
  /** Edge-to-edge spacing to each neighbour on the same layer. */
  spacingM: number;
  /** Dielectric height to the conducting plane below; null = no plane below. */
  ildBelowM: number | null;
  /** Dielectric height to the conducting plane above; null = no plane above. */
  ildAboveM: number | null;
  /** Barrier/liner thickness on both sidewalls and the bottom. */
  barrierM: number;
  /** Metal id in the materials catalogue (e.g. "Cu", "Ru"). */
  metal: string;
  /** Relative permittivity of the surrounding dielectric (effective k for air gaps). */
  k: number;
  netCount: number;
  meanLengthM: number;
  driverOhm: number;
  loadF: number;
  /** Switching activity, 0..1: transitions per clock cycle. */
  activity: number;
  /** Optional length histogram; when present the distribution results use it (merged first when over MAX_EVALUATED_BINS bins). */
  histogram?: LengthBin[];
}

/** Technology parameters shared by all classes of a baseline. */
export interface Technology {
  supplyV: number;
  clockHz: number;
  /** Output resistance of a minimum-size repeater. */
  repeaterR0Ohm: number;
  /** Input capacitance of a minimum-size repeater. */
  repeaterC0F: number;
  /** Delay budget used for the "share of nets over budget" figure. */
  delayBudgetS: number;
}

/** Per-class changes a scenario makes on top of its global settings. */
export interface ClassOverride {
  s?: number;
  sL?: number;
  k?: number;
  metal?: string;
  barrierScales?: boolean;
  /** Aspect ratio T/W after scaling; replaces the scaled thickness. */
  aspectRatio?: number;
  miller?: number;
  /** Barrier/liner thickness after scaling, absolute (m); replaces the scaled or kept barrier (0 = barrier-free fill). */
  barrierM?: number;
}

/** A scenario's settings: what-if scale factors and wiring options. */
export interface ScenarioSettings {
  /** Cross-section factor: W, T, spacing and ILD heights are divided by S. */
  s: number;
  /** Length factor: lengths are divided by S_L. */
  sL: number;
  level: ModelLevel;
  /** Barrier scales with S (true) or keeps its thickness (false). At level `full` default false. */
  barrierScales: boolean;
  /** Miller coupling factor for both neighbours, 0..2. */
  miller: number;
  /** Multiplies driver resistance and repeater R0 (0.8 = 20% stronger devices). */
  deviceRFactor: number;
  /** Multiplies load capacitance and repeater C0. */
  deviceCFactor: number;
  /** Supply voltage of the scenario. */
  supplyV: number;
  /** Global dielectric k override (null = keep each class's k). */
  k: number | null;
  /** Global metal override (null = keep each class's metal). */
  metal: string | null;
  /** Per-class overrides keyed by class name. */
  overrides: Record<string, ClassOverride>;
}

/** A validity warning: an input left the range a model was fitted or derived on. */
export interface ValidityFlag {
  /** Model id, e.g. "sakurai-tamaru-c1", "yuan-trick", "size-effect". */
  model: string;
  /** Quantity that left the range, e.g. "W/H". */
  quantity: string;
  value: number;
  min: number | null;
  max: number | null;
  message: string;
}

/** Capacitance per length split into its parts. total = area + fringe + coupling. */
export interface CapacitanceParts {
  /** Parallel-plate part to the plane(s). */
  areaFPerM: number;
  /** Fringing to the plane(s) beyond the plate part. */
  fringeFPerM: number;
  /** Effective line-to-line part, Miller factor applied, both neighbours together. */
  couplingFPerM: number;
  totalFPerM: number;
  /** Electrostatic coupling to ONE neighbour (Maxwell, no Miller factor); 0 without neighbours. */
  couplingPerNeighbourFPerM: number;
  model: CapacitanceModel;
}

export interface RepeaterResult {
  /**
   * Whole number of repeater stages, >= 1 (1 = just the driver, no inserted repeater). In evaluations, stages are
   * inserted only where they make the line faster than the class's own driver (as in the length distribution).
   */
  count: number;
  /** Optimal repeater size h* in units of a minimum repeater (used by the stages when count >= 2). */
  size: number;
  /**
   * Delay of the line of the class's length with `count` stages. In evaluations: count = 1 reports the class's own
   * delayS (driver as given, no resizing); count >= 2 the Bakoglu–Meindl delay T(count, h*), which is then < delayS.
   */
  delayS: number;
  /** Repeated delay per metre at the optimum. */
  delayPerMS: number;
  /** Length beyond which inserting repeaters reduces delay. */
  criticalLengthM: number;
}

export interface DistributionResult {
  /**
   * One entry per evaluated bin: classDistribution's given bins; in a class result, the class's histogram (merged first
   * when over MAX_EVALUATED_BINS bins, coarsenHistogram) or one bin of all nets at the mean length.
   */
  bins: { lengthM: number; count: number; delayS: number; repeaters: number }[];
  totalNets: number;
  /** Share (0..1) of nets whose delay exceeds the technology's delay budget. */
  shareOverBudget: number;
  totalRepeaters: number;
  /** Net-count-weighted mean delay. */
  meanDelayS: number;
  /** Total wire capacitance of the class (sum over nets). */
  totalCapacitanceF: number;
  /** "histogram" when the class carries one, otherwise "mean" (all nets at the mean length). */
  source: "histogram" | "mean";
}

/** Everything the engine computes for one class at one scenario. */
export interface ClassResult {
  name: string;
  tier: Tier;
  /** Geometry after scaling. */
  widthM: number;
  thicknessM: number;
  spacingM: number;
  ildBelowM: number | null;
  ildAboveM: number | null;
  barrierM: number;
  pitchM: number;
  lengthM: number;
  metal: string;
  k: number;
  /** Effective resistivity (bulk or with size effects). */
  resistivityOhmM: number;
  rOhmPerM: number;
  capacitance: CapacitanceParts;
  cFPerM: number;
  /** Totals at the class's (mean) length. */
  rOhm: number;
  cF: number;
  rcS: number;
  /** 0.377·R·C, the intrinsic 50% delay of the open-ended distributed line. */
  intrinsicDelayS: number;
  /** 50% delay of driver + distributed line + load (Sakurai form). 0.377·RC at level ideal (no driver/load). */
  delayS: number;
  elmoreS: number;
  repeaters: RepeaterResult;
  /** Driver resistance used (× deviceRFactor; 0 at level ideal). */
  driverOhm: number;
  /** Load capacitance used (× deviceCFactor; 0 at level ideal). */
  loadF: number;
  /** C·V² per transition, line + load: the energy drawn from the supply by one rising transition. */
  energyJ: number;
  /** energyJ summed over all nets of the class (histogram lengths when present). */
  totalEnergyJ: number;
  /** Switching power of all nets of the class: ½ · activity · clockHz · totalEnergyJ (activity = transitions per cycle). */
  powerW: number;
  distribution: DistributionResult;
  validity: ValidityFlag[];
  /** Stated accuracy of the models used, e.g. { capacitance: "±6% (Sakurai–Tamaru C1)" }. */
  accuracy: Record<string, string>;
}

/** Scenario / baseline ratios of the headline figures, per class. */
export interface ClassRatio {
  rOhmPerM: number;
  cFPerM: number;
  rOhm: number;
  cF: number;
  rcS: number;
  delayS: number;
  repeaters: number;
  energyJ: number;
}

export interface ClassComparison {
  name: string;
  baseline: ClassResult;
  scenario: ClassResult;
  ratio: ClassRatio;
}

export interface Evaluation {
  engineVersion: string;
  level: ModelLevel;
  classes: ClassComparison[];
  totals: {
    baseline: { capacitanceF: number; energyJ: number; powerW: number; repeaters: number; worstDelayS: number; meanDelayS: number };
    scenario: { capacitanceF: number; energyJ: number; powerW: number; repeaters: number; worstDelayS: number; meanDelayS: number };
  };
}

export type SweepMetric = "delay" | "rc" | "r" | "c";
export type SweepVariable = "s" | "sL" | "k";

export interface SweepPoint {
  x: number;
  y: number;
}

export interface SweepCurve {
  className: string;
  level: ModelLevel;
  metric: SweepMetric;
  variable: SweepVariable;
  points: SweepPoint[];
  /** x values left out because the scaled geometry became impossible there (e.g. the barrier fills the line). */
  skipped?: { x: number; reason: string }[];
}

/**
 * Public types of the scaling engine. SI base units everywhere: every numeric field name
 * carries its unit (M = metre, F = farad, Ohm = ohm, S = second, J = joule, W = watt, V = volt, Hz).
 * This file is the contract between the engine and the app: change it only additively.
 */

/** Wiring tier, as the trade names them. */
export type Tier = "local" | "intermediate" | "semi-global" | "global";
export const TIERS: readonly Tier[] = ["local", "intermediate", "semi-global", "global"];

/** Capacitance model of one line. `field` is the numeric 2D solve. */
export type CapacitanceModel = "ideal" | "fringe" | "coupled" | "accurate" | "field";

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
  /** Vias in series with each net (whole number ≥ 0; default 0 = no vias). Lumped at the driver end in the delay. */
  viasPerNet?: number;
  /**
   * Measured resistance of ONE via at the baseline (Ω). Scaled with the scenario as a square via of the line's width
   * and the ILD-below height: R ∝ height / width², i.e. × S. Takes precedence over the via geometry.
   */
  viaOhm?: number;
  /** Via width (square via) at the baseline; default the line's width. Scaled ÷ S like the line. */
  viaWidthM?: number;
  /** Via height at the baseline; default the ILD below (or above when there is no plane below). Scaled ÷ S. */
  viaHeightM?: number;
  /**
   * Air gap between neighbouring lines, as geometry: relative permittivity of the gap (1 ≤ kGap ≤ k; air = 1.0). The
   * gap fills the space between the lines from the bottom of the lines up to gapFraction × the line thickness; the
   * ILD below and above keeps k. Both absent = no air gap (homogeneous k). Only gapFraction given: kGap = 1.0 (air).
   */
  kGap?: number;
  /**
   * Share of the line thickness the air gap covers, from the bottom of the lines, 0..1 (1 = the whole sidewall).
   * Both absent = no air gap. Only kGap given: gapFraction = 1.
   */
  gapFraction?: number;
}

/** An air gap between neighbouring lines (see WireClass.kGap and gapFraction): 1 ≤ kGap ≤ k, 0 ≤ gapFraction ≤ 1. */
export interface AirGap {
  kGap: number;
  gapFraction: number;
}

/** Delay model of every stage and unrepeated net: the exact distributed-line solution (tabulated) or Sakurai's closed form. */
export type DelayModel = "exact" | "sakurai";
export const DELAY_MODELS: readonly DelayModel[] = ["exact", "sakurai"];

/**
 * Capacitance at levels coupled and full (technology `capacitanceModel`, default "accurate"): the tables of our own
 * field solver (cap-accurate.ts, within 1% of it; published forms with a flag outside their range), or the published
 * closed forms (Sakurai–Tamaru one plane, Cohn two planes). A class with an air gap always takes the tables: the
 * published forms have no gap layer.
 */
export type CapacitanceChoice = "accurate" | "published";
export const CAPACITANCE_CHOICES: readonly CapacitanceChoice[] = ["accurate", "published"];

/** Per-metal overrides of the materials catalogue (SI units), e.g. from fitSizeEffect. */
export interface MetalOverride {
  /** Bulk resistivity at 20 °C, Ω·m. */
  resistivityOhmM?: number;
  /** Temperature coefficient of the bulk resistivity at 20 °C, 1/K: ρ0(T) = ρ0(20 °C)·(1 + α·(T − 20 °C)). */
  tempCoeffPerK?: number;
  /** Electron mean free path at 20 °C, m. */
  meanFreePathM?: number;
  /** Fuchs–Sondheimer specularity p, 0 ≤ p < 1. */
  specularity?: number;
  /** Mayadas–Shatzkes grain-boundary reflection R, 0 ≤ R < 1. */
  grainReflection?: number;
  /** Steinhögl C factor of the surface term. */
  steinhoglC?: number;
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
  /** Delay model of stages and unrepeated nets (default "exact"). */
  delayModel?: DelayModel;
  /** Capacitance at levels coupled and full (default "accurate": the field-solver tables). */
  capacitanceModel?: CapacitanceChoice;
  /** Operating temperature of the wiring, °C (default 25), from −273.15 to 400. */
  temperatureC?: number;
  /** Repeaters are inserted only when they cut a net's delay by at least this share (default 0.10), 0 ≤ g < 1. */
  minRepeaterGain?: number;
  /** Output (diffusion) capacitance of a repeater as a share γ of its input capacitance (default 0.5), ≥ 0. */
  repeaterOutputCRatio?: number;
  /** Layout area of a minimum-size repeater, m² (default 0.1 µm², invented); a repeater of size h takes h times it. */
  repeaterAreaM2?: number;
  /** Leakage power of a minimum-size repeater, W (default 0); a repeater of size h leaks h times it. */
  repeaterLeakageW?: number;
  /** Per-metal overrides of the materials catalogue, keyed by metal id (e.g. { Cu: { specularity: 0.2 } }). */
  materials?: Record<string, MetalOverride>;
  /** Where the materials overrides come from, in words (e.g. "Fitted to 3 measured lines, 2026-12-02"); shown in reports. */
  materialsSource?: string;
}

/**
 * How a class's wire lengths follow a shrink S (the length factor S_L; lengths are divided by it):
 * - follows-s: S_L = S (local-style wires that shrink with the cell)
 * - fixed: S_L = 1 (global-style wires that keep their length)
 * - factor: S_L = sL, a fixed factor > 0 whatever S is
 * - power: S_L = S^exponent, 0 ≤ exponent ≤ 2 (0 = fixed, 1 = follows S)
 */
export type LengthRule = { kind: "follows-s" } | { kind: "fixed" } | { kind: "factor"; sL: number } | { kind: "power"; exponent: number };
export type LengthRuleKind = LengthRule["kind"];
export const LENGTH_RULE_KINDS: readonly LengthRuleKind[] = ["follows-s", "fixed", "factor", "power"];
/** Largest exponent of a power-law length rule (S_L = S^a, 0 ≤ a ≤ 2). */
export const MAX_LENGTH_RULE_EXPONENT = 2;

/** Per-class changes a scenario makes on top of its global settings. */
export interface ClassOverride {
  s?: number;
  sL?: number;
  k?: number;
  metal?: string;
  barrierScales?: boolean;
  /** Aspect ratio T/W after scaling; replaces the scaled thickness. */
  aspectRatio?: number;
  /**
   * Line fraction W/pitch at the class's scaled pitch (0 < f < 1): width = f·pitch, spacing = (1 − f)·pitch, the pitch
   * itself unchanged. Applied before `aspectRatio` (which then sets T from the new width). Written by the design-space
   * optimiser's "apply to scenario".
   */
  lineFraction?: number;
  miller?: number;
  /** Barrier/liner thickness after scaling, absolute (m); replaces the scaled or kept barrier (0 = barrier-free fill). */
  barrierM?: number;
  /**
   * Air gap between this class's lines: an AirGap = this class gets it; null = this class has no air gap, even when the
   * baseline class or the global setting has one; absent = follow the global setting (or the baseline class).
   */
  airGap?: AirGap | null;
  /** This class's length rule: S_L = rule(this class's S). Wins over `sL` here and over the scenario's sL and lengthRule. */
  lengthRule?: LengthRule;
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
  /** Air gap between the lines of every class (null or absent = each class keeps its baseline gap, if any). */
  airGap?: AirGap | null;
  /**
   * Length rule of every class without its own (ClassOverride.lengthRule or ClassOverride.sL): S_L = rule(the class's
   * S). Absent = `sL` applies as the length factor.
   */
  lengthRule?: LengthRule;
  /** Operating temperature of the scenario's wiring, °C (−273.15 to 400); absent = the technology's (default 25). */
  temperatureC?: number;
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
  /** Line-to-line part with the Miller factor, both neighbours together: 2·miller·couplingEachFPerM. */
  couplingMillerFPerM: number;
  /** Electrostatic (Maxwell) coupling to EACH neighbour, no Miller factor; 0 without neighbours. */
  couplingEachFPerM: number;
  totalFPerM: number;
  model: CapacitanceModel;
}

/** A class result's capacitance: the parts, and the effective k they amount to. */
export interface ClassCapacitance extends CapacitanceParts {
  /**
   * The one uniform k that would give the same total at Miller factor 0, 1 and 2 (derived: k × C / C with the ILD's k
   * everywhere). Equal to the class's k without an air gap; with one, ground and coupling fall by different shares.
   */
  effectiveK: EffectiveK;
}

/** Derived effective dielectric constant at Miller factors 0, 1 and 2 (see CapacitanceParts.effectiveK). */
export interface EffectiveK {
  miller0: number;
  miller1: number;
  miller2: number;
}

export interface RepeaterResult {
  /** Inserted repeaters k ≥ 0 of the net at the class's length (real driver → k repeaters → real load). */
  inserted: number;
  /** Stages k + 1 (the driver's stage and one per inserted repeater) = count. */
  stageCount: number;
  /** Delay of the net without repeaters (driver, line, load, vias) with the same stage-delay model. */
  unrepeatedDelayS: number;
  /**
   * Whole number of stages, >= 1 (1 = just the driver, no inserted repeater) = inserted + 1. In evaluations (engine 2)
   * the net keeps its real driver and load, and repeaters are inserted only when they cut its delay by at least
   * the technology's minRepeaterGain.
   */
  count: number;
  /**
   * Repeater size h in units of a minimum repeater: in evaluations the chosen size when inserted ≥ 1, otherwise the
   * Bakoglu–Meindl h* = sqrt(R0·C/(R·C0)) for information.
   */
  size: number;
  /**
   * Delay of the net of the class's length with `count` stages: in evaluations the sum of the stage delays
   * (repeatedNet), equal to unrepeatedDelayS (= the class's delayS) when no repeater is inserted.
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
  bins: { lengthM: number; count: number; delayS: number; repeaters: number; repeaterSize: number }[];
  totalNets: number;
  /** Share (0..1) of nets whose delay exceeds the technology's delay budget. */
  shareOverBudget: number;
  totalRepeaters: number;
  /** Net-count-weighted mean delay. */
  meanDelayS: number;
  /** Total wire capacitance of the class (sum over nets). */
  totalCapacitanceF: number;
  /** Σ over nets of k·h (inserted repeaters × their size, in minimum repeaters): area, energy and leakage follow from it. */
  totalRepeaterSize: number;
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
  /** The air gap between the lines the class was evaluated with (kGap held at k when the gap is larger); null = none. */
  airGap: AirGap | null;
  /** Effective resistivity (bulk or with size effects). */
  resistivityOhmM: number;
  rOhmPerM: number;
  capacitance: ClassCapacitance;
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
  /** C·V² per transition, line + load + repeaters (repeaterEnergyJ): the energy drawn from the supply by one rising transition. */
  energyJ: number;
  /** energyJ summed over all nets of the class (histogram lengths when present). */
  totalEnergyJ: number;
  /**
   * Power of all nets of the class: switching ½ · activity · clockHz · totalEnergyJ (activity = transitions per cycle;
   * totalEnergyJ includes the repeaters' capacitance) + repeater leakage.
   */
  powerW: number;
  /** Operating temperature used for the resistivity, °C. */
  temperatureC: number;
  /** Stage-delay model used (technology delayModel). */
  delayModel: DelayModel;
  /** Resistance of all vias of one net (viasPerNet × one via), Ω; 0 without vias. Lumped at the driver end. */
  viaOhm: number;
  /** Inserted repeaters k of one net at the class's length (= repeaters.inserted). */
  repeaterCount: number;
  /** Repeater size h of that net (= repeaters.size). */
  repeaterSize: number;
  /** Delay of that net with its repeaters; equal to delayS when repeaterCount = 0 (= repeaters.delayS). */
  repeatedDelayS: number;
  /** k + 1 (= repeaters.count). */
  stageCount: number;
  /** Area of one net's inserted repeaters, k·h·repeaterAreaM2, m². */
  repeaterAreaM2: number;
  /** Energy per transition of one net's repeaters, k·h·C0·(1 + γ)·V², J (included in energyJ). */
  repeaterEnergyJ: number;
  /** Repeater area of all nets of the class (histogram when present), m². */
  totalRepeaterAreaM2: number;
  /** Power of the class's repeaters: switching of their capacitance + leakage, W (included in powerW). */
  repeaterPowerW: number;
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

/** Totals of an evaluation over all classes (one for the baseline, one for the scenario). */
export interface EvaluationTotals {
  capacitanceF: number;
  energyJ: number;
  powerW: number;
  /** Inserted repeaters over all nets. */
  repeaters: number;
  worstDelayS: number;
  meanDelayS: number;
  /** Area of all inserted repeaters, m². */
  repeaterAreaM2: number;
  /** Power of all repeaters (switching + leakage), W, included in powerW. */
  repeaterPowerW: number;
  /** repeaterPowerW / powerW (0 when powerW = 0). */
  repeaterPowerShare: number;
}

export interface Evaluation {
  engineVersion: string;
  level: ModelLevel;
  classes: ClassComparison[];
  totals: {
    baseline: EvaluationTotals;
    scenario: EvaluationTotals;
  };
}

export type SweepMetric = "delay" | "rc" | "r" | "c";
export type SweepVariable = "s" | "sL" | "k";

export interface SweepPoint {
  x: number;
  y: number;
  /**
   * Validity flags of the models at this point (empty when every model is inside its range). Engine 2's sweep sets it
   * on every point; optional in the type only so that points stored or drawn before it (plain { x, y }) still fit.
   */
  flags?: ValidityFlag[];
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

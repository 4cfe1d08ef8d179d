/**
 * Public API of Plateau's scaling engine. Pure TypeScript: no React, Next, database, file or network access;
 * runs in Node, client components and Web Workers. SI base units in every name.
 */
export * from "./types";
export { ENGINE_VERSION, EPSILON_0_F_PER_M } from "./constants";
export { DEFAULT_TECHNOLOGY } from "./technology";
export { baselineSettings, evaluateClass, evaluateScenario } from "./evaluate";
export { coarsenHistogram, MAX_EVALUATED_BINS } from "./histogram";
export { sweep, linspace, logspace } from "./sweep";
export { lengthFactor, sFromTargetPitch, scaleClass, type ScaledClass } from "./scale";
export {
  composeRoadmap,
  evaluateRoadmap,
  MAX_ROADMAP_STEPS,
  RoadmapInputError,
  type RoadmapClassStep,
  type RoadmapStep,
  type RoadmapStepResult,
  type RoadmapStepSettings,
} from "./roadmap";
export {
  lineCapacitance,
  parallelPlateFPerM,
  yuanTrickFPerM,
  sakuraiTamaruC1FPerM,
  sakuraiTamaruC21FPerM,
  cohnThickStripFringeFPerM,
  CAPACITANCE_ACCURACY,
  SPLIT_FIT,
  type LineCapacitanceInput,
} from "./capacitance";
export {
  resistivityOhmM,
  conductingAreaM2,
  sizeEffectFactor,
  mayadasShatzkesRatio,
  bulkResistivityAtOhmM,
  metalAt,
  viaResistanceOhm,
  DEFAULT_TEMPERATURE_C,
  REFERENCE_TEMPERATURE_C,
  BARRIER_RESISTIVITY_OHM_M,
} from "./resistance";
export { lineDelay, lumpedT50S, exactStageT50, type LineDelay } from "./delay";
export { exactTau50 } from "./delay-table";
export {
  optimalRepeaters,
  criticalLengthM,
  repeatedDelayS,
  repeatedNet,
  repeatedNetDelayS,
  DEFAULT_OUTPUT_C_RATIO,
  DEFAULT_MIN_REPEATER_GAIN,
  type RepeatedNet,
} from "./repeaters";
export { DEFAULT_REPEATER_AREA_M2 } from "./evaluate";
export { fitSizeEffect, FitInputError, type MeasuredResistance, type FitPoint, type SizeEffectFit } from "./fit";
export { energyPerTransitionJ, switchingPowerW } from "./energy";
export { rentWireLengths, classDistribution, type DistributionInput } from "./distribution";
export { fieldSolve } from "./field-solve";
export type { FieldSolveInput, FieldSolveResult } from "./field-solve";
export {
  parseQuantity,
  formatEngineering,
  formatIn,
  convertExact,
  parseScaled,
  isDecimalComma,
  formatScaled,
  toNm,
  fromNm,
  toUm,
  fromUm,
  NM,
  UM,
  FF,
  PS,
  type BaseUnit,
  type NumberCheck,
} from "./units";
export { METALS, METAL_PARAMETERS, DIELECTRICS, getMetal, getDielectric, isMetalId, type Metal, type Dielectric } from "./materials";
export { hasOwnKey, ownEntry } from "./own";
export {
  WIRE_CLASS_COLUMNS,
  HISTOGRAM_COLUMNS,
  WIRE_CLASS_FORMAT,
  HISTOGRAM_FORMAT,
  HISTOGRAM_LENGTH_COLUMN,
  HISTOGRAM_COUNT_COLUMN,
  normaliseHeader,
  suggestColumn,
  resolveHeader,
  headerUnits,
  type ResolvedHeader,
  parseCell,
  validateWireClassRow,
  validateHistogramRow,
  MEASURED_RESISTANCE_COLUMNS,
  MEASURED_RESISTANCE_FORMAT,
  validateMeasuredRow,
  type ColumnSpec,
  type CsvFormat,
  type FormatIssue,
  type NumberRule,
} from "./formats";
export {
  optimizeClass,
  objectiveGrid,
  objectiveOf,
  delayParts,
  tornado,
  variation,
  flattenClass,
  mulberry32,
  DESIGN_OBJECTIVES,
  TORNADO_INPUTS,
  VARIATION_INPUTS,
  MAX_VARIATION_SAMPLES,
  type DesignObjective,
  type OptimizeInput,
  type OptimizeResult,
  type ObjectiveGrid,
  type GridPoint,
  type DelayParts,
  type TornadoInput,
  type TornadoBar,
  type Sigma,
  type VariationSigmas,
  type Stats,
  type ClassVariation,
  type Corner,
} from "./design-space";

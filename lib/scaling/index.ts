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
export { sFromTargetPitch, scaleClass, type ScaledClass } from "./scale";
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
export { resistivityOhmM, conductingAreaM2, sizeEffectFactor, mayadasShatzkesRatio } from "./resistance";
export { lineDelay, lumpedT50S, type LineDelay } from "./delay";
export { optimalRepeaters, criticalLengthM, repeatedDelayS } from "./repeaters";
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
export { METALS, DIELECTRICS, getMetal, type Metal, type Dielectric } from "./materials";
export {
  WIRE_CLASS_COLUMNS,
  HISTOGRAM_COLUMNS,
  WIRE_CLASS_FORMAT,
  HISTOGRAM_FORMAT,
  HISTOGRAM_LENGTH_COLUMN,
  HISTOGRAM_COUNT_COLUMN,
  normaliseHeader,
  resolveHeader,
  parseCell,
  validateWireClassRow,
  validateHistogramRow,
  type ColumnSpec,
  type CsvFormat,
  type FormatIssue,
  type NumberRule,
} from "./formats";

/**
 * The engine's light half, for the browser's main thread: types, constants, the default technology, catalogues,
 * units and the small helpers forms need. It imports nothing that evaluates (evaluate, sweep, the
 * capacitance and delay tables, the field solver): those run in the editor's Web Worker (components/workspace/
 * engine-worker.ts) and on the server, so the main thread's bundle stays free of the tables (about 220 kB gzip).
 * Client components import values from here; `import type` from "@/lib/scaling" is fine anywhere (ESLint enforces it).
 * The CSV formats (column specs, header resolution, row validation) are their own light entry, "@/lib/scaling/formats":
 * a barrel's re-exports are not tree-shaken from the client chunks, so keeping them out of this file keeps them out
 * of pages that never read a CSV (the scenario editor's first-load JS).
 */
export * from "./types";
export { ENGINE_VERSION, EPSILON_0_F_PER_M, DEFAULT_OUTPUT_C_RATIO, DEFAULT_MIN_REPEATER_GAIN, DEFAULT_REPEATER_AREA_M2 } from "./constants";
export { DEFAULT_TECHNOLOGY } from "./technology";
export { coarsenHistogram, MAX_EVALUATED_BINS } from "./histogram";
export { lengthFactor, sFromTargetPitch } from "./scale";
export { composeRoadmap, MAX_ROADMAP_STEPS, RoadmapInputError, type RoadmapClassStep, type RoadmapStep, type RoadmapStepSettings } from "./roadmap-compose";
export { metalAt, bulkResistivityAtOhmM, DEFAULT_TEMPERATURE_C, REFERENCE_TEMPERATURE_C } from "./resistance";
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

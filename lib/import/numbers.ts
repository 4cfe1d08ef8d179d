/**
 * The exact SI conversion of CSV cells lives in the engine (lib/scaling/units.ts), next to the formats' column units;
 * re-exported here for the import and export code that already reads it from this module.
 */
export { formatScaled, parseScaled, type NumberCheck } from "@/lib/scaling";

/** View choices of the scenario editor's sweep (kept in the URL: ?scale=…&length=…). Plain module: server and client. */
export type SweepScale = "relative" | "absolute";
export type SweepLength = "follow" | "fixed" | "scenario";

export const SWEEP_SCALES: readonly SweepScale[] = ["relative", "absolute"];
export const SWEEP_LENGTHS: readonly SweepLength[] = ["follow", "fixed", "scenario"];

/** Parse the URL values; unknown or missing values give the defaults (relative to S = 1, length follows S). */
export function parseSweepChoices(scale: string | undefined, length: string | undefined): { scale: SweepScale; length: SweepLength } {
  return {
    scale: SWEEP_SCALES.includes(scale as SweepScale) ? (scale as SweepScale) : "relative",
    length: SWEEP_LENGTHS.includes(length as SweepLength) ? (length as SweepLength) : "follow",
  };
}

/**
 * One meaning per figure (issue 13 item 4): the definitions, labels and small rules the editor, the report, both CSVs
 * and the docs share. Pure functions, no I/O (client and server import them).
 *
 * - Worst-class delay: the largest 50% delay (driver + line + load) of a net at its class's mean length, over the
 *   classes — the same figure as each class's "Delay 50%" cell, so the headline is always one of the table's numbers.
 *   (The engine's `totals.worstDelayS` is a different figure, the longest net of the histograms; it is not shown.)
 * - Mean net delay: the mean over every net, each net counted once (weighted by net count; histogram lengths where a
 *   class has one, otherwise all its nets at the mean length).
 * - Repeaters: repeaters INSERTED on a net (0 = the driver alone drives the line); their change is a difference in
 *   count ("+1"), never a ratio (0 → 1 has no ratio). Stages = inserted + 1, and only ever labelled "stages".
 * - Ties: options within TIE_TOLERANCE (0.1%) of the best are equally good; every sentence names all of them.
 */

export const FIGURE_LABEL = {
  worstClassDelay: "Worst-class delay",
  meanNetDelay: "Mean net delay (weighted by net count)",
  repeaters: "Inserted repeaters",
  stages: "Repeater stages",
} as const;

export const FIGURE_DEFINITION = {
  worstClassDelay: "the largest delay of a net at its class's mean length, over the classes (the class table's Delay 50% figure)",
  meanNetDelay: "the mean delay over every net, each net counted once (histogram lengths where a class has one)",
  repeaters: "repeaters inserted on a net of the class's mean length (0 = the driver alone); changes are differences in count",
  stages: "inserted repeaters + 1 (the driver's stage)",
} as const;

/** The slowest class at its mean length ("" and 0 for no classes). */
export function worstClassDelay(results: readonly { name: string; delayS: number }[]): { name: string; delayS: number } {
  let worst = { name: "", delayS: 0 };
  for (const r of results) if (r.delayS > worst.delayS) worst = { name: r.name, delayS: r.delayS };
  return worst;
}

/** The change of a count as a signed difference: "+1", "−2", "±0" (a ratio of counts means nothing when one is 0). */
export function countChange(baseline: number, scenario: number): string {
  const d = Math.round(scenario) - Math.round(baseline);
  if (d === 0) return "±0";
  return `${d < 0 ? "−" : "+"}${Math.abs(d).toLocaleString("en-US")}`;
}

/** Relative distance within which two figures are a tie (0.1%). */
export const TIE_TOLERANCE = 1e-3;

/** The items that share the lowest value (within TIE_TOLERANCE of it), in their given order. */
export function leaders<T>(items: readonly T[], value: (t: T) => number): T[] {
  if (items.length === 0) return [];
  const best = Math.min(...items.map(value));
  return items.filter((t) => value(t) - best <= Math.abs(best) * TIE_TOLERANCE);
}

/** "A", "A and B", "A, B and C". */
export function listWords(items: readonly string[]): string {
  if (items.length <= 1) return items[0] ?? "";
  return `${items.slice(0, -1).join(", ")} and ${items[items.length - 1]}`;
}

/** "Option A", "Options A and B", "Options A, B and C". */
export function optionsWords(keys: readonly string[]): string {
  return `${keys.length === 1 ? "Option" : "Options"} ${listWords(keys)}`;
}

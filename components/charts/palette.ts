/** Plateau chart palette, level styles and tick helpers — no visx here, so pages can use them without loading the charts. */
import type { ModelLevel } from "@/lib/scaling";

/** Plateau's chart palette: copper for the answer, greys for context, a slate blue and a moss green of our own. */
export const CHART = {
  ink: "#1d1f22",
  muted: "#5f6368",
  grid: "#e7e4de",
  rule: "#c4c0b6",
  copper: "#b4622d",
  copperSoft: "#e9c4a8",
  slate: "#47627e",
  moss: "#6d7d3a",
  grey: "#8a8f96",
  good: "#2f6b4f",
  bad: "#a23a2a",
  warn: "#8a6410",
} as const;

/** One style per model level: colour and dash, so curves stay apart in greyscale print too. */
export const LEVEL_STYLE: Record<ModelLevel, { label: string; color: string; dash?: string; width: number }> = {
  ideal: { label: "Ideal scaling", color: CHART.grey, dash: "2 3", width: 1.5 },
  fringe: { label: "+ fringing", color: CHART.slate, dash: "6 3", width: 1.5 },
  coupled: { label: "+ coupling", color: CHART.moss, dash: "10 3 2 3", width: 1.75 },
  full: { label: "+ size effects", color: CHART.copper, width: 2.5 },
};

/** Compact tick label: 3 significant digits, no trailing zeros. */
export function tick(v: number): string {
  if (!Number.isFinite(v)) return "";
  const a = Math.abs(v);
  if (a !== 0 && (a >= 1e5 || a < 1e-3)) return v.toExponential(0).replace("e+", "e");
  return String(Number(v.toPrecision(3)));
}

/** Ticks for a log axis inside [lo, hi]: 1-2-5 per decade, thinned to 1-3 or 1 per decade when there are too many. */
export function logTicks(lo: number, hi: number, max = 7): number[] {
  if (!(lo > 0 && hi > lo)) return [];
  // Narrow ranges (ratios around 1) get finer steps so a levelling-off can be read against the grid.
  const sets = Math.log10(hi / lo) < 1.3 ? [[1, 1.5, 2, 3, 5, 7], [1, 2, 5], [1, 3], [1]] : [[1, 2, 5], [1, 3], [1]];
  for (const mantissas of sets) {
    const out: number[] = [];
    for (let e = Math.floor(Math.log10(lo)); e <= Math.ceil(Math.log10(hi)); e++) {
      for (const m of mantissas) {
        const v = Number((m * 10 ** e).toPrecision(3));
        if (v >= lo * 0.999 && v <= hi * 1.001) out.push(v);
      }
    }
    if (out.length <= max || mantissas.length === 1) return out;
  }
  return [];
}

const S_TICK_SETS = [
  [0.1, 0.2, 0.25, 0.3, 0.4, 0.5, 0.6, 0.7, 0.8, 1, 1.2, 1.5, 2, 2.5, 3, 4, 5, 6, 8, 10, 15, 20],
  [0.1, 0.2, 0.3, 0.5, 0.7, 1, 1.5, 2, 3, 4, 5, 7, 10, 15, 20],
  [0.1, 0.2, 0.5, 1, 2, 3, 4, 5, 10, 20],
  [0.1, 0.2, 0.5, 1, 2, 5, 10, 20],
];

/** Ticks for a scale-factor axis: round values people use (0.7, 1, 1.5, 2, 3 …), at most `max`. */
export function scaleTicks(lo: number, hi: number, max = 8): number[] {
  let inside: number[] = [];
  for (const set of S_TICK_SETS) {
    inside = set.filter((v) => v >= lo * 0.999 && v <= hi * 1.001);
    if (inside.length <= max) return inside;
  }
  return inside;
}

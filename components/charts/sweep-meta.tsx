import type { ModelLevel, SweepMetric } from "@/lib/scaling";
import { LEVEL_STYLE } from "./palette";

/** Display unit of each sweep metric (y values arrive in SI). No visx here: pages use it before the charts load. */
export const SWEEP_METRIC: Record<SweepMetric, { label: string; unit: string; scale: number }> = {
  delay: { label: "50% delay", unit: "ps", scale: 1e12 },
  rc: { label: "RC", unit: "ps", scale: 1e12 },
  r: { label: "Resistance", unit: "Ω", scale: 1 },
  c: { label: "Capacitance", unit: "fF", scale: 1e15 },
};

/** Legend of the model levels (line sample + name). */
export function LevelLegend({ levels = ["ideal", "fringe", "coupled", "full"] as ModelLevel[] }: { levels?: ModelLevel[] }) {
  return (
    <ul className="flex flex-wrap gap-x-4 gap-y-1 text-xs text-muted" aria-label="Model levels">
      {levels.map((l) => (
        <li key={l} className="flex items-center gap-1.5">
          <svg width="26" height="8" aria-hidden="true">
            <line x1="1" y1="4" x2="25" y2="4" stroke={LEVEL_STYLE[l].color} strokeWidth={LEVEL_STYLE[l].width} strokeDasharray={LEVEL_STYLE[l].dash} />
          </svg>
          {LEVEL_STYLE[l].label}
        </li>
      ))}
    </ul>
  );
}

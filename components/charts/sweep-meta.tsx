import type { ModelLevel, SweepMetric } from "@/lib/scaling";
import { CHART, LEVEL_STYLE } from "./palette";

/** Display unit of each sweep metric (y values arrive in SI). No visx here: pages use it before the charts load. */
export const SWEEP_METRIC: Record<SweepMetric, { label: string; unit: string; scale: number }> = {
  delay: { label: "50% delay", unit: "ps", scale: 1e12 },
  rc: { label: "RC", unit: "ps", scale: 1e12 },
  r: { label: "Resistance", unit: "Ω", scale: 1 },
  c: { label: "Capacitance", unit: "fF", scale: 1e15 },
};

/** How a stretch of a curve outside a model's validity range is drawn (a dashed band under the curve). */
export const OUTSIDE_RANGE_STYLE = { color: CHART.warn, dash: "4 3", width: 5, opacity: 0.35, label: "outside model range" } as const;

/** Legend of the model levels (line sample + name); `outsideRange` adds the entry for stretches outside a model's range. */
export function LevelLegend({
  levels = ["ideal", "fringe", "coupled", "full"] as ModelLevel[],
  outsideRange = false,
}: {
  levels?: ModelLevel[];
  outsideRange?: boolean;
}) {
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
      {outsideRange ? (
        <li className="flex items-center gap-1.5" data-testid="legend-outside-range">
          <OutsideRangeSwatch />
          {OUTSIDE_RANGE_STYLE.label}
        </li>
      ) : null}
    </ul>
  );
}

/** Legend swatch of the band drawn where a model is outside its validity range (workspace chart and report figure). */
export function OutsideRangeSwatch() {
  return (
    <svg width="26" height="10" aria-hidden="true">
      <line
        x1="1"
        y1="5"
        x2="25"
        y2="5"
        stroke={OUTSIDE_RANGE_STYLE.color}
        strokeOpacity={OUTSIDE_RANGE_STYLE.opacity}
        strokeWidth={OUTSIDE_RANGE_STYLE.width}
        strokeDasharray={OUTSIDE_RANGE_STYLE.dash}
      />
    </svg>
  );
}

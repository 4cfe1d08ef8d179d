"use client";
import { Axis, GlyphSeries, Grid, LineSeries, Tooltip, XYChart } from "@visx/xychart";
import { CHART, chartTheme, logTicks, tick } from "./chart-theme";
import { GridRowsAt } from "./ref-line";

/** Marker shapes of the lines: the roadmap's levels take circles, the branches a square and a diamond. */
export type RoadmapMarker = "circle" | "square" | "diamond";

export interface RoadmapSeries {
  key: string;
  /** Legend text (the level, or "<branch name> (level)"). */
  label: string;
  color: string;
  dash?: string;
  width: number;
  marker: RoadmapMarker;
  /** y by step index (0 = N0); NaN where the chain has no such step. */
  values: number[];
}

type Datum = { x: number; y: number; key: string };
const xAcc = (d: Datum) => d.x;
const yAcc = (d: Datum) => d.y;

function Glyph({ x, y, color, marker }: { x: number; y: number; color: string; marker: RoadmapMarker }) {
  if (marker === "square") return <rect x={x - 3.5} y={y - 3.5} width={7} height={7} fill="#fff" stroke={color} strokeWidth={1.6} />;
  if (marker === "diamond")
    return <path d={`M${x},${y - 4.5}L${x + 4.5},${y}L${x},${y + 4.5}L${x - 4.5},${y}Z`} fill="#fff" stroke={color} strokeWidth={1.6} />;
  return <circle cx={x} cy={y} r={3} fill={color} />;
}

/**
 * One class's metric across the node steps N0 … Nn: a line per model level of the roadmap and one per compared
 * branch (dashed, own marker), x = the step, so a levelling-off across generations shows as a flat stretch.
 */
export function RoadmapChart({
  title,
  stepNames,
  series,
  unit,
  metricLabel,
  width,
  height,
}: {
  title: string;
  stepNames: string[];
  series: RoadmapSeries[];
  unit: string;
  metricLabel: string;
  width: number;
  height: number;
}) {
  const data = series.map((s) => ({
    ...s,
    points: s.values.map((y, x): Datum => ({ x, y, key: s.key })).filter((d) => Number.isFinite(d.y)),
  }));
  const ys = data.flatMap((s) => s.points.map((p) => p.y));
  const lo = ys.length ? Math.min(...ys) : 0;
  const hi = ys.length ? Math.max(...ys) : 1;
  const pad = (hi - lo) * 0.1 || Math.abs(hi) * 0.05 || 1;
  // a log axis when the lines span more than 4× (e.g. ideal scaling far below the others): each line's trend stays readable
  const log = lo > 0 && hi / lo > 4;
  const yTicks = log ? logTicks(lo / 1.1, hi * 1.1, Math.max(3, Math.floor(height / 45))) : undefined;
  const last = Math.max(1, stepNames.length - 1, ...data.map((s) => s.points.length - 1));
  const styleOf = new Map(series.map((s) => [s.key, s]));
  return (
    <figure className="roadmap-chart m-0" data-testid="roadmap-chart">
      <figcaption className="sr-only">{title}</figcaption>
      {log ? <p className="text-[10px] text-muted">log scale</p> : null}
      <XYChart
        width={width}
        height={height}
        theme={chartTheme}
        margin={{ top: 10, right: 16, bottom: 28, left: 58 }}
        xScale={{ type: "linear", domain: [-0.15, last + 0.15], zero: false }}
        yScale={log ? { type: "log", domain: [lo / 1.1, hi * 1.1] } : { type: "linear", domain: [Math.max(0, lo - pad), hi + pad], zero: false }}
        accessibilityLabel={title}
      >
        {yTicks ? <GridRowsAt values={yTicks} color={CHART.grid} /> : <Grid columns={false} numTicks={4} lineStyle={{ stroke: CHART.grid }} />}
        <Axis orientation="bottom" tickValues={Array.from({ length: last + 1 }, (_, i) => i)} tickFormat={(v) => stepNames[Number(v)] ?? `N${Number(v)}`} />
        <Axis
          orientation="left"
          numTicks={4}
          tickValues={yTicks}
          label={`${metricLabel}${unit ? ` (${unit})` : ""}`}
          labelOffset={30}
          tickFormat={(v) => tick(Number(v))}
        />
        {data.map((s) => (
          <LineSeries
            key={s.key}
            dataKey={s.label}
            data={s.points}
            xAccessor={xAcc}
            yAccessor={yAcc}
            colorAccessor={() => s.color}
            strokeDasharray={s.dash}
            strokeWidth={s.width}
          />
        ))}
        {data.map((s) => (
          <GlyphSeries
            key={`${s.key}:marks`}
            dataKey={`${s.label} `}
            data={s.points}
            xAccessor={xAcc}
            yAccessor={yAcc}
            renderGlyph={({ x, y }) => <Glyph x={x} y={y} color={s.color} marker={s.marker} />}
          />
        ))}
        <Tooltip<Datum>
          snapTooltipToDatumX
          showVerticalCrosshair
          verticalCrosshairStyle={{ stroke: CHART.rule, strokeDasharray: "3 3" }}
          renderTooltip={({ tooltipData }) => {
            const near = tooltipData?.nearestDatum?.datum;
            if (!near) return null;
            return (
              <div className="text-xs">
                <div className="mb-0.5 font-semibold">{stepNames[near.x] ?? `N${near.x}`}</div>
                {Object.entries(tooltipData?.datumByKey ?? {})
                  .filter(([k]) => !k.endsWith(" "))
                  .map(([k, v]) => {
                    const d = v.datum as Datum;
                    return (
                      <div key={k} className="flex justify-between gap-3">
                        <span style={{ color: styleOf.get(d.key)?.color }}>{k}</span>
                        <span className="tabular">
                          {tick(d.y)} {unit}
                        </span>
                      </div>
                    );
                  })}
              </div>
            );
          }}
        />
      </XYChart>
      <ul className="mt-1 flex flex-wrap gap-x-3 gap-y-0.5 text-[11px] text-muted" aria-label="Legend">
        {series.map((s) => (
          <li key={s.key} className="inline-flex items-center gap-1">
            <svg width="26" height="10" aria-hidden="true">
              <line x1="1" y1="5" x2="25" y2="5" stroke={s.color} strokeWidth={s.width} strokeDasharray={s.dash} />
              <Glyph x={13} y={5} color={s.color} marker={s.marker} />
            </svg>
            {s.label}
          </li>
        ))}
      </ul>
    </figure>
  );
}

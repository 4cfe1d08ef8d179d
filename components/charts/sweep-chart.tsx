"use client";
import { createContext, memo, useContext, useMemo } from "react";
import { Axis, DataContext, GlyphSeries, Grid, LineSeries, Tooltip, XYChart } from "@visx/xychart";
import type { ModelLevel, SweepMetric, SweepPoint } from "@/lib/scaling";
import { GridRowsAt, RefLine } from "./ref-line";
import { CHART, LEVEL_STYLE, chartTheme, logTicks, scaleTicks, tick } from "./chart-theme";
import { LevelLegend, OUTSIDE_RANGE_STYLE, SWEEP_METRIC } from "./sweep-meta";

export { LevelLegend, SWEEP_METRIC } from "./sweep-meta";

export interface SweepChartData {
  className: string;
  curves: { level: ModelLevel; points: SweepPoint[] }[];
}

export interface SweepChartProps {
  data: SweepChartData;
  width: number;
  height: number;
  metric: SweepMetric;
  /** x axis label, e.g. "S (cross-section factor)". */
  xLabel?: string;
  /** Mark the scenario's current value of the swept variable (a vertical line). */
  markerX?: number;
  /** Also put dots on the curves at markerX (only when the curves are this scenario's, e.g. its own S_L). */
  markerDots?: boolean;
  /** y values arrive already divided by each curve's value at S = 1: plot them as plain ratios. */
  relative?: boolean;
  logX?: boolean;
  logY?: boolean;
  /** Show the level legend under the chart (small multiples usually share one). */
  legend?: boolean;
}

/** `out`: a model is outside its validity range at this point (the engine's flags on the sweep point). */
type Datum = { x: number; y: number; level: ModelLevel; out?: boolean };
/** Series keys of the outside-range bands: left out of the tooltip. */
const OUT_KEY = "outside:";
const xAcc = (d: Datum) => d.x;
const yAcc = (d: Datum) => d.y;

/** The scenario's S on the chart: read only by the marker layer, so moving S re-renders the line and dots, not the curves. */
const MarkerContext = createContext<{ markerX?: number; markerDots: boolean }>({ markerDots: true });

/**
 * A metric against the scale factor for one class, one curve per model level: where the copper curve flattens, scaling stops paying.
 * While S is dragged only the marker changes: the curves, axes and tooltip (a memoised body) are not rendered again.
 */
export function SweepChart({ markerX, markerDots = true, ...rest }: SweepChartProps) {
  const marker = useMemo(() => ({ markerX, markerDots }), [markerX, markerDots]);
  return (
    <MarkerContext.Provider value={marker}>
      <SweepChartBody {...rest} />
    </MarkerContext.Provider>
  );
}

const SweepChartBody = memo(function SweepChartBody({
  data,
  width,
  height,
  metric,
  xLabel = "S (cross-section factor)",
  relative = false,
  logX = true,
  logY = true,
  legend = false,
}: Omit<SweepChartProps, "markerX" | "markerDots">) {
  const m = relative ? { ...SWEEP_METRIC[metric], unit: "×", scale: 1 } : SWEEP_METRIC[metric];
  const yLabel = relative ? `${m.label} ÷ value at S = 1` : `${m.label} (${m.unit})`;
  const unitLabel = m.unit;
  const series = useMemo(
    () =>
      data.curves.map((c) => ({
        level: c.level,
        points: c.points
          .filter((p) => Number.isFinite(p.y) && p.y > 0)
          .map((p): Datum => ({ x: p.x, y: p.y * m.scale, level: c.level, out: (p.flags?.length ?? 0) > 0 })),
      })),
    [data, m.scale],
  );
  const outside = useMemo(() => series.flatMap((s) => outsideRuns(s.points).map((points, i) => ({ key: `${OUT_KEY}${s.level}:${i}`, points }))), [series]);
  const { xDomain, yDomain, useLogY } = useMemo(() => {
    const xs = series.flatMap((s) => s.points.map((p) => p.x));
    const ys = series.flatMap((s) => s.points.map((p) => p.y));
    if (xs.length === 0) return { xDomain: [0.5, 4] as [number, number], yDomain: [1, 10] as [number, number], useLogY: logY };
    // Relative curves all pass through 1: keep 1 on the axis so the S = 1 reference line always shows.
    const yLo = relative ? Math.min(1, ...ys) : Math.min(...ys);
    const yHi = relative ? Math.max(1, ...ys) : Math.max(...ys);
    // The range comes from the data: a log axis only when the curves span more than 4×; otherwise a linear axis
    // fitted to them (not from 0), so a shallow minimum takes the chart's height instead of a few pixels.
    const log = logY && yHi / yLo > 4;
    const pad = (yHi - yLo) * 0.08 || yHi * 0.02;
    return {
      xDomain: [Math.min(...xs), Math.max(...xs)] as [number, number],
      yDomain: (log ? [yLo / 1.12, yHi * 1.12] : [Math.max(0, yLo - pad), yHi + pad]) as [number, number],
      useLogY: log,
    };
  }, [series, logY, relative]);
  const xTicks = scaleTicks(xDomain[0], xDomain[1], Math.max(3, Math.floor(width / 70)));
  const yTicks = useLogY ? logTicks(yDomain[0], yDomain[1], Math.max(3, Math.floor(height / 40))) : undefined;
  // each curve's lowest point: marked on the chart and named under it
  const minima = useMemo(
    () =>
      series
        .filter((s) => s.points.length > 0)
        .map((s) => {
          const m = s.points.reduce((a, b) => (b.y < a.y ? b : a));
          return { ...m, interior: m !== s.points[0] && m !== s.points[s.points.length - 1] };
        }),
    [series],
  );

  return (
    <figure className="sweep-chart m-0" data-class={data.className}>
      <figcaption className="mb-1 text-xs font-semibold text-ink">
        {data.className}{" "}
        <span className="font-normal text-muted">
          · {m.label}
          {relative ? " relative to S = 1" : ` (${m.unit})`}
        </span>
      </figcaption>
      <XYChart
        width={width}
        height={height}
        theme={chartTheme}
        margin={{ top: 8, right: 14, bottom: 40, left: 62 }}
        xScale={logX ? { type: "log", domain: xDomain } : { type: "linear", domain: xDomain, zero: false }}
        yScale={useLogY ? { type: "log", domain: yDomain } : { type: "linear", domain: yDomain, zero: false }}
        accessibilityLabel={`${m.label} of ${data.className} against ${xLabel}`}
      >
        {yTicks ? <GridRowsAt values={yTicks} color={CHART.grid} /> : <Grid columns={false} numTicks={4} lineStyle={{ stroke: CHART.grid }} />}
        <Axis orientation="bottom" label={xLabel} tickValues={xTicks} tickFormat={(v) => tick(Number(v))} labelOffset={12} />
        <Axis orientation="left" label={yLabel} tickValues={yTicks} numTicks={4} tickFormat={(v) => tick(Number(v))} labelOffset={34} />
        <Marker series={series} xDomain={xDomain} />
        {outside.map((o) => (
          <LineSeries
            key={o.key}
            dataKey={o.key}
            data={o.points}
            xAccessor={xAcc}
            yAccessor={yAcc}
            colorAccessor={() => OUTSIDE_RANGE_STYLE.color}
            strokeDasharray={OUTSIDE_RANGE_STYLE.dash}
            strokeWidth={OUTSIDE_RANGE_STYLE.width}
            strokeOpacity={OUTSIDE_RANGE_STYLE.opacity}
            data-outside-range=""
          />
        ))}
        {series.map((s) => (
          <LineSeries
            key={s.level}
            dataKey={LEVEL_STYLE[s.level].label}
            data={s.points}
            xAccessor={xAcc}
            yAccessor={yAcc}
            colorAccessor={() => LEVEL_STYLE[s.level].color}
            strokeDasharray={LEVEL_STYLE[s.level].dash}
            strokeWidth={LEVEL_STYLE[s.level].width}
          />
        ))}
        <GlyphSeries
          dataKey="Minimum"
          data={minima}
          xAccessor={xAcc}
          yAccessor={yAcc}
          colorAccessor={(d: Datum) => LEVEL_STYLE[d.level].color}
          renderGlyph={({ x, y, color }) => <path d={`M${x - 5},${y + 10}L${x + 5},${y + 10}L${x},${y + 3}Z`} fill={color} data-minimum="" />}
        />
        <Tooltip<Datum>
          snapTooltipToDatumX
          showVerticalCrosshair
          showSeriesGlyphs
          verticalCrosshairStyle={{ stroke: CHART.rule, strokeDasharray: "3 3" }}
          renderGlyph={({ key, x, y, color, size }) =>
            key.startsWith(OUT_KEY) || key === "Minimum" ? null : (
              <circle cx={x} cy={y} r={size} fill={color} stroke="#fff" strokeWidth={1.5} paintOrder="fill" />
            )
          }
          renderTooltip={({ tooltipData }) => {
            const near = tooltipData?.nearestDatum?.datum;
            if (!near) return null;
            return (
              <div className="text-xs">
                <div className="mb-0.5 font-semibold">
                  {data.className} at S = {tick(near.x)}
                </div>
                {Object.entries(tooltipData?.datumByKey ?? {})
                  .filter(([k]) => k !== "Minimum" && !k.startsWith(OUT_KEY))
                  .map(([k, v]) => (
                    <div key={k} className="flex justify-between gap-3">
                      <span style={{ color: LEVEL_STYLE[(v.datum as Datum).level].color }}>{k}</span>
                      <span className="tabular">
                        {relative ? `${tick((v.datum as Datum).y)}×` : `${tick((v.datum as Datum).y)} ${m.unit}`}
                        {(v.datum as Datum).out ? " (outside model range)" : ""}
                      </span>
                    </div>
                  ))}
              </div>
            );
          }}
        />
      </XYChart>
      <p className="mt-0.5 text-[10px] leading-snug text-muted" data-testid="sweep-minima">
        ▲ lowest:{" "}
        {minima.map((m, i) => (
          <span key={m.level} style={{ color: LEVEL_STYLE[m.level].color }}>
            {i > 0 ? "; " : ""}
            {LEVEL_STYLE[m.level].label} {relative ? `${tick(m.y)}×` : `${tick(m.y)} ${unitLabel}`} at S = {tick(m.x)}
            {m.interior ? "" : " (range end)"}
          </span>
        ))}
      </p>
      {legend ? <LevelLegend outsideRange={outside.length > 0} /> : null}
    </figure>
  );
});

/** The scenario's S: a dashed line and (markerDots) a dot on each curve at the nearest sample, drawn with the chart's scales. */
function Marker({ series, xDomain }: { series: { level: ModelLevel; points: Datum[] }[]; xDomain: [number, number] }) {
  const { markerX, markerDots } = useContext(MarkerContext);
  const { xScale, yScale } = useContext(DataContext);
  if (markerX === undefined || markerX < xDomain[0] || markerX > xDomain[1] || !xScale || !yScale) return null;
  const dots = markerDots ? series.map((s) => nearest(s.points, markerX)).filter((p): p is Datum => !!p) : [];
  return (
    <>
      <RefLine x={markerX} color={CHART.muted} dash="3 3" label={`S = ${tick(markerX)}`} labelAt="top" />
      <g data-testid="current-scenario">
        {dots.map((d) => {
          const cx = Number(xScale(d.x as never));
          const cy = Number(yScale(d.y as never));
          return Number.isFinite(cx) && Number.isFinite(cy) ? <circle key={d.level} cx={cx} cy={cy} r={3} fill={LEVEL_STYLE[d.level].color} /> : null;
        })}
      </g>
    </>
  );
}

/**
 * The stretches of a curve where a model is outside its range: each run of flagged points, widened by the
 * in-range neighbour on either side so the band reaches the boundary between two sample points.
 */
function outsideRuns(points: Datum[]): Datum[][] {
  const runs: Datum[][] = [];
  let i = 0;
  while (i < points.length) {
    if (!points[i]!.out) {
      i++;
      continue;
    }
    let j = i;
    while (j + 1 < points.length && points[j + 1]!.out) j++;
    runs.push(points.slice(Math.max(0, i - 1), Math.min(points.length, j + 2)));
    i = j + 1;
  }
  return runs;
}

function nearest(points: Datum[], x: number): Datum | undefined {
  let best: Datum | undefined;
  for (const p of points) if (!best || Math.abs(Math.log(p.x / x)) < Math.abs(Math.log(best.x / x))) best = p;
  return best;
}

"use client";
import { useMemo } from "react";
import { Axis, Grid, LineSeries, Tooltip, XYChart } from "@visx/xychart";
import { CHART, chartTheme, logTicks, tick } from "./chart-theme";
import { RefLine } from "./ref-line";

export interface DistributionSeries {
  /** Legend label, e.g. "Baseline" or a scenario name. */
  label: string;
  bins: { delayS: number; count: number }[];
  color?: string;
  dash?: string;
}

export interface DelayDistributionChartProps {
  data: DistributionSeries[];
  width: number;
  height: number;
  /** Delay budget in seconds: a vertical line; the legend gives each series' share over it. */
  budgetS: number;
  title?: string;
}

type Datum = { x: number; y: number };
const xAcc = (d: Datum) => d.x;
const yAcc = (d: Datum) => d.y;
const DEFAULT_COLORS = [CHART.grey, CHART.copper, CHART.slate, CHART.moss];

/** Cumulative share of nets (%) against delay (ps, log axis) per series, with the delay budget marked. */
export function DelayDistributionChart({ data, width, height, budgetS, title }: DelayDistributionChartProps) {
  const series = useMemo(
    () =>
      data.map((s, i) => {
        const bins = [...s.bins].filter((b) => b.delayS > 0 && b.count > 0).sort((a, b) => a.delayS - b.delayS);
        const total = bins.reduce((a, b) => a + b.count, 0) || 1;
        let acc = 0;
        const points: Datum[] = [];
        for (const b of bins) {
          if (points.length === 0) points.push({ x: b.delayS * 1e12, y: 0 });
          acc += b.count;
          points.push({ x: b.delayS * 1e12, y: (acc / total) * 100 });
        }
        const over = bins.filter((b) => b.delayS > budgetS).reduce((a, b) => a + b.count, 0) / total;
        return { ...s, color: s.color ?? DEFAULT_COLORS[i % DEFAULT_COLORS.length]!, points, over };
      }),
    [data, budgetS],
  );
  const xs = series.flatMap((s) => s.points.map((p) => p.x)).concat(budgetS * 1e12);
  const lo = Math.min(...xs) / 1.2;
  const hi = Math.max(...xs) * 1.2;
  return (
    <figure className="distribution-chart m-0">
      {title ? <figcaption className="mb-1 text-xs font-semibold text-ink">{title}</figcaption> : null}
      <XYChart
        width={width}
        height={height}
        theme={chartTheme}
        margin={{ top: 8, right: 14, bottom: 40, left: 56 }}
        xScale={{ type: "log", domain: [lo, hi] }}
        yScale={{ type: "linear", domain: [0, 100], zero: true }}
        accessibilityLabel={`${title ?? "Delay distribution"} against the delay budget`}
      >
        <Grid columns={false} numTicks={4} lineStyle={{ stroke: CHART.grid }} />
        <Axis
          orientation="bottom"
          label="50% delay (ps)"
          tickValues={logTicks(lo, hi, Math.max(3, Math.floor(width / 70)))}
          tickFormat={(v) => tick(Number(v))}
          labelOffset={14}
        />
        <Axis orientation="left" label="Nets at or below (%)" numTicks={5} tickFormat={(v) => tick(Number(v))} labelOffset={30} />
        {series.map((s) => (
          <LineSeries
            key={s.label}
            dataKey={s.label}
            data={s.points}
            xAccessor={xAcc}
            yAccessor={yAcc}
            colorAccessor={() => s.color}
            strokeDasharray={s.dash}
            strokeWidth={2}
          />
        ))}
        <RefLine x={budgetS * 1e12} color={CHART.bad} label={`budget ${tick(budgetS * 1e12)} ps`} />
        <Tooltip<Datum>
          snapTooltipToDatumX
          showVerticalCrosshair
          renderTooltip={({ tooltipData }) => {
            const d = tooltipData?.nearestDatum;
            return d ? (
              <div className="text-xs">
                <span className="font-semibold">{d.key}</span>: {tick(d.datum.y)}% of nets ≤ {tick(d.datum.x)} ps
              </div>
            ) : null;
          }}
        />
      </XYChart>
      <ul className="mt-1 flex flex-wrap gap-x-4 text-xs text-muted">
        {series.map((s) => (
          <li key={s.label} className="flex items-center gap-1.5">
            <svg width="22" height="8" aria-hidden="true">
              <line x1="1" y1="4" x2="21" y2="4" stroke={s.color} strokeWidth={2} strokeDasharray={s.dash} />
            </svg>
            {s.label}: <span className="tabular text-ink">{tick(s.over * 100)}%</span> over budget
          </li>
        ))}
      </ul>
    </figure>
  );
}

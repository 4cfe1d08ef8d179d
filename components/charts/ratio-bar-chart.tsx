"use client";
import { useContext, useMemo } from "react";
import { Axis, BarSeries, DataContext, Grid, Tooltip, XYChart } from "@visx/xychart";
import { CHART, chartTheme, tick } from "./chart-theme";
import { RefLine } from "./ref-line";

export interface RatioDatum {
  /** Short metric label, e.g. "Delay". */
  label: string;
  /** Scenario / baseline. */
  ratio: number;
  /** Whether a ratio below 1 is an improvement (default true). */
  lowerIsBetter?: boolean;
}

export interface RatioBarChartProps {
  data: RatioDatum[];
  width: number;
  height: number;
  title?: string;
}

/** The ratio printed above each bar (2 decimals), so the chart reads without hovering. */
function BarValues({ data }: { data: RatioDatum[] }) {
  const { xScale, yScale } = useContext(DataContext);
  if (!xScale || !yScale) return null;
  const band = (xScale as unknown as { bandwidth?: () => number }).bandwidth?.() ?? 0;
  return (
    <g aria-hidden="true">
      {data.map((d) => {
        const x = Number(xScale(d.label as never)) + band / 2;
        const y = Number(yScale(d.ratio as never));
        if (!Number.isFinite(x) || !Number.isFinite(y)) return null;
        return (
          <text key={d.label} x={x} y={y - 3} textAnchor="middle" fontSize={10} fill={CHART.ink} className="tabular">
            {d.ratio.toFixed(2)}
          </text>
        );
      })}
    </g>
  );
}

const xAcc = (d: RatioDatum) => d.label;
const yAcc = (d: RatioDatum) => d.ratio;

/** Scenario/baseline ratios of one class as bars around the 1× line: better in the good tone, worse in the bad tone. */
export function RatioBarChart({ data, width, height, title }: RatioBarChartProps) {
  const clean = useMemo(() => data.filter((d) => Number.isFinite(d.ratio)), [data]);
  // Headroom for the value printed above the tallest bar.
  const hi = Math.max(1.2, ...clean.map((d) => d.ratio)) * 1.16;
  return (
    <figure className="ratio-chart m-0">
      {title ? <figcaption className="mb-1 text-xs font-semibold text-ink">{title}</figcaption> : null}
      <XYChart
        width={width}
        height={height}
        theme={chartTheme}
        margin={{ top: 8, right: 8, bottom: 24, left: 40 }}
        xScale={{ type: "band", paddingInner: 0.3, paddingOuter: 0.15 }}
        yScale={{ type: "linear", domain: [0, hi], zero: true }}
        accessibilityLabel={`${title ?? "Ratios"}: scenario over baseline`}
      >
        <Grid columns={false} numTicks={4} lineStyle={{ stroke: CHART.grid }} />
        <Axis orientation="bottom" tickFormat={(v) => String(v)} />
        <Axis orientation="left" numTicks={4} tickFormat={(v) => `${tick(Number(v))}×`} />
        <BarSeries
          dataKey="ratio"
          data={clean}
          xAccessor={xAcc}
          yAccessor={yAcc}
          colorAccessor={(d: RatioDatum) => {
            const better = (d.lowerIsBetter ?? true) ? d.ratio < 0.995 : d.ratio > 1.005;
            const worse = (d.lowerIsBetter ?? true) ? d.ratio > 1.005 : d.ratio < 0.995;
            return better ? CHART.good : worse ? CHART.bad : CHART.grey;
          }}
        />
        <RefLine y={1} color={CHART.ink} dash="3 3" />
        <BarValues data={clean} />
        <Tooltip<RatioDatum>
          snapTooltipToDatumX
          renderTooltip={({ tooltipData }) => {
            const d = tooltipData?.nearestDatum?.datum;
            return d ? (
              <div className="text-xs">
                <span className="font-semibold">{d.label}</span>: {tick(d.ratio)}× baseline
              </div>
            ) : null;
          }}
        />
      </XYChart>
    </figure>
  );
}

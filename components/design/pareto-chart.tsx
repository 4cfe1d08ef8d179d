"use client";
import { Axis, GlyphSeries, Grid, LineSeries, Tooltip, XYChart } from "@visx/xychart";
import type { GridPoint } from "@/lib/scaling";
import { CHART, chartTheme, tick } from "@/components/charts/chart-theme";

type Datum = { x: number; y: number; label: string };
const xAcc = (d: Datum) => d.x;
const yAcc = (d: Datum) => d.y;

/** The delay–energy Pareto front of the heat map's drawings (ps, fJ), with the optimum and the current drawing. */
export function ParetoChart({
  front,
  optimum,
  current,
  width,
}: {
  front: GridPoint[];
  optimum: { delayS: number; energyJ: number };
  current: { delayS: number; energyJ: number };
  width: number;
}) {
  const pts: Datum[] = front.map((p) => ({
    x: p.delayS * 1e12,
    y: p.energyJ * 1e15,
    label: `W/pitch ${p.lineFraction.toFixed(3)}, T/W ${p.aspectRatio.toFixed(2)}`,
  }));
  const opt: Datum[] = [{ x: optimum.delayS * 1e12, y: optimum.energyJ * 1e15, label: "Optimum" }];
  const cur: Datum[] = [{ x: current.delayS * 1e12, y: current.energyJ * 1e15, label: "Current" }];
  const all = [...pts, ...opt, ...cur];
  const span = (v: number[]) => {
    const lo = Math.min(...v);
    const hi = Math.max(...v);
    const pad = (hi - lo) * 0.08 || Math.abs(hi) * 0.05 || 1;
    return [lo - pad, hi + pad] as [number, number];
  };
  return (
    <figure className="m-0" data-testid="pareto-chart">
      <figcaption className="sr-only">Pareto front of delay against energy per transition</figcaption>
      <XYChart
        width={width}
        height={240}
        theme={chartTheme}
        margin={{ top: 10, right: 16, bottom: 36, left: 56 }}
        xScale={{ type: "linear", domain: span(all.map((d) => d.x)), zero: false }}
        yScale={{ type: "linear", domain: span(all.map((d) => d.y)), zero: false }}
        accessibilityLabel="Pareto front of delay against energy"
      >
        <Grid numTicks={4} lineStyle={{ stroke: CHART.grid }} />
        <Axis orientation="bottom" numTicks={5} label="50% delay (ps)" tickFormat={(v) => tick(Number(v))} />
        <Axis orientation="left" numTicks={4} label="Energy per transition (fJ)" labelOffset={28} tickFormat={(v) => tick(Number(v))} />
        <LineSeries dataKey="Pareto front" data={pts} xAccessor={xAcc} yAccessor={yAcc} colorAccessor={() => CHART.copper} strokeWidth={1.5} />
        <GlyphSeries
          dataKey="Front points"
          data={pts}
          xAccessor={xAcc}
          yAccessor={yAcc}
          renderGlyph={({ x, y }) => <circle cx={x} cy={y} r={2.5} fill={CHART.copper} />}
        />
        <GlyphSeries
          dataKey="Current"
          data={cur}
          xAccessor={xAcc}
          yAccessor={yAcc}
          renderGlyph={({ x, y }) => (
            <g>
              <rect x={x - 5} y={y - 5} width={10} height={10} fill="#fff" stroke={CHART.slate} strokeWidth={2} />
              <text x={x + 8} y={y + 12} fontSize={10} fontWeight={600} fill={CHART.slate}>
                Current
              </text>
            </g>
          )}
        />
        <GlyphSeries
          dataKey="Optimum"
          data={opt}
          xAccessor={xAcc}
          yAccessor={yAcc}
          renderGlyph={({ x, y }) => (
            <g>
              <circle cx={x} cy={y} r={6} fill="#fff" stroke={CHART.ink} strokeWidth={2} />
              <circle cx={x} cy={y} r={2} fill={CHART.ink} />
              <text x={x + 9} y={y - 6} fontSize={10} fontWeight={600} fill={CHART.ink}>
                Optimum
              </text>
            </g>
          )}
        />
        <Tooltip<Datum>
          snapTooltipToDatumX
          snapTooltipToDatumY
          renderTooltip={({ tooltipData }) => {
            const d = tooltipData?.nearestDatum?.datum;
            if (!d) return null;
            return (
              <div className="text-xs">
                <div className="font-semibold">{d.label}</div>
                <div>
                  {tick(d.x)} ps, {tick(d.y)} fJ
                </div>
              </div>
            );
          }}
        />
      </XYChart>
    </figure>
  );
}

import { buildChartTheme } from "@visx/xychart";
import { CHART } from "./palette";

export { CHART, LEVEL_STYLE, tick, logTicks, scaleTicks } from "./palette";

export const chartTheme = buildChartTheme({
  backgroundColor: "transparent",
  colors: [CHART.copper, CHART.slate, CHART.moss, CHART.grey, CHART.muted],
  tickLength: 4,
  gridColor: CHART.grid,
  gridColorDark: CHART.rule,
  svgLabelSmall: { fill: CHART.muted, fontSize: 10, fontFamily: "var(--font-sans), system-ui, sans-serif" },
  svgLabelBig: { fill: CHART.ink, fontSize: 11, fontFamily: "var(--font-sans), system-ui, sans-serif" },
  htmlLabel: { color: CHART.ink, fontSize: 12, fontFamily: "var(--font-sans), system-ui, sans-serif" },
  xAxisLineStyles: { stroke: CHART.rule },
  yAxisLineStyles: { stroke: CHART.rule },
  xTickLineStyles: { stroke: CHART.rule },
  yTickLineStyles: { stroke: CHART.rule },
});

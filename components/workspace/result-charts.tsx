"use client";
import { memo } from "react";
import type { Evaluation } from "@/lib/scaling";
import { Card } from "@/components/ui/card";
import { RatioBarChart } from "@/components/charts/ratio-bar-chart";
import { DelayDistributionChart } from "@/components/charts/delay-distribution-chart";
import { CHART } from "@/components/charts/chart-theme";
import { useWidth } from "./use-width";

// The secondary charts of the scenario editor, in their own module so the editor can load visx lazily.

export const RatioCharts = memo(function RatioCharts({ e }: { e: Evaluation }) {
  const [ref, width] = useWidth<HTMLDivElement>(800);
  const cols = width > 900 ? 4 : width > 560 ? 2 : 1;
  const w = Math.floor((width - (cols - 1) * 12) / cols);
  return (
    <Card title="Scenario / baseline per class">
      <div ref={ref} className="grid gap-3" style={{ gridTemplateColumns: `repeat(${cols}, minmax(0, 1fr))` }}>
        {e.classes.map((c) => (
          <RatioBarChart
            key={c.name}
            title={c.name}
            width={w}
            height={170}
            data={[
              { label: "R", ratio: c.ratio.rOhmPerM },
              { label: "C", ratio: c.ratio.cFPerM },
              { label: "RC", ratio: c.ratio.rcS },
              { label: "Delay", ratio: c.ratio.delayS },
              // the engine's ratio of repeater stages (inserted + 1): labelled as such (lib/figures.ts)
              { label: "Stages", ratio: c.ratio.repeaters },
              { label: "Energy", ratio: c.ratio.energyJ },
            ]}
          />
        ))}
      </div>
      <p className="mt-1 text-[11px] text-muted">
        Per-length R and C; RC, delay and energy at each class&apos;s typical length. Stages: repeater stages per net (inserted repeaters + 1). Bars: scenario ÷
        baseline (dashed line = 1×, the baseline). Green: better than the baseline, red: worse, grey: within ±0.5%.
      </p>
    </Card>
  );
});

export const Distributions = memo(function Distributions({ e, budgetS }: { e: Evaluation; budgetS: number }) {
  const [ref, width] = useWidth<HTMLDivElement>(800);
  const withHist = e.classes.filter((c) => c.scenario.distribution.source === "histogram");
  if (withHist.length === 0) return null;
  const cols = width > 700 ? 2 : 1;
  const w = Math.floor((width - (cols - 1) * 16) / cols);
  return (
    <Card title="Delay distribution against the budget">
      <div ref={ref} className="grid gap-4" style={{ gridTemplateColumns: `repeat(${cols}, minmax(0, 1fr))` }}>
        {withHist.map((c) => (
          <DelayDistributionChart
            key={c.name}
            title={`${c.name} — ${c.scenario.distribution.totalNets.toLocaleString("en")} nets`}
            width={w}
            height={220}
            budgetS={budgetS}
            data={[
              { label: "Baseline", bins: c.baseline.distribution.bins, color: CHART.grey, dash: "5 3" },
              { label: "Scenario", bins: c.scenario.distribution.bins, color: CHART.copper },
            ]}
          />
        ))}
      </div>
    </Card>
  );
});

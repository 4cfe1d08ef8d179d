"use client";
import { useEffect, useState } from "react";
import { RatioBarChart, type RatioDatum } from "@/components/charts/ratio-bar-chart";

/**
 * The workspace's ratio bar chart for one option: each class's delay against the baseline (1×).
 * visx draws after hydration, so the figure carries data-chart-pending until it has mounted; the PDF
 * renderer waits for that before printing. Fixed size: it prints the same as on screen.
 */
export function ClassRatioChart({ data, title }: { data: RatioDatum[]; title: string }) {
  const [mounted, setMounted] = useState(false);
  useEffect(() => {
    const id = requestAnimationFrame(() => setMounted(true));
    return () => cancelAnimationFrame(id);
  }, []);
  return (
    <div className="report-ratio mt-2" data-chart-pending={mounted ? undefined : ""} style={{ width: 320, height: 112 }}>
      <RatioBarChart data={data} width={320} height={94} title={title} />
    </div>
  );
}

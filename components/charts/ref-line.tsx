"use client";
import { useContext } from "react";
import { DataContext } from "@visx/xychart";

/** A reference line inside an XYChart at a y (horizontal) or x (vertical) data value, with an optional label. */
export function RefLine({
  y,
  x,
  color,
  label,
  dash = "4 3",
  labelAt = "bottom",
}: {
  y?: number;
  x?: number;
  color: string;
  label?: string;
  dash?: string;
  labelAt?: "top" | "bottom";
}) {
  const { xScale, yScale, innerWidth, innerHeight, margin } = useContext(DataContext);
  if (!xScale || !yScale || !margin || innerWidth === undefined || innerHeight === undefined) return null;
  if (y !== undefined) {
    const py = Number(yScale(y as never));
    if (!Number.isFinite(py)) return null;
    return (
      <g>
        <line x1={margin.left} x2={margin.left + innerWidth} y1={py} y2={py} stroke={color} strokeDasharray={dash} strokeWidth={1.25} />
        {label ? (
          <text x={margin.left + innerWidth - 2} y={py - 3} textAnchor="end" fontSize={10} fill={color}>
            {label}
          </text>
        ) : null}
      </g>
    );
  }
  if (x !== undefined) {
    const px = Number(xScale(x as never));
    if (!Number.isFinite(px)) return null;
    return (
      <g>
        <line x1={px} x2={px} y1={margin.top} y2={margin.top + innerHeight} stroke={color} strokeDasharray={dash} strokeWidth={1.25} />
        {label ? (
          labelAt === "top" ? (
            // Right of the line, unless that would run past the plot's right edge.
            <text
              x={px > margin.left + innerWidth - 50 ? px - 3 : px + 3}
              y={margin.top + 9}
              textAnchor={px > margin.left + innerWidth - 50 ? "end" : "start"}
              fontSize={10}
              fill={color}
            >
              {label}
            </text>
          ) : (
            <text x={px - 3} y={margin.top + innerHeight - 6} textAnchor="end" fontSize={10} fill={color}>
              {label}
            </text>
          )
        ) : null}
      </g>
    );
  }
  return null;
}

/** Horizontal grid lines at exactly these y values (visx's Grid picks its own ticks on log scales). */
export function GridRowsAt({ values, color }: { values: number[]; color: string }) {
  const { yScale, innerWidth, margin } = useContext(DataContext);
  if (!yScale || !margin || innerWidth === undefined) return null;
  return (
    <g aria-hidden="true">
      {values.map((v) => {
        const py = Number(yScale(v as never));
        return Number.isFinite(py) ? <line key={v} x1={margin.left} x2={margin.left + innerWidth} y1={py} y2={py} stroke={color} /> : null;
      })}
    </g>
  );
}

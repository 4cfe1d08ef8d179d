"use client";
import { useState } from "react";
import type { ObjectiveGrid } from "@/lib/scaling";

/** Plateau's own sequential scale for "lower is better" maps: pale sand (best) → copper → dark umber (worst). */
const STOPS: [number, number, number][] = [
  [250, 244, 228],
  [231, 178, 122],
  [180, 98, 45],
  [74, 42, 24],
];

export function scaleColor(t: number): string {
  const u = Math.min(1, Math.max(0, t)) * (STOPS.length - 1);
  const i = Math.min(STOPS.length - 2, Math.floor(u));
  const f = u - i;
  const a = STOPS[i]!;
  const b = STOPS[i + 1]!;
  const c = a.map((v, k) => Math.round(v + (b[k]! - v) * f));
  return `rgb(${c[0]},${c[1]},${c[2]})`;
}

export interface MapPoint {
  lineFraction: number;
  aspectRatio: number;
}

/**
 * The objective over line fraction (x) × aspect ratio (y) as a grid of cells, with the optimum and the current
 * drawing marked, a legend in the objective's unit and a hover readout. Values are shown on a log scale when they span
 * more than 3× (a repeater count change makes steps).
 */
export function HeatMap({
  grid,
  optimum,
  current,
  unit,
  unitSI,
  label,
}: {
  grid: ObjectiveGrid;
  optimum: MapPoint;
  current: MapPoint;
  unit: string;
  unitSI: number;
  label: string;
}) {
  const [hover, setHover] = useState<{ i: number; j: number } | null>(null);
  const n = grid.lineFractions.length;
  const m = grid.aspectRatios.length;
  const vals = grid.values.flat().filter((v): v is number => v !== null);
  const lo = Math.min(...vals);
  const hi = Math.max(...vals);
  const log = lo > 0 && hi / lo > 3;
  const t = (v: number) => (hi === lo ? 0 : log ? Math.log(v / lo) / Math.log(hi / lo) : (v - lo) / (hi - lo));
  // drawing box (SVG user units; the SVG scales to its container)
  const L = 52;
  const T = 8;
  const W = 400;
  const H = 300;
  const xs = grid.lineFractions;
  const as = grid.aspectRatios;
  const x0 = xs[0]!;
  const x1 = xs[n - 1]!;
  const a0 = as[0]!;
  const a1 = as[m - 1]!;
  const cw = W / n;
  const ch = H / m;
  const px = (x: number) => L + ((x - x0) / (x1 - x0)) * (W - cw) + cw / 2;
  const py = (a: number) => T + H - (((a - a0) / (a1 - a0)) * (H - ch) + ch / 2);
  const inside = (p: MapPoint) => p.lineFraction >= x0 - 1e-9 && p.lineFraction <= x1 + 1e-9 && p.aspectRatio >= a0 - 1e-9 && p.aspectRatio <= a1 + 1e-9;
  const show = (v: number) => Number((v / unitSI).toPrecision(4)).toString();
  const ticks = (a: number, b: number) => Array.from({ length: 5 }, (_, k) => a + ((b - a) * k) / 4);
  const hv = hover ? grid.values[hover.i]?.[hover.j] : undefined;
  const optIn = inside(optimum);
  const curIn = inside(current);
  return (
    <figure className="m-0" data-testid="heat-map">
      <svg
        viewBox={`0 0 ${L + W + 8} ${T + H + 44}`}
        className="h-auto w-full max-w-[560px] touch-none select-none"
        role="img"
        aria-label={`${label} over line fraction and aspect ratio; lowest at line fraction ${optimum.lineFraction.toFixed(3)}, aspect ratio ${optimum.aspectRatio.toFixed(2)}`}
        onMouseLeave={() => setHover(null)}
        onMouseMove={(e) => {
          const box = e.currentTarget.getBoundingClientRect();
          const sx = ((e.clientX - box.left) / box.width) * (L + W + 8);
          const sy = ((e.clientY - box.top) / box.height) * (T + H + 44);
          const i = Math.floor((sx - L) / cw);
          const j = m - 1 - Math.floor((sy - T) / ch);
          setHover(i >= 0 && i < n && j >= 0 && j < m ? { i, j } : null);
        }}
      >
        {grid.values.map((row, i) =>
          row.map((v, j) => (
            <rect
              key={`${i}:${j}`}
              x={L + i * cw}
              y={T + H - (j + 1) * ch}
              width={cw + 0.4}
              height={ch + 0.4}
              fill={v === null ? "#e7e4de" : scaleColor(t(v))}
            />
          )),
        )}
        <rect x={L} y={T} width={W} height={H} fill="none" stroke="#c4c0b6" />
        {hover ? <rect x={L + hover.i * cw} y={T + H - (hover.j + 1) * ch} width={cw} height={ch} fill="none" stroke="#1d1f22" strokeWidth={1} /> : null}
        {ticks(x0, x1).map((x) => (
          <g key={`x${x}`}>
            <line x1={px(x)} x2={px(x)} y1={T + H} y2={T + H + 4} stroke="#c4c0b6" />
            <text x={px(x)} y={T + H + 17} textAnchor="middle" fontSize={12} fill="#5f6368">
              {x.toFixed(2)}
            </text>
          </g>
        ))}
        <text x={L + W / 2} y={T + H + 36} textAnchor="middle" fontSize={13} fill="#1d1f22">
          Line fraction W/pitch
        </text>
        {ticks(a0, a1).map((a) => (
          <g key={`a${a}`}>
            <line x1={L - 4} x2={L} y1={py(a)} y2={py(a)} stroke="#c4c0b6" />
            <text x={L - 6} y={py(a) + 3} textAnchor="end" fontSize={12} fill="#5f6368">
              {a.toFixed(2)}
            </text>
          </g>
        ))}
        <text transform={`translate(14 ${T + H / 2}) rotate(-90)`} textAnchor="middle" fontSize={13} fill="#1d1f22">
          Aspect ratio T/W
        </text>
        {curIn ? (
          <g data-testid="current-mark">
            <rect x={px(current.lineFraction) - 5} y={py(current.aspectRatio) - 5} width={10} height={10} fill="#fff" stroke="#47627e" strokeWidth={2} />
            <text
              x={px(current.lineFraction) + 8}
              y={py(current.aspectRatio) + 14}
              fontSize={12}
              fontWeight={600}
              fill="#47627e"
              stroke="#fff"
              strokeWidth={3}
              paintOrder="stroke"
            >
              Current
            </text>
          </g>
        ) : null}
        {optIn ? (
          <g data-testid="optimum-mark">
            <circle cx={px(optimum.lineFraction)} cy={py(optimum.aspectRatio)} r={6} fill="#fff" stroke="#1d1f22" strokeWidth={2} />
            <circle cx={px(optimum.lineFraction)} cy={py(optimum.aspectRatio)} r={2} fill="#1d1f22" />
            <text
              x={px(optimum.lineFraction) + 9}
              y={py(optimum.aspectRatio) - 6}
              fontSize={12}
              fontWeight={600}
              fill="#1d1f22"
              stroke="#fff"
              strokeWidth={3}
              paintOrder="stroke"
            >
              Optimum
            </text>
          </g>
        ) : null}
      </svg>
      <div className="mt-1 flex flex-wrap items-center gap-2 text-xs text-muted" data-testid="heat-legend">
        <span>
          {label} ({unit}){log ? ", log scale" : ""}:
        </span>
        <span>{show(lo)}</span>
        <span
          aria-hidden
          className="inline-block h-2.5 w-32 rounded-sm"
          style={{ background: `linear-gradient(to right, ${[0, 0.25, 0.5, 0.75, 1].map((k) => scaleColor(k)).join(",")})` }}
        />
        <span>{show(hi)}</span>
        <span className="ml-2 inline-flex items-center gap-1">
          <svg width="12" height="12" aria-hidden>
            <circle cx="6" cy="6" r="4.5" fill="#fff" stroke="#1d1f22" strokeWidth="2" />
          </svg>
          optimum
        </span>
        <span className="inline-flex items-center gap-1">
          <svg width="12" height="12" aria-hidden>
            <rect x="1.5" y="1.5" width="9" height="9" fill="#fff" stroke="#47627e" strokeWidth="2" />
          </svg>
          current{curIn ? "" : " (outside the limits, not on the map)"}
        </span>
      </div>
      <p className="mt-1 min-h-5 text-xs text-ink" aria-live="polite" data-testid="heat-readout">
        {hover
          ? `Line fraction ${xs[hover.i]!.toFixed(3)}, aspect ratio ${as[hover.j]!.toFixed(2)}: ${hv === null || hv === undefined ? "not feasible" : `${show(hv)} ${unit}`}`
          : "Point at the map to read a value."}
      </p>
    </figure>
  );
}

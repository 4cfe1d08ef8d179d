import type { FrozenSweep } from "@/lib/validation/report";
import { plain } from "@/lib/reports/format";
import { lengthRuleWords } from "@/lib/reports/assumptions";
import { OUTSIDE_RANGE_STYLE, OutsideRangeSwatch } from "@/components/charts/sweep-meta";

/** Series styles: a distinct colour AND dash pattern each, so the figure still reads when printed in grey. */
export const SERIES_STYLE: Record<string, { color: string; dash?: string; marker: "circle" | "square" | "diamond" | "triangle" }> = {
  // The workspace charts' palette (components/charts/chart-theme.ts): copper, slate, moss, ink; grey for the reference.
  A: { color: "#b4622d", marker: "circle" },
  B: { color: "#47627e", dash: "6 3", marker: "square" },
  C: { color: "#6d7d3a", dash: "2 2", marker: "diamond" },
  D: { color: "#1d1f22", dash: "8 3 2 3", marker: "triangle" },
  reference: { color: "#8a8f96", dash: "3 4", marker: "circle" },
};

const W = 640;
const H = 250;
const M = { l: 56, r: 14, t: 12, b: 42 };

function niceStep(span: number, target: number): number {
  const raw = span / Math.max(1, target);
  const mag = Math.pow(10, Math.floor(Math.log10(raw)));
  const n = raw / mag;
  return (n <= 1 ? 1 : n <= 2 ? 2 : n <= 2.5 ? 2.5 : n <= 5 ? 5 : 10) * mag;
}

export function ticks(lo: number, hi: number, target: number): number[] {
  const step = niceStep(hi - lo, target);
  const out: number[] = [];
  for (let v = Math.ceil(lo / step) * step; v <= hi + step * 1e-9; v += step) out.push(Number(v.toPrecision(10)));
  return out;
}

function Marker({ kind, x, y, color }: { kind: string; x: number; y: number; color: string }) {
  const r = 4;
  if (kind === "square") return <rect x={x - r} y={y - r} width={2 * r} height={2 * r} fill={color} stroke="#fff" strokeWidth={1} />;
  if (kind === "diamond")
    return <path d={`M${x},${y - r - 1}L${x + r + 1},${y}L${x},${y + r + 1}L${x - r - 1},${y}Z`} fill={color} stroke="#fff" strokeWidth={1} />;
  if (kind === "triangle") return <path d={`M${x},${y - r - 1}L${x + r + 1},${y + r}L${x - r - 1},${y + r}Z`} fill={color} stroke="#fff" strokeWidth={1} />;
  return <circle cx={x} cy={y} r={r} fill={color} stroke="#fff" strokeWidth={1} />;
}

/**
 * Delay against S for one class, drawn as static SVG on the server: a frozen report needs no interaction,
 * and a static figure prints and renders to PDF exactly as on screen (no hydration, no measuring).
 * Fixed viewBox; on paper the figure is a fixed width (see the print rules in report.css).
 */
export function SweepFigure({ sweep, optionNames }: { sweep: FrozenSweep; optionNames: Record<string, string> }) {
  const PS = 1e-12;
  const all = sweep.series.flatMap((s) => s.points).concat(sweep.marks.map((m) => ({ x: m.x, y: m.y })));
  // the y range comes from the data (not from 0), so a shallow minimum is not squashed into a few pixels
  const ys = all.map((p) => p.y / PS).filter((v) => Number.isFinite(v));
  const dataMin = ys.length ? Math.min(...ys) : 0;
  const dataMax = ys.length ? Math.max(...ys) : 1;
  const pad = Math.max((dataMax - dataMin) * 0.08, dataMax * 0.01, 1e-9);
  const yTicks = ticks(Math.max(0, dataMin - pad), dataMax + pad, 5);
  const yBottom = Math.min(yTicks[0] ?? dataMin, Math.max(0, dataMin - pad));
  const yTop = Math.max(yTicks[yTicks.length - 1] ?? dataMax, dataMax + pad);
  const xTicks = ticks(sweep.from, sweep.to, 6);
  const sx = (x: number) => M.l + ((x - sweep.from) / (sweep.to - sweep.from)) * (W - M.l - M.r);
  const sy = (yPs: number) => H - M.b - ((yPs - yBottom) / (yTop - yBottom)) * (H - M.t - M.b);
  // each curve's lowest point, marked and labelled (an interior minimum is where shrinking stops paying off)
  const minima = sweep.series.map((s) => {
    const m = s.points.reduce((a, b) => (b.y < a.y ? b : a), s.points[0] ?? { x: NaN, y: NaN });
    const interior = s.points.length > 2 && m !== s.points[0] && m !== s.points[s.points.length - 1];
    return { key: s.key, x: m.x, y: m.y, interior };
  });
  const path = (pts: { x: number; y: number }[]) => pts.map((p, i) => `${i === 0 ? "M" : "L"}${sx(p.x).toFixed(1)},${sy(p.y / PS).toFixed(1)}`).join("");
  const title = `Delay of class ${sweep.className} against the cross-section factor S`;
  // Stretches where a model is outside its validity range (engine 2 stores the flags on every point; older reports have none).
  const outside = sweep.series.flatMap((s) => outsideRuns(s.points).map((pts, i) => ({ key: `${s.key}-${i}`, pts })));
  return (
    <figure className="report-figure break-inside-avoid">
      <svg viewBox={`0 0 ${W} ${H}`} role="img" className="report-chart h-auto w-full" aria-label={title} preserveAspectRatio="xMidYMid meet">
        <title>{title}</title>
        {yTicks.map((t) => (
          <g key={`y${t}`}>
            <line x1={M.l} x2={W - M.r} y1={sy(t)} y2={sy(t)} stroke="#dedbd4" strokeWidth={0.8} />
            <text x={M.l - 6} y={sy(t) + 3.5} textAnchor="end" fontSize={10.5} fill="#5f6368">
              {plain(t, 4)}
            </text>
          </g>
        ))}
        {xTicks.map((t) => (
          <g key={`x${t}`}>
            <line x1={sx(t)} x2={sx(t)} y1={H - M.b} y2={H - M.b + 4} stroke="#8a8f96" strokeWidth={0.8} />
            <text x={sx(t)} y={H - M.b + 16} textAnchor="middle" fontSize={10.5} fill="#5f6368">
              {plain(t, 3)}
            </text>
          </g>
        ))}
        <line x1={M.l} x2={W - M.r} y1={H - M.b} y2={H - M.b} stroke="#8a8f96" strokeWidth={0.8} />
        <line x1={M.l} x2={M.l} y1={M.t} y2={H - M.b} stroke="#8a8f96" strokeWidth={0.8} />
        <text x={(M.l + W - M.r) / 2} y={H - 6} textAnchor="middle" fontSize={11} fill="#1d1f22">
          Cross-section factor S (dimensions ÷ S)
        </text>
        <text transform={`translate(13 ${(M.t + H - M.b) / 2}) rotate(-90)`} textAnchor="middle" fontSize={11} fill="#1d1f22">
          Delay at mean length (ps)
        </text>
        {outside.map((o) => (
          <path
            key={`out-${o.key}`}
            d={path(o.pts)}
            fill="none"
            stroke={OUTSIDE.color}
            strokeOpacity={OUTSIDE.opacity}
            strokeWidth={OUTSIDE.width}
            strokeDasharray={OUTSIDE.dash}
            data-outside-range=""
          />
        ))}
        {sweep.series.map((s) => {
          const st = SERIES_STYLE[s.key] ?? SERIES_STYLE.reference!;
          return (
            <path
              key={s.key}
              d={path(s.points)}
              fill="none"
              stroke={st.color}
              strokeWidth={s.key === "reference" ? 1.4 : 2}
              strokeDasharray={st.dash}
              strokeLinejoin="round"
            >
              <title>{s.key === "reference" ? s.label : `Option ${s.key}: ${optionNames[s.key] ?? ""}`}</title>
            </path>
          );
        })}
        {minima
          .filter((m) => Number.isFinite(m.y))
          .map((m, i) => {
            const st = SERIES_STYLE[m.key] ?? SERIES_STYLE.reference!;
            const x = sx(m.x);
            const y = sy(m.y / PS);
            return (
              <g key={`min${m.key}`} data-minimum={m.key}>
                <line x1={x} x2={x} y1={y + 3} y2={H - M.b} stroke={st.color} strokeWidth={0.8} strokeDasharray="2 2" />
                <path d={`M${x - 5},${y + 9}L${x + 5},${y + 9}L${x},${y + 3}Z`} fill={st.color} />
                <text x={Math.min(W - M.r - 4, Math.max(M.l + 4, x))} y={y + 20 + 11 * i} textAnchor="middle" fontSize={9.5} fill={st.color}>
                  {m.key === "reference" ? "ref." : m.key} min{m.interior ? "" : " (at the end)"} S = {plain(m.x, 3)}, {plain(m.y / PS, 3)} ps
                </text>
              </g>
            );
          })}
        {sweep.marks.map((m) => {
          const st = SERIES_STYLE[m.key] ?? SERIES_STYLE.A!;
          return (
            <g key={`m${m.key}`}>
              <Marker kind={st.marker} x={sx(m.x)} y={sy(m.y / PS)} color={st.color} />
              <title>{`Option ${m.key} at S = ${plain(m.x)}: ${plain(m.y / PS, 4)} ps`}</title>
            </g>
          );
        })}
      </svg>
      <figcaption className="mt-1 flex flex-wrap gap-x-4 gap-y-1 text-xs text-muted">
        {sweep.series.map((s) => {
          const st = SERIES_STYLE[s.key] ?? SERIES_STYLE.reference!;
          return (
            <span key={s.key} className="inline-flex items-center gap-1.5">
              <svg width="26" height="10" aria-hidden="true">
                <line x1="1" x2="25" y1="5" y2="5" stroke={st.color} strokeWidth={2} strokeDasharray={st.dash} />
              </svg>
              {s.key === "reference" ? s.label : `Option ${s.key}: ${optionNames[s.key] ?? ""}`}
            </span>
          );
        })}
        {outside.length > 0 ? (
          <span className="inline-flex items-center gap-1.5">
            <OutsideRangeSwatch />
            {OUTSIDE.label}
          </span>
        ) : null}
        <span>
          Markers: each option at its own S; triangles: each curve&apos;s minimum.{" "}
          {sweep.lengthRule === "follow"
            ? "Wire lengths shrink with S (S_L = S)."
            : sweep.lengthRule === "fixed"
              ? "Wire lengths kept (S_L = 1)."
              : typeof sweep.lengthRule === "object"
                ? `Wire lengths by the rule ${lengthRuleWords(sweep.lengthRule)}.`
                : "Wire lengths at each option's S_L."}
        </span>
      </figcaption>
    </figure>
  );
}

/** Dashed amber band under a curve where a model is outside its range: the workspace sweep chart's style. */
const OUTSIDE = OUTSIDE_RANGE_STYLE;

/** Runs of flagged points, each widened by its in-range neighbours so the band reaches the boundary. */
function outsideRuns<P extends { flags?: unknown[] }>(points: P[]): P[][] {
  const runs: P[][] = [];
  for (let i = 0; i < points.length; i++) {
    if (!points[i]!.flags?.length) continue;
    let j = i;
    while (j + 1 < points.length && points[j + 1]!.flags?.length) j++;
    runs.push(points.slice(Math.max(0, i - 1), Math.min(points.length, j + 2)));
    i = j;
  }
  return runs;
}

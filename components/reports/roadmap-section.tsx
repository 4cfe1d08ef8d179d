import type { z } from "zod";
import { plain } from "@/lib/reports/format";
import { readingOf, signedPercent } from "@/lib/workspace/roadmap-view";
import type { frozenRoadmapSchema } from "@/lib/validation/report";
import { SERIES_STYLE, ticks } from "./sweep-figure";

type FrozenRoadmap = z.output<typeof frozenRoadmapSchema>;

const W = 640;
const H = 220;
const M = { l: 56, r: 14, t: 12, b: 30 };
const PS = 1e-12;
/** R1, R2, R3 take the report's series styles A, B, C (colour and dash: they read in grey print too). */
const styleOf = (key: string) => SERIES_STYLE[String.fromCharCode(64 + Number(key.slice(1)))] ?? SERIES_STYLE.reference!;

/** A class's delay N0 … Nn of a frozen roadmap, ps (N0 from the first step's baseline side); null when the class is not in it. */
function delays(r: FrozenRoadmap, className: string): number[] | null {
  const first = r.steps[0]?.evaluation.classes.find((c) => c.name === className);
  if (!first) return null;
  const out = [first.baseline.delayS / PS];
  for (const st of r.steps) {
    const c = st.evaluation.classes.find((x) => x.name === className);
    if (!c) return null;
    out.push(c.scenario.delayS / PS);
  }
  return out;
}

/** One class's delay across the steps of every frozen roadmap, as static SVG (a report needs no interaction). */
function RoadmapFigure({ className, roadmaps }: { className: string; roadmaps: FrozenRoadmap[] }) {
  const lines = roadmaps.map((r) => ({ r, values: delays(r, className) })).filter((l): l is { r: FrozenRoadmap; values: number[] } => l.values !== null);
  const ys = lines.flatMap((l) => l.values);
  const lo = ys.length ? Math.min(...ys) : 0;
  const hi = ys.length ? Math.max(...ys) : 1;
  const pad = Math.max((hi - lo) * 0.1, hi * 0.01, 1e-9);
  const yTicks = ticks(Math.max(0, lo - pad), hi + pad, 5);
  const bottom = Math.min(yTicks[0] ?? lo, Math.max(0, lo - pad));
  const top = Math.max(yTicks[yTicks.length - 1] ?? hi, hi + pad);
  const n = Math.max(1, ...lines.map((l) => l.values.length - 1));
  const sx = (i: number) => M.l + (i / n) * (W - M.l - M.r);
  const sy = (v: number) => H - M.b - ((v - bottom) / (top - bottom)) * (H - M.t - M.b);
  const names = ["N0", ...(roadmaps[0]?.steps.map((s) => s.name) ?? [])];
  const title = `Delay of class ${className} across the roadmap steps`;
  return (
    <figure className="report-figure break-inside-avoid">
      <svg viewBox={`0 0 ${W} ${H}`} role="img" className="report-chart h-auto w-full" aria-label={title} preserveAspectRatio="xMidYMid meet">
        <title>{title}</title>
        {yTicks.map((t) => (
          <g key={t}>
            <line x1={M.l} x2={W - M.r} y1={sy(t)} y2={sy(t)} stroke="#dedbd4" strokeWidth={0.8} />
            <text x={M.l - 6} y={sy(t) + 3.5} textAnchor="end" fontSize={10.5} fill="#5f6368">
              {plain(t, 4)}
            </text>
          </g>
        ))}
        {Array.from({ length: n + 1 }, (_, i) => (
          <text key={i} x={sx(i)} y={H - M.b + 16} textAnchor="middle" fontSize={10.5} fill="#5f6368">
            {names[i] ?? `N${i}`}
          </text>
        ))}
        <text x={14} y={(M.t + H - M.b) / 2} fontSize={10.5} fill="#5f6368" transform={`rotate(-90 14 ${(M.t + H - M.b) / 2})`} textAnchor="middle">
          Delay (ps)
        </text>
        {lines.map(({ r, values }) => {
          const st = styleOf(r.key);
          return (
            <g key={r.key}>
              <path
                d={values.map((v, i) => `${i === 0 ? "M" : "L"}${sx(i).toFixed(1)},${sy(v).toFixed(1)}`).join("")}
                fill="none"
                stroke={st.color}
                strokeWidth={2}
                strokeDasharray={st.dash}
              />
              {values.map((v, i) => (
                <circle key={i} cx={sx(i)} cy={sy(v)} r={3} fill={st.color} />
              ))}
            </g>
          );
        })}
      </svg>
      <figcaption className="mt-1 flex flex-wrap gap-x-4 text-xs text-muted">
        {lines.map(({ r }) => (
          <span key={r.key} className="inline-flex items-center gap-1">
            <svg width="24" height="8" aria-hidden="true">
              <line x1="0" y1="4" x2="24" y2="4" stroke={styleOf(r.key).color} strokeWidth={2} strokeDasharray={styleOf(r.key).dash} />
            </svg>
            {r.key} {r.name}
          </span>
        ))}
      </figcaption>
    </figure>
  );
}

/**
 * The report's frozen roadmaps (issue 14): per class the delay across the steps of every roadmap (one chart), a
 * table with the ratio to N0 and the change from the step before, and where delay stops improving in words.
 */
export function RoadmapSection({ roadmaps, classNames }: { roadmaps: FrozenRoadmap[]; classNames: string[] }) {
  return (
    <div className="space-y-5" data-testid="report-roadmaps">
      <p className="text-xs text-muted">
        Each step is relative to the one before and evaluated against N0, the baseline, at the level it was frozen with (
        {[...new Set(roadmaps.flatMap((r) => r.steps.map((s) => s.evaluation.level)))].join(", ")}).{" "}
        {roadmaps.map((r) => `${r.key}: ${r.name} (version ${r.version}, N0 → ${r.steps.map((s) => s.name).join(" → ")})`).join("; ")}.
      </p>
      <div className="grid gap-6 lg:grid-cols-2 print:grid-cols-1">
        {classNames.map((c) => (
          <div key={c} className="min-w-0 break-inside-avoid">
            <h3 className="mb-1 text-sm font-semibold text-ink">{c}</h3>
            <ul className="mb-2 space-y-0.5 text-xs text-ink">
              {roadmaps.map((r) => {
                const v = delays(r, c);
                return v ? (
                  <li key={r.key}>
                    {r.key}: {readingOf(c, "delay", ["N0", ...r.steps.map((s) => s.name)], v)}
                  </li>
                ) : null;
              })}
            </ul>
            <RoadmapFigure className={c} roadmaps={roadmaps} />
            <table className="mt-2 w-full text-xs">
              <thead className="text-left text-muted">
                <tr className="border-b border-rule">
                  <th scope="col" className="py-1 pr-2 font-medium">
                    Roadmap
                  </th>
                  <th scope="col" className="px-1 font-medium">
                    Step
                  </th>
                  <th scope="col" className="px-1 text-right font-medium">
                    Pitch nm
                  </th>
                  <th scope="col" className="px-1 text-right font-medium">
                    Delay ps
                  </th>
                  <th scope="col" className="px-1 text-right font-medium">
                    ÷ N0
                  </th>
                  <th scope="col" className="px-1 text-right font-medium">
                    vs step before
                  </th>
                  <th scope="col" className="px-1 text-right font-medium">
                    Flags
                  </th>
                </tr>
              </thead>
              <tbody>
                {roadmaps.flatMap((r) => {
                  const v = delays(r, c);
                  if (!v) return [];
                  const first = r.steps[0]!.evaluation.classes.find((x) => x.name === c)!;
                  const results = [first.baseline, ...r.steps.map((s) => s.evaluation.classes.find((x) => x.name === c)!.scenario)];
                  const names = ["N0", ...r.steps.map((s) => s.name)];
                  return results.map((res, i) => (
                    <tr key={`${r.key}:${i}`} className="border-b border-rule/60">
                      <td className="py-0.5 pr-2">{i === 0 ? r.key : ""}</td>
                      <td className="px-1">{names[i]}</td>
                      <td className="tabular px-1 text-right">{plain(res.pitchM * 1e9, 3)}</td>
                      <td className="tabular px-1 text-right">{plain(v[i]!, 3)}</td>
                      <td className="tabular px-1 text-right">{v[0]! > 0 ? `${plain(v[i]! / v[0]!, 3)}×` : "—"}</td>
                      <td className="tabular px-1 text-right">{i > 0 && v[i - 1]! > 0 ? signedPercent(v[i]! / v[i - 1]!) : "—"}</td>
                      <td className="tabular px-1 text-right">{res.validity.length || "—"}</td>
                    </tr>
                  ));
                })}
              </tbody>
            </table>
          </div>
        ))}
      </div>
    </div>
  );
}

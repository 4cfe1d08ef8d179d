/**
 * A plain-words reading of one class's S sweep, computed from the curves (no React, no visx): where the full-model
 * curve stops improving, and what it does at the scenario's own S. Everything is read off the curves as computed;
 * values between sweep points are interpolated on log–log axes and said with "≈".
 */
import type { ModelLevel, SweepPoint } from "@/lib/scaling";

export interface ClassSweepData {
  className: string;
  /** Absolute curves (SI) per model level. */
  curves: Partial<Record<ModelLevel, SweepPoint[]>>;
  /** Each level's value at S = 1 (SI), the reference of "relative to S = 1". */
  at1: Partial<Record<ModelLevel, number>>;
}

export interface SweepReading {
  className: string;
  /** One or two plain sentences. */
  text: string;
  /** S where the full model is lowest over S ≥ 1 within the range (undefined when it never gets below S = 1). */
  bestS?: number;
  /** Full model at bestS relative to S = 1. */
  bestRel?: number;
  /** First S ≥ 1 from which a further 10% shrink gains less than `gain` (undefined when that never happens while improving). */
  plateauS?: number;
  /** Full model at the scenario's S relative to S = 1. */
  relAtS?: number;
  /** Ideal scaling at the scenario's S relative to S = 1. */
  idealRelAtS?: number;
  /** Full / + coupling at the scenario's S (absolute values): what size effects and the kept barrier add. */
  sizeFactorAtS?: number;
}

/** Log–log interpolation of a curve at x; undefined outside the sampled range. */
export function interpolateLogLog(points: SweepPoint[], x: number): number | undefined {
  const pts = points.filter((p) => p.x > 0 && p.y > 0);
  for (let i = 0; i < pts.length; i++) {
    const a = pts[i]!;
    if (Math.abs(a.x - x) <= 1e-9 * x) return a.y;
    const b = pts[i + 1];
    if (b && a.x < x && x < b.x) {
      const t = Math.log(x / a.x) / Math.log(b.x / a.x);
      return Math.exp(Math.log(a.y) + t * Math.log(b.y / a.y));
    }
  }
  return undefined;
}

const sig = (v: number, n = 2) => String(Number(v.toPrecision(n)));
const times = (v: number) => `${v.toFixed(2)}×`;

/**
 * Read one class: `gain` is the per-10%-shrink improvement below which the curve counts as levelled off (default 2%).
 * `metricLabel` starts the sentence ("Delay", "RC", …).
 */
export function readSweep(d: ClassSweepData, p: { scenarioS: number; metricLabel: string; gain?: number }): SweepReading {
  const gain = p.gain ?? 0.02;
  const full = d.curves.full ?? [];
  const f1 = d.at1.full;
  const out: SweepReading = { className: d.className, text: "" };
  if (!(f1 && f1 > 0) || full.length < 2) {
    out.text = "Not enough of the full-model curve to read (widen the range or check skipped points).";
    return out;
  }
  // The shrink side: S = 1 (value 1 by definition) and every sweep point beyond it.
  const rel = [{ x: 1, y: 1 }, ...full.filter((q) => q.x > 1 + 1e-9 && q.y > 0).map((q) => ({ x: q.x, y: q.y / f1 }))];
  const parts: string[] = [];
  if (rel.length < 2) {
    parts.push("The range does not reach beyond S = 1.");
  } else {
    let best = rel[0]!;
    for (const q of rel) if (q.y < best.y) best = q;
    // Per-10%-shrink gain on each segment: 1 − 1.1^(d ln y / d ln S).
    let plateau: number | undefined;
    for (let i = 0; i + 1 < rel.length; i++) {
      const a = rel[i]!;
      const b = rel[i + 1]!;
      const e = Math.log(b.y / a.y) / Math.log(b.x / a.x);
      if (1 - Math.pow(1.1, e) < gain) {
        plateau = a.x;
        break;
      }
    }
    const last = rel[rel.length - 1]!;
    if (best.x === 1) {
      parts.push(`${p.metricLabel} gets no better from shrinking: ${times(last.y)} of S = 1 at S = ${sig(last.x)}.`);
    } else {
      out.bestS = best.x;
      out.bestRel = best.y;
      if (plateau !== undefined && plateau > 1) out.plateauS = plateau;
      const flat = out.plateauS !== undefined ? `; each further 10% shrink gains under ${Math.round(gain * 100)}% from S ≈ ${sig(out.plateauS)}` : "";
      if (best === last) parts.push(`${p.metricLabel} still improves at S = ${sig(best.x)} (${times(best.y)} of S = 1)${flat}.`);
      else parts.push(`${p.metricLabel} is lowest at S ≈ ${sig(best.x)} (${times(best.y)} of S = 1) and worsens beyond${flat}.`);
    }
  }
  const fS = interpolateLogLog(full, p.scenarioS);
  if (fS !== undefined) {
    out.relAtS = fS / f1;
    const ideal = d.curves.ideal && d.at1.ideal ? interpolateLogLog(d.curves.ideal, p.scenarioS) : undefined;
    if (ideal !== undefined && d.at1.ideal) out.idealRelAtS = ideal / d.at1.ideal;
    const coupled = d.curves.coupled ? interpolateLogLog(d.curves.coupled, p.scenarioS) : undefined;
    if (coupled !== undefined && coupled > 0) out.sizeFactorAtS = fS / coupled;
    const bits = [`${times(out.relAtS)} of S = 1`];
    if (out.idealRelAtS !== undefined) bits.push(`ideal scaling ${times(out.idealRelAtS)}`);
    let sentence = `At this scenario's S = ${sig(p.scenarioS, 3)}: ${bits.join(", ")}`;
    if (out.sizeFactorAtS !== undefined) {
      const pct = Math.round((out.sizeFactorAtS - 1) * 100);
      sentence += `; size effects and barrier ${pct >= 0 ? "add" : "take off"} ${Math.abs(pct)}% over “+ coupling”`;
    }
    parts.push(`${sentence}.`);
  }
  out.text = parts.join(" ");
  return out;
}

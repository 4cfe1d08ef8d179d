/**
 * Calibration of the size-effect model to measured line resistance (ours; least squares on the published model of
 * resistance.ts). SI units: Ω/m, m, °C.
 */
import { ownEntry } from "./own";
import { getMetal } from "./materials";
import { DEFAULT_TEMPERATURE_C, metalAtInto, newMetal, sizeEffectFactor } from "./resistance";
import type { MetalOverride, Technology, WireClass } from "./types";

/** One measured resistance per length of a class at its baseline geometry. */
export interface MeasuredResistance {
  className: string;
  /** Measured resistance per length, Ω/m. */
  rOhmPerM: number;
  /** Temperature of the measurement, °C (default: the technology's, else 25). */
  temperatureC?: number;
}

export interface FitPoint {
  class: string;
  measuredOhmPerM: number;
  fittedOhmPerM: number;
  /** (fitted − measured)/measured. */
  residual: number;
}

export interface SizeEffectFit {
  /** Fitted overrides per metal id, the shape of Technology.materials. */
  metals: Record<string, MetalOverride>;
  points: FitPoint[];
}

/**
 * A measured point the fit cannot use: which point (index into `measured`), which field, and for a value below the bulk
 * resistance the bound it broke (Ω/m at the point's temperature). The message names all of it.
 */
export class FitInputError extends RangeError {
  constructor(
    message: string,
    readonly index: number,
    readonly field: "className" | "rOhmPerM" | "temperatureC",
    readonly bulkOhmPerM?: number,
    readonly temperatureC?: number,
  ) {
    super(message);
    this.name = "FitInputError";
  }
}

const P_MAX = 0.95;
const R_MIN = 0.01;
const R_MAX = 0.95;

/**
 * Fits the size-effect parameters of each metal to measured resistance per length of one or more classes (at their
 * baseline geometry: conducting cross-section (W − 2t_b)(T − t_b), level `full` model of resistance.ts at the
 * measurement's temperature, with the technology's materials overrides as the starting catalogue).
 * - Two or more points of a metal: specularity p ∈ [0, 0.95] and grain reflection R ∈ [0.01, 0.95] by bounded least
 *   squares on ln(fitted/measured) (a 46 × 48 grid, then a pattern search shrinking to 1e-9; deterministic).
 * - One point: one scale factor on the bulk resistivity (resistivityOhmM = f·ρ0(20 °C)), p and R kept.
 * Throws RangeError naming the point for a measurement ≤ 0, non-finite, of an unknown class, or below the bulk
 * resistance ρ0(T)/A of the conducting cross-section (impossible: size effects only add resistance).
 * @returns metals (same shape as Technology.materials, fitted fields only) and the residual of every point
 */
export function fitSizeEffect(p: { classes: WireClass[]; measured: MeasuredResistance[]; technology?: Technology }): SizeEffectFit {
  if (p.measured.length === 0) throw new RangeError("measured must hold at least one point (got none)");
  const byName = new Map(p.classes.map((c) => [c.name.toLowerCase(), c]));
  const tDefault = p.technology?.temperatureC ?? DEFAULT_TEMPERATURE_C;
  interface Pt {
    i: number;
    cls: WireClass;
    w: number;
    h: number;
    t: number;
    meas: number;
  }
  const groups = new Map<string, Pt[]>();
  p.measured.forEach((m, i) => {
    const name = `measured[${i}] (class ${m.className})`;
    const cls = byName.get(m.className.toLowerCase());
    if (!cls) throw new FitInputError(`${name}.className must name a class of the baseline (got "${m.className}")`, i, "className");
    if (!(m.rOhmPerM > 0 && Number.isFinite(m.rOhmPerM))) throw new FitInputError(`${name}.rOhmPerM must be > 0 and finite (got ${m.rOhmPerM})`, i, "rOhmPerM");
    const t = m.temperatureC ?? tDefault;
    if (!(t > -273.15 && t <= 400)) throw new FitInputError(`${name}.temperatureC must be above -273.15 and at most 400 (got ${t})`, i, "temperatureC");
    const w = cls.widthM - 2 * cls.barrierM;
    const h = cls.thicknessM - cls.barrierM;
    if (!(w > 0 && h > 0))
      throw new RangeError(`${name}: the barrier fills the line (width ${cls.widthM}, thickness ${cls.thicknessM}, barrier ${cls.barrierM})`);
    const id = getMetal(cls.metal).id;
    const metal = metalAtInto(getMetal(id), ownEntry(p.technology?.materials, id), t, newMetal());
    const bulk = metal.resistivityOhmM / (w * h);
    if (m.rOhmPerM < bulk) {
      throw new FitInputError(
        `${name}.rOhmPerM must be >= the bulk resistance of the conducting cross-section, ${bulk.toPrecision(4)} Ω/m at ${t} °C (got ${m.rOhmPerM})`,
        i,
        "rOhmPerM",
        bulk,
        t,
      );
    }
    const list = groups.get(id) ?? [];
    list.push({ i, cls, w, h, t, meas: m.rOhmPerM });
    groups.set(id, list);
  });
  const metals: Record<string, MetalOverride> = {};
  const points: FitPoint[] = new Array(p.measured.length);
  const scratch = newMetal();
  for (const [id, pts] of groups) {
    const base = ownEntry(p.technology?.materials, id) ?? {};
    const predict = (pt: Pt, o: MetalOverride) => {
      const m = metalAtInto(getMetal(id), { ...base, ...o }, pt.t, scratch);
      return (m.resistivityOhmM * sizeEffectFactor(m, pt.w, pt.h)) / (pt.w * pt.h);
    };
    let fitted: MetalOverride;
    if (pts.length === 1) {
      const pt = pts[0]!;
      const rho20 = base.resistivityOhmM ?? getMetal(id).resistivityOhmM;
      const lambda20 = base.meanFreePathM ?? getMetal(id).meanFreePathM;
      // keep λ (not ρ0·λ) so the whole resistivity scales by f
      const f = pt.meas / predict(pt, { meanFreePathM: lambda20 });
      fitted = { resistivityOhmM: rho20 * f, meanFreePathM: lambda20 };
    } else {
      const cost = (sp: number, gr: number) => {
        let s = 0;
        for (const pt of pts) {
          const e = Math.log(predict(pt, { specularity: sp, grainReflection: gr }) / pt.meas);
          s += e * e;
        }
        return s;
      };
      let bp = 0;
      let br = R_MIN;
      let bc = Infinity;
      for (let a = 0; a <= 45; a++) {
        for (let b = 0; b <= 47; b++) {
          const sp = (P_MAX * a) / 45;
          const gr = R_MIN + ((R_MAX - R_MIN) * b) / 47;
          const c = cost(sp, gr);
          if (c < bc) {
            bc = c;
            bp = sp;
            br = gr;
          }
        }
      }
      let step = 0.02;
      while (step > 1e-9) {
        let moved = false;
        for (const [dp, dr] of [
          [step, 0],
          [-step, 0],
          [0, step],
          [0, -step],
          [step, step],
          [-step, -step],
          [step, -step],
          [-step, step],
        ] as const) {
          const sp = Math.min(P_MAX, Math.max(0, bp + dp));
          const gr = Math.min(R_MAX, Math.max(R_MIN, br + dr));
          const c = cost(sp, gr);
          if (c < bc) {
            bc = c;
            bp = sp;
            br = gr;
            moved = true;
          }
        }
        if (!moved) step /= 2;
      }
      fitted = { specularity: bp, grainReflection: br };
    }
    metals[id] = fitted;
    for (const pt of pts) {
      const f = predict(pt, fitted);
      points[pt.i] = { class: pt.cls.name, measuredOhmPerM: pt.meas, fittedOhmPerM: f, residual: (f - pt.meas) / pt.meas };
    }
  }
  return { metals, points };
}

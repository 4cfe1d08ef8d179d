/**
 * Capacitance per length of one line: parallel plate, Yuan–Trick (single line over a plane),
 * Sakurai–Tamaru (with neighbours) with a ground/coupling split validated against the field solver,
 * and the numeric 2D solve. SI units: lengths in m, capacitance per length in F/m.
 */
import { EPSILON_0_F_PER_M } from "./constants";
import { atLeast, inRange, positive, rangeFlag, round3 } from "./check";
import { accurateCapacitanceInto } from "./cap-accurate";
import { fieldSolve } from "./field-solve";
import type { CapacitanceModel, CapacitanceParts, ValidityFlag } from "./types";

/**
 * Parallel-plate capacitance per length, C′ = ε·W/H.
 * Valid only for W ≫ H (thin, wide lines); several times too low for W/H ≤ 1. Common practice, no source.
 * @param epsFPerM permittivity ε = ε0·k (F/m)   @param widthM W (m)   @param heightM H (m)   @returns F/m
 */
export function parallelPlateFPerM(epsFPerM: number, widthM: number, heightM: number): number {
  return (epsFPerM * widthM) / heightM;
}

/**
 * Yuan–Trick single line over a plane:
 * C′ = ε·[ (W − T/2)/H + 2π / ln(1 + 2H/T + sqrt((2H/T)·(2H/T + 2))) ].
 * The log term is the exact capacitance of a cylinder of diameter T over a plane; the first a plate of width W − T/2.
 * Needs W ≥ T/2 (the plate term is clamped at 0 below that, and a flag is raised by lineCapacitance).
 * @see C. P. Yuan and T. N. Trick, IEEE Electron Device Letters EDL-3(12), 1982 [form secondary/memory, docs/models.md]
 * @returns F/m
 */
export function yuanTrickFPerM(epsFPerM: number, widthM: number, thicknessM: number, heightM: number): number {
  const u = (2 * heightM) / thicknessM;
  const plate = Math.max(0, (widthM - thicknessM / 2) / heightM);
  return epsFPerM * (plate + (2 * Math.PI) / Math.log(1 + u + Math.sqrt(u * (u + 2))));
}

/**
 * Sakurai–Tamaru single line over a plane: C1′/ε = 1.15·(W/H) + 2.80·(T/H)^0.222.
 * Fitted for 0.3 ≤ W/H ≤ 30 and 0.3 ≤ T/H ≤ 30, stated error about 6% [ranges from memory].
 * @see T. Sakurai and K. Tamaru, IEEE TED ED-30(2), 1983 [secondary, docs/models.md]
 * @returns F/m
 */
export function sakuraiTamaruC1FPerM(epsFPerM: number, widthM: number, thicknessM: number, heightM: number): number {
  return epsFPerM * (1.15 * (widthM / heightM) + 2.8 * Math.pow(thicknessM / heightM, 0.222));
}

/**
 * Sakurai–Tamaru coupling term per neighbour at edge-to-edge spacing S:
 * C21′/ε = [0.03·(W/H) + 0.83·(T/H) − 0.07·(T/H)^0.222]·(S/H)^(−1.34).
 * This is how much the TOTAL capacitance grows per neighbour, not the Maxwell line-to-line capacitance.
 * Fitted for 0.3 ≤ W/H ≤ 10, 0.3 ≤ T/H ≤ 10, 0.5 ≤ S/H ≤ 10, about 10% [ranges from memory].
 * @see T. Sakurai and K. Tamaru, IEEE TED ED-30(2), 1983; T. Sakurai, IEEE TED 40(1), 1993 [secondary, docs/models.md]
 * @returns F/m
 */
export function sakuraiTamaruC21FPerM(epsFPerM: number, widthM: number, thicknessM: number, heightM: number, spacingM: number): number {
  const th = thicknessM / heightM;
  return epsFPerM * (0.03 * (widthM / heightM) + 0.83 * th - 0.07 * Math.pow(th, 0.222)) * Math.pow(spacingM / heightM, -1.34);
}

/**
 * Cohn's thick strip centred between two planes a distance b apart, fringe part only (both edges, both planes):
 * C′_fringe/ε = (4/π)·[2g·ln(g + 1) − (g − 1)·ln(g² − 1)], g = 1/(1 − T/b). The full formula adds the plates
 * 4W/(b − T); we add ε·W/H + ε·W/H2 instead so that an off-centre line is covered (measured ≤ 2.5% against the
 * field solver for 1 ≤ H2/H ≤ 2). Valid for W/(b − T) ≳ 0.35.
 * @see S. B. Cohn, "Problems in strip transmission lines", IRE Trans. MTT-3, 1955 [secondary, docs/models.md]
 * @returns F/m
 */
export function cohnThickStripFringeFPerM(epsFPerM: number, thicknessM: number, separationM: number): number {
  const g = 1 / (1 - thicknessM / separationM);
  return epsFPerM * (4 / Math.PI) * (2 * g * Math.log(g + 1) - (g - 1) * Math.log(g * g - 1));
}

/**
 * Ground/coupling split (ours, fitted to the field solver; see scaling/README.md for the fit and its error).
 * With neighbours, the fringe to the plane(s) is limited by the gaps between the lines: the ground fringe is the
 * isolated fringe f_iso and a gap-limited fringe f_gap combined as (f_iso^−n + f_gap^−n)^(−1/n) (n = `norm`).
 * Both splits are built so that, with grounded neighbours, the total C_ground + 2·C_couple can only rise as the
 * neighbours approach, the ground part only fall and the coupling only rise (every piece is monotonic in S):
 * - one plane: f_iso = C1/ε − W/H (Sakurai–Tamaru), f_gap = 1.2·(S/H)^0.64, n = 4; coupling per neighbour is the rest
 *   of the Sakurai–Tamaru total: C_couple = (C1 + 2·C21 − C_ground)/2 = C21 + (f_iso − f_ground)/2, so the total with
 *   quiet neighbours is Sakurai–Tamaru's (C21 ≥ 0 falls with S).
 * - two planes (since engine 1.1.0): f_iso = Cohn's fringe, b = H + T + H2,
 *   f_gap = 0.709·(1 + 0.110·T/b)·[(S/H)^0.674 + (S/H2)^0.674]·exp(0.646·S/b), n = 2.55;
 *   total with grounded neighbours C_tot/ε = W/H + W/H2 + f_iso + 2·X, where
 *   X = [1.042·T/S + 0.370 + 3.625·T/b + 0.335·W/b]·exp(−1.95·π·S/b) ≥ 0 is half the rise of the total over the
 *   isolated line (it falls as S grows; the field between parallel planes decays as exp(−π·S/b), and the total's rise
 *   is second order in that field); coupling per neighbour C_couple = (C_tot − C_ground)/2 = X + (f_iso − f_ground)/2.
 *   Coefficients by a minimax-weighted fit to 1,350 field solves (scaling/README.md).
 * The ground deficit f_iso − f_ground is computed as −f_iso·expm1(−log1p((f_iso/f_gap)^n)/n), free of cancellation.
 * `twoPlane.couple` holds engine 1.0.0's two-plane coupling fit, kept for reference only (it let the total dip by up
 * to ~2% as spacing shrank).
 */
export const SPLIT_FIT = {
  onePlane: { a: 1.2, b: 0.64 },
  twoPlane: {
    a: 0.709,
    b: 0.674,
    growth: 0.646,
    thick: 0.11,
    norm: 2.55,
    total: [1.042, 0.37, 3.625, 0.335] as const,
    decay: 1.95,
    /** @deprecated engine 1.0.0's two-plane coupling coefficients; no longer used. */
    couple: [0.8974, 1.0308, 4.2272, 0.1371, -0.0061] as const,
  },
  /** Norm of the one-plane fringe combination. */
  norm: 4,
} as const;

/** Accuracy of the accurate (table) model: held-out field solves, scaling/README.md "Accurate capacitance". */
export const ACCURATE_ACCURACY =
  "table of our 2D field solver (resolution 20, its own error ≤ 0.08% ground/total): on 600 held-out geometries ground within 0.29% (RMS 0.05%), total within 0.26% (RMS 0.06%), coupling per neighbour within 0.33% without a gap layer; with one (kGap < k) within 0.77% where coupling is ≥ 3% of the total, 1.2% where ≥ 0.1%, up to 5.9% where it is a smaller share (measured)";

/** Accuracy of the accurate tables without a gap layer (kGap = k): the 152 such held-out geometries (scaling/README.md). */
export const ACCURATE_ACCURACY_HOMOGENEOUS =
  "tables of our 2D field solver (resolution 20, its own error ≤ 0.08% ground/total): on 152 held-out geometries ground within 0.13%, coupling per neighbour within 0.33%, total within 0.08% (measured)";

/** Accuracy of the accurate tables with a gap layer (kGap < k): the 448 such held-out geometries (scaling/README.md). */
export const ACCURATE_ACCURACY_AIR_GAP =
  "tables of our 2D field solver with the gap layer: on 448 held-out geometries ground within 0.29%, total within 0.26%; coupling per neighbour within 0.77% where it is ≥ 3% of the total, 1.2% where ≥ 0.1%, up to 5.9% where it is a smaller share (measured)";

/** Accuracy statements, measured against the field solver (scaling/README.md, tests/scaling/capacitance.test.ts). */
export const CAPACITANCE_ACCURACY: Readonly<Record<CapacitanceModel, string>> = {
  ideal: "parallel plate: a lower bound that ignores fringing and coupling; several times too low for W/H ≤ 1",
  fringe: "Yuan–Trick (one plane): within 11% of the field solver for W ≥ T/2; Cohn (two planes): within 2.5% (measured)",
  coupled:
    "Sakurai–Tamaru total (one plane): within 6% (C1) / 11% (with neighbours) of the field solver in the fitted ranges; ground/coupling split fitted to the field solver: ground within 11%, Miller-weighted total within 15% (measured); two planes (H2/H ≤ 2, S/H ≤ 4): Cohn + fitted split, ground within 3.3%, total within 2.9% (Miller 2: 4.4%), coupling per neighbour within 21% (measured); with grounded neighbours the total never falls as they approach",
  accurate: ACCURATE_ACCURACY,
  field: "numeric 2D field solve (finite differences): < 1% on analytic cases",
};

/** Internal output of the closed forms (per length, F/m; couple = Maxwell per neighbour). */
export interface Split {
  area: number;
  ground: number;
  couple: number;
}

/**
 * Ground deficit f_iso − (f_iso^−n + f_gap^−n)^(−1/n) = −f_iso·expm1(−log1p((f_iso/f_gap)^n)/n), computed without
 * cancellation; in (0, f_iso), falling as f_gap grows.
 */
function fringeDeficit(fIso: number, fGap: number, n: number): number {
  return -fIso * Math.expm1(-Math.log1p(Math.pow(fIso / fGap, n)) / n);
}

/** Closed forms, one plane at height h. Dimensionless work in units of ε, scaled at the end. */
function onePlane(model: "ideal" | "fringe" | "coupled", eps: number, w: number, t: number, h: number, sp: number | null, out: Split): void {
  const wh = w / h;
  out.area = eps * wh;
  if (model === "ideal") {
    out.ground = out.area;
    return;
  }
  if (model === "fringe") {
    out.ground = yuanTrickFPerM(eps, w, t, h);
    return;
  }
  const c1 = 1.15 * wh + 2.8 * Math.pow(t / h, 0.222);
  if (sp === null) {
    out.ground = eps * c1;
    return;
  }
  const th = t / h;
  const s = sp / h;
  const c21 = Math.max(0, (0.03 * wh + 0.83 * th - 0.07 * Math.pow(th, 0.222)) * Math.pow(s, -1.34));
  const deficit = fringeDeficit(c1 - wh, SPLIT_FIT.onePlane.a * Math.pow(s, SPLIT_FIT.onePlane.b), SPLIT_FIT.norm);
  out.ground = eps * (c1 - deficit);
  out.couple = eps * (c21 + deficit / 2); // = (C1 + 2·C21 − ground)/2
}

/** Closed forms, planes at h (below) and h2 (above). */
function twoPlanes(model: "ideal" | "fringe" | "coupled", eps: number, w: number, t: number, h: number, h2: number, sp: number | null, out: Split): void {
  const plates = w / h + w / h2;
  out.area = eps * plates;
  if (model === "ideal") {
    out.ground = out.area;
    return;
  }
  const b = h + t + h2;
  const g = 1 / (1 - t / b);
  const fIso = (4 / Math.PI) * (2 * g * Math.log(g + 1) - (g - 1) * Math.log(g * g - 1));
  if (model === "fringe" || sp === null) {
    out.ground = eps * (plates + fIso);
    return;
  }
  const tp = SPLIT_FIT.twoPlane;
  const sb = sp / b;
  const fGap = tp.a * (1 + (tp.thick * t) / b) * (Math.pow(sp / h, tp.b) + Math.pow(sp / h2, tp.b)) * Math.exp(tp.growth * sb);
  const deficit = fringeDeficit(fIso, fGap, tp.norm);
  const q = tp.total;
  const rise = ((q[0] * t) / sp + q[1] + (q[2] * t) / b + (q[3] * w) / b) * Math.exp(-tp.decay * Math.PI * sb);
  out.ground = eps * (plates + fIso - deficit);
  out.couple = eps * (rise + deficit / 2); // = (C_tot − C_ground)/2 with C_tot/ε = plates + f_iso + 2·rise
}

function flagsFor(model: CapacitanceModel, w: number, t: number, h: number, h2: number | null, sp: number | null, flags: ValidityFlag[]): void {
  if (model === "ideal") {
    rangeFlag(flags, "parallel-plate", "W/H", w / h, 10, null, "the parallel plate's (W ≫ H)");
    if (h2 !== null) rangeFlag(flags, "parallel-plate", "W/H2", w / h2, 10, null, "the parallel plate's (W ≫ H)");
    return;
  }
  if (h2 === null) {
    if (model === "fringe") {
      rangeFlag(flags, "yuan-trick", "W/T", w / t, 0.5, null, "Yuan–Trick's (W ≥ T/2)");
      return;
    }
    rangeFlag(flags, "sakurai-tamaru-c1", "W/H", w / h, 0.3, 30, "Sakurai–Tamaru C1's fitted");
    rangeFlag(flags, "sakurai-tamaru-c1", "T/H", t / h, 0.3, 30, "Sakurai–Tamaru C1's fitted");
    if (sp !== null) {
      rangeFlag(flags, "sakurai-tamaru-c21", "W/H", w / h, 0.3, 10, "Sakurai–Tamaru C21's fitted");
      rangeFlag(flags, "sakurai-tamaru-c21", "T/H", t / h, 0.3, 10, "Sakurai–Tamaru C21's fitted");
      rangeFlag(flags, "sakurai-tamaru-c21", "S/H", sp / h, 0.5, 10, "Sakurai–Tamaru C21's fitted");
      rangeFlag(flags, "ground-split", "T/H", t / h, 0.3, 4, "the ground/coupling split's fitted");
      rangeFlag(flags, "ground-split", "S/H", sp / h, 0.5, 8, "the ground/coupling split's fitted");
    }
    return;
  }
  rangeFlag(flags, "cohn-thick-strip", "W/(H+H2)", w / (h + h2), 0.35, null, "Cohn's thick-strip");
  const hMin = Math.min(h, h2);
  rangeFlag(flags, "cohn-thick-strip", "Hmax/Hmin", Math.max(h, h2) / hMin, 1, 2, "the off-centre check's");
  if (model === "coupled" && sp !== null) {
    rangeFlag(flags, "two-plane-split", "W/Hmin", w / hMin, 0.3, 8, "the two-plane split's fitted");
    rangeFlag(flags, "two-plane-split", "T/Hmin", t / hMin, 0.3, 3, "the two-plane split's fitted");
    rangeFlag(flags, "two-plane-split", "S/Hmin", sp / hMin, 0.5, 4, "the two-plane split's fitted");
    rangeFlag(flags, "two-plane-split", "Hmax/Hmin", Math.max(h, h2) / hMin, 1, 2, "the two-plane split's fitted");
  }
}

export interface LineCapacitanceInput {
  widthM: number;
  thicknessM: number;
  /** Edge-to-edge spacing to each of two neighbours; null = isolated line. */
  spacingM: number | null;
  /** Height to the plane below; null = none. At least one plane is needed. */
  heightBelowM: number | null;
  /** Height to the plane above; null = none. */
  heightAboveM: number | null;
  /** Relative permittivity of the ILD (everywhere except the gap layer), ≥ 1. */
  k: number;
  /** Permittivity of the gap layer between the lines, 1 ≤ kGap ≤ k (default: 1 (air) when gapFraction is given, else k: no gap). */
  kGap?: number;
  /** Height of the gap layer from the bottom of the lines, as a share of T, 0..1 (default 1 when kGap is given). */
  gapFraction?: number;
  /**
   * An optional cap layer on top of the lines and gaps (model "field" only: the tables and the published forms have
   * none): its thickness (m, at most heightAboveM) and permittivity (default k).
   */
  capThicknessM?: number;
  capK?: number;
  /** Miller coupling factor applied to both neighbours, 0..2. */
  miller: number;
  model: CapacitanceModel;
}

/**
 * Capacitance per length of a line (F/m), split into area (plate), fringe (rest of the ground part) and
 * coupling (Miller-weighted, both neighbours). total = area + fringe + coupling.
 * - ideal: ε·W/H (+ ε·W/H2 with a plane above); neighbours ignored.
 * - fringe: Yuan–Trick single line over one plane; Cohn's thick strip between two planes; neighbours ignored.
 * - coupled: one plane: Sakurai–Tamaru C1 + 2·C21 with the ground/coupling split (SPLIT_FIT); two planes: Cohn's
 *   fringe with the fitted two-plane split (Sakurai–Tamaru is a one-plane fit); without spacing, C1 or Cohn alone.
 * - field: the numeric 2D solve (fieldSolve), synchronous; tens of ms at the default grid.
 * With no plane below but one above, the plane above is used as the only plane (the geometry is mirror-symmetric).
 * Throws RangeError on non-positive sizes, k < 1, miller outside 0..2, or no plane at all.
 */
export function lineCapacitance(p: LineCapacitanceInput): CapacitanceParts & { validity: ValidityFlag[]; accuracy: string } {
  const validity: ValidityFlag[] = [];
  const parts = capacitanceParts(p, validity);
  const gap = p.model === "accurate" && p.kGap !== undefined && p.kGap < p.k && (p.gapFraction ?? 1) > 0;
  const accuracy = p.model === "accurate" ? (gap ? ACCURATE_ACCURACY_AIR_GAP : ACCURATE_ACCURACY_HOMOGENEOUS) : CAPACITANCE_ACCURACY[p.model];
  return { ...parts, validity, accuracy };
}

/** lineCapacitance without the copy: pushes flags into `validity`. Used by the evaluation hot path. */
export function capacitanceParts(p: LineCapacitanceInput, validity: ValidityFlag[]): CapacitanceParts {
  positive("widthM", p.widthM);
  positive("thicknessM", p.thicknessM);
  if (p.spacingM !== null) positive("spacingM", p.spacingM);
  if (p.heightBelowM !== null) positive("heightBelowM", p.heightBelowM);
  if (p.heightAboveM !== null) positive("heightAboveM", p.heightAboveM);
  atLeast("k", p.k, 1);
  inRange("miller", p.miller, 0, 2);
  let hb = p.heightBelowM;
  let ha = p.heightAboveM;
  if (hb === null) {
    if (ha === null) throw new RangeError("heightBelowM or heightAboveM must be given (got no plane)");
    hb = ha;
    ha = null;
  }
  if (p.kGap !== undefined && !(p.kGap >= 1 && p.kGap <= p.k)) throw new RangeError(`kGap must be >= 1 and <= k = ${p.k} (got ${p.kGap})`);
  if (p.gapFraction !== undefined) inRange("gapFraction", p.gapFraction, 0, 1);
  if ((p.capThicknessM !== undefined || p.capK !== undefined) && p.model !== "field")
    throw new RangeError(`capThicknessM and capK need model "field" (the ${p.model} model has no cap layer)`);
  // kGap without a fraction: the gap fills the line's height
  // as for a wire class (scale.ts): a gap given by its fraction alone is air (kGap 1, held at k when k is lower)
  const kGap = p.kGap ?? (p.gapFraction !== undefined ? Math.min(1, p.k) : p.k);
  const gapFraction = p.gapFraction ?? (p.kGap === undefined ? 0 : 1);
  const hasGap = kGap < p.k && gapFraction > 0;
  const eps = EPSILON_0_F_PER_M * p.k;
  const w = p.widthM;
  const t = p.thicknessM;
  const sp = p.spacingM;

  if (p.model === "field") {
    const r = fieldSolve({
      widthM: w,
      thicknessM: t,
      spacingM: sp,
      heightBelowM: hb,
      heightAboveM: ha,
      k: p.k,
      ...(hasGap ? { kGap, gapFraction } : {}),
      ...(p.capThicknessM !== undefined ? { capThicknessM: p.capThicknessM } : {}),
      ...(p.capK !== undefined ? { capK: p.capK } : {}),
    });
    const area = parallelPlateFPerM(eps, w, hb) + (ha !== null ? parallelPlateFPerM(eps, w, ha) : 0);
    const coupling = 2 * p.miller * r.couplingEachFPerM;
    return {
      areaFPerM: area,
      fringeFPerM: r.groundFPerM - area,
      couplingMillerFPerM: coupling,
      couplingEachFPerM: r.couplingEachFPerM,
      totalFPerM: r.groundFPerM + coupling,
      model: "field",
    };
  }

  const split: Split = { area: 0, ground: 0, couple: 0 };
  let model = p.model;
  if (model === "accurate" && sp !== null) accurateCapacitanceInto(w, t, sp, hb, ha, p.k, kGap, gapFraction, split, validity);
  else {
    if (model === "accurate") {
      // the tables need two neighbours: an isolated line takes the published single-line form
      validity.push({
        model: "accurate-table",
        quantity: "neighbours",
        value: 0,
        min: 2,
        max: 2,
        message: "no neighbours (isolated line): the accurate tables need two; the published single-line form was used",
      });
      model = "fringe";
    }
    closedFormInto(model, eps, w, t, sp, hb, ha, split, validity);
    if (hasGap && model === "coupled" && sp !== null) {
      // first order: the coupling part sees the side walls' layers in parallel; the ground part keeps k
      split.couple *= (kGap * gapFraction + p.k * (1 - gapFraction)) / p.k;
      validity.push({
        model: "air-gap-first-order",
        quantity: "kGap",
        value: kGap,
        min: null,
        max: null,
        message: `published form with an air gap: coupling scaled by the side-wall average k (${round3(kGap * gapFraction + p.k * (1 - gapFraction))}), ground unchanged — first order; the accurate model computes the gap`,
      });
    }
  }
  const coupling = 2 * p.miller * split.couple;
  return {
    areaFPerM: split.area,
    fringeFPerM: split.ground - split.area,
    couplingMillerFPerM: coupling,
    couplingEachFPerM: split.couple,
    totalFPerM: split.ground + coupling,
    model,
  };
}

/**
 * Engine-internal hot path: closed-form capacitance (no input checks) into a reusable `out`; flags are pushed into
 * `validity` unless it is null. hb is the plane used as "below" (the caller swaps a lone plane above into it).
 */
export function closedFormInto(
  model: "ideal" | "fringe" | "coupled",
  eps: number,
  w: number,
  t: number,
  sp: number | null,
  hb: number,
  ha: number | null,
  out: Split,
  validity: ValidityFlag[] | null,
): void {
  closedForm(model, eps, w, t, sp, hb, ha, out);
  if (validity !== null) closedFormFlags(model, w, t, sp, hb, ha, validity);
}

/** The closed forms alone (no checks, no flags) into `out`: the evaluation and sweep hot path. */
export function closedForm(
  model: "ideal" | "fringe" | "coupled",
  eps: number,
  w: number,
  t: number,
  sp: number | null,
  hb: number,
  ha: number | null,
  out: Split,
): void {
  out.area = 0;
  out.ground = 0;
  out.couple = 0;
  const useSp = model === "coupled" ? sp : null;
  if (ha === null) onePlane(model, eps, w, t, hb, useSp, out);
  else twoPlanes(model, eps, w, t, hb, ha, useSp, out);
}

/** The validity flags of closedForm's models for this geometry, pushed into `validity`. */
export function closedFormFlags(
  model: "ideal" | "fringe" | "coupled",
  w: number,
  t: number,
  sp: number | null,
  hb: number,
  ha: number | null,
  validity: ValidityFlag[],
): void {
  flagsFor(model, w, t, hb, ha, model === "coupled" ? sp : null, validity);
}

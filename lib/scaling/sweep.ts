/**
 * Sweeps: a metric of each class against S, S_L or k, one curve per model level, so the plateau shows.
 */
import { positive } from "./check";
import { classMetricCore } from "./evaluate";
import type {
  ClassOverride,
  ModelLevel,
  ScenarioSettings,
  SweepCurve,
  SweepMetric,
  SweepPoint,
  SweepVariable,
  Technology,
  ValidityFlag,
  WireClass,
} from "./types";
import { MODEL_LEVELS } from "./types";
import { checkSettings, checkTechnology, checkWireClass, dedupeFlags } from "./validity";

/** n evenly spaced values from `from` to `to` inclusive (n = 1 gives [from]). */
export function linspace(from: number, to: number, n: number): number[] {
  checkCount(n);
  if (n === 1) return [from];
  const out = new Array<number>(n);
  for (let i = 0; i < n; i++) out[i] = i === n - 1 ? to : from + ((to - from) * i) / (n - 1);
  return out;
}

/** n logarithmically spaced values from `from` to `to` inclusive; both must be > 0. */
export function logspace(from: number, to: number, n: number): number[] {
  positive("from", from);
  positive("to", to);
  checkCount(n);
  if (n === 1) return [from];
  const a = Math.log(from);
  const b = Math.log(to);
  const out = new Array<number>(n);
  for (let i = 0; i < n; i++) out[i] = i === 0 ? from : i === n - 1 ? to : Math.exp(a + ((b - a) * i) / (n - 1));
  return out;
}

/** The shared, frozen flags array of every sweep point without flags (no allocation per point). */
const NO_FLAGS = Object.freeze([]) as unknown as ValidityFlag[];

function checkCount(n: number): void {
  if (!(Number.isInteger(n) && n >= 1 && n <= 100_000)) throw new RangeError(`points must be a whole number from 1 to 100000 (got ${n})`);
}

/**
 * One curve per class and level: y = the metric of the class at its scaled mean length (delay: delayS, the
 * unrepeated net with the technology's delay model; rc: rcS; r: rOhm; c: cF), x = the swept value; every point carries
 * the validity flags of the models at that point (`flags`, empty when all are in range). The swept value replaces the scenario's global value and any per-class
 * override of the same variable. Levels other than the scenario's own use their default barrier (scales except at
 * `full`). Points where the scaled geometry is impossible (e.g. a fixed barrier fills the line) are left out and
 * listed in `skipped`.
 */
export function sweep(p: {
  classes: WireClass[];
  technology: Technology;
  settings: ScenarioSettings;
  variable: SweepVariable;
  metric: SweepMetric;
  from: number;
  to: number;
  points: number;
  levels?: ModelLevel[];
  spacing?: "linear" | "log";
  classNames?: string[];
  /**
   * S sweeps only: what the length factor does while S moves. "scenario" (default) keeps the scenario's S_L (and
   * per-class S_L overrides); "follow" sets S_L = S (local-style wires that shrink with the cell); "fixed" sets
   * S_L = 1 (global-style wires that keep their length). Ignored for S_L and k sweeps.
   */
  lengthMode?: "scenario" | "follow" | "fixed";
}): SweepCurve[] {
  checkTechnology(p.technology);
  checkSettings(p.settings);
  for (const wc of p.classes) checkWireClass(wc);
  positive("from", p.from);
  positive("to", p.to);
  if (p.variable === "k" && !(p.from >= 1 && p.to >= 1)) throw new RangeError(`k sweep must stay >= 1 (got ${p.from} to ${p.to})`);
  const xs = (p.spacing ?? "linear") === "log" ? logspace(p.from, p.to, p.points) : linspace(p.from, p.to, p.points);
  const levels = p.levels ?? MODEL_LEVELS;
  const classes = p.classNames ? p.classes.filter((c) => p.classNames!.includes(c.name)) : p.classes;
  const key: keyof ClassOverride = p.variable;
  const lengthMode = p.variable === "s" ? (p.lengthMode ?? "scenario") : "scenario";
  const overrides: Record<string, ClassOverride> = {};
  for (const [name, o] of Object.entries(p.settings.overrides)) {
    const copy = { ...o };
    delete copy[key];
    if (lengthMode !== "scenario") delete copy.sL;
    overrides[name] = copy;
  }
  const curves: SweepCurve[] = [];
  const scratch: ValidityFlag[] = [];
  for (const level of levels) {
    const base: ScenarioSettings = {
      ...p.settings,
      level,
      overrides,
      barrierScales: level === p.settings.level ? p.settings.barrierScales : level !== "full",
    };
    const perClass = classes.map((wc) => ({
      className: wc.name,
      level,
      metric: p.metric,
      variable: p.variable,
      points: [] as SweepPoint[],
      skipped: [] as { x: number; reason: string }[],
    }));
    for (const x of xs) {
      const st = base;
      if (p.variable === "s") {
        st.s = x;
        if (lengthMode === "follow") st.sL = x;
        else if (lengthMode === "fixed") st.sL = 1;
      } else if (p.variable === "sL") st.sL = x;
      else st.k = x;
      for (let i = 0; i < classes.length; i++) {
        const curve = perClass[i]!;
        try {
          scratch.length = 0;
          const y = classMetricCore(classes[i]!, p.technology, st, p.metric, scratch);
          curve.points.push({ x, y, flags: scratch.length === 0 ? NO_FLAGS : scratch.length > 1 ? dedupeFlags(scratch) : [scratch[0]!] });
        } catch (e) {
          if (!(e instanceof RangeError)) throw e;
          curve.skipped.push({ x, reason: e.message });
        }
      }
    }
    for (const c of perClass)
      curves.push(c.skipped.length > 0 ? c : { className: c.className, level, metric: c.metric, variable: c.variable, points: c.points });
  }
  return curves;
}

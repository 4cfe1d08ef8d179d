/**
 * Sweeps: a metric of each class against S, S_L or k, one curve per model level, so the plateau shows.
 */
import { ownEntry } from "./own";
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

/*
 * How the sweep allocates its result. A sweep keeps every point it makes until it returns, so a scavenge in the middle
 * of one finds nearly all recent points alive. V8 then "pretenures" the allocation site that made them (an object or
 * array literal, or `new Array`): from then on it allocates them straight in the old generation, where, once the caller
 * drops the result, they stay until the next major collection and keep the young objects they point to alive through
 * every scavenge. The sweep then ran 2–3× slower, in some processes and not in others. So what a sweep returns (points,
 * flags, their arrays, curves) is made without an allocation site: plain objects by constructors whose prototype is
 * Object.prototype (the same keys in the same order as the literals they replace, so JSON, structured clones and
 * equality checks see no difference) and arrays by Array.prototype.slice.
 */
function PlainPoint(this: SweepPoint, x: number, y: number, flags: ValidityFlag[]): void {
  this.x = x;
  this.y = y;
  this.flags = flags;
}
PlainPoint.prototype = Object.prototype;
const Point = PlainPoint as unknown as new (x: number, y: number, flags: ValidityFlag[]) => SweepPoint;

function PlainFlag(this: ValidityFlag, model: string, quantity: string, value: number, min: number | null, max: number | null, message: string): void {
  this.model = model;
  this.quantity = quantity;
  this.value = value;
  this.min = min;
  this.max = max;
  this.message = message;
}
PlainFlag.prototype = Object.prototype;
const Flag = PlainFlag as unknown as new (
  model: string,
  quantity: string,
  value: number,
  min: number | null,
  max: number | null,
  message: string,
) => ValidityFlag;

function PlainCurve(this: SweepCurve, className: string, level: ModelLevel, metric: SweepMetric, variable: SweepVariable, points: SweepPoint[]): void {
  this.className = className;
  this.level = level;
  this.metric = metric;
  this.variable = variable;
  this.points = points;
}
PlainCurve.prototype = Object.prototype;
const Curve = PlainCurve as unknown as new (
  className: string,
  level: ModelLevel,
  metric: SweepMetric,
  variable: SweepVariable,
  points: SweepPoint[],
) => SweepCurve;

const EMPTY: readonly never[] = Object.freeze([]);
/** A new empty array without an allocation site (see above). */
function newList<T>(): T[] {
  return EMPTY.slice();
}

/**
 * The last few distinct flag sets of one curve. Neighbouring points mostly raise the same flags with the same values
 * (a ratio such as W/H does not move with S), so a point whose flags equal a recent set shares that set's frozen array
 * of frozen flags instead of keeping copies of its own.
 */
interface FlagCache {
  /** Each set as the models pushed it (before dedupeFlags), to compare the next point's flags against. */
  raw: ValidityFlag[][];
  /** What the points carry: dedupeFlags of raw, frozen. */
  out: ValidityFlag[][];
  next: number;
}

const FLAG_CACHE_SIZE = 4;
/** One cache per curve of the sweep, reused by every sweep (the engine is synchronous and never re-entered). */
const CACHES: FlagCache[] = [];

/** CACHES[0 … n − 1], emptied. */
function resetCaches(n: number): void {
  while (CACHES.length < n) CACHES.push({ raw: [], out: [], next: 0 });
  for (let i = 0; i < CACHES.length; i++) {
    const c = CACHES[i]!;
    c.raw.length = 0;
    c.out.length = 0;
    c.next = 0;
  }
}

/**
 * Whether a flag of this model has a message that is a function of its model, quantity, value, min and max within one
 * curve, so that equal fields mean an equal message: rangeFlag's (check.ts: the quantity, the value to three digits,
 * the range and the call site's text, one call site per model and quantity in capacitance.ts), sizeEffectFlags' (the
 * value and the curve's metal) and temperatureFlags' (the value; resistance.ts). Comparing two messages of equal
 * fields costs more than everything else in a sweep point's flags, so these are not compared; any other model's
 * messages are. A new flag of one of these models whose message says more than its fields must leave this list.
 */
function messageFromFields(model: string): boolean {
  switch (model) {
    case "parallel-plate":
    case "yuan-trick":
    case "sakurai-tamaru-c1":
    case "sakurai-tamaru-c21":
    case "ground-split":
    case "cohn-thick-strip":
    case "two-plane-split":
    case "size-effect":
    case "temperature":
      return true;
    default:
      return false;
  }
}

/** Equal flags, field by field (the value with Object.is, so −0 and NaN count as themselves; see messageFromFields). */
function sameFlags(a: readonly ValidityFlag[], b: readonly ValidityFlag[]): boolean {
  if (a.length !== b.length) return false;
  for (let i = 0; i < a.length; i++) {
    const f = a[i]!;
    const g = b[i]!;
    if (!Object.is(f.value, g.value) || f.model !== g.model || f.quantity !== g.quantity || f.min !== g.min || f.max !== g.max) return false;
    if (!messageFromFields(f.model) && f.message !== g.message) return false;
  }
  return true;
}

/**
 * The frozen, deduplicated flags of one point (`flags`: non-empty, the caller's scratch): a recent equal set, or a new
 * one of copies (so that the models' own flag objects never outlive the point that raised them).
 */
function internFlags(cache: FlagCache, flags: ValidityFlag[]): ValidityFlag[] {
  const raw = cache.raw;
  for (let j = 0; j < raw.length; j++) if (sameFlags(raw[j]!, flags)) return cache.out[j]!;
  const copy = flags.slice();
  for (let i = 0; i < copy.length; i++) {
    const f = copy[i]!;
    copy[i] = Object.freeze(new Flag(f.model, f.quantity, f.value, f.min, f.max, f.message));
  }
  const out = Object.freeze(dedupeFlags(copy)) as ValidityFlag[];
  const j = cache.next;
  raw[j] = copy;
  cache.out[j] = out;
  cache.next = j + 1 === FLAG_CACHE_SIZE ? 0 : j + 1;
  return out;
}

function checkCount(n: number): void {
  if (!(Number.isInteger(n) && n >= 1 && n <= 100_000)) throw new RangeError(`points must be a whole number from 1 to 100000 (got ${n})`);
}

/**
 * One curve per class and level: y = the metric of the class at its scaled mean length (delay: delayS, the
 * unrepeated net with the technology's delay model; rc: rcS; r: rOhm; c: cF), x = the swept value; every point carries
 * the validity flags of the models at that point (`flags`, empty when all are in range; frozen, and shared by
 * neighbouring points with equal flags). The swept value replaces the scenario's global value and any per-class
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
   * S sweeps only: what the length factor does while S moves. "scenario" (default) keeps the scenario's length rules
   * (each class's lengthRule, else its S_L override, else the scenario's lengthRule, else its S_L, applied at each S:
   * S_L = rule(S)); "follow" sets S_L = S for every class (local-style wires that shrink with the cell); "fixed" sets
   * S_L = 1 (global-style wires that keep their length); both replace every rule and S_L override. Ignored for S_L
   * and k sweeps (an S_L sweep replaces every rule with the swept value).
   */
  lengthMode?: "scenario" | "follow" | "fixed";
  /**
   * true: the ideal curve keeps the class's driver, load and vias (bulk), like the other levels, so each curve adds one
   * effect to the previous one (plate → + fringing → + coupling → + size effects). false (default): the ideal level
   * as evaluateScenario defines it, the bare line.
   */
  idealWithDevices?: boolean;
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
  // the length rules: an S sweep in "scenario" mode applies each class's rule at each S (scaleClassWith); "follow"
  // and "fixed" replace every rule and S_L; an S_L sweep replaces them with the swept value; a k sweep keeps them
  const dropRules = p.variable === "sL" || lengthMode !== "scenario";
  for (const [name, o] of Object.entries(p.settings.overrides)) {
    const copy = { ...o };
    delete copy[key];
    if (lengthMode !== "scenario") delete copy.sL;
    if (dropRules) delete copy.lengthRule;
    overrides[name] = copy;
  }
  const scratch: ValidityFlag[] = [];
  const nc = classes.length;
  const classOverrides = classes.map((wc) => ownEntry(overrides, wc.name));
  const nl = levels.length;
  const bases: ScenarioSettings[] = levels.map((level) => {
    const st: ScenarioSettings = {
      ...p.settings,
      level,
      overrides,
      barrierScales: level === p.settings.level ? p.settings.barrierScales : level !== "full",
    };
    if (dropRules) delete st.lengthRule;
    return st;
  });
  // curve j = li·nc + i (level li, class i): its points, its skipped x and (CACHES[j]) its recent flag sets
  const points: SweepPoint[][] = new Array(nl * nc);
  const skipped: { x: number; reason: string }[][] = new Array(nl * nc);
  for (let j = 0; j < nl * nc; j++) {
    points[j] = newList();
    skipped[j] = newList();
  }
  resetCaches(nl * nc);
  // x, then class, then level: one class's levels in a row, so that levels on the same closed forms (coupled, full)
  // share one capacitance evaluation (evaluate.ts, capacitanceInto)
  for (let xi = 0; xi < xs.length; xi++) {
    const x = xs[xi]!;
    for (let li = 0; li < nl; li++) {
      const st = bases[li]!;
      if (p.variable === "s") {
        st.s = x;
        if (lengthMode === "follow") st.sL = x;
        else if (lengthMode === "fixed") st.sL = 1;
      } else if (p.variable === "sL") st.sL = x;
      else st.k = x;
    }
    for (let i = 0; i < nc; i++) {
      const wc = classes[i]!;
      const o = classOverrides[i];
      for (let li = 0; li < nl; li++) {
        const j = li * nc + i;
        try {
          while (scratch.length !== 0) scratch.pop();
          const y = classMetricCore(wc, p.technology, bases[li]!, p.metric, scratch, o, p.idealWithDevices === true);
          points[j]!.push(new Point(x, y, scratch.length === 0 ? NO_FLAGS : internFlags(CACHES[j]!, scratch)));
        } catch (e) {
          if (!(e instanceof RangeError)) throw e;
          skipped[j]!.push({ x, reason: e.message });
        }
      }
    }
  }
  resetCaches(0); // drop this sweep's flags from the shared caches
  const curves: SweepCurve[] = new Array(nl * nc);
  for (let li = 0; li < nl; li++) {
    for (let i = 0; i < nc; i++) {
      const j = li * nc + i;
      const c = new Curve(classes[i]!.name, levels[li]!, p.metric, p.variable, points[j]!);
      if (skipped[j]!.length > 0) c.skipped = skipped[j]!;
      curves[j] = c;
    }
  }
  return curves;
}

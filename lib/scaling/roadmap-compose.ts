/**
 * Roadmaps, the light half: the types of a chain of node steps N0 (the baseline) → N1 → … → N8 and their composition
 * into absolute scenario settings against N0 (composeRoadmap). Pure and free of the evaluating modules, so the
 * browser's main thread may import it (through client.ts); evaluateRoadmap (roadmap.ts) adds the evaluation.
 *
 * Composition (scaling/README.md, "Roadmaps"): each step is relative to the previous one. Per class c at step i:
 *   s_i,c  = override.s ?? (override.targetPitchM → pitch_(i−1),c / targetPitchM) ?? step.s ?? 1
 *   rule_i,c = override.lengthRule ?? (override.sL as a factor) ?? step.lengthRule ?? (step.sL as a factor)
 *              ?? the rule c followed at step i − 1 ?? fixed
 *   sL_i,c = rule_i,c(s_i,c)
 * and the absolute S and S_L of c at step n are the products over steps 1…n. deviceRFactor and deviceCFactor multiply
 * along the chain; every other option (level, barrierScales, miller, supplyV, k, metal, airGap, temperatureC, and per
 * class k, metal, barrierScales, aspectRatio, lineFraction, miller, barrierM, airGap) is carried forward from the last step that
 * set it.
 */
import { getMetal } from "./materials";
import { lengthFactor, ruleOfFactor } from "./scale";
import { atLeast, inRange, positive } from "./check";
import { checkLengthRule } from "./validity";
import { ownEntry } from "./own";
import type { AirGap, ClassOverride, LengthRule, ScenarioSettings, Technology, WireClass } from "./types";
import { MODEL_LEVELS } from "./types";

/** Most steps a roadmap holds after its baseline N0. */
export const MAX_ROADMAP_STEPS = 8;

/**
 * One class's settings at one step, relative to the previous step: a ClassOverride (s and sL relative to the previous
 * step) or, instead of `s`, the class's target pitch at this step (S of this step = previous pitch / target).
 */
export interface RoadmapClassStep extends ClassOverride {
  /** Target pitch (width + spacing) of this class at this step, m; exclusive with `s`. */
  targetPitchM?: number;
}

/** A step's settings: any (partial) scenario setting, relative to the previous step (see composeRoadmap). */
export interface RoadmapStepSettings extends Partial<Omit<ScenarioSettings, "overrides">> {
  overrides?: Record<string, RoadmapClassStep>;
}

/** One node step of a roadmap. `fromScenarioId`: the scenario its settings were copied from (kept for the record). */
export interface RoadmapStep {
  name: string;
  settings: RoadmapStepSettings;
  fromScenarioId?: string;
}

/**
 * A roadmap's steps cannot be composed. `path` locates the field as a request body would (step index from 0), e.g.
 * ["steps", 1, "settings", "overrides", "M9"]; the message names the step by number (from 1) and name.
 */
export class RoadmapInputError extends Error {
  readonly path: (string | number)[];
  constructor(path: (string | number)[], message: string) {
    super(message);
    this.name = "RoadmapInputError";
    this.path = path;
  }
}

/** The options of a class override that are carried forward as they are (not s, sL or lengthRule). */
const CARRIED_CLASS_FIELDS = ["k", "metal", "barrierScales", "aspectRatio", "lineFraction", "miller", "barrierM", "airGap"] as const;

/** The global options carried forward from the last step that set them. */
const CARRIED_FIELDS = ["level", "barrierScales", "miller", "supplyV", "k", "metal", "airGap", "temperatureC"] as const;

/** The step's own words for a message: step 2 "N2". */
function stepLabel(i: number, step: RoadmapStep | undefined): string {
  const name = step && typeof step.name === "string" && step.name.trim() !== "" ? ` "${step.name}"` : "";
  return `step ${i + 1}${name}`;
}

/** Runs a check; its RangeError becomes a RoadmapInputError at `path`, the message naming the step and field. */
function guard(i: number, step: RoadmapStep, path: (string | number)[], check: (field: string) => void): void {
  const field = path.join(".");
  try {
    check(field);
  } catch (e) {
    if (!(e instanceof RangeError)) throw e;
    throw new RoadmapInputError(["steps", i, ...path], `${stepLabel(i, step)}: ${e.message}`);
  }
}

const isObject = (v: unknown): boolean => v !== null && typeof v === "object" && !Array.isArray(v);

function checkAirGapAt(i: number, step: RoadmapStep, path: (string | number)[], g: AirGap | null): void {
  if (g === null) return;
  guard(i, step, path, (f) => {
    if (!isObject(g)) throw new RangeError(`${f} must be an object { kGap, gapFraction } or null (got ${String(g)})`);
    atLeast(`${f}.kGap`, g.kGap, 1);
    inRange(`${f}.gapFraction`, g.gapFraction, 0, 1);
  });
}

function checkMetalAt(i: number, step: RoadmapStep, path: (string | number)[], m: string | null): void {
  if (m === null) return;
  guard(i, step, path, (f) => {
    try {
      getMetal(m);
    } catch (e) {
      throw new RangeError(`${f}: ${(e as Error).message}`);
    }
  });
}

/** Every field a step gives, checked where it stands (the baseline's class names for the overrides). */
function checkStep(i: number, step: RoadmapStep, classNames: ReadonlySet<string>): void {
  if (!isObject(step)) throw new RoadmapInputError(["steps", i], `${stepLabel(i, undefined)}: must be an object { name, settings }`);
  if (typeof step.name !== "string" || step.name.trim() === "") throw new RoadmapInputError(["steps", i, "name"], `${stepLabel(i, step)}: name is required`);
  const st = step.settings;
  if (!isObject(st)) throw new RoadmapInputError(["steps", i, "settings"], `${stepLabel(i, step)}: settings must be an object`);
  const at = (...p: (string | number)[]) => ["settings", ...p];
  const pos = (name: keyof RoadmapStepSettings) => {
    const v = st[name];
    if (v !== undefined) guard(i, step, at(name), (f) => positive(f, v as number));
  };
  pos("s");
  pos("sL");
  pos("deviceRFactor");
  pos("deviceCFactor");
  pos("supplyV");
  if (st.level !== undefined && !MODEL_LEVELS.includes(st.level))
    guard(i, step, at("level"), (f) => {
      throw new RangeError(`${f} must be one of ${MODEL_LEVELS.join(", ")} (got ${String(st.level)})`);
    });
  if (st.barrierScales !== undefined && typeof st.barrierScales !== "boolean")
    guard(i, step, at("barrierScales"), (f) => {
      throw new RangeError(`${f} must be true or false`);
    });
  if (st.miller !== undefined) guard(i, step, at("miller"), (f) => inRange(f, st.miller!, 0, 2));
  if (st.k !== undefined && st.k !== null) guard(i, step, at("k"), (f) => atLeast(f, st.k!, 1));
  if (st.metal !== undefined) checkMetalAt(i, step, at("metal"), st.metal);
  if (st.airGap !== undefined) checkAirGapAt(i, step, at("airGap"), st.airGap);
  if (st.lengthRule !== undefined) guard(i, step, at("lengthRule"), (f) => checkLengthRule(f, st.lengthRule!));
  if (st.temperatureC !== undefined) guard(i, step, at("temperatureC"), (f) => inRange(f, st.temperatureC!, -273.15, 400));
  if (st.overrides === undefined) return;
  if (!isObject(st.overrides))
    throw new RoadmapInputError(["steps", i, "settings", "overrides"], `${stepLabel(i, step)}: overrides must be an object keyed by class name`);
  for (const [name, o] of Object.entries(st.overrides)) {
    const op = (...p: (string | number)[]) => at("overrides", name, ...p);
    if (!classNames.has(name)) throw new RoadmapInputError(["steps", i, ...op()], `${stepLabel(i, step)}: class "${name}" is not in the baseline`);
    if (!isObject(o)) throw new RoadmapInputError(["steps", i, ...op()], `${stepLabel(i, step)}: the settings of class ${name} must be an object`);
    for (const f of ["s", "sL", "aspectRatio", "targetPitchM"] as const) {
      const v = o[f];
      if (v !== undefined) guard(i, step, op(f), (n) => positive(n, v));
    }
    if (o.s !== undefined && o.targetPitchM !== undefined)
      throw new RoadmapInputError(
        ["steps", i, ...op("targetPitchM")],
        `${stepLabel(i, step)}: class ${name} gives both s and targetPitchM; give one (S follows from the target pitch)`,
      );
    if (o.k !== undefined) guard(i, step, op("k"), (f) => atLeast(f, o.k!, 1));
    if (o.metal !== undefined) checkMetalAt(i, step, op("metal"), o.metal);
    if (o.miller !== undefined) guard(i, step, op("miller"), (f) => inRange(f, o.miller!, 0, 2));
    if (o.barrierM !== undefined) guard(i, step, op("barrierM"), (f) => atLeast(f, o.barrierM!, 0));
    if (o.barrierScales !== undefined && typeof o.barrierScales !== "boolean")
      guard(i, step, op("barrierScales"), (f) => {
        throw new RangeError(`${f} must be true or false`);
      });
    if (o.airGap !== undefined) checkAirGapAt(i, step, op("airGap"), o.airGap);
    if (o.lengthRule !== undefined) guard(i, step, op("lengthRule"), (f) => checkLengthRule(f, o.lengthRule!));
  }
}

/** What a class carries from step to step. */
interface ClassState {
  wc: WireClass;
  /** Absolute S and S_L against N0. */
  s: number;
  sL: number;
  /** The rule the class followed at the last step (undefined before the first). */
  rule: LengthRule | undefined;
  /** Per-class options carried forward (k, metal, barrierScales, aspectRatio, lineFraction, miller, barrierM, airGap). */
  options: ClassOverride;
}

/**
 * The absolute settings of each step against N0 (the baseline), one per step in order: every class gets an explicit
 * `s`/`sL` override (the products along the chain, see the file's comment) and the per-class options carried to that
 * step; the global `s`/`sL` are the products of the steps' global S and of the global rule's S_L (what a class without
 * overrides would get), deviceRFactor/deviceCFactor the products, the other options those of the last step that set
 * them (defaults before: level full, barrier kept, Miller 1, the technology's supply, each class's k and metal).
 * Throws RoadmapInputError (path and message naming the step and field) on no steps, more than MAX_ROADMAP_STEPS, a
 * class not in the baseline, targetPitchM with s, a target pitch ≤ 2 × the class's barrier at that step (no metal
 * left), a length-rule exponent outside 0–2, non-positive factors and any other value out of range.
 */
export function composeRoadmap(p: { classes: WireClass[]; technology: Technology; steps: RoadmapStep[] }): ScenarioSettings[] {
  const steps = p.steps;
  if (!Array.isArray(steps) || steps.length === 0) throw new RoadmapInputError(["steps"], "a roadmap needs at least one step after its baseline N0");
  if (steps.length > MAX_ROADMAP_STEPS)
    throw new RoadmapInputError(["steps"], `a roadmap holds at most ${MAX_ROADMAP_STEPS} steps after its baseline N0 (got ${steps.length})`);
  const classNames = new Set(p.classes.map((c) => c.name));
  for (let i = 0; i < steps.length; i++) checkStep(i, steps[i]!, classNames);

  // the carried global state, from the defaults of a new scenario (lib/validation/scenario.ts)
  const g: ScenarioSettings = {
    s: 1,
    sL: 1,
    level: "full",
    barrierScales: false,
    miller: 1,
    deviceRFactor: 1,
    deviceCFactor: 1,
    supplyV: p.technology.supplyV,
    k: null,
    metal: null,
    overrides: {},
  };
  let globalRule: LengthRule | undefined;
  const state: ClassState[] = p.classes.map((wc) => ({ wc, s: 1, sL: 1, rule: undefined, options: {} }));
  const out: ScenarioSettings[] = [];

  for (let i = 0; i < steps.length; i++) {
    const step = steps[i]!;
    const st = step.settings;
    const carried = g as unknown as Record<string, unknown>;
    for (const f of CARRIED_FIELDS) if (st[f] !== undefined) carried[f] = st[f];
    if (st.deviceRFactor !== undefined) g.deviceRFactor *= st.deviceRFactor;
    if (st.deviceCFactor !== undefined) g.deviceCFactor *= st.deviceCFactor;
    const stepS = st.s ?? 1;
    const stepRule = st.lengthRule ?? (st.sL !== undefined ? ruleOfFactor(st.sL) : undefined);
    globalRule = stepRule ?? globalRule;
    g.s *= stepS;
    g.sL *= lengthFactor(globalRule ?? { kind: "fixed" }, stepS);

    const overrides: Record<string, ClassOverride> = {};
    for (const c of state) {
      const o = ownEntry(st.overrides, c.wc.name);
      if (o !== undefined) {
        const opts = c.options as Record<string, unknown>;
        for (const f of CARRIED_CLASS_FIELDS) if (o[f] !== undefined) opts[f] = o[f];
      }
      let s = stepS;
      if (o?.s !== undefined) s = o.s;
      else if (o?.targetPitchM !== undefined) {
        const target = o.targetPitchM;
        const before = (c.wc.widthM + c.wc.spacingM) / c.s;
        s = before / target;
        const barrierScales = g.level === "ideal" ? true : (c.options.barrierScales ?? g.barrierScales);
        const barrier = c.options.barrierM ?? (barrierScales ? c.wc.barrierM / (c.s * s) : c.wc.barrierM);
        if (!(target > 2 * barrier))
          throw new RoadmapInputError(
            ["steps", i, "settings", "overrides", c.wc.name, "targetPitchM"],
            `${stepLabel(i, step)}: target pitch ${fmtNm(target)} of class ${c.wc.name} is not more than twice its barrier ${fmtNm(barrier)}: no metal would be left`,
          );
      }
      const rule = o?.lengthRule ?? (o?.sL !== undefined ? ruleOfFactor(o.sL) : undefined) ?? stepRule ?? c.rule ?? { kind: "fixed" };
      c.rule = rule;
      c.s *= s;
      c.sL *= lengthFactor(rule, s);
      overrides[c.wc.name] = { s: c.s, sL: c.sL, ...c.options };
    }
    out.push({
      s: g.s,
      sL: g.sL,
      level: g.level,
      barrierScales: g.barrierScales,
      miller: g.miller,
      deviceRFactor: g.deviceRFactor,
      deviceCFactor: g.deviceCFactor,
      supplyV: g.supplyV,
      k: g.k,
      metal: g.metal,
      ...(g.airGap !== undefined ? { airGap: g.airGap } : {}),
      ...(g.temperatureC !== undefined ? { temperatureC: g.temperatureC } : {}),
      overrides,
    });
  }
  return out;
}

function fmtNm(m: number): string {
  return `${Number((m * 1e9).toPrecision(4))} nm`;
}

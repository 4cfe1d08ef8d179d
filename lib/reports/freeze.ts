import {
  ENGINE_VERSION,
  MODEL_LEVELS,
  evaluateRoadmap,
  evaluateScenario,
  ownEntry,
  sweep,
  type ClassOverride,
  type Evaluation,
  type LengthRule,
  type RoadmapStep,
  type ScenarioSettings,
  type Technology,
  type WireClass,
} from "@/lib/scaling";
import {
  DEFAULT_REPORT_METRICS,
  FROZEN_SCHEMA_VERSION,
  frozenReportSchema,
  type FrozenReport,
  type FrozenSweep,
  type ReportMetric,
} from "@/lib/validation/report";
import { scopeToChosenClasses } from "./scope";
import { freezeShaping } from "./shaping";

/** Everything a report is computed from, as loaded from the team's baseline and scenarios. */
export interface FreezeInput {
  baseline: { id: string; name: string; description: string; version: number; technology: Technology; classes: WireClass[] };
  scenarios: { id: string; name: string; notes: string; version: number; settings: ScenarioSettings }[];
  /** Roadmaps on the same baseline (issue 14), frozen beside the options; none when absent. */
  roadmaps?: { id: string; name: string; version: number; steps: RoadmapStep[] }[];
  classNames?: string[];
  metrics?: ReportMetric[];
  /** The "Layer shaping" section (issue 15): frozen when given. */
  shaping?: { objective: "delay" | "repeated" | "energy" | "edp" };
}

export const OPTION_KEYS = ["A", "B", "C", "D"] as const;
/** Histogram bins kept in the frozen document, over all classes; above it the bins are dropped (totals keep them). */
const MAX_FROZEN_BINS = 4000;
/** Sweep charts frozen per report (one per chosen class, in table order). */
const MAX_SWEEP_CLASSES = 6;
const SWEEP_POINTS = 31;

/** A class choice that names no class of the baseline: the compose route turns it into a 400. */
export class UnknownClassError extends Error {
  constructor(readonly names: string[]) {
    super(`Unknown class${names.length > 1 ? "es" : ""}: ${names.join(", ")}.`);
  }
}

/**
 * Runs the engine on the server and returns ONE self-contained document: the inputs (baseline classes and
 * technology, each scenario's settings), each option's Evaluation, the delay-vs-S sweeps of the chosen
 * classes, the engine version and model levels, and each chosen roadmap's steps with their composed settings and
 * evaluations. Reading a report never calls the engine again, so later edits to the scenarios or roadmaps, or a new
 * engine version, leave it unchanged.
 */
export function freezeReport(input: FreezeInput, now = Date.now()): FrozenReport {
  const { baseline, scenarios } = input;
  if (scenarios.length < 1 || scenarios.length > OPTION_KEYS.length) throw new RangeError("a report compares 1 to 4 scenarios");
  const known = new Set(baseline.classes.map((c) => c.name));
  const unknown = (input.classNames ?? []).filter((n) => !known.has(n));
  if (unknown.length > 0) throw new UnknownClassError(unknown);
  // Table order follows the baseline, whatever order the classes were picked in.
  const classNames = input.classNames ? baseline.classes.map((c) => c.name).filter((n) => input.classNames!.includes(n)) : [...known];
  const metrics = input.metrics ? REPORT_METRIC_ORDER.filter((m) => input.metrics!.includes(m)) : [...DEFAULT_REPORT_METRICS];
  // The report is about the chosen classes only: the engine evaluates just those (totals, worst class and flags are
  // theirs), and nothing of the other classes is stored, so no view of the report (a share link above all) shows them.
  const chosen = new Set(classNames);
  const classes = baseline.classes.filter((c) => chosen.has(c.name));
  const onlyChosen = (s: ScenarioSettings): ScenarioSettings => ({
    ...s,
    overrides: Object.fromEntries(Object.entries(s.overrides).filter(([name]) => chosen.has(name))),
  });
  const scoped: FreezeInput = { ...input, baseline: { ...baseline, classes }, scenarios: scenarios.map((s) => ({ ...s, settings: onlyChosen(s.settings) })) };

  const evaluations: Evaluation[] = scoped.scenarios.map((s) => evaluateScenario({ classes, technology: baseline.technology, settings: s.settings }));

  const totalBins = classes.reduce((n, c) => n + (c.histogram?.length ?? 0), 0);
  const binsTrimmed = totalBins > MAX_FROZEN_BINS;
  const options = scoped.scenarios.map((s, i) => ({
    key: OPTION_KEYS[i]!,
    scenarioId: s.id,
    name: s.name,
    notes: s.notes,
    version: s.version,
    settings: s.settings,
    evaluation: binsTrimmed ? trimBins(evaluations[i]!) : evaluations[i]!,
  }));

  // Roadmaps: each step's settings without the classes not chosen (as for the options), composed and evaluated
  // against N0 on the chosen classes only; each step's evaluation is stored without its distribution bins.
  const roadmaps = (input.roadmaps ?? []).map((r, i) => {
    const steps: RoadmapStep[] = r.steps.map((st) => ({
      ...st,
      settings: st.settings.overrides
        ? { ...st.settings, overrides: Object.fromEntries(Object.entries(st.settings.overrides).filter(([name]) => chosen.has(name))) }
        : st.settings,
    }));
    const evaluated = evaluateRoadmap({ classes, technology: baseline.technology, steps }).steps;
    return {
      key: `R${i + 1}`,
      roadmapId: r.id,
      name: r.name,
      version: r.version,
      steps: steps.map((st, j) => ({
        name: st.name,
        ...(st.fromScenarioId ? { fromScenarioId: st.fromScenarioId } : {}),
        settings: st.settings,
        composed: evaluated[j]!.settings,
        // without the length-histogram bins (totals and over-budget shares are computed with them): a roadmap view
        // reads per-class figures across steps, and the bins would take the demo report from 369 to 620 KiB
        evaluation: trimBins(evaluated[j]!.evaluation),
      })),
    };
  });

  const doc = {
    schemaVersion: FROZEN_SCHEMA_VERSION,
    createdAt: now,
    engineVersion: ENGINE_VERSION,
    modelLevels: [...MODEL_LEVELS],
    baseline: {
      id: baseline.id,
      name: baseline.name,
      description: baseline.description,
      version: baseline.version,
      technology: baseline.technology,
      classes: classes.map((c) => {
        const bins = c.histogram?.length ?? 0;
        const { histogram, ...rest } = c;
        return binsTrimmed || bins === 0 ? { ...rest, histogramBins: bins } : { ...rest, histogram, histogramBins: bins };
      }),
    },
    options,
    classNames,
    metrics,
    sweeps: freezeSweeps(scoped, classNames.slice(0, MAX_SWEEP_CLASSES), evaluations),
    binsTrimmed,
    ...(roadmaps.length > 0 ? { roadmaps } : {}),
    ...(input.shaping ? { shaping: freezeShaping({ classes, technology: baseline.technology, options, classNames, objective: input.shaping.objective }) } : {}),
  } satisfies FrozenReport;
  // Round-trip through JSON and the schema: what is stored is exactly what every later read will accept.
  return scopeToChosenClasses(frozenReportSchema.parse(JSON.parse(JSON.stringify(doc, finiteOrNull))));
}

export const REPORT_METRIC_ORDER: ReportMetric[] = ["delay", "rc", "resistance", "capacitance", "repeaters", "energy", "power", "overBudget"];

function finiteOrNull(_key: string, value: unknown): unknown {
  return typeof value === "number" && !Number.isFinite(value) ? null : value;
}

function trimBins(e: Evaluation): Evaluation {
  const strip = <T extends { distribution: { bins: unknown[] } }>(r: T): T => ({ ...r, distribution: { ...r.distribution, bins: [] } });
  return { ...e, classes: e.classes.map((c) => ({ ...c, baseline: strip(c.baseline), scenario: strip(c.scenario) })) };
}

/**
 * The length rule of a class's sweep (issue 13 item 6), from the first option. A length rule of the class (its own,
 * else the option's global one when the class has no S_L of its own; issue 14): follows-s is "follow", fixed is
 * "fixed", a factor or power law is that rule, applied at every S. Otherwise from the option's S_L: "follow" when it
 * equals the class's S (lengths shrink with the section), "fixed" when S_L = 1; any other S_L follows the tier (local
 * and intermediate wires shrink with the cell, semi-global and global wires keep their length).
 */
export function sweepLengthRule(settings: ScenarioSettings, wc: Pick<WireClass, "name" | "tier">): "follow" | "fixed" | LengthRule {
  const o = ownEntry(settings.overrides, wc.name);
  const rule = o?.lengthRule ?? (o?.sL === undefined ? settings.lengthRule : undefined);
  if (rule !== undefined) return rule.kind === "follows-s" ? "follow" : rule.kind === "fixed" ? "fixed" : rule;
  const s = o?.s ?? settings.s;
  const sL = o?.sL ?? settings.sL;
  if (Math.abs(sL - s) <= 1e-9 * s) return "follow";
  if (sL === 1) return "fixed";
  return wc.tier === "local" || wc.tier === "intermediate" ? "follow" : "fixed";
}

/**
 * Delay against S for each chosen class: one curve per option at its own model level, each option marked at
 * its own S on its curve. The wire length follows the class's length rule (sweepLengthRule), so a class whose
 * lengths shrink with the section shows where shrinking stops paying off. When the first option uses the full
 * model, the same option without size effects (bulk resistivity, a barrier that thins with S) is the grey
 * reference: the gap between the two is what the size effects cost.
 */
function freezeSweeps(input: FreezeInput, classNames: string[], _evaluations: Evaluation[]): FrozenSweep[] {
  if (classNames.length === 0) return [];
  const { baseline, scenarios } = input;
  const maxS = Math.max(...scenarios.flatMap((s) => [s.settings.s, ...Object.values(s.settings.overrides).map((o) => o.s ?? s.settings.s)]));
  const from = 1;
  const to = Math.max(2, Math.ceil(maxS * 1.3 * 4) / 4);
  const classes = baseline.classes.map(({ histogram: _h, ...c }) => c);
  const first = scenarios[0]!.settings;
  const rules = new Map(classes.map((c) => [c.name, sweepLengthRule(first, c)]));
  const byClass = new Map<string, FrozenSweep>(
    classNames.map((n) => [n, { className: n, metric: "delay", variable: "s", from, to, series: [], marks: [], lengthRule: rules.get(n) ?? "fixed" }]),
  );
  scenarios.forEach((s, i) => {
    const key = OPTION_KEYS[i]!;
    const withReference = i === 0 && s.settings.level === "full";
    for (const lengthMode of ["follow", "fixed", "scenario"] as const) {
      const names = classNames.filter((n) => {
        const r = rules.get(n);
        return lengthMode === "scenario" ? typeof r === "object" : r === lengthMode;
      });
      if (names.length === 0) continue;
      // a factor or power-law rule of the first option: every option's curve of that class follows it at every S
      let settings = s.settings;
      if (lengthMode === "scenario") {
        const overrides: Record<string, ClassOverride> = { ...settings.overrides };
        for (const n of names) overrides[n] = { ...ownEntry(settings.overrides, n), lengthRule: rules.get(n) as LengthRule };
        settings = { ...settings, overrides };
      }
      const common = {
        classes,
        technology: baseline.technology,
        settings,
        variable: "s" as const,
        metric: "delay" as const,
        classNames: names,
        lengthMode,
      };
      const curves = sweep({ ...common, from, to, points: SWEEP_POINTS, levels: withReference ? ["full", "coupled"] : [s.settings.level] });
      for (const c of curves) {
        const target = byClass.get(c.className);
        if (!target) continue;
        if (c.level === s.settings.level) target.series.push({ key, label: `Option ${key}`, level: c.level, points: c.points });
        else
          target.series.push({
            key: "reference",
            label: `Option ${key} without size effects (bulk resistivity, barrier thins with S)`,
            level: c.level,
            points: c.points,
          });
      }
      // each option's mark on its own curve: the same length rule at its own S
      for (const n of names) {
        const target = byClass.get(n)!;
        const sHere = ownEntry(s.settings.overrides, n)?.s ?? s.settings.s;
        const at = sweep({ ...common, classNames: [n], from: sHere, to: sHere, points: 1, levels: [s.settings.level] })[0]?.points[0];
        if (at) target.marks.push({ key, x: sHere, y: at.y });
      }
    }
  });
  const order = (k: string) => (k === "reference" ? "Z" : k);
  return [...byClass.values()].map((sw) => ({ ...sw, series: [...sw.series].sort((a, b) => order(a.key).localeCompare(order(b.key))) }));
}

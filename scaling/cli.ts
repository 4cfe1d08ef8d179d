/**
 * Command line of Plateau's scaling engine:
 *   npm run scaling -- <command> [options]      or      npx tsx scaling/cli.ts <command> [options]
 * Commands: capacitance, delay, evaluate, sweep, roadmap, optimize, variation, fit, materials. `--json` prints only JSON on standard output.
 * Values take SI-prefixed units ("20nm", "1.5fF", "2kohm") or bare SI numbers. Bad arguments exit with code 2
 * and one line naming the argument and the expected unit. CSV files are read with the app's one reader (lib/import)
 * and the formats' rules (lib/scaling/formats.ts), so a file the upload rejects is rejected here with the same message.
 * Without --technology the engine's DEFAULT_TECHNOLOGY is used. No network access.
 */
import { readFileSync } from "node:fs";
import { pathToFileURL } from "node:url";
import { parseArgs } from "node:util";
import {
  baselineSettings,
  composeRoadmap,
  DEFAULT_TECHNOLOGY,
  DIELECTRICS,
  evaluateRoadmap,
  evaluateScenario,
  fitSizeEffect,
  formatEngineering,
  lineCapacitance,
  lineDelay,
  MAX_VARIATION_SAMPLES,
  optimizeClass,
  variation,
  DESIGN_OBJECTIVES,
  type DesignObjective,
  type Sigma,
  type Stats,
  type VariationSigmas,
  MEASURED_RESISTANCE_FORMAT,
  METALS,
  MODEL_LEVELS,
  parseQuantity,
  resolveHeader,
  RoadmapInputError,
  sweep,
  validateMeasuredRow,
  type BaseUnit,
  type CapacitanceModel,
  type ClassResult,
  type LengthRule,
  type MeasuredResistance,
  type ModelLevel,
  type RoadmapStep,
  type ScenarioSettings,
  type SweepMetric,
  type SweepVariable,
  type Technology,
  type WireClass,
} from "../lib/scaling/index";
import { readCsvSync } from "../lib/import/csv-stream";
import { parseHistogramBins } from "../lib/import/histograms";
import { ImportFatalError, type ImportIssue } from "../lib/import/types";
import { parseWireClassCsv } from "../lib/import/wire-classes";
import { roadmapStepsSchema } from "../lib/validation/roadmap";

export interface CliResult {
  code: number;
  stdout: string;
  stderr: string;
}

class UsageError extends Error {}

const HELP = `Plateau scaling engine — command line

Usage: npm run scaling -- <command> [options]   (or: npx tsx scaling/cli.ts <command> [options])

Commands:
  capacitance  --width W --thickness T --height H [--height-above H2] [--spacing S] [--k 3.9] [--miller 1]
               [--k-gap KG] [--gap-fraction F] [--model ideal|fringe|coupled|accurate|field]
               capacitance per length of one line (default model: accurate with --spacing, else fringe);
               --k is the dielectric everywhere except the gap between the lines (--k-gap, from the bottom of
               the lines up to F × T, default F = 1); with --model field also [--cap-thickness C] [--cap-k KC]:
               a cap layer of thickness C (≤ --height-above) and permittivity KC (default --k) on the lines
  delay        --r-total R --c-total C [--driver RD] [--load CL]   50% step delay and Elmore delay
  evaluate     --baseline classes.csv --s S [--sl 1 | --length-rule RULE] [--model ideal|fringe|coupled|full]
               [--histograms h.csv] [--technology t.json] [--miller M] [--k K] [--metal Cu] [--barrier fixed|scales]
               [--supply V] [--device-r F] [--device-c F]    a scenario against its baseline
  sweep        --baseline classes.csv --s-from 1 --s-to 4 --points N [--metric delay|rc|r|c]
               [--variable s|sL|k] [--levels ideal,fringe,coupled,full] [--class NAME] [--log]
               [--length-rule scenario|RULE]   S sweeps: S_L = RULE(S) at every point; scenario (default): --sl
  roadmap      --baseline classes.csv --steps steps.json [--technology t.json] [--histograms h.csv]
               a chain of node steps N0 (the baseline) → N1 → … (1 to 8), each relative to the previous one, every
               step evaluated against N0; steps.json: [{ "name": "N1", "settings": { "s": 1.25, "lengthRule": {…},
               "overrides": { "M2": { "targetPitchM": 4.8e-8 } } } }, …] (or { "steps": […] }); --json prints
               { "steps": [{ "name", "evaluation" }] }, else a table per class across the steps (ratios to N0)
  optimize     --baseline classes.csv --class NAME [--s S] [--objective delay|repeated|energy|edp]
               [--min-fraction 0.3] [--max-fraction 0.7] [--min-aspect 1] [--max-aspect 3] [--min-width W] [--min-space S]
               (+ the scenario options of evaluate) the line fraction W/pitch and aspect ratio T/W at the class's
               scenario pitch that minimise the objective: delay = the net's 50% delay with its driver, load and
               repeaters; repeated = delay per metre of the optimally repeated line; energy = energy per transition;
               edp = energy × delay. --json prints { "widthM", "thicknessM", "spacingM", "objectiveValue",
               "lineFraction", "aspectRatio", "pitchM", "objective", "currentValue" }
  variation    --baseline classes.csv [--s S] --samples N --seed N [--sigma-width 1nm] [--sigma-thickness 2nm]
               [--sigma-barrier σ] [--sigma-ild σ] [--sigma-k 0.05|2%] [--fixed-pitch] [--corner-sigma 3]
               (+ the scenario options of evaluate) Monte Carlo of process variation (σ in metres or in % of the
               value; samples 2 to 100000; --fixed-pitch: the spacing moves against the width) → per class
               mean/std/p5/p50/p95; --json prints [{ "class", "rOhmPerM": {"mean","std","p5","p50","p95"},
               "cFPerM", "rcS", "delayS", "energyJ", "samples", "redrawn", "corners": { "fast", "slow", "nominal" } }]
  fit          --baseline classes.csv --measured measured.csv [--technology t.json]
               fit size-effect p and R per metal to measured resistance (columns class,r_ohm_per_um,temperature_c);
               prints { metals, points }; "metals" can be passed back as the technology JSON's "materials"
  materials    the materials catalogue with sources

Length rules (RULE, how wire lengths follow the shrink S; lengths ÷ S_L): follows-s (S_L = S), fixed (S_L = 1),
factor:X (S_L = X > 0 whatever S is), power:A (S_L = S^A, 0 ≤ A ≤ 2). On evaluate and sweep the rule applies to
every class; in a roadmap's steps.json per step ("lengthRule": {"kind": "power", "exponent": 0.5}) or per class.
delay takes [--model exact|sakurai] (default exact: the tabulated exact solution; sakurai: the closed form).
The technology JSON (--technology) lays its fields over the default technology: supplyV, clockHz, repeaterR0Ohm,
repeaterC0F, delayBudgetS, and (engine 2) delayModel ("exact"|"sakurai"), capacitanceModel ("accurate", the default:
our field solver's tables at levels coupled and full; "published": Sakurai–Tamaru / Cohn), temperatureC (default 25), minRepeaterGain
(default 0.1), repeaterOutputCRatio (default 0.5), repeaterAreaM2 (default 1e-13), repeaterLeakageW (default 0),
materials ({ "Cu": { "specularity": 0.2, ... } }). The baseline CSV may carry the optional columns vias_per_net,
via_ohm, via_width_nm, via_height_nm, and k_gap, gap_fraction (an air gap between the lines).
evaluate --json gives per class (baseline and scenario): repeaterCount (k inserted), repeaterSize (h), repeatedDelayS
(= delayS when k = 0), stageCount (k + 1), repeaterAreaM2, repeaterEnergyJ (per net at the class's length),
viaOhm, temperatureC, besides the line's R, C, delays, energy and power (repeaters included).

Values: SI-prefixed units (20nm, 0.02um, 1.5fF, 2kohm, 10ps) or bare SI numbers (2e-8).
Options: --json (only JSON on standard output), --help.
Without --model each command uses its most accurate model (capacitance: accurate with --spacing, else fringe;
evaluate: full, with the accurate tables unless the technology JSON says capacitanceModel "published").
Results are first-order planning estimates, not sign-off.`;

function q(values: Record<string, unknown>, name: string, unit: BaseUnit, what: string): number | undefined {
  const v = values[name];
  if (v === undefined) return undefined;
  if (typeof v !== "string") throw new UsageError(`--${name}: expected ${what}`);
  try {
    return parseQuantity(v, unit);
  } catch {
    throw new UsageError(`--${name}: expected ${what}, got "${v}"`);
  }
}

function need(values: Record<string, unknown>, name: string, unit: BaseUnit, what: string): number {
  const v = q(values, name, unit, what);
  if (v === undefined) throw new UsageError(`--${name} is required: ${what}`);
  return v;
}

const LEN = "a length in metres, e.g. 20nm or 2e-8";
const CAP = "a capacitance in farads, e.g. 1.5fF or 1.5e-15";
const RES = "a resistance in ohms, e.g. 2kohm or 2000";
const NUMS = (what: string) => `${what} (a plain number)`;

function positiveOrThrow(name: string, v: number | undefined, what: string, allowZero = false): void {
  if (v === undefined) return;
  if (!(allowZero ? v >= 0 : v > 0)) throw new UsageError(`--${name}: expected ${what} ${allowZero ? ">= 0" : "> 0"}, got ${v}`);
}

function parse(argv: string[], options: Record<string, { type: "string" | "boolean" }>): Record<string, string | boolean | undefined> {
  // "--width -20nm" would read as an unknown option; glue negative numbers to their option so the
  // value check below can say what is wrong with them.
  const args: string[] = [];
  for (let i = 0; i < argv.length; i++) {
    const a = argv[i]!;
    const next = argv[i + 1];
    const name = a.startsWith("--") ? a.slice(2) : "";
    if (name && options[name]?.type === "string" && next !== undefined && /^-[\d.]/.test(next)) {
      args.push(`${a}=${next}`);
      i++;
    } else args.push(a);
  }
  try {
    const { values, positionals } = parseArgs({
      args,
      options: { ...options, json: { type: "boolean" }, help: { type: "boolean" } },
      strict: true,
      allowPositionals: true,
    });
    if (positionals.length > 0) throw new UsageError(`unexpected argument "${positionals[0]}"`);
    return values as Record<string, string | boolean | undefined>;
  } catch (e) {
    if (e instanceof UsageError) throw e;
    const msg = (e as Error).message.split("\n")[0] ?? "bad arguments";
    throw new UsageError(msg.replace(/\. To specify.*$/, ""));
  }
}

function readBytes(path: string, arg: string): Uint8Array {
  try {
    return readFileSync(path);
  } catch {
    throw new UsageError(`--${arg}: cannot read file "${path}"`);
  }
}

/** One problem of a CSV file as one line: where (line, column, value) and why. */
function issueText(arg: string, path: string, e: ImportIssue, total = 1): string {
  const where = [e.line !== null ? `line ${e.line}` : "", e.column ? `column ${e.column}` : "", e.column && e.value ? `value ${JSON.stringify(e.value)}` : ""]
    .filter(Boolean)
    .join(", ");
  return `--${arg}: ${path}${where ? ` ${where}` : ""}: ${e.message}${total > 1 ? ` (and ${total - 1} more error${total > 2 ? "s" : ""})` : ""}`;
}

/**
 * Reads a CSV file with the app's reader and rules (lib/import: the same classes and errors as an upload); the
 * first problem becomes a usage error naming line, column, value and reason.
 */
function readCsvFile<R extends { ok: boolean; errors: ImportIssue[]; errorCount: number }>(arg: string, path: string, parse: (bytes: Uint8Array) => R): R {
  const bytes = readBytes(path, arg);
  let r: R;
  try {
    r = parse(bytes);
  } catch (e) {
    if (e instanceof ImportFatalError) throw new UsageError(issueText(arg, path, e.issue));
    throw e;
  }
  if (!r.ok) throw new UsageError(issueText(arg, path, r.errors[0]!, r.errorCount));
  return r;
}

/** The CLI's technology: DEFAULT_TECHNOLOGY, with the fields of the --technology JSON file over it. */
export function cliTechnology(technologyPath?: string): Technology {
  if (technologyPath === undefined) return { ...DEFAULT_TECHNOLOGY };
  const text = new TextDecoder().decode(readBytes(technologyPath, "technology"));
  try {
    return { ...DEFAULT_TECHNOLOGY, ...(JSON.parse(text) as Partial<Technology>) };
  } catch {
    throw new UsageError(`--technology: ${technologyPath} is not valid JSON`);
  }
}

const json = (x: unknown) => JSON.stringify(x, null, 2) + "\n";

function capacitanceCmd(argv: string[]): CliResult {
  const v = parse(argv, {
    width: { type: "string" },
    thickness: { type: "string" },
    height: { type: "string" },
    "height-above": { type: "string" },
    spacing: { type: "string" },
    k: { type: "string" },
    "k-gap": { type: "string" },
    "gap-fraction": { type: "string" },
    "cap-thickness": { type: "string" },
    "cap-k": { type: "string" },
    miller: { type: "string" },
    model: { type: "string" },
  });
  if (v.help) return ok(HELP);
  const widthM = need(v, "width", "m", LEN);
  const thicknessM = need(v, "thickness", "m", LEN);
  const heightM = need(v, "height", "m", LEN);
  const above = q(v, "height-above", "m", LEN);
  const spacing = q(v, "spacing", "m", LEN);
  const k = q(v, "k", "", NUMS("a relative permittivity >= 1")) ?? 3.9;
  const miller = q(v, "miller", "", NUMS("a Miller factor from 0 to 2")) ?? 1;
  for (const [n, x] of [
    ["width", widthM],
    ["thickness", thicknessM],
    ["height", heightM],
    ["height-above", above],
    ["spacing", spacing],
  ] as const)
    positiveOrThrow(n, x, "a length in metres");
  if (!(k >= 1)) throw new UsageError(`--k: expected a relative permittivity >= 1, got ${k}`);
  if (!(miller >= 0 && miller <= 2)) throw new UsageError(`--miller: expected a Miller factor from 0 to 2, got ${miller}`);
  const kGap = q(v, "k-gap", "", NUMS("a relative permittivity from 1 to --k"));
  const gapFraction = q(v, "gap-fraction", "", NUMS("a share of the line thickness from 0 to 1"));
  if (kGap !== undefined && !(kGap >= 1 && kGap <= k)) throw new UsageError(`--k-gap: expected a relative permittivity from 1 to --k (${k}), got ${kGap}`);
  if (gapFraction !== undefined && !(gapFraction >= 0 && gapFraction <= 1))
    throw new UsageError(`--gap-fraction: expected a share of the line thickness from 0 to 1, got ${gapFraction}`);
  if (gapFraction !== undefined && kGap === undefined) throw new UsageError("--gap-fraction needs --k-gap (the gap layer's permittivity, 1 for air)");
  const model = (v.model as string | undefined) ?? (spacing !== undefined ? "accurate" : "fringe");
  if (!["ideal", "fringe", "coupled", "accurate", "field"].includes(model))
    throw new UsageError(`--model: expected ideal, fringe, coupled, accurate or field, got "${model}"`);
  // a cap layer on the lines and gaps: only the field solve models it
  const capThicknessM = q(v, "cap-thickness", "m", LEN);
  const capK = q(v, "cap-k", "", NUMS("a relative permittivity >= 1"));
  if ((capThicknessM !== undefined || capK !== undefined) && model !== "field")
    throw new UsageError(`--cap-thickness and --cap-k need --model field (the ${model} model has no cap layer)`);
  if (capThicknessM !== undefined) {
    if (!(capThicknessM >= 0)) throw new UsageError(`--cap-thickness: expected a thickness >= 0, got ${capThicknessM}`);
    if (above === undefined) throw new UsageError("--cap-thickness needs --height-above (the cap sits in the ILD above the lines)");
    if (capThicknessM > above)
      throw new UsageError(`--cap-thickness: the cap layer (${capThicknessM} m) is thicker than the ILD above the lines (--height-above ${above} m)`);
  }
  if (capK !== undefined && !(capK >= 1)) throw new UsageError(`--cap-k: expected a relative permittivity >= 1, got ${capK}`);
  const r = lineCapacitance({
    widthM,
    thicknessM,
    spacingM: spacing ?? null,
    heightBelowM: heightM,
    heightAboveM: above ?? null,
    k,
    ...(kGap !== undefined ? { kGap } : {}),
    ...(gapFraction !== undefined ? { gapFraction } : {}),
    ...(capThicknessM !== undefined ? { capThicknessM } : {}),
    ...(capK !== undefined ? { capK } : {}),
    miller,
    model: model as CapacitanceModel,
  });
  const out = {
    model: r.model,
    groundFPerM: r.areaFPerM + r.fringeFPerM,
    couplingEachFPerM: r.couplingEachFPerM,
    couplingMillerFPerM: r.couplingMillerFPerM,
    totalFPerM: r.totalFPerM,
    areaFPerM: r.areaFPerM,
    fringeFPerM: r.fringeFPerM,
    miller,
    validity: r.validity,
    accuracy: r.accuracy,
  };
  if (v.json) return ok(json(out));
  const f = (x: number) => `${formatEngineering(x * 1e-6, "F", 4)}/µm`;
  return ok(
    [
      `model        ${out.model}`,
      `ground       ${f(out.groundFPerM)}  (area ${f(out.areaFPerM)}, fringe ${f(out.fringeFPerM)})`,
      `coupling     ${f(out.couplingEachFPerM)} to each neighbour; ×${miller} Miller, both sides: ${f(out.couplingMillerFPerM)}`,
      `total        ${f(out.totalFPerM)}`,
      ...out.validity.map((x) => `warning      ${x.model}: ${x.message}`),
      `accuracy     ${out.accuracy}`,
    ].join("\n") + "\n",
  );
}

function delayCmd(argv: string[]): CliResult {
  const v = parse(argv, {
    "r-total": { type: "string" },
    "c-total": { type: "string" },
    driver: { type: "string" },
    load: { type: "string" },
    model: { type: "string" },
  });
  if (v.help) return ok(HELP);
  const rOhm = need(v, "r-total", "ohm", RES);
  const cF = need(v, "c-total", "F", CAP);
  const driverOhm = q(v, "driver", "ohm", RES) ?? 0;
  const loadF = q(v, "load", "F", CAP) ?? 0;
  positiveOrThrow("r-total", rOhm, "a resistance in ohms", true);
  positiveOrThrow("c-total", cF, "a capacitance in farads", true);
  positiveOrThrow("driver", driverOhm, "a resistance in ohms", true);
  positiveOrThrow("load", loadF, "a capacitance in farads", true);
  const model = (v.model as string | undefined) ?? "exact";
  if (model !== "exact" && model !== "sakurai") throw new UsageError(`--model: expected exact or sakurai, got "${model}"`);
  const d = lineDelay({ rOhm, cF, driverOhm, loadF, model });
  if (v.json) return ok(json(d));
  return ok(
    `t50 (${model.padEnd(7)})   ${formatEngineering(d.t50S, "s")}\nt50 (Sakurai)     ${formatEngineering(d.sakuraiS, "s")}\nElmore T_D        ${formatEngineering(d.elmoreS, "s")}\nline alone 0.377RC ${formatEngineering(d.intrinsicS, "s")}\n`,
  );
}

function loadBaseline(v: Record<string, unknown>): { classes: WireClass[]; technology: Technology } {
  const path = v.baseline;
  if (typeof path !== "string") throw new UsageError("--baseline is required: a wire-class CSV file (format: /help/csv in the app)");
  // the one reader keeps the optional columns (vias, air gap): each class carries exactly the fields its row gives
  const classes: WireClass[] = readCsvFile("baseline", path, (bytes) => parseWireClassCsv(bytes)).classes;
  const histograms = v.histograms;
  if (typeof histograms === "string") {
    const h = readCsvFile("histograms", histograms, (bytes) =>
      parseHistogramBins(
        bytes,
        classes.map((c) => c.name),
      ),
    );
    for (const c of classes) if (h.bins[c.name]) c.histogram = h.bins[c.name];
  }
  return { classes, technology: cliTechnology(typeof v.technology === "string" ? v.technology : undefined) };
}

const SCENARIO_OPTIONS = {
  baseline: { type: "string" },
  histograms: { type: "string" },
  technology: { type: "string" },
  s: { type: "string" },
  sl: { type: "string" },
  model: { type: "string" },
  miller: { type: "string" },
  k: { type: "string" },
  metal: { type: "string" },
  barrier: { type: "string" },
  supply: { type: "string" },
  "device-r": { type: "string" },
  "device-c": { type: "string" },
  "length-rule": { type: "string" },
} as const;

/** A length rule as the command line writes it: follows-s, fixed, factor:X or power:A. */
export function parseLengthRule(text: string): LengthRule {
  const what = "follows-s, fixed, factor:X (S_L = X > 0) or power:A (S_L = S^A, 0 ≤ A ≤ 2)";
  if (text === "follows-s" || text === "fixed") return { kind: text };
  const m = /^(factor|power):(.+)$/.exec(text);
  if (!m) throw new UsageError(`--length-rule: expected ${what}, got "${text}"`);
  let x: number;
  try {
    x = parseQuantity(m[2]!, "");
  } catch {
    throw new UsageError(`--length-rule: expected ${what}, got "${text}"`);
  }
  if (m[1] === "factor") {
    if (!(x > 0 && Number.isFinite(x))) throw new UsageError(`--length-rule: factor:X needs X > 0, got ${x}`);
    return { kind: "factor", sL: x };
  }
  if (!(x >= 0 && x <= 2)) throw new UsageError(`--length-rule: power:A needs an exponent A from 0 to 2, got ${x}`);
  return { kind: "power", exponent: x };
}

function settingsFrom(v: Record<string, unknown>, technology: Technology, requireS: boolean): ScenarioSettings {
  const model = (v.model as string | undefined) ?? "full";
  if (!(MODEL_LEVELS as readonly string[]).includes(model)) throw new UsageError(`--model: expected ideal, fringe, coupled or full, got "${model}"`);
  const st = baselineSettings(model as ModelLevel, technology);
  const s = requireS ? need(v, "s", "", NUMS("a cross-section factor S > 0")) : q(v, "s", "", NUMS("a cross-section factor S > 0"));
  if (s !== undefined) {
    positiveOrThrow("s", s, "a cross-section factor S");
    st.s = s;
  }
  const sl = q(v, "sl", "", NUMS("a length factor S_L > 0"));
  if (sl !== undefined) {
    positiveOrThrow("sl", sl, "a length factor S_L");
    st.sL = sl;
  }
  const rule = v["length-rule"];
  if (typeof rule === "string" && rule !== "scenario") {
    if (sl !== undefined) throw new UsageError("--length-rule and --sl: give one (the rule sets S_L from S)");
    st.lengthRule = parseLengthRule(rule);
  }
  const miller = q(v, "miller", "", NUMS("a Miller factor from 0 to 2"));
  if (miller !== undefined) {
    if (!(miller >= 0 && miller <= 2)) throw new UsageError(`--miller: expected a Miller factor from 0 to 2, got ${miller}`);
    st.miller = miller;
  }
  const k = q(v, "k", "", NUMS("a relative permittivity >= 1"));
  if (k !== undefined) {
    if (!(k >= 1)) throw new UsageError(`--k: expected a relative permittivity >= 1, got ${k}`);
    st.k = k;
  }
  if (typeof v.metal === "string") {
    if (!Object.keys(METALS).some((m) => m.toLowerCase() === (v.metal as string).toLowerCase()))
      throw new UsageError(`--metal: expected one of ${Object.keys(METALS).join(", ")}, got "${v.metal}"`);
    st.metal = v.metal;
  }
  if (v.barrier !== undefined) {
    if (v.barrier !== "fixed" && v.barrier !== "scales") throw new UsageError(`--barrier: expected fixed or scales, got "${String(v.barrier)}"`);
    st.barrierScales = v.barrier === "scales";
  }
  const supply = q(v, "supply", "V", "a supply voltage in volts, e.g. 0.75V");
  if (supply !== undefined) {
    positiveOrThrow("supply", supply, "a supply voltage in volts");
    st.supplyV = supply;
  }
  const dr = q(v, "device-r", "", NUMS("a driver resistance factor > 0"));
  if (dr !== undefined) {
    positiveOrThrow("device-r", dr, "a driver resistance factor");
    st.deviceRFactor = dr;
  }
  const dc = q(v, "device-c", "", NUMS("a device capacitance factor > 0"));
  if (dc !== undefined) {
    positiveOrThrow("device-c", dc, "a device capacitance factor");
    st.deviceCFactor = dc;
  }
  return st;
}

function summary(r: ClassResult) {
  return {
    lengthM: r.lengthM,
    widthM: r.widthM,
    thicknessM: r.thicknessM,
    spacingM: r.spacingM,
    barrierM: r.barrierM,
    metal: r.metal,
    k: r.k,
    resistivityOhmM: r.resistivityOhmM,
    rOhmPerM: r.rOhmPerM,
    cFPerM: r.cFPerM,
    capacitance: {
      areaFPerM: r.capacitance.areaFPerM,
      fringeFPerM: r.capacitance.fringeFPerM,
      couplingMillerFPerM: r.capacitance.couplingMillerFPerM,
      couplingEachFPerM: r.capacitance.couplingEachFPerM,
      model: r.capacitance.model,
      effectiveK: r.capacitance.effectiveK,
    },
    rOhm: r.rOhm,
    cF: r.cF,
    rcS: r.rcS,
    delayS: r.delayS,
    elmoreS: r.elmoreS,
    intrinsicDelayS: r.intrinsicDelayS,
    repeaters: r.repeaters.count,
    repeaterSize: r.repeaterSize,
    repeatedDelayS: r.repeatedDelayS,
    criticalLengthM: r.repeaters.criticalLengthM,
    repeaterCount: r.repeaterCount,
    stageCount: r.stageCount,
    repeaterAreaM2: r.repeaterAreaM2,
    repeaterEnergyJ: r.repeaterEnergyJ,
    viaOhm: r.viaOhm,
    temperatureC: r.temperatureC,
    delayModel: r.delayModel,
    energyJ: r.energyJ,
    powerW: r.powerW,
    repeaterPowerW: r.repeaterPowerW,
    totalRepeaterAreaM2: r.totalRepeaterAreaM2,
    distribution: {
      source: r.distribution.source,
      totalNets: r.distribution.totalNets,
      shareOverBudget: r.distribution.shareOverBudget,
      totalRepeaters: r.distribution.totalRepeaters,
      meanDelayS: r.distribution.meanDelayS,
    },
    validity: r.validity,
  };
}

/** A length rule in words: "S_L = S^0.5". */
function ruleText(r: LengthRule): string {
  switch (r.kind) {
    case "follows-s":
      return "S_L = S";
    case "fixed":
      return "S_L = 1";
    case "factor":
      return `S_L = ${r.sL}`;
    case "power":
      return `S_L = S^${r.exponent}`;
  }
}

function evaluateCmd(argv: string[]): CliResult {
  const v = parse(argv, SCENARIO_OPTIONS);
  if (v.help) return ok(HELP);
  if (v["length-rule"] === "scenario") throw new UsageError('--length-rule: "scenario" is for sweeps; expected follows-s, fixed, factor:X or power:A');
  const { classes, technology } = loadBaseline(v);
  const settings = settingsFrom(v, technology, true);
  const ev = evaluateScenario({ classes, technology, settings });
  const out = {
    engineVersion: ev.engineVersion,
    level: ev.level,
    settings,
    classes: ev.classes.map((c) => ({ class: c.name, baseline: summary(c.baseline), scenario: summary(c.scenario), ratio: c.ratio })),
    totals: ev.totals,
  };
  if (v.json) return ok(json(out));
  const sL = settings.lengthRule ? `${ruleText(settings.lengthRule)}` : `S_L = ${settings.sL}`;
  const lines = [`Scenario S = ${settings.s}, ${sL}, level ${settings.level} (engine ${ev.engineVersion}); scenario/baseline`];
  const head = ["class", "length", "R", "C", "RC", "delay", "repeaters", "repeated", "energy", "×R", "×C", "×RC", "×delay"];
  const rows = ev.classes.map((c) => [
    c.name,
    formatEngineering(c.scenario.lengthM, "m", 3),
    formatEngineering(c.scenario.rOhm, "Ω", 3),
    formatEngineering(c.scenario.cF, "F", 3),
    formatEngineering(c.scenario.rcS, "s", 3),
    formatEngineering(c.scenario.delayS, "s", 3),
    c.scenario.repeaterCount > 0 ? `${c.scenario.repeaterCount} × ${c.scenario.repeaterSize.toFixed(1)}` : "0",
    formatEngineering(c.scenario.repeatedDelayS, "s", 3),
    formatEngineering(c.scenario.energyJ, "J", 3),
    c.ratio.rOhm.toFixed(3),
    c.ratio.cF.toFixed(3),
    c.ratio.rcS.toFixed(3),
    c.ratio.delayS.toFixed(3),
  ]);
  const widths = head.map((h, i) => Math.max(h.length, ...rows.map((r) => r[i]!.length)));
  lines.push(head.map((h, i) => (i === 0 ? h.padEnd(widths[i]!) : h.padStart(widths[i]!))).join("  "));
  for (const r of rows) lines.push(r.map((x, i) => (i === 0 ? x.padEnd(widths[i]!) : x.padStart(widths[i]!))).join("  "));
  for (const c of ev.classes) for (const f of c.scenario.validity) lines.push(`warning  ${c.name}: ${f.model}: ${f.message}`);
  return ok(lines.join("\n") + "\n");
}

function sweepCmd(argv: string[]): CliResult {
  const v = parse(argv, {
    ...SCENARIO_OPTIONS,
    "s-from": { type: "string" },
    "s-to": { type: "string" },
    from: { type: "string" },
    to: { type: "string" },
    points: { type: "string" },
    metric: { type: "string" },
    variable: { type: "string" },
    levels: { type: "string" },
    class: { type: "string" },
    log: { type: "boolean" },
  });
  if (v.help) return ok(HELP);
  const { classes, technology } = loadBaseline(v);
  const settings = settingsFrom(v, technology, false);
  const variable = (v.variable as string | undefined) ?? "s";
  if (!["s", "sL", "k"].includes(variable)) throw new UsageError(`--variable: expected s, sL or k, got "${variable}"`);
  const fromName = v.from !== undefined ? "from" : "s-from";
  const toName = v.to !== undefined ? "to" : "s-to";
  const from = need(v, fromName, "", NUMS(`the first value of ${variable}`));
  const to = need(v, toName, "", NUMS(`the last value of ${variable}`));
  positiveOrThrow(fromName, from, `the first value of ${variable}`);
  positiveOrThrow(toName, to, `the last value of ${variable}`);
  const points = need(v, "points", "", NUMS("a whole number of points from 2 to 10000"));
  if (!(Number.isInteger(points) && points >= 2 && points <= 10000))
    throw new UsageError(`--points: expected a whole number of points from 2 to 10000, got ${points}`);
  const metric = (v.metric as string | undefined) ?? "delay";
  if (!["delay", "rc", "r", "c"].includes(metric)) throw new UsageError(`--metric: expected delay, rc, r or c, got "${metric}"`);
  const levels = typeof v.levels === "string" ? v.levels.split(",").map((x) => x.trim()) : [...MODEL_LEVELS];
  for (const l of levels)
    if (!(MODEL_LEVELS as readonly string[]).includes(l)) throw new UsageError(`--levels: expected a comma list of ideal, fringe, coupled, full, got "${l}"`);
  const classNames = typeof v.class === "string" ? [v.class] : undefined;
  if (classNames && !classes.some((c) => c.name === classNames[0])) throw new UsageError(`--class: no class "${classNames[0]}" in the baseline`);
  // --length-rule: settingsFrom has set the global rule (follows-s, fixed, factor:X, power:A); the sweep applies it
  // at every S. "scenario" (default) keeps --sl.
  const rule = (v["length-rule"] as string | undefined) ?? "scenario";
  if (rule !== "scenario" && variable !== "s") throw new UsageError(`--length-rule: only for S sweeps (--variable s), got --variable ${variable}`);
  const curves = sweep({
    classes,
    technology,
    settings,
    variable: variable as SweepVariable,
    metric: metric as SweepMetric,
    from,
    to,
    points,
    levels: levels as ModelLevel[],
    spacing: v.log ? "log" : "linear",
    classNames,
  });
  if (v.json) return ok(json({ metric, variable, lengthRule: rule, curves }));
  const lines: string[] = [`${metric} against ${variable} (${levels.join(", ")})`];
  const unit = { delay: "s", rc: "s", r: "Ω", c: "F" }[metric as SweepMetric];
  for (const c of curves) {
    const first = c.points[0];
    const last = c.points[c.points.length - 1];
    lines.push(
      `${c.className.padEnd(14)} ${c.level.padEnd(8)} ${first ? `${first.x.toFixed(3)}: ${formatEngineering(first.y, unit, 3)}` : "-"}  →  ${last ? `${last.x.toFixed(3)}: ${formatEngineering(last.y, unit, 3)}` : "-"}${c.skipped ? `  (${c.skipped.length} points skipped)` : ""}`,
    );
  }
  return ok(lines.join("\n") + "\n");
}

/**
 * Reads a roadmap's steps file: the `steps` array of the API's body (or an object { "steps": [...] }), checked with the
 * API's schema (lib/validation/roadmap.ts). The first problem becomes one line naming the step and field.
 */
function readSteps(path: string): RoadmapStep[] {
  const text = new TextDecoder().decode(readBytes(path, "steps"));
  let raw: unknown;
  try {
    raw = JSON.parse(text);
  } catch (e) {
    throw new UsageError(`--steps: ${path} is not valid JSON (${(e as Error).message.split("\n")[0]})`);
  }
  const list = raw !== null && typeof raw === "object" && !Array.isArray(raw) && "steps" in raw ? (raw as { steps: unknown }).steps : raw;
  const r = roadmapStepsSchema.safeParse(list);
  if (r.success) return r.data;
  const issue = r.error.issues[0]!;
  const [index, ...field] = issue.path.map(String);
  const steps = Array.isArray(list) ? (list as unknown[]) : [];
  if (index === undefined || !/^\d+$/.test(index)) throw new UsageError(`--steps: ${path}: ${issue.message}`);
  const step = steps[Number(index)] as { name?: unknown } | undefined;
  const name = step && typeof step.name === "string" && step.name.trim() !== "" ? ` "${step.name}"` : "";
  const more = r.error.issues.length > 1 ? ` (and ${r.error.issues.length - 1} more error${r.error.issues.length > 2 ? "s" : ""})` : "";
  throw new UsageError(`--steps: ${path}: step ${Number(index) + 1}${name}${field.length > 0 ? ` ${field.join(".")}` : ""}: ${issue.message}${more}`);
}

function roadmapCmd(argv: string[]): CliResult {
  const v = parse(argv, { baseline: { type: "string" }, histograms: { type: "string" }, technology: { type: "string" }, steps: { type: "string" } });
  if (v.help) return ok(HELP);
  const { classes, technology } = loadBaseline(v);
  if (typeof v.steps !== "string") throw new UsageError('--steps is required: a JSON file with the steps [{ "name": "N1", "settings": { "s": 1.25 } }, …]');
  const stepsPath = v.steps;
  const steps = readSteps(stepsPath);
  let result: ReturnType<typeof evaluateRoadmap>;
  try {
    composeRoadmap({ classes, technology, steps });
    result = evaluateRoadmap({ classes, technology, steps });
  } catch (e) {
    if (e instanceof RoadmapInputError) throw new UsageError(`--steps: ${stepsPath}: ${e.message} (at ${e.path.join(".")})`);
    throw e;
  }
  // the API's answer: each step's name and evaluation against N0
  if (v.json) return ok(json({ steps: result.steps.map((s) => ({ name: s.name, evaluation: s.evaluation })) }));
  const lines: string[] = [`Roadmap N0 → ${result.steps.map((s) => s.name).join(" → ")}, level ${result.steps.at(-1)!.settings.level}; every step against N0`];
  const head = ["step", "S", "S_L", "delay", "repeated", "R", "C", "×delay", "×R", "×C", "×RC"];
  for (let ci = 0; ci < classes.length; ci++) {
    const name = classes[ci]!.name;
    const base = result.steps[0]!.evaluation.classes[ci]!.baseline;
    const rows: string[][] = [
      [
        "N0",
        "1",
        "1",
        formatEngineering(base.delayS, "s", 3),
        formatEngineering(base.repeatedDelayS, "s", 3),
        formatEngineering(base.rOhm, "Ω", 3),
        formatEngineering(base.cF, "F", 3),
        "1.000",
        "1.000",
        "1.000",
        "1.000",
      ],
    ];
    for (const s of result.steps) {
      const c = s.evaluation.classes[ci]!;
      const o = s.settings.overrides[name];
      rows.push([
        s.name,
        Number((o?.s ?? s.settings.s).toPrecision(4)).toString(),
        Number((o?.sL ?? s.settings.sL).toPrecision(4)).toString(),
        formatEngineering(c.scenario.delayS, "s", 3),
        formatEngineering(c.scenario.repeatedDelayS, "s", 3),
        formatEngineering(c.scenario.rOhm, "Ω", 3),
        formatEngineering(c.scenario.cF, "F", 3),
        c.ratio.delayS.toFixed(3),
        c.ratio.rOhm.toFixed(3),
        c.ratio.cF.toFixed(3),
        c.ratio.rcS.toFixed(3),
      ]);
    }
    const widths = head.map((h, i) => Math.max(h.length, ...rows.map((r) => r[i]!.length)));
    lines.push("", `${name} (${classes[ci]!.tier})`);
    lines.push(head.map((h, i) => (i === 0 ? h.padEnd(widths[i]!) : h.padStart(widths[i]!))).join("  "));
    for (const r of rows) lines.push(r.map((x, i) => (i === 0 ? x.padEnd(widths[i]!) : x.padStart(widths[i]!))).join("  "));
    for (const s of result.steps) for (const f of s.evaluation.classes[ci]!.scenario.validity) lines.push(`warning  ${s.name}: ${f.model}: ${f.message}`);
  }
  return ok(lines.join("\n") + "\n");
}

/** Reads the measured-resistance CSV (class, r_ohm_per_um, temperature_c) with the one reader and the format's rules. */
function readMeasured(path: string): MeasuredResistance[] {
  const bytes = readBytes(path, "measured");
  const out: MeasuredResistance[] = [];
  let index = new Map<string, number>();
  let width = 0;
  const problems: string[] = [];
  try {
    readCsvSync(
      bytes,
      {
        header(h) {
          const r = resolveHeader(h.fields, MEASURED_RESISTANCE_FORMAT);
          if (!r.ok) throw new UsageError(issueText("measured", path, r.issue));
          index = r.index;
          width = h.fields.length;
        },
        malformed(line, message) {
          problems.push(issueText("measured", path, { line, column: null, value: null, message }));
        },
        row(f, line) {
          if (f.length !== width && !(f.length === width + 1 && f[width] === "")) {
            problems.push(issueText("measured", path, { line, column: null, value: null, message: `has ${f.length} fields, the header has ${width}` }));
            return;
          }
          const record: Record<string, string> = {};
          for (const [name, i] of index) record[name] = f[i] ?? "";
          const r = validateMeasuredRow(record, line);
          for (const e of r.errors) problems.push(issueText("measured", path, e));
          if (r.measured) out.push(r.measured);
        },
      },
      { maxBytes: 64 * 1024 * 1024 },
    );
  } catch (e) {
    if (e instanceof UsageError) throw e;
    if (e instanceof ImportFatalError) throw new UsageError(issueText("measured", path, e.issue));
    throw e;
  }
  if (problems.length > 0)
    throw new UsageError(`${problems[0]}${problems.length > 1 ? ` (and ${problems.length - 1} more error${problems.length > 2 ? "s" : ""})` : ""}`);
  if (out.length === 0) throw new UsageError(`--measured: ${path} has no measurements`);
  return out;
}

function fitCmd(argv: string[]): CliResult {
  const v = parse(argv, { baseline: { type: "string" }, measured: { type: "string" }, technology: { type: "string" } });
  if (v.help) return ok(HELP);
  const { classes, technology } = loadBaseline(v);
  if (typeof v.measured !== "string") throw new UsageError("--measured is required: a CSV file with columns class,r_ohm_per_um,temperature_c");
  const measured = readMeasured(v.measured);
  const f = fitSizeEffect({ classes, measured, technology });
  if (v.json) return ok(json(f));
  const lines = ['Fitted metals (pass as the technology JSON\'s "materials"):'];
  for (const [id, m] of Object.entries(f.metals)) lines.push(`  ${id}: ${JSON.stringify(m)}`);
  lines.push("Points (measured → fitted, residual):");
  for (const p of f.points)
    lines.push(
      `  ${p.class.padEnd(14)} ${formatEngineering(p.measuredOhmPerM * 1e-6, "Ω", 4)}/µm → ${formatEngineering(p.fittedOhmPerM * 1e-6, "Ω", 4)}/µm  ${(p.residual * 100).toFixed(3)}%`,
    );
  return ok(lines.join("\n") + "\n");
}

function materialsCmd(argv: string[]): CliResult {
  const v = parse(argv, {});
  if (v.help) return ok(HELP);
  if (v.json) return ok(json({ metals: METALS, dielectrics: DIELECTRICS }));
  const lines = ["Metals (bulk resistivity at 20 °C, mean free path, specularity p, grain reflection R, Steinhögl C):"];
  for (const m of Object.values(METALS)) {
    lines.push(
      `  ${m.id.padEnd(3)} ρ0 = ${(m.resistivityOhmM * 1e8).toFixed(3)} µΩ·cm  λ = ${(m.meanFreePathM * 1e9).toFixed(1)} nm  p = ${m.specularity}  R = ${m.grainReflection}  C = ${m.steinhoglC}`,
    );
    lines.push(`      ρ0: ${m.sources.resistivity}`, `      λ: ${m.sources.meanFreePath}`);
  }
  lines.push("Dielectrics (relative permittivity k):");
  for (const d of Object.values(DIELECTRICS)) lines.push(`  ${d.id.padEnd(12)} k = ${d.k}  ${d.name}; ${d.source}`);
  return ok(lines.join("\n") + "\n");
}

/** Runs `f`, turning the engine's RangeError that starts with an engine field name into a usage error naming the option. */
function withOptionNames<T>(names: Record<string, string>, f: () => T): T {
  try {
    return f();
  } catch (e) {
    if (!(e instanceof RangeError)) throw e;
    for (const [field, option] of Object.entries(names)) if (e.message.startsWith(field)) throw new UsageError(`--${option}: ${e.message}`);
    throw e;
  }
}

function fraction(v: Record<string, unknown>, name: string): number | undefined {
  const x = q(v, name, "", NUMS("a share from 0 to 1"));
  if (x !== undefined && !(x > 0 && x < 1)) throw new UsageError(`--${name}: expected a share between 0 and 1, got ${x}`);
  return x;
}

function optimizeCmd(argv: string[]): CliResult {
  const v = parse(argv, {
    ...SCENARIO_OPTIONS,
    class: { type: "string" },
    objective: { type: "string" },
    "min-fraction": { type: "string" },
    "max-fraction": { type: "string" },
    "min-aspect": { type: "string" },
    "max-aspect": { type: "string" },
    "min-width": { type: "string" },
    "min-space": { type: "string" },
  });
  if (v.help) return ok(HELP);
  const objective = (v.objective as string | undefined) ?? "delay";
  if (!(DESIGN_OBJECTIVES as readonly string[]).includes(objective))
    throw new UsageError(`--objective: expected delay, repeated, energy or edp, got "${objective}"`);
  const minFraction = fraction(v, "min-fraction");
  const maxFraction = fraction(v, "max-fraction");
  const minAspect = q(v, "min-aspect", "", NUMS("an aspect ratio T/W > 0"));
  positiveOrThrow("min-aspect", minAspect, "an aspect ratio T/W");
  const maxAspect = q(v, "max-aspect", "", NUMS("an aspect ratio T/W > 0"));
  positiveOrThrow("max-aspect", maxAspect, "an aspect ratio T/W");
  const minWidthM = q(v, "min-width", "m", LEN);
  positiveOrThrow("min-width", minWidthM, "a width", true);
  const minSpaceM = q(v, "min-space", "m", LEN);
  positiveOrThrow("min-space", minSpaceM, "a space", true);
  if (typeof v.class !== "string") throw new UsageError("--class is required: the name of one class of the baseline");
  const { classes, technology } = loadBaseline(v);
  const name = v.class;
  if (!classes.some((c) => c.name === name))
    throw new UsageError(`--class: no class named "${name}" (the baseline has ${classes.map((c) => c.name).join(", ")})`);
  const settings = settingsFrom(v, technology, false);
  const r = withOptionNames(
    {
      minFraction: "min-fraction",
      maxFraction: "max-fraction",
      minAspect: "min-aspect",
      maxAspect: "max-aspect",
      minWidthM: "min-width",
      minSpaceM: "min-space",
    },
    () =>
      optimizeClass({
        wireClass: classes,
        className: name,
        technology,
        settings,
        objective: objective as DesignObjective,
        ...(minFraction !== undefined && { minFraction }),
        ...(maxFraction !== undefined && { maxFraction }),
        ...(minAspect !== undefined && { minAspect }),
        ...(maxAspect !== undefined && { maxAspect }),
        ...(minWidthM !== undefined && { minWidthM }),
        ...(minSpaceM !== undefined && { minSpaceM }),
      }),
  );
  const out = {
    widthM: r.widthM,
    thicknessM: r.thicknessM,
    spacingM: r.spacingM,
    objectiveValue: r.objectiveValue,
    lineFraction: r.lineFraction,
    aspectRatio: r.aspectRatio,
    pitchM: r.pitchM,
    objective: r.objective,
    currentValue: r.currentValue,
  };
  if (v.json) return ok(json(out));
  const unit = objective === "energy" ? "J" : objective === "edp" ? "J·s" : objective === "repeated" ? "s/m" : "s";
  const fmt = (x: number) => (unit === "J·s" ? `${x.toPrecision(4)} J·s` : formatEngineering(x, unit, 4));
  return ok(
    [
      `Class ${name}, objective ${objective}, pitch ${formatEngineering(r.pitchM, "m", 4)} (S = ${settings.s}, level ${settings.level})`,
      `  line fraction W/pitch  ${r.lineFraction.toFixed(4)}`,
      `  aspect ratio T/W       ${r.aspectRatio.toFixed(4)}`,
      `  width                  ${formatEngineering(r.widthM, "m", 4)}`,
      `  thickness              ${formatEngineering(r.thicknessM, "m", 4)}`,
      `  spacing                ${formatEngineering(r.spacingM, "m", 4)}`,
      `  objective              ${fmt(r.objectiveValue)} (now ${fmt(r.currentValue)})`,
    ].join("\n") + "\n",
  );
}

/** A σ as the command line writes it: a length or number ("1nm", "0.05") or a percentage of the value ("2%"). */
function sigmaArg(v: Record<string, unknown>, name: string, unit: BaseUnit, what: string): Sigma | undefined {
  const text = v[name];
  if (text === undefined) return undefined;
  if (typeof text !== "string") throw new UsageError(`--${name}: expected ${what}`);
  const pct = /^\s*(.+?)\s*%\s*$/.exec(text);
  let x: number;
  try {
    x = parseQuantity(pct ? pct[1]! : text, pct ? "" : unit);
  } catch {
    throw new UsageError(`--${name}: expected ${what}, got "${text}"`);
  }
  if (!(x >= 0) || !Number.isFinite(x)) throw new UsageError(`--${name}: expected ${what} >= 0, got "${text}"`);
  return pct ? { relative: x / 100 } : { absolute: x };
}

const SIGMA_OPTIONS: { option: string; key: keyof VariationSigmas; unit: BaseUnit; what: string }[] = [
  { option: "sigma-width", key: "width", unit: "m", what: "a σ in metres (e.g. 1nm) or % of the width (e.g. 3%)" },
  { option: "sigma-thickness", key: "thickness", unit: "m", what: "a σ in metres (e.g. 2nm) or % of the thickness" },
  { option: "sigma-barrier", key: "barrier", unit: "m", what: "a σ in metres (e.g. 0.3nm) or % of the barrier" },
  { option: "sigma-ild", key: "ildHeight", unit: "m", what: "a σ in metres (e.g. 2nm) or % of the ILD height" },
  { option: "sigma-k", key: "k", unit: "", what: "a σ of k (e.g. 0.05) or % of k (e.g. 2%)" },
];

function variationCmd(argv: string[]): CliResult {
  const v = parse(argv, {
    ...SCENARIO_OPTIONS,
    samples: { type: "string" },
    seed: { type: "string" },
    "fixed-pitch": { type: "boolean" },
    "corner-sigma": { type: "string" },
    ...Object.fromEntries(SIGMA_OPTIONS.map((o) => [o.option, { type: "string" as const }])),
  });
  if (v.help) return ok(HELP);
  const sigma: VariationSigmas = {};
  for (const o of SIGMA_OPTIONS) {
    const s = sigmaArg(v, o.option, o.unit, o.what);
    if (s !== undefined) sigma[o.key] = s;
  }
  const samples = need(v, "samples", "", NUMS(`a sample count from 2 to ${MAX_VARIATION_SAMPLES}`));
  if (!(Number.isInteger(samples) && samples >= 2 && samples <= MAX_VARIATION_SAMPLES))
    throw new UsageError(`--samples: expected a whole number from 2 to ${MAX_VARIATION_SAMPLES}, got ${samples}`);
  const seed = need(v, "seed", "", NUMS("a whole-number seed"));
  if (!Number.isInteger(seed)) throw new UsageError(`--seed: expected a whole number, got ${seed}`);
  const cornerSigma = q(v, "corner-sigma", "", NUMS("a corner distance in σ, > 0 and ≤ 6"));
  if (cornerSigma !== undefined && !(cornerSigma > 0 && cornerSigma <= 6))
    throw new UsageError(`--corner-sigma: expected a number > 0 and <= 6, got ${cornerSigma}`);
  const { classes, technology } = loadBaseline(v);
  const settings = settingsFrom(v, technology, false);
  const names = Object.fromEntries(SIGMA_OPTIONS.map((o) => [`sigma.${o.key}`, o.option]));
  const res = withOptionNames(names, () =>
    variation({
      classes,
      technology,
      settings,
      sigma,
      samples,
      seed,
      fixedPitch: v["fixed-pitch"] === true,
      ...(cornerSigma !== undefined && { cornerSigma }),
    }),
  );
  if (v.json) return ok(json(res));
  const band = (s: Stats, unit: string) =>
    `${formatEngineering(s.p50, unit, 3)} [${formatEngineering(s.p5, unit, 3)} … ${formatEngineering(s.p95, unit, 3)}] ±${((100 * s.std) / s.mean).toFixed(1)}%`;
  const lines = [`Monte Carlo, ${samples} samples per class, seed ${seed} (S = ${settings.s}, level ${settings.level}); p50 [p5 … p95] ±1σ/mean`];
  const head = ["class", "R per length", "C per length", "delay", "fast delay", "slow delay"];
  const rows = res.map((c) => [
    c.class,
    band(c.rOhmPerM, "Ω/m"),
    band(c.cFPerM, "F/m"),
    band(c.delayS, "s"),
    formatEngineering(c.corners.fast.delayS, "s", 3),
    formatEngineering(c.corners.slow.delayS, "s", 3),
  ]);
  const widths = head.map((h, i) => Math.max(h.length, ...rows.map((r) => r[i]!.length)));
  lines.push(head.map((h, i) => h.padEnd(widths[i]!)).join("  "));
  for (const r of rows) lines.push(r.map((x, i) => x.padEnd(widths[i]!)).join("  "));
  return ok(lines.join("\n") + "\n");
}

function ok(stdout: string): CliResult {
  return { code: 0, stdout, stderr: "" };
}

/** Runs the command line on `argv` (without node and script) and returns exit code and output; never exits. */
export function run(argv: string[]): CliResult {
  const [command, ...rest] = argv;
  try {
    switch (command) {
      case "capacitance":
        return capacitanceCmd(rest);
      case "delay":
        return delayCmd(rest);
      case "evaluate":
        return evaluateCmd(rest);
      case "sweep":
        return sweepCmd(rest);
      case "roadmap":
        return roadmapCmd(rest);
      case "materials":
        return materialsCmd(rest);
      case "fit":
        return fitCmd(rest);
      case "optimize":
        return optimizeCmd(rest);
      case "variation":
        return variationCmd(rest);
      case undefined:
      case "--help":
      case "-h":
      case "help":
        return ok(HELP + "\n");
      default:
        throw new UsageError(`unknown command "${command}": expected capacitance, delay, evaluate, sweep, roadmap, optimize, variation, fit or materials`);
    }
  } catch (e) {
    if (e instanceof UsageError || e instanceof RangeError) return { code: 2, stdout: "", stderr: `error: ${e.message}\n` };
    return { code: 1, stdout: "", stderr: `error: ${(e as Error).message ?? String(e)}\n` };
  }
}

if (process.argv[1] && import.meta.url === pathToFileURL(process.argv[1]).href) {
  const r = run(process.argv.slice(2));
  if (r.stdout) process.stdout.write(r.stdout);
  if (r.stderr) process.stderr.write(r.stderr);
  process.exitCode = r.code;
}

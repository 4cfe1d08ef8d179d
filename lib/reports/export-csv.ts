import { csvLine, header } from "@/lib/csv-safe";
import { worstClassDelay } from "@/lib/figures";
import type { FrozenClassResult, FrozenReport } from "@/lib/validation/report";
import { change } from "./summary";

const sig = (x: number, digits = 6): number | null => (Number.isFinite(x) ? Number(x.toPrecision(digits)) : null);
const pct = (c: number | null): number | null => (c === null ? null : sig(c * 100, 4));

const COLUMNS = [
  header("option"),
  header("scenario"),
  header("model_level"),
  header("class"),
  header("tier"),
  header("width", "nm"),
  header("thickness", "nm"),
  header("spacing", "nm"),
  header("pitch", "nm"),
  header("barrier", "nm"),
  header("length", "um"),
  header("metal"),
  header("k"),
  header("resistivity", "uohm_cm"),
  header("r", "ohm"),
  header("c", "ff"),
  header("rc", "ps"),
  header("delay", "ps"),
  header("delay_change", "pct"),
  header("elmore", "ps"),
  // stages = inserted repeaters + 1 (lib/figures.ts); the inserted count is repeater_count
  header("repeater_stages"),
  header("energy", "fj"),
  header("energy_change", "pct"),
  header("class_power", "uw"),
  header("nets"),
  header("over_budget", "pct"),
  header("validity_flags"),
  // Engine 2.x (empty for reports frozen by engine 1.x): inserted repeaters and what they cost, and the temperature R is at.
  header("repeater_count"),
  header("repeater_size"),
  header("repeater_area", "um2"),
  header("repeater_energy", "fj"),
  header("temperature", "c"),
];

function row(option: string, scenario: string, level: string, r: FrozenClassResult, base: FrozenClassResult | null) {
  return [
    option,
    scenario,
    level,
    r.name,
    r.tier,
    sig(r.widthM / 1e-9),
    sig(r.thicknessM / 1e-9),
    sig(r.spacingM / 1e-9),
    sig(r.pitchM / 1e-9),
    sig(r.barrierM / 1e-9),
    sig(r.lengthM / 1e-6),
    r.metal,
    sig(r.k),
    sig(r.resistivityOhmM / 1e-8),
    sig(r.rOhm),
    sig(r.cF / 1e-15),
    sig(r.rcS / 1e-12),
    sig(r.delayS / 1e-12),
    base ? pct(change(base.delayS, r.delayS).change) : null,
    sig(r.elmoreS / 1e-12),
    r.repeaters.count,
    sig(r.energyJ / 1e-15),
    base ? pct(change(base.energyJ, r.energyJ).change) : null,
    sig(r.powerW / 1e-6),
    r.distribution.totalNets,
    sig(r.distribution.shareOverBudget * 100, 4),
    r.validity.map((f) => f.message).join(" | "),
    r.repeaterCount ?? null,
    r.repeaterSize === undefined ? null : sig(r.repeaterSize),
    r.repeaterAreaM2 === undefined ? null : sig(r.repeaterAreaM2 / 1e-12),
    r.repeaterEnergyJ === undefined ? null : sig(r.repeaterEnergyJ / 1e-15),
    r.temperatureC ?? null,
  ];
}

/**
 * The report's side-by-side table as CSV: for each chosen class a baseline row then one row per option,
 * units in the headers, every text cell (class and scenario names included) neutralised against formula
 * injection by lib/csv-safe.ts; after the options, one row per step of each frozen roadmap ("Roadmap R1 N2", the
 * roadmap's name in the scenario column, changes against N0). A second block lists the per-option (and per roadmap
 * step) totals behind the headline cards.
 */
export function reportCsv(title: string, report: FrozenReport): string {
  let out = csvLine(COLUMNS);
  const first = report.options[0];
  for (const name of report.classNames) {
    const baseRes = first?.evaluation.classes.find((c) => c.name === name);
    if (baseRes) out += csvLine(row("Baseline", report.baseline.name, first!.evaluation.level, baseRes.baseline, null));
    for (const o of report.options) {
      const c = o.evaluation.classes.find((x) => x.name === name);
      if (c) out += csvLine(row(`Option ${o.key}`, o.name, o.evaluation.level, c.scenario, c.baseline));
    }
    // one row per roadmap step (issue 14), each against N0 (the baseline): "Roadmap R1 N2"
    for (const r of report.roadmaps ?? []) {
      for (const st of r.steps) {
        const c = st.evaluation.classes.find((x) => x.name === name);
        if (c) out += csvLine(row(`Roadmap ${r.key} ${st.name}`, r.name, st.evaluation.level, c.scenario, c.baseline));
      }
    }
  }
  out += "\r\n";
  out += csvLine([
    header("option"),
    header("scenario"),
    header("report"),
    // lib/figures.ts: worst-class delay (the slowest class at its mean length), mean over nets weighted by net count, inserted repeaters
    header("worst_class_delay", "ps"),
    header("mean_net_delay", "ps"),
    header("total_wire_capacitance", "pf"),
    header("switching_energy", "pj"),
    header("switching_power", "mw"),
    header("repeaters"),
  ]);
  const totalsRow = (option: string, scenario: string, t: FrozenReport["options"][number]["evaluation"]["totals"]["baseline"], worst: number) => [
    option,
    scenario,
    title,
    sig(worst / 1e-12),
    sig(t.meanDelayS / 1e-12),
    sig(t.capacitanceF / 1e-12),
    sig(t.energyJ / 1e-12),
    sig(t.powerW / 1e-3),
    sig(t.repeaters),
  ];
  if (first) {
    const worstB = worstClassDelay(first.evaluation.classes.map((c) => c.baseline)).delayS;
    out += csvLine(totalsRow("Baseline", report.baseline.name, first.evaluation.totals.baseline, worstB));
  }
  for (const o of report.options) {
    const worst = worstClassDelay(o.evaluation.classes.map((c) => c.scenario)).delayS;
    out += csvLine(totalsRow(`Option ${o.key}`, o.name, o.evaluation.totals.scenario, worst));
  }
  for (const r of report.roadmaps ?? []) {
    for (const st of r.steps) {
      const worst = worstClassDelay(st.evaluation.classes.map((c) => c.scenario)).delayS;
      out += csvLine(totalsRow(`Roadmap ${r.key} ${st.name}`, r.name, st.evaluation.totals.scenario, worst));
    }
  }
  return out;
}

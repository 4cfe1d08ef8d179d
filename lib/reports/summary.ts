import { leaders, listWords, optionsWords, worstClassDelay } from "@/lib/figures";
import type { FrozenClassResult, FrozenOption, FrozenReport } from "@/lib/validation/report";

/** A before/after pair with its relative change (scenario / baseline − 1; null when the baseline is 0). */
export interface Change {
  baseline: number;
  scenario: number;
  change: number | null;
}

export interface OptionHeadline {
  key: string;
  name: string;
  /** The worst-class delay (lib/figures.ts): the slowest class at its mean length, before and after. */
  worstDelay: Change & { baselineClass: string; scenarioClass: string };
  /** Net-count-weighted mean delay over every net (histogram lengths where the class has one). */
  meanDelay: Change;
  /** Σ wire capacitance over all nets. */
  capacitance: Change;
  /** Σ nets × energy per transition. */
  energy: Change;
  power: Change;
  repeaters: Change;
  /** One plain sentence for a manager. */
  sentence: string;
}

export interface ClassVerdict {
  className: string;
  tier: string;
  /** Options ordered fastest first, with their delay change against the baseline. */
  ranking: { key: string; name: string; delayS: number; change: number | null }[];
  sentence: string;
}

export interface ReportSummary {
  headlines: OptionHeadline[];
  verdicts: ClassVerdict[];
  /** Sentences naming the best option per headline figure. */
  overall: string[];
  /** False when the options were evaluated at different model levels or Miller factors (their baselines differ). */
  baselineConsistent: boolean;
}

export function change(baseline: number, scenario: number): Change {
  return { baseline, scenario, change: baseline !== 0 && Number.isFinite(baseline) ? scenario / baseline - 1 : null };
}

/** "18%" from −0.18; one decimal below 10%. */
export function pctText(c: number | null): string {
  if (c === null) return "n/a";
  const a = Math.abs(c) * 100;
  return `${a < 10 ? a.toFixed(1).replace(/\.0$/, "") : a.toFixed(0)}%`;
}

/** "−18%" / "+4.2%" / "±0%" for tables. */
export function signedPct(c: number | null): string {
  if (c === null) return "n/a";
  if (Math.abs(c) < 0.0005) return "±0%";
  return `${c < 0 ? "−" : "+"}${pctText(c)}`;
}

/** "cuts X by 18%", "raises X by 4%", "leaves X unchanged". */
export function changeWords(c: number | null, what: string, down = "cuts", up = "raises"): string {
  if (c === null) return `changes ${what} (no baseline to compare)`;
  if (Math.abs(c) < 0.005) return `leaves ${what} about unchanged`;
  return `${c < 0 ? down : up} ${what} by ${pctText(c)}`;
}

export function tierWords(tier: string): string {
  return tier === "semi-global" ? "semi-global" : tier;
}

/** The worst-class delay (lib/figures.ts) with the class's tier. */
function worstClass(results: FrozenClassResult[]): { name: string; tier: string; delayS: number } {
  const w = worstClassDelay(results);
  return { ...w, tier: results.find((r) => r.name === w.name)?.tier ?? "" };
}

export function optionHeadline(o: FrozenOption): OptionHeadline {
  const e = o.evaluation;
  const wb = worstClass(e.classes.map((c) => c.baseline));
  const ws = worstClass(e.classes.map((c) => c.scenario));
  const tb = e.totals.baseline;
  const ts = e.totals.scenario;
  const worstDelay = { ...change(wb.delayS, ws.delayS), baselineClass: wb.name, scenarioClass: ws.name };
  const wsTier = e.classes.find((c) => c.name === ws.name)?.scenario.tier ?? "";
  const sentence =
    `Option ${o.key} ${changeWords(worstDelay.change, `the worst-class delay (${ws.name.toLowerCase() === wsTier ? `${wsTier} class` : `${tierWords(wsTier)} class ${ws.name}`})`)}` +
    `, ${changeWords(change(tb.capacitanceF, ts.capacitanceF).change, "total wire capacitance")}` +
    ` and ${changeWords(change(tb.repeaters, ts.repeaters).change, "the repeater count")}.`;
  return {
    key: o.key,
    name: o.name,
    worstDelay,
    meanDelay: change(tb.meanDelayS, ts.meanDelayS),
    capacitance: change(tb.capacitanceF, ts.capacitanceF),
    energy: change(tb.energyJ, ts.energyJ),
    power: change(tb.powerW, ts.powerW),
    repeaters: change(tb.repeaters, ts.repeaters),
    sentence,
  };
}

export function classVerdict(report: FrozenReport, className: string): ClassVerdict | null {
  const ranking: ClassVerdict["ranking"] = [];
  let tier = "";
  for (const o of report.options) {
    const c = o.evaluation.classes.find((x) => x.name === className);
    if (!c) continue;
    tier = c.scenario.tier;
    ranking.push({ key: o.key, name: o.name, delayS: c.scenario.delayS, change: change(c.baseline.delayS, c.scenario.delayS).change });
  }
  if (ranking.length === 0) return null;
  ranking.sort((a, b) => a.delayS - b.delayS);
  const [win, ...rest] = ranking;
  const dir = (c: number | null) =>
    c === null ? "" : Math.abs(c) < 0.005 ? "about the same as" : c < 0 ? `${pctText(c)} lower than` : `${pctText(c)} higher than`;
  const others = rest.map((r) => `Option ${r.key}: ${dir(r.change)} the baseline`).join("; ");
  // "Intermediate wires (M3):" — or just "Intermediate wires:" when the class is named after its tier.
  const who = className.toLowerCase() === tier ? `${capitalize(tierWords(tier))} wires` : `${capitalize(tierWords(tier))} wires (${className})`;
  // One rule for ties (lib/figures.ts): options within 0.1% of the fastest share the lead, and all of them are named.
  const tied = leaders(ranking, (r) => r.delayS);
  const rest2 = ranking.filter((r) => !tied.includes(r));
  const others2 = rest2.map((r) => `Option ${r.key}: ${dir(r.change)} the baseline`).join("; ");
  const sentence =
    ranking.length === 1
      ? `${who}: delay ${dir(win!.change)} the baseline with Option ${win!.key}.`
      : tied.length === ranking.length
        ? `${who}: all options about the same, delay ${dir(win!.change)} the baseline.`
        : tied.length > 1
          ? `${who}: ${optionsWords(
              inOptionOrder(
                report,
                tied.map((r) => r.key),
              ),
            )} are equally fastest, delay ${dir(win!.change)} the baseline${others2 ? ` (${others2})` : ""}.`
          : `${who}: Option ${win!.key} is fastest, delay ${dir(win!.change)} the baseline${others ? ` (${others})` : ""}.`;
  return { className, tier, ranking, sentence };
}

/** Option keys in the report's order (a tie lists A, B and C, not the order of their tiny differences). */
function inOptionOrder(report: FrozenReport, keys: string[]): string[] {
  const order = report.options.map((o) => o.key);
  return [...keys].sort((a, b) => order.indexOf(a) - order.indexOf(b));
}

function capitalize(s: string): string {
  return s.charAt(0).toUpperCase() + s.slice(1);
}

/** Headline figures, per-class verdicts and plain-words conclusions, all computed from the frozen document. */
export function summarizeReport(report: FrozenReport): ReportSummary {
  const headlines = report.options.map(optionHeadline);
  const verdicts = report.classNames.map((n) => classVerdict(report, n)).filter((v): v is ClassVerdict => v !== null);
  const overall: string[] = [];
  if (headlines.length > 1) {
    // Best option per figure, with the same tie rule as the per-class verdicts: every option within 0.1% of the best is named.
    const line = (what: string, pick: (h: OptionHeadline) => number, ch: (h: OptionHeadline) => number | null) => {
      const tied = leaders(headlines, pick);
      const best = tied[0]!;
      if (tied.length === headlines.length) return `${what}: all options about the same, ${signedPct(ch(best))} against the baseline.`;
      if (tied.length > 1)
        return `${what}: ${optionsWords(tied.map((h) => h.key))} equally (${listWords(tied.map((h) => h.name))}), ${signedPct(ch(best))} against the baseline.`;
      return `${what}: Option ${best.key} (${best.name}), ${signedPct(ch(best))} against the baseline.`;
    };
    overall.push(
      line(
        "Lowest worst-class delay",
        (h) => h.worstDelay.scenario,
        (h) => h.worstDelay.change,
      ),
    );
    overall.push(
      line(
        "Lowest mean net delay",
        (h) => h.meanDelay.scenario,
        (h) => h.meanDelay.change,
      ),
    );
    overall.push(
      line(
        "Lowest switching energy",
        (h) => h.energy.scenario,
        (h) => h.energy.change,
      ),
    );
    overall.push(
      line(
        "Fewest repeaters",
        (h) => h.repeaters.scenario,
        (h) => h.repeaters.change,
      ),
    );
  }
  const first = report.options[0]!;
  const baselineConsistent = report.options.every((o) => o.evaluation.level === first.evaluation.level && o.settings.miller === first.settings.miller);
  return { headlines, verdicts, overall, baselineConsistent };
}

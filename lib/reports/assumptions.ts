import { DEFAULT_TEMPERATURE_C, DIELECTRICS, METALS, NM, ownEntry, type LengthRule } from "@/lib/scaling/client";
import type { FrozenOption, FrozenReport } from "@/lib/validation/report";
import { fixed, plain } from "./format";

const LEVEL_WORDS: Record<string, string> = {
  ideal: "ideal scaling (parallel-plate capacitance, bulk resistivity, no driver or load)",
  fringe: "with fringing (single line over its plane(s), bulk resistivity, driver and load)",
  coupled: "with fringing and neighbour coupling (bulk resistivity, driver and load)",
  full: "full (fringing, neighbour coupling, size-effect resistivity, barrier that keeps its thickness unless told otherwise)",
};

export function levelWords(level: string): string {
  return ownEntry(LEVEL_WORDS, level) ?? level;
}

function metalWords(id: string): string {
  const m = ownEntry(METALS, id);
  return m ? `${m.name} (${m.id})` : id;
}

function kWords(k: number): string {
  const d = Object.values(DIELECTRICS).find((x) => Math.abs(x.k - k) < 1e-9);
  return d ? `k = ${plain(k)} (${d.name})` : `k = ${plain(k)}`;
}

/** A length rule in words: "S_L = S^0.5 (power law)". */
export function lengthRuleWords(r: LengthRule): string {
  switch (r.kind) {
    case "follows-s":
      return "S_L = S (lengths shrink with the cell)";
    case "fixed":
      return "S_L = 1 (lengths kept)";
    case "factor":
      return `S_L = ${plain(r.sL)} whatever S is`;
    case "power":
      return `S_L = S^${plain(r.exponent)} (power law)`;
  }
}

function range(values: number[], f: (v: number) => string): string {
  const lo = Math.min(...values);
  const hi = Math.max(...values);
  return lo === hi ? f(lo) : `${f(lo)}–${f(hi)}`;
}

/**
 * Every input of one option that differs from the baseline, in plain words (plus the model level, which
 * always matters). The baseline is S = S_L = 1, each class's own k and metal, factors 1, the technology's supply.
 */
export function optionAssumptions(report: FrozenReport, o: FrozenOption): string[] {
  const s = o.settings;
  const tech = report.baseline.technology;
  const classes = report.baseline.classes;
  const out: string[] = [];
  out.push(`Model: ${levelWords(s.level)}.`);
  if (s.s !== 1) {
    out.push(
      `Cross-section ${s.s > 1 ? "shrunk" : "grown"} by S = ${plain(s.s)}: widths, thicknesses, spacings and dielectric heights ÷ ${plain(s.s)} (pitch × ${plain(1 / s.s)}).`,
    );
  }
  if (s.lengthRule) out.push(`Wire lengths ÷ S_L, by the rule ${lengthRuleWords(s.lengthRule)}, on every class without its own.`);
  else if (s.sL !== 1) out.push(`Wire lengths ÷ S_L = ${plain(s.sL)} (× ${plain(1 / s.sL)}).`);
  else if (s.s !== 1) out.push("Wire lengths unchanged (S_L = 1): the same design on the new wiring.");
  const defaultBarrier = s.level !== "full";
  if (s.level !== "ideal" && s.barrierScales !== defaultBarrier) {
    out.push(s.barrierScales ? "Barrier/liner thins in proportion with S." : "Barrier/liner keeps its thickness as the line shrinks.");
  } else if (s.level === "full" && s.s !== 1) {
    out.push("Barrier/liner keeps its thickness as the line shrinks (the model's default at this level).");
  }
  if (s.k !== null)
    out.push(
      `Dielectric ${kWords(s.k)} on every class (baseline ${range(
        classes.map((c) => c.k),
        (v) => plain(v),
      )}).`,
    );
  if (s.metal !== null)
    out.push(`Every class filled with ${metalWords(s.metal)} (baseline ${[...new Set(classes.map((c) => metalWords(c.metal)))].join(", ")}).`);
  if (s.miller !== 1) {
    out.push(`Miller coupling factor ${plain(s.miller)} for both neighbours (1 = quiet neighbours); the baseline column uses the same factor.`);
  }
  if (s.deviceRFactor !== 1) {
    const pct = Math.round(Math.abs(1 - s.deviceRFactor) * 100);
    out.push(`Drivers and repeaters ${pct}% ${s.deviceRFactor < 1 ? "stronger" : "weaker"} (output resistance × ${plain(s.deviceRFactor)}).`);
  }
  if (s.deviceCFactor !== 1) out.push(`Load and repeater input capacitance × ${plain(s.deviceCFactor)}.`);
  if (s.supplyV !== tech.supplyV) out.push(`Supply ${plain(s.supplyV)} V (baseline ${plain(tech.supplyV)} V).`);
  const baseT = tech.temperatureC ?? DEFAULT_TEMPERATURE_C;
  if (s.temperatureC !== undefined && s.temperatureC !== baseT) out.push(`Wiring at ${plain(s.temperatureC)} °C (baseline ${plain(baseT)} °C).`);
  for (const [name, ov] of Object.entries(s.overrides)) {
    const cls = classes.find((c) => c.name === name);
    const parts: string[] = [];
    if (ov.s !== undefined && ov.s !== s.s) parts.push(`S = ${plain(ov.s)}`);
    if (ov.lengthRule !== undefined) parts.push(`lengths by the rule ${lengthRuleWords(ov.lengthRule)}`);
    else if (ov.sL !== undefined && ov.sL !== s.sL) parts.push(`S_L = ${plain(ov.sL)}`);
    if (ov.k !== undefined) parts.push(`dielectric ${kWords(ov.k)}${cls ? ` (baseline ${plain(cls.k)})` : ""}`);
    if (ov.metal !== undefined) parts.push(`${metalWords(ov.metal)} fill${cls ? ` (baseline ${metalWords(cls.metal)})` : ""}`);
    if (ov.barrierM !== undefined) {
      parts.push(ov.barrierM === 0 ? "no barrier/liner (barrier-free fill)" : `barrier/liner ${fixed(ov.barrierM, NM, 3)} nm`);
    } else if (ov.barrierScales !== undefined && ov.barrierScales !== s.barrierScales) {
      parts.push(ov.barrierScales ? "barrier thins with S" : "barrier keeps its thickness");
    }
    if (ov.aspectRatio !== undefined) parts.push(`aspect ratio T/W = ${plain(ov.aspectRatio)} after scaling`);
    if (ov.miller !== undefined && ov.miller !== s.miller) parts.push(`Miller factor ${plain(ov.miller)}`);
    if (parts.length > 0) out.push(`Class ${name}${cls ? ` (${cls.tier})` : ""}: ${parts.join("; ")}.`);
  }
  if (out.length === 1) out.push("No input differs from the baseline.");
  return out;
}

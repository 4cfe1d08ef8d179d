import {
  DEFAULT_MIN_REPEATER_GAIN,
  DEFAULT_OUTPUT_C_RATIO,
  DEFAULT_REPEATER_AREA_M2,
  DEFAULT_TEMPERATURE_C,
  METAL_PARAMETERS,
  METALS,
  ownEntry,
} from "@/lib/scaling";
import type { FrozenReport } from "@/lib/validation/report";

export interface ModelUse {
  quantity: string;
  model: string;
  sources: string[];
  /** Accuracy statements frozen with the results (the engine's own words). */
  accuracy: string[];
  usedBy: string[];
}

const CAPACITANCE: Record<string, { model: string; sources: string[] }> = {
  ideal: { model: "Parallel plate, C′ = ε·W/H", sources: ["Common practice, no single source"] },
  fringe: {
    model: "Yuan–Trick single line over a plane",
    sources: [
      'C. P. Yuan and T. N. Trick, "A simple formula for the estimation of the capacitance of two-dimensional interconnects in VLSI circuits", IEEE Electron Device Letters EDL-3(12), 1982',
    ],
  },
  coupled: {
    model: "Sakurai–Tamaru line with neighbours (C1 + 2·C21), Miller factor on the coupling part",
    sources: [
      'T. Sakurai and K. Tamaru, "Simple formulas for two- and three-dimensional capacitances", IEEE Trans. Electron Devices ED-30(2), 1983',
      'T. Sakurai, "Closed-form expressions for interconnection delay, coupling, and crosstalk in VLSI\'s", IEEE Trans. Electron Devices 40(1), 1993',
    ],
  },
  accurate: {
    model:
      "Air gap between the lines as geometry: tables of our own 2D field solver (layered dielectrics), ground and coupling separately, Miller factor on the coupling part",
    sources: [
      "Plateau's finite-volume field solver (lib/scaling/field-solve.ts) and its tables (scaling/make-cap-table.ts), checked against exact layered plates and Cohn's stripline (S. B. Cohn, IRE Trans. MTT 2(2), 1954); docs/models.md",
    ],
  },
};

const RESISTIVITY = {
  bulk: {
    model: "Bulk resistivity through the conducting cross-section (W − 2t_b)·(T − t_b)",
    sources: ['CRC Handbook of Chemistry and Physics, "Electrical resistivity of pure metals", 20 °C'],
  },
  size: {
    model: "Size-effect resistivity: surface (Fuchs–Sondheimer) plus grain-boundary (Mayadas–Shatzkes) scattering, additive form",
    sources: [
      "K. Fuchs, Proc. Cambridge Philos. Soc. 34, 1938; E. H. Sondheimer, Adv. Phys. 1, 1952",
      "A. F. Mayadas and M. Shatzkes, Phys. Rev. B 1, 1382, 1970",
      'W. Steinhögl et al., "Size-dependent resistivity of metallic wires in the mesoscopic range", Phys. Rev. B 66, 075414, 2002',
      'D. Gall, "Electron mean free path in elemental metals", J. Appl. Phys. 119, 085101, 2016 (mean free paths)',
    ],
  },
};

const DELAY = {
  ideal: {
    model: "Distributed RC line, 50% delay 0.377·RC, no driver or load",
    sources: ["H. B. Bakoglu, Circuits, Interconnections, and Packaging for VLSI, 1990"],
  },
  other: {
    model: "Driver + distributed line + load, 50% delay 0.377·RC + 0.693·(Rd·C + Rd·CL + R·CL); Elmore delay alongside",
    sources: [
      'T. Sakurai, "Approximation of wiring delay in MOSFET LSI", IEEE J. Solid-State Circuits SC-18(4), 1983',
      "W. C. Elmore, J. Appl. Phys. 19, 1948",
    ],
  },
};

const REPEATERS = {
  model: "Optimal repeater insertion (whole number of stages, optimal size)",
  sources: ['H. B. Bakoglu and J. D. Meindl, "Optimal interconnection circuits for VLSI", IEEE Trans. Electron Devices ED-32(5), 1985'],
};

/**
 * The models behind the report's figures, per quantity, with their published sources and the accuracy
 * statements the engine froze with each result. Grouped so that options sharing a model share a row.
 */
export function modelsUsed(report: FrozenReport): ModelUse[] {
  const rows = new Map<string, ModelUse>();
  const add = (quantity: string, m: { model: string; sources: string[] }, accuracy: string | undefined, who: string) => {
    const id = `${quantity}|${m.model}`;
    const row = rows.get(id) ?? { quantity, model: m.model, sources: m.sources, accuracy: [], usedBy: [] };
    if (accuracy && !row.accuracy.includes(accuracy)) row.accuracy.push(accuracy);
    if (!row.usedBy.includes(who)) row.usedBy.push(who);
    rows.set(id, row);
  };
  for (const o of report.options) {
    const level = o.evaluation.level;
    const who = `Option ${o.key}`;
    for (const c of o.evaluation.classes) {
      const acc = c.scenario.accuracy;
      // the model each class used: an air-gapped class takes the accurate tables at levels coupled and full
      const cap = c.scenario.capacitance.model === "accurate" ? "accurate" : level === "full" ? "coupled" : level;
      add("Capacitance", ownEntry(CAPACITANCE, cap) ?? CAPACITANCE.coupled!, acc.capacitance, who);
      add("Resistance", level === "full" ? RESISTIVITY.size : RESISTIVITY.bulk, acc.resistivity, who);
      add("Delay", level === "ideal" ? DELAY.ideal : DELAY.other, acc.delay, who);
      add("Repeaters", REPEATERS, acc.repeaters, who);
    }
  }
  return [...rows.values()];
}

/** Material sources for the metals that appear in the report (baseline and options). */
/**
 * Sources of the metals a report uses, and the baseline's own values where its materials block overrides the
 * catalogue (e.g. a fit to measured lines), with the source the baseline gives for them.
 */
export function materialSources(
  report: FrozenReport,
): { metal: string; resistivity: string; meanFreePath: string; override: string | null; overrideSource: string | null }[] {
  const ids = new Set<string>();
  for (const o of report.options)
    for (const c of o.evaluation.classes) {
      ids.add(c.baseline.metal);
      ids.add(c.scenario.metal);
    }
  const materials = report.baseline.technology.materials ?? {};
  return [...ids]
    .map((id) => ownEntry(METALS, id))
    .filter((m): m is NonNullable<typeof m> => Boolean(m))
    .map((m) => {
      const o = ownEntry(materials, m.id);
      const parts = o
        ? METAL_PARAMETERS.filter((q) => o[q.key] !== undefined).map(
            (q) =>
              `${q.short} ${Number((o[q.key]! / q.unitSI).toPrecision(4))}${q.unit ? ` ${q.unit}` : ""} (catalogue ${Number((m[q.key] / q.unitSI).toPrecision(4))})`,
          )
        : [];
      return {
        metal: `${m.name} (${m.id})`,
        resistivity: m.sources.resistivity,
        meanFreePath: m.sources.meanFreePath,
        override: parts.length > 0 ? parts.join(", ") : null,
        overrideSource: parts.length > 0 ? (report.baseline.technology.materialsSource ?? "not given") : null,
      };
    });
}

/** The technology's operating point and repeater settings in words (engine defaults where the baseline sets none). */
export function technologyWords(report: FrozenReport): string {
  const t = report.baseline.technology;
  const pct = (v: number) => `${Number((v * 100).toPrecision(3))}%`;
  return [
    `wiring at ${t.temperatureC ?? DEFAULT_TEMPERATURE_C} °C`,
    `delay model ${(t.delayModel ?? "exact") === "exact" ? "exact distributed line" : "Sakurai's closed form"}`,
    `repeaters only where they cut a net's delay by ≥ ${pct(t.minRepeaterGain ?? DEFAULT_MIN_REPEATER_GAIN)}`,
    `repeater output capacitance ${Number((t.repeaterOutputCRatio ?? DEFAULT_OUTPUT_C_RATIO).toPrecision(3))} × input`,
    `minimum repeater area ${Number(((t.repeaterAreaM2 ?? DEFAULT_REPEATER_AREA_M2) / 1e-12).toPrecision(4))} µm²`,
    `leakage ${Number(((t.repeaterLeakageW ?? 0) / 1e-9).toPrecision(4))} nW per minimum repeater`,
  ].join(", ");
}

export interface ReportFlag {
  option: string;
  className: string;
  side: "baseline" | "option";
  model: string;
  message: string;
}

/** Validity flags of every result in the report, deduplicated (a baseline flag is listed once). */
export function validityFlags(report: FrozenReport): ReportFlag[] {
  const out: ReportFlag[] = [];
  const seen = new Set<string>();
  for (const o of report.options) {
    for (const c of o.evaluation.classes) {
      for (const [side, r] of [
        ["baseline", c.baseline],
        ["option", c.scenario],
      ] as const) {
        for (const f of r.validity) {
          const id = side === "baseline" ? `b|${o.evaluation.level}|${c.name}|${f.model}|${f.quantity}` : `${o.key}|${c.name}|${f.model}|${f.quantity}`;
          if (seen.has(id)) continue;
          seen.add(id);
          out.push({
            option: side === "baseline" ? "Baseline" : `Option ${o.key}`,
            className: c.name,
            side,
            model: f.model,
            message: f.message,
          });
        }
      }
    }
  }
  return out;
}

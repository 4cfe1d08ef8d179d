import {
  DEFAULT_MIN_REPEATER_GAIN,
  DEFAULT_OUTPUT_C_RATIO,
  DEFAULT_REPEATER_AREA_M2,
  DEFAULT_TEMPERATURE_C,
  METAL_PARAMETERS,
  METALS,
  ownEntry,
} from "@/lib/scaling/client";
import type { FrozenReport } from "@/lib/validation/report";

export interface ModelUse {
  quantity: string;
  model: string;
  sources: string[];
  /** Accuracy statements frozen with the results (the engine's own words). */
  accuracy: string[];
  usedBy: string[];
  /** Per option (e.g. "Option A"), the classes whose figures use this model. */
  classesByOption: Record<string, string[]>;
}

const SAKURAI_TAMARU = [
  'T. Sakurai and K. Tamaru, "Simple formulas for two- and three-dimensional capacitances", IEEE Trans. Electron Devices ED-30(2), 1983',
  'T. Sakurai, "Closed-form expressions for interconnection delay, coupling, and crosstalk in VLSI\'s", IEEE Trans. Electron Devices 40(1), 1993',
];
const COHN = ['S. B. Cohn, "Characteristic impedance of the shielded-strip transmission line", IRE Trans. MTT 2(2), 1954'];
const TABLES = [
  "Plateau's finite-volume field solver (lib/scaling/field-solve.ts, layered dielectrics) and its tables (scaling/make-cap-table.ts), checked against exact layered plates and Cohn's stripline (S. B. Cohn, IRE Trans. MTT 2(2), 1954); held out on 600 geometries (scaling/README.md)",
];

/**
 * The capacitance model one class result used, named with its planes and air gap: the frozen model id, and the
 * class's planes (a plane above too when both ILD heights are set) and gap (engine 2.2 freezes airGap; in reports
 * frozen before it, only an air-gapped class took the accurate tables).
 */
export function capacitanceModelOf(r: {
  capacitance: { model: string };
  ildBelowM: number | null;
  ildAboveM: number | null;
  airGap?: { kGap: number; gapFraction: number } | null;
}): { model: string; sources: string[] } {
  const two = r.ildBelowM !== null && r.ildAboveM !== null;
  const planes = two ? "planes below and above" : "one plane";
  switch (r.capacitance.model) {
    case "ideal":
      return { model: `Parallel plate, C′ = ε·W/H${two ? " + ε·W/H2" : ""} (${planes})`, sources: ["Common practice, no single source"] };
    case "fringe":
      return two
        ? { model: "Cohn's thick strip between two planes, single line (planes below and above)", sources: COHN }
        : {
            model: "Yuan–Trick single line over a plane (one plane)",
            sources: [
              'C. P. Yuan and T. N. Trick, "A simple formula for the estimation of the capacitance of two-dimensional interconnects in VLSI circuits", IEEE Electron Device Letters EDL-3(12), 1982',
            ],
          };
    case "accurate": {
      const gap = r.airGap !== undefined ? r.airGap !== null : true;
      return {
        model: `Accurate tables of our own 2D field solver, ${planes}${gap ? ", air gap between the lines as geometry" : ""}: ground and coupling separately, Miller factor on the coupling part`,
        sources: TABLES,
      };
    }
    default:
      return two
        ? {
            model:
              "Published: Cohn's thick strip between two planes with the fitted ground/coupling split, Miller factor on the coupling part (planes below and above)",
            sources: [...COHN, ...SAKURAI_TAMARU.slice(0, 1)],
          }
        : { model: "Published: Sakurai–Tamaru line with neighbours (C1 + 2·C21), Miller factor on the coupling part (one plane)", sources: SAKURAI_TAMARU };
  }
}

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
 * The separate statements of one accuracy text: split at "; " outside parentheses, so "one plane: within 6% …; two planes
 * (H2/H ≤ 2, S/H ≤ 4): …" prints as two items. The text of each statement is kept as the engine froze it.
 */
export function accuracyStatements(text: string): string[] {
  const out: string[] = [];
  let depth = 0;
  let start = 0;
  for (let i = 0; i < text.length; i++) {
    const ch = text[i];
    if (ch === "(") depth++;
    else if (ch === ")") depth = Math.max(0, depth - 1);
    else if (ch === ";" && depth === 0 && text[i + 1] === " ") {
      out.push(text.slice(start, i).trim());
      start = i + 2;
    }
  }
  out.push(text.slice(start).trim());
  return out.filter((x) => x.length > 0);
}

/**
 * The models behind the report's figures, per quantity, with their published sources and the accuracy
 * statements the engine froze with each result. Grouped so that options sharing a model share a row.
 */
export function modelsUsed(report: FrozenReport): ModelUse[] {
  const rows = new Map<string, ModelUse>();
  const add = (quantity: string, m: { model: string; sources: string[] }, accuracy: string | undefined, who: string, className: string) => {
    const id = `${quantity}|${m.model}`;
    const row = rows.get(id) ?? { quantity, model: m.model, sources: m.sources, accuracy: [], usedBy: [], classesByOption: {} };
    // each statement of an accuracy text is its own item (one plane; two planes; …), listed once per row
    for (const a of accuracy ? accuracyStatements(accuracy) : []) if (!row.accuracy.includes(a)) row.accuracy.push(a);
    if (!row.usedBy.includes(who)) row.usedBy.push(who);
    const list = (row.classesByOption[who] ??= []);
    if (!list.includes(className)) list.push(className);
    rows.set(id, row);
  };
  for (const o of report.options) {
    const level = o.evaluation.level;
    const who = `Option ${o.key}`;
    for (const c of o.evaluation.classes) {
      const acc = c.scenario.accuracy;
      // the model each class used, with its planes and air gap
      add("Capacitance", capacitanceModelOf(c.scenario), acc.capacitance, who, c.name);
      add("Resistance", level === "full" ? RESISTIVITY.size : RESISTIVITY.bulk, acc.resistivity, who, c.name);
      add("Delay", level === "ideal" ? DELAY.ideal : DELAY.other, acc.delay, who, c.name);
      add("Repeaters", REPEATERS, acc.repeaters, who, c.name);
    }
  }
  // one block per quantity (a quantity's models side by side), in the order of the first row of each
  const order = ["Capacitance", "Resistance", "Delay", "Repeaters"];
  return [...rows.values()].sort((a, b) => order.indexOf(a.quantity) - order.indexOf(b.quantity));
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
    `capacitance at the coupled and full levels from ${(t.capacitanceModel ?? "accurate") === "accurate" ? "the accurate field-solver tables" : "the published closed forms (air-gapped classes: the tables)"}`,
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

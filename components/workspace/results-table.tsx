"use client";
import { memo, useState, useSyncExternalStore } from "react";
import type { ClassComparison, ClassResult, Evaluation } from "@/lib/scaling";
import { countChange } from "@/lib/figures";
import { fmt, fmtRatio, U } from "./units";

// Per-length units: Ω/µm = 1e6 Ω/m, fF/µm = 1e-9 F/m; repeated delay per mm: ps/mm = 1e-9 s/m.
const PER_UM_OHM = { label: "Ω/µm", unitSI: 1e6, base: "" as const, suffix: "" };
const FF_PER_UM = { label: "fF/µm", unitSI: 1e-9, base: "" as const, suffix: "" };
const PS_PER_MM = { label: "ps/mm", unitSI: 1e-9, base: "" as const, suffix: "" };
const FJ = { label: "fJ", unitSI: 1e-15, base: "" as const, suffix: "" };

type Col = {
  key: string;
  label: string;
  unit: string;
  /** null = not applicable (shown as —). */
  get: (r: ClassResult) => number | null;
  ratio?: (c: ClassComparison) => number;
  /** For counts: the change as text (a difference), shown in the ratio row instead of a ratio. */
  change?: (c: ClassComparison) => string;
  concern?: "capacitance" | "resistivity" | "delay" | "repeaters";
  title?: string;
  /** A breakdown column: shown from 1280 px (xl) or on request, so the key columns fit at 1024 px without scrolling. */
  detail?: boolean;
};

const COLS: Col[] = [
  {
    key: "r",
    label: "R",
    unit: "Ω/µm",
    get: (r) => Number(fmtRaw(r.rOhmPerM, PER_UM_OHM.unitSI)),
    ratio: (c) => c.ratio.rOhmPerM,
    concern: "resistivity",
  },
  {
    key: "c",
    label: "C total",
    unit: "fF/µm",
    get: (r) => Number(fmtRaw(r.cFPerM, FF_PER_UM.unitSI)),
    ratio: (c) => c.ratio.cFPerM,
    concern: "capacitance",
  },
  {
    key: "ca",
    detail: true,
    label: "area",
    unit: "fF/µm",
    get: (r) => Number(fmtRaw(r.capacitance.areaFPerM, FF_PER_UM.unitSI)),
    title: "Parallel-plate part to the plane(s)",
  },
  {
    key: "cf",
    detail: true,
    label: "fringe",
    unit: "fF/µm",
    get: (r) => Number(fmtRaw(r.capacitance.fringeFPerM, FF_PER_UM.unitSI)),
    title: "Fringing to the plane(s)",
  },
  {
    key: "cc",
    detail: true,
    label: "coupling",
    unit: "fF/µm",
    get: (r) => Number(fmtRaw(r.capacitance.couplingMillerFPerM, FF_PER_UM.unitSI)),
    title: "Line-to-line, both neighbours, Miller factor applied",
  },
  { key: "rc", label: "RC", unit: "ps", get: (r) => Number(fmtRaw(r.rcS, 1e-12)), ratio: (c) => c.ratio.rcS },
  {
    key: "d",
    label: "Delay 50%",
    unit: "ps",
    get: (r) => Number(fmtRaw(r.delayS, 1e-12)),
    ratio: (c) => c.ratio.delayS,
    concern: "delay",
    title: "Driver + line + load at the class's typical (mean) length",
  },
  {
    key: "n",
    label: "Repeaters",
    unit: "inserted",
    get: (r) => r.repeaterCount,
    // a count's change is a difference (0 → 1 is "+1"; lib/figures.ts), not the engine's ratio of stages
    change: (c) => countChange(c.baseline.repeaterCount, c.scenario.repeaterCount),
    concern: "repeaters",
    title: "Inserted repeaters on a net of the typical length: real driver → repeaters → real load (0 = driver only); the change row gives the difference",
  },
  {
    key: "h",
    detail: true,
    label: "Rep. size",
    unit: "× min",
    get: (r) => (r.repeaterCount > 0 ? r.repeaterSize : null),
    title: "Size of each inserted repeater, in minimum-size repeaters (— when none is inserted)",
  },
  {
    key: "ra",
    detail: true,
    label: "Rep. area",
    unit: "µm²",
    get: (r) => Number(fmtRaw(r.repeaterAreaM2, 1e-12)),
    title: "Area of one such net's inserted repeaters (count × size × minimum repeater area)",
  },
  {
    key: "rp",
    detail: true,
    label: "Rep. power",
    unit: "% of class",
    get: (r) => (r.powerW > 0 ? (100 * r.repeaterPowerW) / r.powerW : null),
    title: "Share of the class's power spent in its repeaters (their capacitance switching, plus leakage)",
  },
  {
    key: "rd",
    label: "Repeated",
    unit: "ps/mm",
    get: (r) => Number(fmtRaw(r.repeaters.delayPerMS, PS_PER_MM.unitSI)),
    title: "Delay per mm of an optimally repeated line",
  },
  {
    key: "e",
    label: "Energy",
    unit: "fJ",
    get: (r) => Number(fmtRaw(r.energyJ, FJ.unitSI)),
    ratio: (c) => c.ratio.energyJ,
    title: "C·V² per transition, line + load + repeaters",
  },
];

/** Below Tailwind's `sm` (40rem): the width at which the phone cards show instead of the table. */
const PHONE_QUERY = "not all and (min-width: 40rem)";
const subscribePhone = (onChange: () => void) => {
  const mq = window.matchMedia(PHONE_QUERY);
  mq.addEventListener("change", onChange);
  return () => mq.removeEventListener("change", onChange);
};
/**
 * Whether the phone cards can show: on the server (and while hydrating) yes, so a phone's first paint has them; in a
 * wider window they are hidden by CSS and not rendered at all (a slider step then renders only the table).
 */
function usePhoneCards(): boolean {
  return useSyncExternalStore(
    subscribePhone,
    () => window.matchMedia(PHONE_QUERY).matches,
    () => true,
  );
}

function fmtRaw(v: number, unitSI: number): number {
  return v / unitSI;
}

function show(v: number | null): string {
  return fmt(v, U.none);
}

function tone(r: number): string {
  if (!Number.isFinite(r)) return "";
  if (r < 0.995) return "bg-good-soft text-good";
  if (r > 1.005) return "bg-bad-soft text-bad";
  return "text-muted";
}

/**
 * Baseline vs scenario per class, ratio row highlighted, validity flags and model accuracy beside the figures. Memoised:
 * it renders again only when a new evaluation arrives (not on every keystroke or slider step before it).
 */
export const ResultsTable = memo(function ResultsTable({ evaluation, dataKey }: { evaluation: Evaluation; dataKey?: string }) {
  // One operating temperature per evaluation (the baseline's technology): resistance is at it.
  const temperatureC = evaluation.classes[0]?.scenario.temperatureC;
  const [all, setAll] = useState(false);
  const phone = usePhoneCards();
  const cell = (c: Col) => (c.detail && !all ? "hidden xl:table-cell" : "");
  return (
    <div data-results-key={dataKey}>
      <button
        type="button"
        className="no-print mb-1 text-[11px] text-copper-dark hover:underline xl:hidden"
        aria-pressed={all}
        onClick={() => setAll((a) => !a)}
        data-testid="all-columns"
      >
        {all ? "Key columns only" : "Show all columns (capacitance parts, repeater size, area and power)"}
      </button>
      {/* Phones (below 640 px): one card per class with the key columns, no sideways scrolling; the whole table on request. */}
      <div className={all ? "hidden" : "space-y-2 sm:hidden"} data-testid="result-cards">
        {phone ? evaluation.classes.map((cc) => <ClassCard key={cc.name} cc={cc} />) : null}
      </div>
      <div className={`overflow-x-auto ${all ? "" : "hidden sm:block"}`}>
        <table className="num w-full border-collapse text-xs" data-testid="results-table">
          <caption className="sr-only">Results per wire class: baseline, scenario and scenario/baseline ratio</caption>
          <thead>
            <tr className="border-b border-rule-strong text-muted">
              <th scope="col" className="sticky left-0 z-10 bg-panel py-1.5 pr-2 text-left font-medium">
                Class
              </th>
              <th scope="col" className="pr-2 text-left font-medium" />
              {COLS.map((c) => (
                <th key={c.key} scope="col" className={`px-1.5 text-right font-medium ${cell(c)}`} title={c.title}>
                  {c.label}
                  {c.unit ? <span className="block text-[10px] font-normal text-faint">{c.unit}</span> : <span className="block text-[10px]">&nbsp;</span>}
                  {c.key === "r" && temperatureC !== undefined ? (
                    <span className="block whitespace-nowrap text-[10px] font-normal text-faint" data-testid="r-temperature">
                      at {fmt(temperatureC, U.none)} °C
                    </span>
                  ) : null}
                </th>
              ))}
            </tr>
          </thead>
          {evaluation.classes.map((cc) => (
            <ClassRows key={cc.name} cc={cc} cell={cell} />
          ))}
        </table>
      </div>
    </div>
  );
});

/** The key columns of a phone's card: R, C, delay and repeaters (the class is the card's heading). */
const CARD_COLS = ["r", "c", "d", "n"].map((k) => COLS.find((c) => c.key === k)!);

/** One class on a phone: baseline, scenario and the change of each key figure, in a grid that fits 390 px. */
function ClassCard({ cc }: { cc: ClassComparison }) {
  const s = cc.scenario;
  const flags = s.validity;
  return (
    <section className="rounded border border-rule px-2 py-1.5 text-xs" data-class={cc.name} data-testid="result-card">
      <h3 className="font-semibold text-ink">
        {cc.name}{" "}
        <span className="font-normal text-muted">
          {s.tier !== cc.name ? `${s.tier} · ` : ""}
          {fmt(s.pitchM, U.nm, 3)} nm pitch · {fmt(s.lengthM, U.um, 3)} µm
        </span>
      </h3>
      <table className="num mt-1 w-full border-collapse">
        <caption className="sr-only">{cc.name}: baseline, scenario and change of the key figures</caption>
        <thead>
          <tr className="text-[10px] text-faint">
            <th scope="col" className="text-left font-normal" />
            <th scope="col" className="px-1 text-right font-normal">
              Baseline
            </th>
            <th scope="col" className="px-1 text-right font-normal">
              Scenario
            </th>
            <th scope="col" className="pl-1 text-right font-normal">
              Change
            </th>
          </tr>
        </thead>
        <tbody>
          {CARD_COLS.map((c) => {
            const r = c.ratio?.(cc);
            const d = c.change?.(cc);
            return (
              <tr key={c.key} className="border-t border-rule/60" title={c.title}>
                <th scope="row" className="py-0.5 pr-1 text-left font-medium text-muted">
                  {c.label} <span className="text-[10px] font-normal text-faint">{c.unit}</span>
                </th>
                <td className="tabular px-1 text-right text-muted">{show(c.get(cc.baseline))}</td>
                <td className="tabular px-1 text-right font-medium text-ink" data-card-col={c.key}>
                  {show(c.get(s))}
                </td>
                <td className="pl-1 text-right">
                  {r !== undefined ? <span className={`tabular rounded px-1 ${tone(r)}`}>{fmtRatio(r)}</span> : null}
                  {d !== undefined ? (
                    <span
                      className={`tabular rounded px-1 ${d === "±0" ? "text-muted" : d.startsWith("+") ? "bg-bad-soft text-bad" : "bg-good-soft text-good"}`}
                    >
                      {d}
                    </span>
                  ) : null}
                </td>
              </tr>
            );
          })}
        </tbody>
      </table>
      {flags.length ? (
        <ul className="mt-1 text-[11px] leading-snug text-warn">
          {flags.map((f, i) => (
            <li key={i}>
              ⚠ {f.message} <span className="text-muted">({f.model})</span>
            </li>
          ))}
        </ul>
      ) : null}
      {s.airGap ? <AirGapLine r={s} testId="card-effective-k" /> : null}
    </section>
  );
}

function ClassRows({ cc, cell }: { cc: ClassComparison; cell: (c: Col) => string }) {
  const s = cc.scenario;
  const flags = s.validity;
  return (
    <tbody className="border-b border-rule" data-class={cc.name}>
      <tr>
        <th scope="rowgroup" rowSpan={3} className="sticky left-0 z-10 max-w-[9rem] bg-panel py-1 pr-2 text-left align-top">
          <div className="font-semibold text-ink">{cc.name}</div>
          {s.tier !== cc.name ? <div className="font-normal text-muted">{s.tier}</div> : null}
          <div className="font-normal text-muted">
            {fmt(s.pitchM, U.nm, 3)} nm pitch · {fmt(s.lengthM, U.um, 3)} µm
          </div>
          {flags.length ? (
            <div className="mt-0.5 inline-block rounded bg-warn-soft px-1 text-[10px] font-medium text-warn" title={flags.map((f) => f.message).join("\n")}>
              {flags.length} validity flag{flags.length > 1 ? "s" : ""}
            </div>
          ) : null}
        </th>
        <td className="pr-2 text-muted">Baseline</td>
        {COLS.map((c) => (
          <td key={c.key} className={`tabular px-1.5 py-0.5 text-right text-muted ${cell(c)}`}>
            {show(c.get(cc.baseline))}
          </td>
        ))}
      </tr>
      <tr>
        <td className="pr-2 font-medium text-ink">Scenario</td>
        {COLS.map((c) => (
          <td key={c.key} className={`tabular px-1.5 py-0.5 text-right font-medium text-ink ${cell(c)}`} data-col={c.key}>
            {show(c.get(s))}
            {c.concern && s.accuracy[c.concern] ? (
              <sup className="ml-0.5 cursor-help text-faint" title={`Accuracy: ${s.accuracy[c.concern]}`} aria-label={`accuracy: ${s.accuracy[c.concern]}`}>
                ±
              </sup>
            ) : null}
          </td>
        ))}
      </tr>
      <tr>
        <td className="pr-2 text-muted">Ratio</td>
        {COLS.map((c) => {
          const r = c.ratio?.(cc);
          const d = c.change?.(cc);
          return (
            <td key={c.key} className={`px-1.5 py-0.5 text-right ${cell(c)}`} data-ratio={c.key}>
              {r !== undefined ? <span className={`tabular rounded px-1 ${tone(r)}`}>{fmtRatio(r)}</span> : null}
              {d !== undefined ? (
                <span className={`tabular rounded px-1 ${d === "±0" ? "text-muted" : d.startsWith("+") ? "bg-bad-soft text-bad" : "bg-good-soft text-good"}`}>
                  {d}
                </span>
              ) : null}
            </td>
          );
        })}
      </tr>
      <tr>
        <td colSpan={COLS.length + 2} className="pb-2 pt-0.5 text-[11px] leading-snug text-muted">
          {flags.length ? (
            <ul className="mt-0.5 text-warn">
              {flags.map((f, i) => (
                <li key={i}>
                  ⚠ {f.message} <span className="text-muted">({f.model})</span>
                </li>
              ))}
            </ul>
          ) : null}
          {s.airGap ? <AirGapLine r={s} /> : null}
          <details className="mt-0.5">
            <summary className="cursor-pointer select-none">Model accuracy (±)</summary>
            <dl className="mt-0.5 grid grid-cols-[5.5rem_1fr] gap-x-2">
              <dt className="font-medium text-ink">Capacitance</dt>
              <dd>{s.accuracy.capacitance}</dd>
              <dt className="font-medium text-ink">Resistivity</dt>
              <dd>{s.accuracy.resistivity}</dd>
              <dt className="font-medium text-ink">Delay</dt>
              <dd>{s.accuracy.delay}</dd>
              {s.accuracy.repeaters ? (
                <>
                  <dt className="font-medium text-ink">Repeaters</dt>
                  <dd>{s.accuracy.repeaters}</dd>
                </>
              ) : null}
            </dl>
          </details>
        </td>
      </tr>
    </tbody>
  );
}

/** An air-gapped class: its gap, and the one uniform k that would give the same C at Miller 0, 1 and 2 (derived). */
function AirGapLine({ r, testId = "effective-k" }: { r: ClassResult; testId?: string }) {
  const gap = r.airGap!;
  const eff = r.capacitance.effectiveK;
  return (
    <p className="mt-0.5 text-ink" data-testid={testId}>
      Air gap between the lines: k<sub>gap</sub> {fmt(gap.kGap, U.none, 3)} over {fmt(100 * gap.gapFraction, U.none, 3)}% of the thickness, ILD k{" "}
      {fmt(r.k, U.none, 3)} → effective k{" "}
      <span className="tabular font-medium">
        {fmt(eff.miller0, U.none, 3)} / {fmt(eff.miller1, U.none, 3)} / {fmt(eff.miller2, U.none, 3)}
      </span>{" "}
      at Miller 0 / 1 / 2 <span className="text-muted">(derived, not an input)</span>
    </p>
  );
}

export { PER_UM_OHM, FF_PER_UM };

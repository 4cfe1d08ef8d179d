import type { ReactNode } from "react";
import { Caution } from "@/components/caution";
import { TableHead } from "@/components/ui/table";
import { optionAssumptions, levelWords } from "@/lib/reports/assumptions";
import { countChange, FIGURE_LABEL } from "@/lib/figures";
import { count, dateTime, eng, fixed, plain } from "@/lib/reports/format";
import { materialSources, modelsUsed, technologyWords, validityFlags } from "@/lib/reports/models";
import { signedPct, type Change, type ReportSummary } from "@/lib/reports/summary";
import type { PublicReport } from "@/lib/reports/service";
import type { FrozenClassResult, ReportMetric } from "@/lib/validation/report";
import { ClassRatioChart } from "./class-ratio-chart";
import { SERIES_STYLE, SweepFigure } from "./sweep-figure";
import { RoadmapSection } from "./roadmap-section";
import { ShapingSection } from "./shaping-section";
import "./report.css";

const NM = 1e-9;
const UM = 1e-6;
const PS = 1e-12;
const FF = 1e-15;

interface MetricRow {
  label: string;
  unit: string;
  value: (r: FrozenClassResult) => number;
  format: (v: number) => string;
  /** "context": geometry, no better/worse tone; "points": a share, its change in percentage points; "count": a count, its change a difference. */
  kind?: "context" | "points" | "count";
  /** Depends on the operating temperature: the label names it (when the frozen result carries it). */
  atTemperature?: boolean;
}

/** A result field added by engine 2 (absent in reports frozen by engine 1.x): NaN shows as n/a. */
const since2 = (v: number | undefined): number => v ?? Number.NaN;

/** Table rows per chosen metric: label, unit (in the header cell), value and format. Lower is better for all. */
const METRIC_ROWS: Record<ReportMetric, MetricRow[]> = {
  delay: [{ label: "Delay at mean length", unit: "ps", value: (r) => r.delayS, format: (v) => fixed(v, PS) }],
  rc: [{ label: "Wire RC", unit: "ps", value: (r) => r.rcS, format: (v) => fixed(v, PS) }],
  resistance: [
    { label: "Resistance per length", unit: "Ω/µm", value: (r) => r.rOhmPerM, format: (v) => fixed(v, 1e6), atTemperature: true },
    { label: "Wire resistance", unit: "Ω", value: (r) => r.rOhm, format: (v) => fixed(v, 1), atTemperature: true },
  ],
  capacitance: [
    { label: "Capacitance per length", unit: "fF/µm", value: (r) => r.cFPerM, format: (v) => fixed(v, 1e-9) },
    { label: "Wire capacitance", unit: "fF", value: (r) => r.cF, format: (v) => fixed(v, FF) },
  ],
  repeaters: [
    // one meaning (lib/figures.ts): repeaters inserted on the net; reports frozen by engine 1.x carry stages = inserted + 1
    { label: `${FIGURE_LABEL.repeaters} per net`, unit: "", value: (r) => r.repeaterCount ?? r.repeaters.count - 1, format: (v) => count(v), kind: "count" },
    {
      label: "Repeater size",
      unit: "× minimum",
      // no size (and no change) where no repeater is inserted
      value: (r) => (r.repeaterCount !== undefined && r.repeaterCount > 0 ? since2(r.repeaterSize) : Number.NaN),
      format: (v) => (Number.isFinite(v) ? plain(v, 3) : "—"),
      kind: "context",
    },
    { label: "Repeater area per net", unit: "µm²", value: (r) => since2(r.repeaterAreaM2), format: (v) => fixed(v, 1e-12) },
    {
      label: "Repeaters' share of power",
      unit: "%",
      value: (r) => (r.repeaterPowerW === undefined ? Number.NaN : r.powerW > 0 ? (100 * r.repeaterPowerW) / r.powerW : 0),
      format: (v) => plain(v, 3),
      kind: "points",
    },
  ],
  energy: [{ label: "Energy per transition", unit: "fJ", value: (r) => r.energyJ, format: (v) => fixed(v, FF) }],
  power: [{ label: "Switching power, all nets", unit: "µW", value: (r) => r.powerW, format: (v) => fixed(v, 1e-6) }],
  overBudget: [
    {
      label: "Nets over the delay budget",
      unit: "%",
      value: (r) => r.distribution.shareOverBudget * 100,
      format: (v) => plain(v, 3),
      kind: "points",
    },
  ],
};

function tone(c: number | null): string {
  if (c === null || Math.abs(c) < 0.005) return "text-muted";
  return c < 0 ? "text-good" : "text-bad";
}

function Delta({ c, className = "" }: { c: number | null; className?: string }) {
  return <span className={`tabular whitespace-nowrap ${tone(c)} ${className}`}>{signedPct(c)}</span>;
}

function CellDelta({ m, base, value }: { m: MetricRow; base: number; value: number }) {
  if (!Number.isFinite(base) || !Number.isFinite(value)) return <span className="tabular whitespace-nowrap text-muted">n/a</span>;
  if (m.kind === "count") {
    const text = countChange(base, value);
    return <span className={`tabular whitespace-nowrap ${text === "±0" ? "text-muted" : value < base ? "text-good" : "text-bad"}`}>{text}</span>;
  }
  if (m.kind === "points") {
    const d = value - base;
    const text = Math.abs(d) < 0.005 ? "±0 pt" : `${d < 0 ? "−" : "+"}${plain(Math.abs(d), 2)} pt`;
    return <span className={`tabular whitespace-nowrap ${Math.abs(d) < 0.005 ? "text-muted" : d < 0 ? "text-good" : "text-bad"}`}>{text}</span>;
  }
  const c = base !== 0 ? value / base - 1 : null;
  if (m.kind === "context") return <span className="tabular whitespace-nowrap text-muted">{signedPct(c)}</span>;
  return <Delta c={c} />;
}

/** "Cu, k 2.7" when the baseline and every option share them, else "baseline Cu, k 2.7 · A Ru, k 2.2 · B Cu, k 2.2". */
function materialWords(base: FrozenClassResult, options: { key: string; r: FrozenClassResult | undefined }[]): string {
  const words = (r: FrozenClassResult) => `${r.metal}, k ${plain(r.k)}`;
  const b = words(base);
  const own = options.filter((o): o is { key: string; r: FrozenClassResult } => o.r !== undefined).map((o) => ({ key: o.key, w: words(o.r) }));
  if (own.every((o) => o.w === b)) return b;
  return [`baseline ${b}`, ...own.map((o) => `${o.key} ${o.w}`)].join(" · ");
}

function Section({ id, title, children, breakBefore = false }: { id: string; title: string; children: ReactNode; breakBefore?: boolean }) {
  return (
    <section id={id} aria-labelledby={`${id}-h`} className={`mt-8 ${breakBefore ? "report-break" : ""}`}>
      <h2 id={`${id}-h`} className="mb-3 border-b border-rule pb-1 text-base font-semibold text-ink">
        {title}
      </h2>
      {children}
    </section>
  );
}

function OptionSwatch({ k }: { k: string }) {
  const st = SERIES_STYLE[k] ?? SERIES_STYLE.A!;
  return <span aria-hidden="true" className="mr-1.5 inline-block h-2.5 w-2.5 rounded-sm align-[-1px]" style={{ background: st.color }} />;
}

function Figure({ label, change, value, unit }: { label: string; change: Change; value: string; unit?: string }) {
  return (
    <div className="flex items-baseline justify-between gap-2 border-t border-rule py-1.5 first:border-t-0">
      <dt className="text-xs text-muted">{label}</dt>
      <dd className="text-right">
        <Delta c={change.change} className="text-sm font-semibold" />
        <span className="ml-2 whitespace-nowrap text-xs text-muted tabular">
          {value}
          {unit ? ` ${unit}` : ""}
        </span>
      </dd>
    </div>
  );
}

/**
 * The report itself, shared by the team's report page, the share-link page and the print view: plain words
 * first (for managers), exact figures with units after (for engineers), then assumptions, models, flags and
 * the caution. Everything comes from the frozen document; nothing is recomputed by the engine.
 */
export function ReportBody({ report, summary, isDemo = false }: { report: PublicReport; summary: ReportSummary; isDemo?: boolean }) {
  const f = report.frozen;
  const optionNames = Object.fromEntries(f.options.map((o) => [o.key, o.name]));
  const first = f.options[0]!;
  const flags = validityFlags(f);
  const models = modelsUsed(f);
  const classCount = f.options[0]?.evaluation.classes.length ?? 0;
  const materials = materialSources(f);
  const metricRows = f.metrics.flatMap((m) => METRIC_ROWS[m]);
  return (
    <article className="report-body" data-report-body>
      <header>
        <p className="text-xs font-medium uppercase tracking-wide text-copper-dark">
          Plateau report · version {report.version}
          {isDemo ? " · invented demo data" : ""}
        </p>
        <h1 className="mt-1 text-2xl font-semibold text-ink">{report.title}</h1>
        {report.audienceNote ? <p className="mt-2 max-w-3xl whitespace-pre-line text-sm text-ink">{report.audienceNote}</p> : null}
        <p className="mt-2 text-xs text-muted">
          Baseline <strong className="font-medium text-ink">{f.baseline.name}</strong> (version {f.baseline.version}) against{" "}
          {f.options.map((o, i) => (
            <span key={o.key}>
              {i > 0 ? (i === f.options.length - 1 ? " and " : ", ") : ""}
              <OptionSwatch k={o.key} />
              Option {o.key} <strong className="font-medium text-ink">{o.name}</strong>
            </span>
          ))}
          . Frozen {dateTime(report.createdAt)} with engine {f.engineVersion}; later edits to the scenarios do not change this report.
        </p>
      </header>

      <Section id="in-short" title="In short">
        <ul className="space-y-1.5 text-sm text-ink">
          {summary.verdicts.map((v) => (
            <li key={v.className} className="flex gap-2">
              <span aria-hidden="true" className="text-copper">
                ▸
              </span>
              <span>{v.sentence}</span>
            </li>
          ))}
          {summary.overall.map((s) => (
            <li key={s} className="flex gap-2">
              <span aria-hidden="true" className="text-faint">
                ▸
              </span>
              <span>{s}</span>
            </li>
          ))}
        </ul>
        {!summary.baselineConsistent ? (
          <p className="mt-2 text-xs text-warn">
            The options use different model levels or Miller factors, so each is compared with the baseline evaluated the same way; compare their deltas rather
            than their absolute figures.
          </p>
        ) : null}
      </Section>

      <Section id="headlines" title="Headline figures per option (whole design, all classes)">
        <p className="mb-3 text-xs text-muted">
          Changes are against the baseline ({first.evaluation.level === "ideal" ? "ideal model" : `model level “${first.evaluation.level}”`}
          ): worst-class delay {fixed(summary.headlines[0]!.worstDelay.baseline, PS)} ps ({summary.headlines[0]!.worstDelay.baselineClass}), mean net delay{" "}
          {fixed(summary.headlines[0]!.meanDelay.baseline, PS)} ps, wire capacitance {eng(summary.headlines[0]!.capacitance.baseline, "F")}, switching energy{" "}
          {eng(summary.headlines[0]!.energy.baseline, "J")}, {count(summary.headlines[0]!.repeaters.baseline)} repeaters. Green is lower (better), red higher.
        </p>
        <div className="grid gap-3 sm:grid-cols-2 print:grid-cols-2">
          {summary.headlines.map((h) => (
            <div key={h.key} className="report-card rounded-lg border border-rule bg-panel p-3 print:py-2">
              <h3 className="text-sm font-semibold text-ink">
                <OptionSwatch k={h.key} />
                Option {h.key}: {h.name}
              </h3>
              <p className="mt-1 text-xs text-ink">{h.sentence}</p>
              <dl className="mt-2">
                <Figure
                  label={`${FIGURE_LABEL.worstClassDelay} (${h.worstDelay.scenarioClass}, at mean length)`}
                  change={h.worstDelay}
                  value={fixed(h.worstDelay.scenario, PS)}
                  unit="ps"
                />
                <Figure label={FIGURE_LABEL.meanNetDelay} change={h.meanDelay} value={fixed(h.meanDelay.scenario, PS)} unit="ps" />
                <Figure label="Total wire capacitance" change={h.capacitance} value={eng(h.capacitance.scenario, "F")} />
                <Figure label="Switching energy, all nets once" change={h.energy} value={eng(h.energy.scenario, "J")} />
                <Figure label={`${FIGURE_LABEL.repeaters}, all nets`} change={h.repeaters} value={count(h.repeaters.scenario)} />
              </dl>
              <ClassRatioChart
                title="Delay per class against the baseline (1×)"
                data={(f.options.find((o) => o.key === h.key)?.evaluation.classes ?? [])
                  .filter((c) => f.classNames.includes(c.name))
                  .map((c) => ({ label: c.name, ratio: c.baseline.delayS > 0 ? c.scenario.delayS / c.baseline.delayS : NaN }))}
              />
            </div>
          ))}
        </div>
      </Section>

      <Section id="table" title="Side by side, per class" breakBefore>
        <div className="overflow-x-auto">
          <table className="num w-full border-collapse text-sm">
            <caption className="sr-only">Per class: baseline and each option, with the change against the baseline</caption>
            <thead>
              <tr className="border-b border-rule-strong text-left text-xs text-muted">
                <th scope="col" className="sticky left-0 z-10 bg-panel py-1.5 pr-3 font-medium print:static">
                  Class · quantity (unit)
                </th>
                <th scope="col" className="px-2 py-1.5 text-right font-medium">
                  Baseline
                </th>
                {f.options.map((o) => (
                  <th key={o.key} scope="colgroup" colSpan={2} className="px-2 py-1.5 text-right font-medium">
                    <OptionSwatch k={o.key} />
                    Option {o.key}
                    <span className="block font-normal text-faint">value · change</span>
                  </th>
                ))}
              </tr>
            </thead>
            {f.classNames.map((name) => {
              const base = first.evaluation.classes.find((c) => c.name === name)?.baseline;
              if (!base) return null;
              const rows: MetricRow[] = [
                { label: "Pitch", unit: "nm", value: (r) => r.pitchM, format: (v) => fixed(v, NM), kind: "context" },
                { label: "Mean length", unit: "µm", value: (r) => r.lengthM, format: (v) => fixed(v, UM), kind: "context" },
                ...metricRows,
              ];
              return (
                <tbody key={name} className="border-b border-rule">
                  <tr>
                    <th scope="rowgroup" colSpan={2 + 2 * f.options.length} className="bg-ground/70 px-1 py-1 text-left text-xs font-semibold text-ink">
                      <span className="sticky left-1">{name}</span>{" "}
                      <span className="font-normal text-muted">
                        · {base.tier} ·{" "}
                        {materialWords(
                          base,
                          f.options.map((o) => ({ key: o.key, r: o.evaluation.classes.find((x) => x.name === name)?.scenario })),
                        )}
                      </span>
                    </th>
                  </tr>
                  {rows.map((m) => (
                    <tr key={m.label} className="border-t border-rule/60">
                      <th scope="row" className="sticky left-0 z-10 bg-panel py-1 pr-3 pl-3 text-left text-xs font-normal text-muted print:static">
                        {m.label}
                        {m.unit ? ` (${m.unit})` : ""}
                        {m.atTemperature && base.temperatureC !== undefined ? ` at ${plain(base.temperatureC, 4)} °C` : ""}
                      </th>
                      <td className="num px-2 py-1 text-right tabular">{m.format(m.value(base))}</td>
                      {f.options.map((o) => {
                        const c = o.evaluation.classes.find((x) => x.name === name);
                        if (!c) return <td key={o.key} colSpan={2} />;
                        const bv = m.value(c.baseline);
                        const sv = m.value(c.scenario);
                        return [
                          <td key={`${o.key}v`} className="num px-2 py-1 text-right tabular">
                            {m.format(sv)}
                          </td>,
                          <td key={`${o.key}d`} className="num py-1 pr-2 text-right text-xs">
                            <CellDelta m={m} base={bv} value={sv} />
                          </td>,
                        ];
                      })}
                    </tr>
                  ))}
                </tbody>
              );
            })}
          </table>
        </div>
        <p className="mt-2 text-xs text-muted">
          Per net at the class&apos;s mean length. Change = option ÷ baseline − 1, each option against the baseline evaluated at its own model level and Miller
          factor.
        </p>
      </Section>

      {f.sweeps.length > 0 ? (
        <Section id="sweeps" title="Where delay stops improving: delay against S" breakBefore>
          <p className="mb-3 max-w-3xl text-xs text-muted">
            Each curve shrinks the cross-section further (larger S) with the option&apos;s other choices kept; wire lengths follow the class&apos;s rule (they
            shrink with S where the option scales lengths with the section, or for local and intermediate wires; otherwise they are kept), as each figure says.
            The marker is where the option sits; a triangle marks each curve&apos;s minimum. Where a curve bends upward, resistance grows faster than
            capacitance falls and a further shrink stops paying off. The grey dashed line is Option A without size effects: the gap to Option A is what electron
            scattering at surfaces and grain boundaries costs.
          </p>
          <div className="grid gap-6 lg:grid-cols-2 print:grid-cols-1">
            {f.sweeps.map((s) => (
              <div key={s.className}>
                <h3 className="mb-1 text-sm font-semibold text-ink">Class {s.className}</h3>
                <SweepFigure sweep={s} optionNames={optionNames} />
              </div>
            ))}
          </div>
        </Section>
      ) : null}

      {f.roadmaps && f.roadmaps.length > 0 ? (
        <Section id="roadmaps" title="Roadmaps: delay across the node steps" breakBefore>
          <RoadmapSection roadmaps={f.roadmaps} classNames={f.roadmaps[0]!.steps[0]!.evaluation.classes.map((c) => c.name)} />
        </Section>
      ) : null}

      {f.shaping ? (
        <Section id="shaping" title="Layer shaping: line fraction and aspect ratio at each option's pitch" breakBefore>
          <ShapingSection shaping={f.shaping} optionNames={optionNames} />
        </Section>
      ) : null}

      <Section id="assumptions" title="Assumptions: what each option changes" breakBefore>
        <div className="grid gap-3 sm:grid-cols-2 print:grid-cols-2">
          {f.options.map((o) => (
            <div key={o.key} className="report-card rounded-lg border border-rule bg-panel p-3">
              <h3 className="text-sm font-semibold text-ink">
                <OptionSwatch k={o.key} />
                Option {o.key}: {o.name} <span className="font-normal text-muted">(scenario version {o.version})</span>
              </h3>
              {o.notes ? <p className="mt-1 whitespace-pre-line text-xs text-muted">{o.notes}</p> : null}
              <ul className="mt-2 list-disc space-y-0.5 pl-4 text-xs text-ink">
                {optionAssumptions(f, o).map((a) => (
                  <li key={a}>{a}</li>
                ))}
              </ul>
            </div>
          ))}
        </div>
        <p className="mt-2 text-xs text-muted">
          Technology (same for all): supply {plain(f.baseline.technology.supplyV)} V, clock {eng(f.baseline.technology.clockHz, "Hz")}, minimum repeater R0{" "}
          {eng(f.baseline.technology.repeaterR0Ohm, "Ω")} and C0 {fixed(f.baseline.technology.repeaterC0F, FF)} fF, delay budget{" "}
          {eng(f.baseline.technology.delayBudgetS, "s")}; {technologyWords(f)}.
        </p>
      </Section>

      <Section id="models" title="Models, sources and accuracy">
        <table className="w-full border-collapse text-xs">
          <TableHead
            rowClassName="border-b border-rule-strong text-left text-muted"
            cell="py-1 pr-2"
            lastCell="py-1"
            columns={["Quantity", { label: "Model and published source", className: "w-[42%]" }, "Stated accuracy", "Used by (option: classes)"]}
          />
          <tbody>
            {models.map((m) => (
              <tr key={`${m.quantity}${m.model}`} className="border-b border-rule/60 align-top">
                <td className="py-1.5 pr-2 font-medium text-ink">{m.quantity}</td>
                <td className="py-1.5 pr-2 text-ink">
                  {m.model}
                  <ul className="mt-0.5 text-muted">
                    {m.sources.map((s) => (
                      <li key={s}>{s}</li>
                    ))}
                  </ul>
                </td>
                <td className="py-1.5 pr-2 text-muted">
                  <ul className="space-y-0.5">
                    {m.accuracy.map((a) => (
                      <li key={a}>{a}</li>
                    ))}
                  </ul>
                </td>
                <td className="py-1.5 text-muted" data-testid="model-used-by">
                  {m.usedBy.map((u) => {
                    const classes = m.classesByOption[u] ?? [];
                    const all = classes.length === classCount;
                    return (
                      <div key={u} className="whitespace-nowrap">
                        {u.replace("Option ", "")}
                        {all ? "" : `: ${classes.join(", ")}`}
                      </div>
                    );
                  })}
                </td>
              </tr>
            ))}
          </tbody>
        </table>
        {materials.length > 0 ? (
          <ul className="mt-2 space-y-0.5 text-xs text-muted">
            {materials.map((m) => (
              <li key={m.metal}>
                <span className="text-ink">{m.metal}</span>: resistivity {m.resistivity}; mean free path {m.meanFreePath}.
                {m.override ? (
                  <>
                    {" "}
                    <span className="text-ink">This baseline&apos;s values:</span> {m.override}; source: {m.overrideSource}.
                  </>
                ) : null}
              </li>
            ))}
          </ul>
        ) : null}
        <p className="mt-2 text-xs text-muted">
          Model levels available in engine {f.engineVersion}: {f.modelLevels.map((l) => `${l} (${levelWords(l)})`).join("; ")}.
        </p>
      </Section>

      <Section id="validity" title="Validity flags">
        {flags.length === 0 ? (
          <p className="text-sm text-good">Every input is inside the validity ranges of the models used.</p>
        ) : (
          <>
            <p className="mb-2 text-xs text-muted">
              Where an input leaves the range a model was fitted or derived on, the figure is less certain than the stated accuracy.
            </p>
            <ul className="space-y-0.5 text-xs">
              {flags.map((fl) => (
                <li key={`${fl.option}${fl.className}${fl.model}${fl.message}`} className="text-warn">
                  <span className="font-medium">
                    {fl.option} · {fl.className}
                  </span>
                  : {fl.message} <span className="text-muted">({fl.model})</span>
                </li>
              ))}
            </ul>
          </>
        )}
        {f.binsTrimmed ? (
          <p className="mt-2 text-xs text-muted">
            The baseline&apos;s length histograms were used for the totals; their bins are too many to keep in the report itself.
          </p>
        ) : null}
      </Section>

      <Section id="inputs" title="Baseline inputs">
        <div className="overflow-x-auto">
          <table className="num w-full border-collapse text-xs">
            <TableHead
              rowClassName="border-b border-rule-strong text-right text-muted"
              cell="px-1 py-1"
              columns={[
                { label: "Class", cell: "py-1 pr-2", className: "text-left" },
                { label: "Tier", cell: "py-1 pr-2", className: "text-left" },
                ...["Width (nm)", "Thickness (nm)", "Spacing (nm)", "ILD below (nm)", "ILD above (nm)", "Barrier (nm)"],
                { label: "Metal", className: "text-left" },
                "k",
                "Nets",
                "Mean length (µm)",
              ]}
            />
            <tbody>
              {f.baseline.classes.map((c) => (
                <tr key={c.name} className="border-b border-rule/60 text-right tabular">
                  <td className="py-1 pr-2 text-left text-ink">{c.name}</td>
                  <td className="py-1 pr-2 text-left text-muted">{c.tier}</td>
                  <td className="px-1 py-1">{fixed(c.widthM, NM)}</td>
                  <td className="px-1 py-1">{fixed(c.thicknessM, NM)}</td>
                  <td className="px-1 py-1">{fixed(c.spacingM, NM)}</td>
                  <td className="px-1 py-1">{c.ildBelowM === null ? "none" : fixed(c.ildBelowM, NM)}</td>
                  <td className="px-1 py-1">{c.ildAboveM === null ? "none" : fixed(c.ildAboveM, NM)}</td>
                  <td className="px-1 py-1">{fixed(c.barrierM, NM)}</td>
                  <td className="px-1 py-1 text-left">{c.metal}</td>
                  <td className="px-1 py-1">{plain(c.k)}</td>
                  <td className="px-1 py-1">{count(c.netCount)}</td>
                  <td className="px-1 py-1">{fixed(c.meanLengthM, UM)}</td>
                </tr>
              ))}
            </tbody>
          </table>
        </div>
      </Section>

      <div className="mt-8">
        <Caution />
      </div>
    </article>
  );
}

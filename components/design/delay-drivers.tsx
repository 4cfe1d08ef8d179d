import type { DelayParts, TornadoBar } from "@/lib/scaling";
import { DELAY_PART_LABEL, TORNADO_LABEL, type DelayPartKey } from "@/lib/workspace/shaping-view";

/** One colour per part (Plateau's chart palette), so the bar and its key match in print too. */
const PART_COLOR: Record<DelayPartKey, string> = {
  driverWireS: "#47627e",
  driverLoadS: "#8fa3b8",
  wireWireS: "#b4622d",
  wireLoadS: "#e0a77c",
  repeatersS: "#6d7d3a",
};
const PART_KEYS = Object.keys(DELAY_PART_LABEL) as DelayPartKey[];

const ps = (s: number) => Number((s * 1e12).toPrecision(3)).toString();
const pct = (v: number) => `${v > 0 ? "+" : v < 0 ? "−" : ""}${Number(Math.abs(v).toPrecision(2))}%`;

/**
 * The net's delay split into its parts as one horizontal stacked bar (the four Elmore terms fill the delay without
 * repeaters; what repeaters change is shown after it: a saving as a hatched stretch taken back from the end), with the
 * values in ps and their share of the delay with repeaters.
 */
export function DelayPartsBar({ parts }: { parts: DelayParts }) {
  const positive = PART_KEYS.filter((k) => k !== "repeatersS");
  const rep = parts.repeatersS;
  const full = Math.max(parts.unrepeatedS, parts.unrepeatedS + rep, 1e-30);
  const w = (s: number) => `${(Math.max(0, s) / full) * 100}%`;
  return (
    <div data-testid="delay-parts">
      <div
        className="relative flex h-6 w-full overflow-hidden rounded-sm border border-rule"
        role="img"
        aria-label={`Delay ${ps(parts.totalS)} ps split into its parts`}
      >
        {positive.map((k) => (
          <div key={k} style={{ width: w(parts[k]), background: PART_COLOR[k] }} title={`${DELAY_PART_LABEL[k]}: ${ps(parts[k])} ps`} />
        ))}
        {rep > 0 ? <div style={{ width: w(rep), background: PART_COLOR.repeatersS }} title={`Repeaters: +${ps(rep)} ps`} /> : null}
        {rep < 0 ? (
          <div
            className="absolute inset-y-0 right-0"
            style={{
              width: w(-rep),
              background: `repeating-linear-gradient(135deg, rgba(255,255,255,0.85) 0 3px, ${PART_COLOR.repeatersS} 3px 5px)`,
            }}
            title={`Repeaters save ${ps(-rep)} ps`}
          />
        ) : null}
      </div>
      <table className="mt-2 w-full text-xs">
        <thead>
          <tr className="text-left text-muted">
            <th className="py-0.5 font-medium">Part</th>
            <th className="py-0.5 text-right font-medium">ps</th>
            <th className="py-0.5 text-right font-medium">% of delay</th>
          </tr>
        </thead>
        <tbody>
          {PART_KEYS.map((k) => (
            <tr key={k} className="border-t border-rule/70">
              <td className="py-0.5">
                <span aria-hidden className="mr-1.5 inline-block h-2.5 w-2.5 rounded-sm align-middle" style={{ background: PART_COLOR[k] }} />
                {DELAY_PART_LABEL[k]}
              </td>
              <td className="py-0.5 text-right tabular-nums">{ps(parts[k])}</td>
              <td className="py-0.5 text-right tabular-nums">{parts.totalS > 0 ? pct((parts[k] / parts.totalS) * 100).replace("+", "") : "—"}</td>
            </tr>
          ))}
          <tr className="border-t border-rule font-medium">
            <td className="py-0.5">Delay with repeaters</td>
            <td className="py-0.5 text-right tabular-nums">{ps(parts.totalS)}</td>
            <td className="py-0.5 text-right tabular-nums">100%</td>
          </tr>
        </tbody>
      </table>
    </div>
  );
}

/** The ±step tornado: change in the delay for each input × (1 ± step), sorted by impact, bars left/right of zero in %. */
export function TornadoChart({ nominalS, step, bars, limit }: { nominalS: number; step: number; bars: TornadoBar[]; limit?: number }) {
  const shown = (limit ? bars.slice(0, limit) : bars).filter((b) => b.impactS > 0);
  const rel = (d: number) => (nominalS > 0 ? (d / nominalS) * 100 : 0);
  const max = Math.max(1e-9, ...shown.map((b) => Math.max(Math.abs(rel(b.deltaLowS)), Math.abs(rel(b.deltaHighS)))));
  const stepPct = Math.round(step * 100);
  const bar = (d: number, color: string, which: string) => {
    const v = rel(d);
    const width = `${(Math.abs(v) / max) * 50}%`;
    return (
      <div
        className="absolute inset-y-0.5"
        style={{ width, background: color, ...(v < 0 ? { right: "50%" } : { left: "50%" }) }}
        title={`${which}: ${pct(v)}`}
      />
    );
  };
  return (
    <div data-testid="tornado">
      <div className="mb-1 flex justify-between text-[11px] text-muted">
        <span>
          <span aria-hidden className="mr-1 inline-block h-2 w-2.5 align-middle" style={{ background: "#47627e" }} />
          input −{stepPct}%
        </span>
        <span>change in the net&apos;s delay (no repeaters)</span>
        <span>
          <span aria-hidden className="mr-1 inline-block h-2 w-2.5 align-middle" style={{ background: "#b4622d" }} />
          input +{stepPct}%
        </span>
      </div>
      <ul className="space-y-1">
        {shown.map((b) => (
          <li key={b.input} className="grid grid-cols-[7.5rem_3.2rem_minmax(0,1fr)_3.2rem] items-center gap-1 text-xs" data-testid="tornado-row">
            <span className="truncate">{TORNADO_LABEL[b.input] ?? b.input}</span>
            <span className="text-right tabular-nums text-muted">{pct(rel(b.deltaLowS))}</span>
            <div
              className="relative h-4"
              aria-label={`${TORNADO_LABEL[b.input]}: −${stepPct}% → ${pct(rel(b.deltaLowS))}, +${stepPct}% → ${pct(rel(b.deltaHighS))}`}
            >
              <div className="absolute inset-y-0 left-1/2 w-px bg-rule-strong" />
              {bar(b.deltaLowS, "#47627e", `−${stepPct}%`)}
              {bar(b.deltaHighS, "#b4622d", `+${stepPct}%`)}
            </div>
            <span className="tabular-nums text-muted">{pct(rel(b.deltaHighS))}</span>
          </li>
        ))}
      </ul>
    </div>
  );
}

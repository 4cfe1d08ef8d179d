import type { FrozenReport } from "@/lib/validation/report";
import type { FrozenShapingClass } from "@/lib/validation/report-shaping";
import { DELAY_PART_LABEL, OBJECTIVE_LABEL, percentChange, TORNADO_LABEL, type DelayPartKey } from "@/lib/workspace/shaping-view";

const nm = (v: number) => Number((v * 1e9).toPrecision(3)).toString();
const signed = (v: number, digits = 2) => {
  if (!Number.isFinite(v)) return "—";
  const r = Number(v.toPrecision(digits));
  return `${r > 0 ? "+" : r < 0 ? "−" : ""}${Math.abs(r)}%`;
};

/** The largest part of the delay, in words with its share. */
function mainPart(c: FrozenShapingClass): string {
  if (!c.parts || c.parts.totalS <= 0) return "—";
  const keys = (Object.keys(DELAY_PART_LABEL) as DelayPartKey[]).filter((k) => k !== "repeatersS");
  const k = keys.reduce((a, b) => (c.parts![b] > c.parts![a] ? b : a));
  // share of the delay without repeaters (the four Elmore parts add up to it; repeaters may take some back)
  const unrepeated = keys.reduce((sum, key) => sum + c.parts![key], 0);
  return `${DELAY_PART_LABEL[k]} ${Math.round((c.parts[k] / unrepeated) * 100)}%`;
}

/**
 * The report's "Layer shaping" section: per option a compact table of the chosen classes — current and optimum line
 * fraction and aspect ratio, the optimum's width / space / thickness, the objective and its change, the largest delay
 * part and the five inputs that move the delay most (±10%). Static: the same body prints.
 */
export function ShapingSection({ shaping, optionNames }: { shaping: NonNullable<FrozenReport["shaping"]>; optionNames: Record<string, string> }) {
  const obj = OBJECTIVE_LABEL[shaping.objective];
  const l = shaping.limits;
  return (
    <div className="space-y-4" data-testid="report-shaping">
      <p className="text-sm text-muted">
        Each class redrawn at its option&apos;s pitch: the line fraction (W/pitch, {l.minFraction}–{l.maxFraction}) and aspect ratio (T/W, 1–{l.maxAspect}) with
        the lowest {obj.short.toLowerCase()} ({obj.unit}) for the class&apos;s net, with its driver, load and repeaters, against the drawing the option has.
        &quot;Moves delay most&quot;: the change in the net&apos;s delay for each input −/+
        {Math.round((shaping.options[0]?.classes[0]?.tornado?.step ?? 0.1) * 100)}%.
        {shaping.omittedClasses.length > 0 ? ` Not shaped (at most 12 classes): ${shaping.omittedClasses.join(", ")}.` : ""}
      </p>
      {shaping.options.map((o) => (
        <div key={o.key} className="report-card overflow-x-auto">
          <h3 className="mb-1 text-sm font-semibold text-ink">
            Option {o.key}: {optionNames[o.key] ?? ""}
          </h3>
          <table className="w-full min-w-[44rem] text-xs">
            <thead>
              <tr className="border-b border-rule text-left text-muted">
                <th className="py-1 pr-2 font-medium">Class</th>
                <th className="py-1 pr-2 text-right font-medium">W/pitch now → best</th>
                <th className="py-1 pr-2 text-right font-medium">T/W now → best</th>
                <th className="py-1 pr-2 text-right font-medium">Best W / S / T (nm)</th>
                <th className="py-1 pr-2 text-right font-medium">
                  {obj.short} now → best ({obj.unit})
                </th>
                <th className="py-1 pr-2 text-right font-medium">Change</th>
                <th className="py-1 pr-2 font-medium">Largest delay part (share without repeaters)</th>
                <th className="py-1 font-medium">Moves delay most (−/+)</th>
              </tr>
            </thead>
            <tbody>
              {o.classes.map((c) =>
                c.error || !c.current || !c.optimum ? (
                  <tr key={c.className} className="border-b border-rule/60">
                    <td className="py-1 pr-2 font-medium">{c.className}</td>
                    <td colSpan={7} className="py-1 text-warn">
                      {c.error ?? "Not shaped."}
                    </td>
                  </tr>
                ) : (
                  <tr key={c.className} className="border-b border-rule/60 align-top">
                    <td className="py-1 pr-2 font-medium">
                      {c.className}
                      {c.optimum.flags.length > 0 ? (
                        <span className="block font-normal text-warn" title={c.optimum.flags.join(" ")}>
                          {c.optimum.flags.length} validity flag(s) at the best drawing
                        </span>
                      ) : null}
                    </td>
                    <td className="whitespace-nowrap py-1 pr-2 text-right tabular-nums">
                      {c.current.lineFraction.toFixed(2)} → {c.optimum.lineFraction.toFixed(3)}
                    </td>
                    <td className="whitespace-nowrap py-1 pr-2 text-right tabular-nums">
                      {c.current.aspectRatio.toFixed(2)} → {c.optimum.aspectRatio.toFixed(2)}
                    </td>
                    <td className="whitespace-nowrap py-1 pr-2 text-right tabular-nums">
                      {nm(c.optimum.widthM)} / {nm(c.optimum.spacingM)} / {nm(c.optimum.thicknessM)}
                    </td>
                    <td className="whitespace-nowrap py-1 pr-2 text-right tabular-nums">
                      {Number((c.current.objectiveValue / obj.unitSI).toPrecision(3))} → {Number((c.optimum.objectiveValue / obj.unitSI).toPrecision(3))}
                    </td>
                    <td className="whitespace-nowrap py-1 pr-2 text-right tabular-nums">
                      {signed(percentChange(c.current.objectiveValue, c.optimum.objectiveValue), 3)}
                    </td>
                    <td className="py-1 pr-2">{mainPart(c)}</td>
                    <td className="py-1">
                      {c.tornado && c.tornado.nominalS > 0
                        ? c.tornado.top
                            .map(
                              (t) =>
                                `${TORNADO_LABEL[t.input] ?? t.input} ${signed((t.deltaLowS / c.tornado!.nominalS) * 100)}/${signed((t.deltaHighS / c.tornado!.nominalS) * 100)}`,
                            )
                            .join("; ")
                        : "—"}
                    </td>
                  </tr>
                ),
              )}
            </tbody>
          </table>
        </div>
      ))}
    </div>
  );
}

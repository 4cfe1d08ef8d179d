"use client";
import { useEffect, useRef, useState } from "react";
import type { ClassResult, FieldSolveResult } from "@/lib/scaling";
import type { CapacitanceModels } from "./engine-protocol";
import { Button } from "@/components/ui/button";
import { inputClass } from "@/components/ui/field";
import { Notice } from "@/components/ui/card";
import { CrossSection } from "./cross-section";
import { EngineWorker } from "./engine-client";
import { fmt, U } from "./units";

const FF_PER_UM = { label: "fF/µm", unitSI: 1e-9, base: "" as const, suffix: "" };

/** Field check: the engine's numeric 2D solve in a Web Worker against the closed form, on the scenario's scaled cross-section. */
export function FieldCheck({ results }: { results: ClassResult[] }) {
  const [name, setName] = useState(results[0]?.name ?? "");
  const [resolution, setResolution] = useState<"coarse" | "default" | "fine">("default");
  const [progress, setProgress] = useState<number | null>(null);
  const [out, setOut] = useState<{ r: FieldSolveResult; cls: ClassResult; models: CapacitanceModels } | null>(null);
  const [error, setError] = useState<string | null>(null);
  const worker = useRef<EngineWorker | null>(null);
  useEffect(() => () => worker.current?.terminate(), []);
  const cls = results.find((r) => r.name === name) ?? results[0];
  if (!cls) return null;
  const below = cls.ildBelowM ?? cls.ildAboveM;
  const above = cls.ildBelowM === null ? null : cls.ildAboveM;

  async function run() {
    if (!cls || below === null) return;
    setError(null);
    setOut(null);
    setProgress(0);
    worker.current ??= new EngineWorker();
    // the class's own cross-section, with its air gap between the lines when it has one
    const section = {
      widthM: cls.widthM,
      thicknessM: cls.thicknessM,
      spacingM: cls.spacingM,
      heightBelowM: below,
      heightAboveM: above,
      k: cls.k,
      ...(cls.airGap ? { kGap: cls.airGap.kGap, gapFraction: cls.airGap.gapFraction } : {}),
    };
    try {
      const r = await worker.current.field({ ...section, resolution }, (f) => setProgress(f));
      const models = await worker.current.capacitance({ ...section, miller: 1 });
      setOut({ r, cls, models });
    } catch (e) {
      setError(e instanceof Error ? e.message : String(e));
    } finally {
      setProgress(null);
    }
  }

  // the two models the evaluation can use, on the same cross-section: the accurate tables and the published closed forms
  const accurate = out?.models.accurate ?? null;
  const closed = out?.models.published ?? null;
  const parts = (c: NonNullable<typeof closed>) => [c.areaFPerM + c.fringeFPerM, c.couplingEachFPerM, c.areaFPerM + c.fringeFPerM + 2 * c.couplingEachFPerM];
  const rows =
    out && closed && accurate
      ? (["Ground (to planes)", "Coupling (one neighbour)", "Total (ground + 2 × coupling)"] as const).map((label, i) => ({
          label,
          numeric: [out.r.groundFPerM, out.r.couplingEachFPerM, out.r.totalFPerM][i]!,
          accurate: parts(accurate)[i]!,
          closed: parts(closed)[i]!,
        }))
      : [];
  const diffCell = (v: number, ref: number) => {
    const diff = ref > 0 ? ((v - ref) / ref) * 100 : NaN;
    return (
      <td className={`tabular px-2 text-right ${Math.abs(diff) > 10 ? "text-bad" : Math.abs(diff) > 2 ? "text-warn" : "text-good"}`}>
        {Number.isFinite(diff) ? `${diff > 0 ? "+" : ""}${diff.toFixed(Math.abs(diff) < 1 ? 2 : 1)}%` : "—"}
      </td>
    );
  };

  return (
    <div className="grid gap-4 md:grid-cols-[auto_1fr]">
      <div className="space-y-2">
        <div className="flex items-end gap-2">
          <label className="text-xs">
            <span className="mb-1 block font-medium">Class</span>
            <select className={`${inputClass} py-1 text-xs`} value={cls.name} onChange={(e) => setName(e.target.value)}>
              {results.map((r) => (
                <option key={r.name} value={r.name}>
                  {r.name}
                </option>
              ))}
            </select>
          </label>
          <label className="text-xs">
            <span className="mb-1 block font-medium">Grid</span>
            <select className={`${inputClass} py-1 text-xs`} value={resolution} onChange={(e) => setResolution(e.target.value as typeof resolution)}>
              <option value="coarse">coarse</option>
              <option value="default">default</option>
              <option value="fine">fine</option>
            </select>
          </label>
          <Button onClick={run} disabled={progress !== null || below === null} variant="secondary">
            {progress !== null ? "Solving…" : "Run field check"}
          </Button>
        </div>
        <CrossSection
          widthM={cls.widthM}
          thicknessM={cls.thicknessM}
          spacingM={cls.spacingM}
          heightBelowM={below ?? cls.thicknessM}
          heightAboveM={above}
          barrierM={cls.barrierM}
          k={cls.k}
          airGap={cls.airGap ?? null}
        />
        <p className="max-w-[260px] text-[11px] text-muted">
          Scaled cross-section of the scenario: ILD k {fmt(cls.k, U.none, 3)}
          {cls.airGap
            ? `; between the lines, k ${fmt(cls.airGap.kGap, U.none, 3)} from their bottom up to ${fmt(100 * cls.airGap.gapFraction, U.none, 3)}% of their thickness (air gap)`
            : ""}
          . Neighbours are grounded.
        </p>
      </div>
      <div>
        {progress !== null ? (
          <div className="mb-3" aria-live="polite">
            <div className="mb-1 text-xs text-muted">Solving Laplace&apos;s equation on the cross-section… {Math.round(progress * 100)}%</div>
            <div
              className="h-2 w-full max-w-sm overflow-hidden rounded bg-rule"
              role="progressbar"
              aria-valuemin={0}
              aria-valuemax={100}
              aria-valuenow={Math.round(progress * 100)}
              aria-label="Field check progress"
            >
              <div className="h-full bg-copper transition-[width]" style={{ width: `${Math.max(3, progress * 100)}%` }} />
            </div>
          </div>
        ) : null}
        {error ? <Notice tone="bad">Field check failed: {error}</Notice> : null}
        {out ? (
          <div data-testid="field-check-result">
            <table className="num w-full max-w-2xl text-xs">
              <caption className="mb-1 text-left text-xs font-semibold text-ink">
                {out.cls.name}: numeric 2D solve vs the accurate tables and the published forms
                {out.cls.airGap ? " (with its air gap)" : ""}
              </caption>
              <thead className="text-muted">
                <tr className="border-b border-rule">
                  <th className="py-1 text-left font-medium">Part (fF/µm)</th>
                  <th className="px-2 text-right font-medium">Numeric</th>
                  <th className="px-2 text-right font-medium">Accurate</th>
                  <th className="px-2 text-right font-medium">Difference</th>
                  <th className="px-2 text-right font-medium">Published</th>
                  <th className="px-2 text-right font-medium">Difference</th>
                </tr>
              </thead>
              <tbody>
                {rows.map((r) => (
                  <tr key={r.label} className="border-b border-rule/60">
                    <td className="py-1">{r.label}</td>
                    <td className="tabular px-2 text-right">{fmt(r.numeric, FF_PER_UM)}</td>
                    <td className="tabular px-2 text-right">{fmt(r.accurate, FF_PER_UM)}</td>
                    {diffCell(r.accurate, r.numeric)}
                    <td className="tabular px-2 text-right">{fmt(r.closed, FF_PER_UM)}</td>
                    {diffCell(r.closed, r.numeric)}
                  </tr>
                ))}
              </tbody>
            </table>
            <p className="mt-1 max-w-2xl text-[11px] text-muted">Accurate: {accurate?.accuracy}</p>
            <p className="mt-1 max-w-2xl text-[11px] text-muted">Published: {closed?.accuracy}</p>
            {closed && closed.validity.length ? (
              <ul className="mt-1 max-w-2xl text-[11px] text-warn">
                {closed.validity.map((f, i) => (
                  <li key={i}>⚠ Published: {f.message}</li>
                ))}
              </ul>
            ) : null}
            {accurate && accurate.validity.length ? (
              <ul className="mt-1 max-w-2xl text-[11px] text-warn">
                {accurate.validity.map((f, i) => (
                  <li key={i}>⚠ Accurate: {f.message}</li>
                ))}
              </ul>
            ) : null}
            <p className="mt-1 text-[11px] text-muted">
              {out.r.cells.toLocaleString("en")} cells, {out.r.iterations} iterations, residual {out.r.residual.toExponential(1)}, {Math.round(out.r.elapsedMs)}{" "}
              ms. Difference = the model relative to the numeric solve.
            </p>
          </div>
        ) : progress === null && !error ? (
          <p className="text-sm text-muted">
            Run a field check to set the closed-form capacitance of a class against a numeric 2D solve of its scaled cross-section.
          </p>
        ) : null}
      </div>
    </div>
  );
}

/**
 * Benchmark of the numeric field check (lib/scaling/field-solve.ts): time of the default
 * resolution on typical cases and its error against a much finer grid.
 *
 * Cases: W = T = S = H = 20 nm, k = 1, with and without a plane 20 nm above the line (the
 * summary figures are over these two), and one layered case: W = 40, T = 80, S = 40,
 * H = H2 = 80 nm, k = 2.7 with an air gap (kGap = 1) up to half the line height and a 10 nm cap
 * of capK = 4.5 on the lines (its ground and coupling are also printed as ratios to the
 * homogeneous k = 2.7 solve of the same geometry).
 * Time: median wall time of 7 runs after 2 warm-up runs (single thread; the CPU time is printed
 * too, as it is less disturbed by a busy machine). Error: largest relative
 * difference of ground, coupling and total against resolution 40 (4× the default, about 16×
 * the cells), and against the Richardson extrapolation of resolutions 20 and 40 (second order).
 *
 * Called by scaling/bench.ts; run alone with `npx tsx scaling/bench-field.ts`.
 */
import { pathToFileURL } from "node:url";
import { fieldSolve, type FieldSolveInput, type FieldSolveResult } from "../lib/scaling/field-solve";

const NM = 1e-9;
const WARM_UP_RUNS = 2;
const TIMED_RUNS = 7;
const REFERENCE_RESOLUTION = 40;

interface BenchCase {
  name: string;
  input: FieldSolveInput;
  /** Layered case: reported, but kept out of the summary so that stays comparable over time. */
  layered?: boolean;
}

const CASES: BenchCase[] = [
  {
    name: "W=T=S=H=20nm, plane below only (open top)",
    input: { widthM: 20 * NM, thicknessM: 20 * NM, spacingM: 20 * NM, heightBelowM: 20 * NM, heightAboveM: null, k: 1 },
  },
  {
    name: "W=T=S=H=H2=20nm, planes below and above",
    input: { widthM: 20 * NM, thicknessM: 20 * NM, spacingM: 20 * NM, heightBelowM: 20 * NM, heightAboveM: 20 * NM, k: 1 },
  },
  {
    name: "layered: W=40 T=80 S=40 H=H2=80nm, k=2.7, air gap (kGap=1) to 0.5*T, 10nm cap capK=4.5",
    input: {
      widthM: 40 * NM,
      thicknessM: 80 * NM,
      spacingM: 40 * NM,
      heightBelowM: 80 * NM,
      heightAboveM: 80 * NM,
      k: 2.7,
      kGap: 1,
      gapFraction: 0.5,
      capThicknessM: 10 * NM,
      capK: 4.5,
    },
    layered: true,
  },
];

const QUANTITIES = ["groundFPerM", "couplingEachFPerM", "totalFPerM"] as const;

function median(values: number[]): number {
  const sorted = [...values].sort((a, b) => a - b);
  return sorted[Math.floor(sorted.length / 2)] ?? Number.NaN;
}

function maxRelErr(a: FieldSolveResult, ref: Record<(typeof QUANTITIES)[number], number>): number {
  return Math.max(...QUANTITIES.map((q) => Math.abs(a[q] / ref[q] - 1)));
}

const aFPerUm = (fPerM: number): string => (fPerM * 1e12).toFixed(4); // 1 pF/m = 1 aF/µm

/**
 * Runs the field-solver benchmark.
 * @returns ms: the slower case's median time at the default resolution; relErr: the largest
 *   relative error (ground, coupling or total, either case) against resolution 40; cells: the
 *   larger default cell count; lines: a readable report.
 */
export async function benchField(): Promise<{ ms: number; relErr: number; cells: number; lines: string[] }> {
  const lines: string[] = ["Field solver (2D finite volumes, MIC(0)-PCG), default resolution vs resolution 40:"];
  let ms = 0;
  let relErr = 0;
  let cells = 0;
  for (const c of CASES) {
    for (let i = 0; i < WARM_UP_RUNS; i++) fieldSolve(c.input);
    const runs: FieldSolveResult[] = [];
    const cpuMs: number[] = [];
    for (let i = 0; i < TIMED_RUNS; i++) {
      const before = process.cpuUsage();
      runs.push(fieldSolve(c.input));
      const used = process.cpuUsage(before);
      cpuMs.push((used.user + used.system) / 1000);
    }
    const result = runs[runs.length - 1]!;
    const caseMs = median(runs.map((r) => r.elapsedMs));
    const fine20 = fieldSolve({ ...c.input, resolution: 20 });
    const fine = fieldSolve({ ...c.input, resolution: REFERENCE_RESOLUTION });
    const extrapolated = Object.fromEntries(QUANTITIES.map((q) => [q, fine[q] + (fine[q] - fine20[q]) / 3])) as Record<(typeof QUANTITIES)[number], number>;
    const err = maxRelErr(result, fine);
    const errExtrapolated = maxRelErr(result, extrapolated);
    if (!c.layered) {
      ms = Math.max(ms, caseMs);
      relErr = Math.max(relErr, err);
      cells = Math.max(cells, result.cells);
    }
    lines.push(
      `  ${c.name}`,
      `    default: ${caseMs.toFixed(1)} ms wall, ${median(cpuMs).toFixed(1)} ms CPU (medians of ${TIMED_RUNS}), ` +
        `${result.cells} cells, ${result.iterations} iterations`,
      `    C' [aF/um] ground ${aFPerUm(result.groundFPerM)}, coupling ${aFPerUm(result.couplingEachFPerM)}, total ${aFPerUm(result.totalFPerM)}`,
      `    resolution ${REFERENCE_RESOLUTION}: ground ${aFPerUm(fine.groundFPerM)}, coupling ${aFPerUm(fine.couplingEachFPerM)}, total ${aFPerUm(fine.totalFPerM)} (${fine.cells} cells, ${fine.elapsedMs.toFixed(0)} ms)`,
      `    max relative error: ${(err * 100).toFixed(3)}% vs resolution ${REFERENCE_RESOLUTION}, ${(errExtrapolated * 100).toFixed(3)}% vs Richardson(20, 40)`,
    );
    if (c.layered) {
      const homogeneous = fieldSolve({ ...c.input, kGap: c.input.k, capK: c.input.k }); // kGap = capK = k: no layers
      lines.push(
        `    vs homogeneous k=${c.input.k}: ground x${(result.groundFPerM / homogeneous.groundFPerM).toFixed(4)}, ` +
          `coupling x${(result.couplingEachFPerM / homogeneous.couplingEachFPerM).toFixed(4)}, total x${(result.totalFPerM / homogeneous.totalFPerM).toFixed(4)}`,
      );
    }
  }
  lines.push(`  summary (homogeneous cases): ${ms.toFixed(1)} ms, max error ${(relErr * 100).toFixed(3)}%, ${cells} cells (target ≤ 250 ms, < 1%)`);
  return { ms, relErr, cells, lines };
}

if (process.argv[1] !== undefined && import.meta.url === pathToFileURL(process.argv[1]).href) {
  const { lines } = await benchField();
  console.log(lines.join("\n"));
}

/**
 * Generates lib/scaling/cap-table-data.ts, the tables read by lib/scaling/cap-accurate.ts: our own 2D field solver
 * (lib/scaling/field-solve.ts) over a grid of the dimensionless inputs, and the held-out references that measure the
 * interpolation.
 *
 *   nice -n 19 npm run scaling:tables                 full tables (51,408 solves: 45 min wall on 2 shared, busy cores;
 *                                                     about 25 min on 2 idle ones)
 *   nice -n 19 npm run scaling:tables -- --quick      tiny smoke grid, written to the temp folder (seconds)
 *   nice -n 19 npm run scaling:tables -- --heldout    random held-out geometries → tests/scaling/cap-accurate-heldout.json,
 *                                                     then the model's max and RMS errors against them
 *   nice -n 19 npm run scaling:tables -- --resolution-check
 *                                                     the solver's own error at the table resolution (vs 2× finer and
 *                                                     the Richardson extrapolation) on a sample of geometries
 *   nice -n 19 npm run scaling:tables -- --reuse      as the first, but nodes the committed table already holds are
 *                                                     copied from it (the same integers a solve gives): refining an
 *                                                     axis by halving its step solves only the new nodes
 *   options: --out <file> (table file), --workers <1|2> (default 2), --count <n> (held-out cases, default 600)
 *
 * Work runs in worker threads (2 by default; the process lowers its own priority first, and the threads inherit it).
 * Every finished solve is appended to a checkpoint file in the temp folder (named by a hash of the grid, the
 * resolution and the solver's source), so an interrupted run resumes where it stopped. Progress and an ETA are
 * printed every 20 s.
 *
 * What is tabulated (all capacitances divided by ε0·k, which makes them depend on ratios only; the solves use
 * H = 100 nm and k = 4 so that kGap = 4·kGap/k ≥ 1):
 * - table A, kGap = k: ln(C/C_base) of ground and coupling, C_base = tableBases (cap-accurate.ts), on a uniform grid in
 *   ln(W/H) (9 nodes, 0.2–20), ln(T/H) (7, 0.3–4), ln(S/H) (12, 0.3–10) and z = sqrt(H/(H + H2)) (12, 0–sqrt(1/1.3):
 *   no plane above, then H2/H from ∞ down to 0.3), at resolution 20 (cells across the smallest feature).
 * - table B, the gap layer: ln(C_gap/C_homogeneous) of ground and coupling on ln(W/H) (6), ln(T/H) (7), ln(S/H) (8),
 *   z (11), ρ = ln(kGap/k) (3: 0.25, 0.5, 1) and ξ = ln(f + 0.02) − ln(1 − f + 0.02) (11, f = gapFraction 0…1), at
 *   resolution 10: the ratio converges much faster than the capacitances (within 0.02% for ground and 0.3% for
 *   coupling of resolution 24 on 24 random cases, where the capacitances themselves move by up to 3%).
 * Resolution 20 for table A and the references: `--resolution-check` measures the solver's own error there (against
 * resolution 40 and the Richardson extrapolation, 20 random cases) at ≤ 0.07% ground, ≤ 0.08% total and ≤ 0.2% coupling
 * where the coupling is ≥ 1% of the total (up to 1.2% for couplings below 1e-3 of the total, at large S/H under a
 * plane), well below the 1% target; 16 would have been 0.3% for coupling, 24 costs 1.7× more.
 * The solver's tolerance is tightened to 1e-14 (default 1e-12) so that couplings down to about 1e-5 of the total are
 * converged (smaller ones are not, even at 1e-16, so their references carry a few % of solver noise).
 */
import { createHash } from "node:crypto";
import { appendFileSync, existsSync, mkdirSync, readFileSync, writeFileSync } from "node:fs";
import { setPriority, tmpdir } from "node:os";
import { join } from "node:path";
import { fileURLToPath } from "node:url";
import { Worker, isMainThread, parentPort } from "node:worker_threads";
import { fieldSolve } from "../lib/scaling/field-solve";

const H_M = 100e-9;
const K_SOLVE = 4;
const EPS_SOLVE = 8.8541878188e-12 * K_SOLVE;
const TOLERANCE = 1e-14;
const GAP_EPS = 0.02; // must equal cap-accurate.ts's GAP_EPS (checked in main)
const Z_MAX = Math.sqrt(1 / 1.3);

/** One axis: uniform in its coordinate from lo to hi with n nodes. */
interface Axis {
  lo: number;
  hi: number;
  n: number;
}
interface Grid {
  resolutionA: number;
  resolutionB: number;
  a: [Axis, Axis, Axis, Axis];
  b: [Axis, Axis, Axis, Axis, Axis, Axis];
}

const xi = (f: number): number => Math.log(f + GAP_EPS) - Math.log(1 - f + GAP_EPS);
const fFromXi = (x: number): number => {
  const e = Math.exp(x);
  return Math.min(1, Math.max(0, (e * (1 + GAP_EPS) - GAP_EPS) / (1 + e)));
};

const W_AXIS = (n: number): Axis => ({ lo: Math.log(0.2), hi: Math.log(20), n });
const T_AXIS = (n: number): Axis => ({ lo: Math.log(0.3), hi: Math.log(4), n });
const S_AXIS = (n: number): Axis => ({ lo: Math.log(0.3), hi: Math.log(10), n });
const Z_AXIS = (n: number): Axis => ({ lo: 0, hi: Z_MAX, n });
const RHO_AXIS: Axis = { lo: Math.log(0.25), hi: 0, n: 3 };
const XI_AXIS = (n: number): Axis => ({ lo: xi(0), hi: xi(1), n });

const FULL: Grid = {
  resolutionA: 20,
  resolutionB: 10,
  a: [W_AXIS(9), T_AXIS(7), S_AXIS(12), Z_AXIS(12)],
  b: [W_AXIS(6), T_AXIS(7), S_AXIS(8), Z_AXIS(11), RHO_AXIS, XI_AXIS(11)],
};
const QUICK: Grid = {
  resolutionA: 5,
  resolutionB: 5,
  a: [W_AXIS(4), T_AXIS(4), S_AXIS(4), Z_AXIS(4)],
  b: [W_AXIS(2), T_AXIS(4), S_AXIS(4), Z_AXIS(4), RHO_AXIS, XI_AXIS(4)],
};

const node = (ax: Axis, i: number): number => (ax.n === 1 ? ax.lo : ax.lo + ((ax.hi - ax.lo) * i) / (ax.n - 1));
const step = (ax: Axis): number => (ax.hi - ax.lo) / (ax.n - 1);
const uFromZ = (z: number): number => (z === 0 ? 0 : (z * z) / (1 - z * z)); // H/H2

/** One field solve in dimensionless inputs: w = W/H, t = T/H, s = S/H, u = H/H2 (0: none), r = kGap/k, f. */
interface Job {
  w: number;
  t: number;
  s: number;
  u: number;
  r: number;
  f: number;
  n: number;
  /** Held-out cases: the exact SI input (then w … f only describe it). */
  si?: SiInput;
}
interface SiInput {
  widthM: number;
  thicknessM: number;
  spacingM: number;
  heightBelowM: number;
  heightAboveM: number | null;
  k: number;
  kGap: number;
  gapFraction: number;
}
interface Solved {
  g: number; // ground / (ε0·k)
  c: number; // coupling to one neighbour / (ε0·k)
  ms: number;
  cells: number;
}

function solveJob(j: Job): Solved {
  if (j.si) {
    const res = fieldSolve({ ...j.si, resolution: j.n, tolerance: TOLERANCE });
    const eps = 8.8541878188e-12 * j.si.k;
    return { g: res.groundFPerM / eps, c: res.couplingEachFPerM / eps, ms: res.elapsedMs, cells: res.cells };
  }
  const res = fieldSolve({
    widthM: j.w * H_M,
    thicknessM: j.t * H_M,
    spacingM: j.s * H_M,
    heightBelowM: H_M,
    heightAboveM: j.u === 0 ? null : H_M / j.u,
    k: K_SOLVE,
    kGap: K_SOLVE * j.r,
    gapFraction: j.f,
    resolution: j.n,
    tolerance: TOLERANCE,
  });
  return { g: res.groundFPerM / EPS_SOLVE, c: res.couplingEachFPerM / EPS_SOLVE, ms: res.elapsedMs, cells: res.cells };
}

if (!isMainThread) {
  parentPort!.on("message", (m: { id: number; job: Job }) => {
    try {
      parentPort!.postMessage({ id: m.id, result: solveJob(m.job) });
    } catch (e) {
      parentPort!.postMessage({ id: m.id, error: e instanceof Error ? e.message : String(e) });
    }
  });
}

const fmtTime = (ms: number): string => {
  const s = Math.round(ms / 1000);
  return s >= 3600
    ? `${Math.floor(s / 3600)}h${String(Math.floor((s % 3600) / 60)).padStart(2, "0")}m`
    : `${Math.floor(s / 60)}m${String(s % 60).padStart(2, "0")}s`;
};

/**
 * Solves `jobs` on `workers` threads, resuming from and appending to the checkpoint `name` in the temp folder.
 * `kind(i)` labels a job for the per-kind timing used by the ETA.
 */
async function runJobs(jobs: Job[], name: string, workers: number, label: string): Promise<Solved[]> {
  const dir = join(tmpdir(), "plateau-cap-table");
  mkdirSync(dir, { recursive: true });
  const checkpoint = join(dir, `${name}.jsonl`);
  const results: (Solved | undefined)[] = new Array(jobs.length);
  let resumed = 0;
  if (existsSync(checkpoint)) {
    for (const line of readFileSync(checkpoint, "utf8").split("\n")) {
      if (!line) continue;
      try {
        const r = JSON.parse(line) as { i: number } & Solved;
        if (r.i >= 0 && r.i < jobs.length && results[r.i] === undefined) {
          results[r.i] = { g: r.g, c: r.c, ms: r.ms, cells: r.cells };
          resumed++;
        }
      } catch {
        // a line cut by a crash: solved again
      }
    }
  }
  const todo: number[] = [];
  for (let i = 0; i < jobs.length; i++) if (results[i] === undefined) todo.push(i);
  console.log(`${label}: ${jobs.length} solves, ${resumed} from the checkpoint ${checkpoint}, ${todo.length} to do on ${workers} worker(s)`);
  if (todo.length === 0) return results as Solved[];

  // Expected cost of a job ∝ n³ (cells ∝ n², iterations ∝ n): the ETA weighs the remaining work by it.
  const cost = (j: Job): number => j.n ** 3;
  let remainingCost = todo.reduce((a, i) => a + cost(jobs[i]!), 0);
  let doneCost = 0;
  let done = 0;
  const start = Date.now();
  let lastPrint = start;
  let next = 0;
  const bootstrap = `import(${JSON.stringify(import.meta.resolve("tsx/esm/api"))}).then((api) => { api.register(); return import(${JSON.stringify(import.meta.url)}); });`;
  const progress = (force: boolean): void => {
    const now = Date.now();
    if (!force && now - lastPrint < 20_000) return;
    lastPrint = now;
    const elapsed = now - start;
    const eta = doneCost > 0 ? (elapsed * remainingCost) / doneCost : NaN;
    const pct = ((100 * (resumed + done)) / jobs.length).toFixed(1);
    console.log(`  ${label}: ${resumed + done}/${jobs.length} (${pct}%), elapsed ${fmtTime(elapsed)}, ETA ${Number.isFinite(eta) ? fmtTime(eta) : "?"}`);
  };
  await Promise.all(
    Array.from(
      { length: Math.min(workers, todo.length) },
      () =>
        new Promise<void>((resolve, reject) => {
          const worker = new Worker(bootstrap, { eval: true });
          const feed = (): void => {
            if (next >= todo.length) {
              void worker.terminate().then(() => resolve());
              return;
            }
            const id = todo[next++]!;
            worker.postMessage({ id, job: jobs[id] });
          };
          worker.on("message", (m: { id: number; result?: Solved; error?: string }) => {
            if (m.error !== undefined || !m.result) {
              reject(new Error(`solve ${m.id} (${JSON.stringify(jobs[m.id])}) failed: ${m.error}`));
              void worker.terminate();
              return;
            }
            results[m.id] = m.result;
            appendFileSync(checkpoint, JSON.stringify({ i: m.id, ...m.result }) + "\n");
            const c = cost(jobs[m.id]!);
            doneCost += c;
            remainingCost -= c;
            done++;
            progress(false);
            feed();
          });
          worker.on("error", reject);
          feed();
        }),
    ),
  );
  progress(true);
  console.log(`  ${label}: done in ${fmtTime(Date.now() - start)} wall time`);
  return results as Solved[];
}

function signature(parts: unknown): string {
  const solver = readFileSync(fileURLToPath(new URL("../lib/scaling/field-solve.ts", import.meta.url)), "utf8");
  return createHash("sha256").update(JSON.stringify({ parts, TOLERANCE, H_M, K_SOLVE })).update(solver).digest("hex").slice(0, 16);
}

/** Deterministic shuffle (so partial results and the ETA cover the whole grid evenly). */
function shuffled(n: number, seed: number): number[] {
  const order = Array.from({ length: n }, (_, i) => i);
  const rand = mulberry32(seed);
  for (let i = n - 1; i > 0; i--) {
    const j = Math.floor(rand() * (i + 1));
    [order[i], order[j]] = [order[j]!, order[i]!];
  }
  return order;
}

/** Mulberry32, a small seeded PRNG (public domain, T. Ettinger). */
function mulberry32(seed: number): () => number {
  let a = seed >>> 0;
  return () => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = a;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

async function prettierFormat(text: string, filepath: string): Promise<string> {
  const prettier = await import("prettier");
  // The repository's settings, also for an --out file outside it.
  const options = (await prettier.resolveConfig(fileURLToPath(new URL("../package.json", import.meta.url)))) ?? {};
  return prettier.format(text, { ...options, filepath });
}

/** Lines of comma-separated numbers (prettier re-flows them anyway). */
function numberList(values: ArrayLike<number>): string {
  const out: string[] = [];
  for (let i = 0; i < values.length; i += 20)
    out.push(Array.from({ length: Math.min(20, values.length - i) }, (_, k) => String(values[i + k])).join(", ") + ",");
  return out.join("\n");
}

/** The committed table (cap-table-data.ts) decoded for `--reuse`: its axes and stored integers. */
interface CommittedTables {
  aAxes: Float64Array;
  aValues: Int32Array;
  bAxes: Float64Array;
  bValues: Int32Array;
}

/** Index of `value` among the nodes of a committed axis ([lo, step, n] at `axes[3·axis]`), or −1 when it is not a node. */
function committedNode(axes: Float64Array, axis: number, value: number): number {
  const lo = axes[3 * axis]!;
  const st = axes[3 * axis + 1]!;
  const n = axes[3 * axis + 2]!;
  const p = n === 1 ? 0 : (value - lo) / st;
  const i = Math.round(p);
  return i >= 0 && i < n && Math.abs(p - i) < 1e-9 ? i : -1;
}

async function makeTables(grid: Grid, outFile: string, workers: number, reuse: CommittedTables | null): Promise<void> {
  const { tableBases, GAP_EPS: modelEps } = await import("../lib/scaling/cap-accurate");
  if (modelEps !== GAP_EPS) throw new Error(`GAP_EPS differs from cap-accurate.ts (${modelEps})`);
  const [aw, at, as, az] = grid.a;
  const [bw, bt, bs, bz, brho, bxi] = grid.b;
  const jobs: Job[] = [];
  // Table A: homogeneous.
  const aStart = jobs.length;
  for (let i = 0; i < aw.n; i++)
    for (let j = 0; j < at.n; j++)
      for (let k = 0; k < as.n; k++)
        for (let l = 0; l < az.n; l++)
          jobs.push({ w: Math.exp(node(aw, i)), t: Math.exp(node(at, j)), s: Math.exp(node(as, k)), u: uFromZ(node(az, l)), r: 1, f: 1, n: grid.resolutionA });
  const aCount = jobs.length - aStart;
  // Table B: per geometry node one homogeneous solve, then the non-trivial (ρ < 0, f > 0) nodes.
  const bStart = jobs.length;
  const perGeometry = 1 + (brho.n - 1) * (bxi.n - 1);
  for (let i = 0; i < bw.n; i++)
    for (let j = 0; j < bt.n; j++)
      for (let k = 0; k < bs.n; k++)
        for (let l = 0; l < bz.n; l++) {
          const geo = { w: Math.exp(node(bw, i)), t: Math.exp(node(bt, j)), s: Math.exp(node(bs, k)), u: uFromZ(node(bz, l)), n: grid.resolutionB };
          jobs.push({ ...geo, r: 1, f: 1 });
          for (let a = 0; a < brho.n - 1; a++) for (let m = 1; m < bxi.n; m++) jobs.push({ ...geo, r: Math.exp(node(brho, a)), f: fFromXi(node(bxi, m)) });
        }
  const bGeometries = (jobs.length - bStart) / perGeometry;
  console.log(
    `table A: ${aw.n}×${at.n}×${as.n}×${az.n} = ${aCount} solves at resolution ${grid.resolutionA}; ` +
      `table B: ${bw.n}×${bt.n}×${bs.n}×${bz.n} = ${bGeometries} geometries × ${perGeometry} = ${jobs.length - bStart} solves at resolution ${grid.resolutionB}`,
  );
  // --reuse: nodes that the committed table already holds are copied from it (the stored integers are what a solve
  // would give again: the solver is deterministic and the values are rounded the same way), so refining one axis by
  // halving its step solves only the new nodes. Table A is reused when its grid is unchanged; table B node by node when
  // every axis but z is unchanged and the node's z is a committed z node.
  const aReused = reuse !== null && grid.a.every((ax, d) => [ax.lo, step(ax), ax.n].every((v, e) => Math.abs(v - reuse.aAxes[3 * d + e]!) < 1e-12));
  const bOldGeometry: number[] = []; // per new B geometry: index of the committed geometry holding it, or −1
  {
    const old = reuse?.bAxes;
    const sameOtherAxes =
      old !== undefined && [0, 1, 2, 4, 5].every((d) => [grid.b[d]!.lo, step(grid.b[d]!), grid.b[d]!.n].every((v, e) => Math.abs(v - old[3 * d + e]!) < 1e-12));
    for (let i = 0; i < bw.n; i++)
      for (let j = 0; j < bt.n; j++)
        for (let k = 0; k < bs.n; k++)
          for (let l = 0; l < bz.n; l++) {
            const oz = sameOtherAxes ? committedNode(old, 3, node(bz, l)) : -1;
            bOldGeometry.push(oz < 0 ? -1 : ((i * old![5]! + j) * old![8]! + k) * old![11]! + oz);
          }
  }
  const needed = jobs.map((_, q) => (q < bStart ? !aReused : bOldGeometry[Math.floor((q - bStart) / perGeometry)]! < 0));
  const neededIdx = jobs.flatMap((_, q) => (needed[q] ? [q] : []));
  if (reuse !== null) {
    const geoReused = bOldGeometry.filter((g) => g >= 0).length;
    console.log(
      `--reuse: table A ${aReused ? "copied from the committed file" : "solved (its grid changed)"}; table B: ${geoReused} of ${bGeometries} geometries copied; ${neededIdx.length} solves left`,
    );
  }
  const order = shuffled(neededIdx.length, 20261202);
  const shuffledJobs = order.map((i) => jobs[neededIdx[i]!]!);
  const t0 = Date.now();
  const solvedShuffled = await runJobs(shuffledJobs, `tables-${signature({ grid, reuse: reuse !== null })}`, workers, "tables");
  const solved: (Solved | undefined)[] = new Array(jobs.length);
  order.forEach((orig, pos) => (solved[neededIdx[orig]!] = solvedShuffled[pos]!));
  const wallMs = Date.now() - t0;

  const split = { area: 0, ground: 0, couple: 0 };
  const aValues = new Int32Array(aCount * 2);
  if (aReused) aValues.set(reuse!.aValues);
  for (let q = 0; q < aCount && !aReused; q++) {
    const j = jobs[aStart + q]!;
    const r = solved[aStart + q]!;
    if (!(r.g > 0 && r.c > 0)) throw new Error(`non-positive capacitance at ${JSON.stringify(j)}: ${r.g}, ${r.c}`);
    tableBases(j.w, j.t, j.s, j.u, split);
    aValues[2 * q] = Math.round(Math.log(r.g / split.ground) * 1e5);
    aValues[2 * q + 1] = Math.round(Math.log(r.c / split.couple) * 1e5);
  }
  const stored = perGeometry - 1;
  const bValues = new Int32Array(bGeometries * stored * 2);
  let minRatio = Infinity;
  for (let gIdx = 0; gIdx < bGeometries; gIdx++) {
    const oldGeo = bOldGeometry[gIdx]!;
    if (oldGeo >= 0) {
      const from = oldGeo * stored * 2;
      bValues.set(reuse!.bValues.subarray(from, from + stored * 2), gIdx * stored * 2);
      for (let q = 0; q < stored * 2; q++) minRatio = Math.min(minRatio, Math.exp(reuse!.bValues[from + q]! * 1e-4));
      continue;
    }
    const h = solved[bStart + gIdx * perGeometry]!;
    for (let p = 0; p < stored; p++) {
      const r = solved[bStart + gIdx * perGeometry + 1 + p]!;
      const rg = r.g / h.g;
      const rc = r.c / h.c;
      if (!(rg > 0 && rc > 0)) throw new Error(`non-positive ratio at ${JSON.stringify(jobs[bStart + gIdx * perGeometry + 1 + p])}`);
      minRatio = Math.min(minRatio, rg, rc);
      bValues[(gIdx * stored + p) * 2] = Math.round(Math.log(rg) * 1e4);
      bValues[(gIdx * stored + p) * 2 + 1] = Math.round(Math.log(rc) * 1e4);
    }
  }
  const axes = (list: Axis[]): string => list.map((ax) => `${ax.lo}, ${step(ax)}, ${ax.n}`).join(",\n  ");
  const text = `/**
 * GENERATED by scaling/make-cap-table.ts — do not edit by hand (run \`nice -n 19 npm run scaling:tables\`).
 *
 * Tables of our own 2D field solver (lib/scaling/field-solve.ts, tolerance ${TOLERANCE}) read by cap-accurate.ts.
 * Capacitances are divided by ε0·k; W, T, S, H2 by H; z = sqrt(H/(H + H2)) (0: no plane above).
 * Axes: [first node, step, node count] per axis, uniform in the coordinate.
 * A: ln(W/H), ln(T/H), ln(S/H), z; kGap = k; resolution ${grid.resolutionA}; values round(1e5·ln(C/C_base)) of ground and
 *    coupling interleaved, index (((iw·nT + it)·nS + is)·nZ + iz)·2 (+1 for coupling); C_base = tableBases.
 * B: ln(W/H), ln(T/H), ln(S/H), z, ρ = ln(kGap/k), ξ = ln(f + ${GAP_EPS}) − ln(1 − f + ${GAP_EPS}); resolution ${grid.resolutionB};
 *    values round(1e4·ln(C_gap/C_homogeneous)) of ground and coupling interleaved, only for ρ < 0 and f > 0 (the ratio
 *    is 1 elsewhere): index ((((iw·nT + it)·nS + is)·nZ + iz)·(nρ − 1)·(nξ − 1) + iρ·(nξ − 1) + iξ − 1)·2.
 *    Smallest ratio ${minRatio.toFixed(4)}.
 */

export const A_AXES = new Float64Array([
  ${axes(grid.a)},
]);
export const A_SCALE = 1e-5;
export const A_VALUES = new Int32Array([
${numberList(aValues)}
]);

export const B_AXES = new Float64Array([
  ${axes(grid.b)},
]);
export const B_SCALE = 1e-4;
export const B_VALUES = new Int32Array([
${numberList(bValues)}
]);
`;
  writeFileSync(outFile, await prettierFormat(text, outFile));
  const size = readFileSync(outFile).length;
  console.log(`wrote ${outFile}: ${aValues.length + bValues.length} numbers, ${(size / 1024).toFixed(0)} KiB; solves took ${fmtTime(wallMs)} wall time`);
}

// ---------------------------------------------------------------------------------------------------------------
// Held-out references.

interface HeldOutCase extends SiInput {
  groundFPerM: number;
  couplingEachFPerM: number;
  totalFPerM: number;
  cells: number;
}

const HELDOUT_FILE = fileURLToPath(new URL("../tests/scaling/cap-accurate-heldout.json", import.meta.url));
const HELDOUT_SEED = 11_003;

/** Random geometries, uniform in the table coordinates over the whole covered range (none of them on grid nodes). */
function heldOutInputs(count: number): SiInput[] {
  const rand = mulberry32(HELDOUT_SEED);
  const uni = (lo: number, hi: number): number => lo + (hi - lo) * rand();
  const cases: SiInput[] = [];
  for (let i = 0; i < count; i++) {
    const h = Math.exp(uni(Math.log(20e-9), Math.log(300e-9)));
    const w = Math.exp(uni(Math.log(0.2), Math.log(20)));
    const t = Math.exp(uni(Math.log(0.3), Math.log(4)));
    const s = Math.exp(uni(Math.log(0.3), Math.log(10)));
    const z = uni(0, Z_MAX);
    const none = i % 4 === 0; // a quarter with no plane above
    const homogeneous = Math.floor(i / 4) % 4 === 0; // a quarter with kGap = k
    const r = homogeneous ? 1 : Math.exp(uni(Math.log(0.25), 0));
    const f = fFromXi(uni(xi(0), xi(1)));
    const k = Math.max(uni(2.2, 4.2), 1 / r);
    cases.push({
      widthM: w * h,
      thicknessM: t * h,
      spacingM: s * h,
      heightBelowM: h,
      heightAboveM: none || z === 0 ? null : h * (1 / (z * z) - 1),
      k,
      kGap: homogeneous ? k : Math.max(1, r * k),
      gapFraction: f,
    });
  }
  return cases;
}

const siJob = (c: SiInput, n: number): Job => ({
  w: c.widthM / c.heightBelowM,
  t: c.thicknessM / c.heightBelowM,
  s: c.spacingM / c.heightBelowM,
  u: c.heightAboveM === null ? 0 : c.heightBelowM / c.heightAboveM,
  r: c.kGap / c.k,
  f: c.gapFraction,
  n,
  si: c,
});

async function makeHeldOut(count: number, resolution: number, workers: number): Promise<void> {
  const inputs = heldOutInputs(count);
  const solved = await runJobs(
    inputs.map((c) => siJob(c, resolution)),
    `heldout-${signature({ count, resolution, HELDOUT_SEED })}`,
    workers,
    "held-out",
  );
  const cases: HeldOutCase[] = inputs.map((c, i) => {
    const eps = 8.8541878188e-12 * c.k;
    const r = solved[i]!;
    return { ...c, groundFPerM: r.g * eps, couplingEachFPerM: r.c * eps, totalFPerM: (r.g + 2 * r.c) * eps, cells: r.cells };
  });
  const doc = {
    about:
      "Held-out references for lib/scaling/cap-accurate.ts, made by `npm run scaling:tables -- --heldout` (scaling/make-cap-table.ts): " +
      "random geometries uniform in the table coordinates (ln W/H, ln T/H, ln S/H, z = sqrt(H/(H + H2)), ln kGap/k, ξ(gapFraction)), " +
      "a quarter without a plane above and a quarter with kGap = k, solved by fieldSolve at the given resolution and tolerance. " +
      "SI units (m, F/m); cells = the solve's cell count (the tests recompute a few cheap ones).",
    resolution,
    tolerance: TOLERANCE,
    seed: HELDOUT_SEED,
    count: cases.length,
    cases,
  };
  writeFileSync(HELDOUT_FILE, await prettierFormat(JSON.stringify(doc), HELDOUT_FILE));
  console.log(`wrote ${HELDOUT_FILE}: ${cases.length} cases`);
  await reportHeldOut(cases);
}

async function reportHeldOut(cases: HeldOutCase[]): Promise<void> {
  const { accurateCapacitanceInto } = await import("../lib/scaling/cap-accurate");
  const out = { area: 0, ground: 0, couple: 0 };
  type Row = { g: number; c: number; t: number; frac: number; none: boolean; homogeneous: boolean; c0: HeldOutCase };
  const rows: Row[] = cases.map((c) => {
    accurateCapacitanceInto(c.widthM, c.thicknessM, c.spacingM, c.heightBelowM, c.heightAboveM, c.k, c.kGap, c.gapFraction, out, null);
    const total = out.ground + 2 * out.couple;
    return {
      g: out.ground / c.groundFPerM - 1,
      c: out.couple / c.couplingEachFPerM - 1,
      t: total / c.totalFPerM - 1,
      frac: c.couplingEachFPerM / c.totalFPerM,
      none: c.heightAboveM === null,
      homogeneous: c.kGap === c.k,
      c0: c,
    };
  });
  const stats = (sel: Row[], key: "g" | "c" | "t"): string => {
    if (sel.length === 0) return "—";
    let max = 0;
    let sum = 0;
    for (const r of sel) {
      max = Math.max(max, Math.abs(r[key]));
      sum += r[key] * r[key];
    }
    return `${(100 * max).toFixed(2)}% / ${(100 * Math.sqrt(sum / sel.length)).toFixed(3)}%`;
  };
  const line = (name: string, sel: Row[]): void =>
    console.log(`${name.padEnd(44)} n=${String(sel.length).padStart(4)}  ground ${stats(sel, "g")}  coupling ${stats(sel, "c")}  total ${stats(sel, "t")}`);
  console.log("held-out errors of cap-accurate.ts (max / RMS relative):");
  line("all", rows);
  line(
    "kGap = k",
    rows.filter((r) => r.homogeneous),
  );
  line(
    "kGap < k",
    rows.filter((r) => !r.homogeneous),
  );
  line(
    "no plane above",
    rows.filter((r) => r.none),
  );
  line(
    "plane above",
    rows.filter((r) => !r.none),
  );
  for (const [lo, hi] of [
    [0, 1e-4],
    [1e-4, 1e-3],
    [1e-3, 1e-2],
    [1e-2, 1],
  ] as const)
    line(
      `coupling/total in [${lo}, ${hi})`,
      rows.filter((r) => r.frac >= lo && r.frac < hi),
    );
  const worst = [...rows]
    .sort((a, b) => Math.max(Math.abs(b.g), Math.abs(b.c), Math.abs(b.t)) - Math.max(Math.abs(a.g), Math.abs(a.c), Math.abs(a.t)))
    .slice(0, 12);
  console.log("worst cases (W/H, T/H, S/H, H2/H, kGap/k, f, coupling/total: errors ground, coupling, total):");
  for (const r of worst) {
    const c = r.c0;
    const h = c.heightBelowM;
    console.log(
      `  ${(c.widthM / h).toFixed(2)}, ${(c.thicknessM / h).toFixed(2)}, ${(c.spacingM / h).toFixed(2)}, ${c.heightAboveM === null ? "none" : (c.heightAboveM / h).toFixed(2)}, ` +
        `${(c.kGap / c.k).toFixed(2)}, ${c.gapFraction.toFixed(3)}, ${r.frac.toExponential(1)}: ${(100 * r.g).toFixed(2)}%, ${(100 * r.c).toFixed(2)}%, ${(100 * r.t).toFixed(2)}%`,
    );
  }
}

// ---------------------------------------------------------------------------------------------------------------
// The solver's own error at the table resolution.

async function resolutionCheck(resolution: number, workers: number): Promise<void> {
  const cases = heldOutInputs(40).filter((_, i) => i % 2 === 0);
  const base: Job[] = cases.map((c) => siJob(c, resolution));
  const jobs = [...base, ...base.map((j) => ({ ...j, n: 2 * resolution }))];
  const res = await runJobs(jobs, `rescheck-${signature({ resolution, HELDOUT_SEED })}`, workers, "resolution check");
  console.log(`solver error at resolution ${resolution}: against ${2 * resolution} and against the Richardson extrapolation (order 2)`);
  let worstG = 0;
  let worstC = 0;
  let worstT = 0;
  for (let i = 0; i < base.length; i++) {
    const a = res[i]!;
    const b = res[i + base.length]!;
    const rich = (x: number, y: number): number => y + (y - x) / 3;
    const eg = a.g / rich(a.g, b.g) - 1;
    const ec = a.c / rich(a.c, b.c) - 1;
    const ta = a.g + 2 * a.c;
    const tb = b.g + 2 * b.c;
    const et = ta / rich(ta, tb) - 1;
    const frac = a.c / ta;
    worstG = Math.max(worstG, Math.abs(eg));
    if (frac > 1e-3) worstC = Math.max(worstC, Math.abs(ec));
    worstT = Math.max(worstT, Math.abs(et));
    const j = base[i]!;
    console.log(
      `  W/H ${j.w.toFixed(2)} T/H ${j.t.toFixed(2)} S/H ${j.s.toFixed(2)} H/H2 ${j.u.toFixed(2)} kGap/k ${j.r.toFixed(2)} f ${j.f.toFixed(2)} (coupling/total ${frac.toExponential(1)}): ` +
        `vs ${2 * resolution}: ground ${(100 * (a.g / b.g - 1)).toFixed(3)}%, coupling ${(100 * (a.c / b.c - 1)).toFixed(3)}%; vs extrapolation: ${(100 * eg).toFixed(3)}%, ${(100 * ec).toFixed(3)}%, total ${(100 * et).toFixed(3)}%`,
    );
  }
  console.log(
    `largest against the extrapolation: ground ${(100 * worstG).toFixed(3)}%, coupling ${(100 * worstC).toFixed(3)}% (coupling/total > 1e-3), total ${(100 * worstT).toFixed(3)}%`,
  );
}

async function main(): Promise<void> {
  const args = process.argv.slice(2);
  const opt = (name: string): string | undefined => {
    const i = args.indexOf(name);
    return i >= 0 ? args[i + 1] : undefined;
  };
  const workers = Math.min(2, Math.max(1, Number(opt("--workers") ?? 2)));
  // Lower this process's priority before the worker threads start; on Linux each thread inherits it.
  try {
    setPriority(19);
  } catch {
    // not permitted: run the script under `nice -n 19` instead
  }
  const quick = args.includes("--quick");
  const grid = quick ? QUICK : FULL;
  if (args.includes("--heldout")) {
    await makeHeldOut(Number(opt("--count") ?? 600), grid.resolutionA, workers);
    return;
  }
  if (args.includes("--resolution-check")) {
    await resolutionCheck(grid.resolutionA, workers);
    return;
  }
  const out =
    opt("--out") ?? (quick ? join(tmpdir(), "plateau-cap-table-quick.ts") : fileURLToPath(new URL("../lib/scaling/cap-table-data.ts", import.meta.url)));
  let reuse: CommittedTables | null = null;
  if (args.includes("--reuse") && !quick) {
    const t = await import("../lib/scaling/cap-table-data");
    reuse = { aAxes: t.A_AXES, aValues: t.A_VALUES, bAxes: t.B_AXES, bValues: t.B_VALUES };
  }
  await makeTables(grid, out, workers, reuse);
}

if (isMainThread && process.argv[1] && fileURLToPath(import.meta.url) === process.argv[1]) {
  main().catch((e: unknown) => {
    console.error(e);
    process.exit(1);
  });
}

/**
 * `npm run bench` (engine part): throughput of the scaling engine against a bare hand-inlined loop of the same
 * formulas, then the field check's time and error (scaling/bench-field.ts). Prints a figures table.
 */
import { readFileSync } from "node:fs";
import { baselineSettings, evaluateScenario, sweep, type ModelLevel, type ScenarioSettings, type Technology, type WireClass, MODEL_LEVELS } from "../lib/scaling/index";
import { EPSILON_0_F_PER_M, LN2, SAKURAI_DISTRIBUTED_COEFF, REPEATER_A, REPEATER_B } from "../lib/scaling/constants";
import { SPLIT_FIT } from "../lib/scaling/capacitance";
import { mayadasShatzkesRatio } from "../lib/scaling/resistance";
import { parseHistogramCsv, parseWireClassCsv } from "./csv";
import { getMetal } from "./materials";
import { benchField } from "./bench-field";

const here = new URL(".", import.meta.url).pathname;
const base = parseWireClassCsv(readFileSync(`${here}examples/skua-baseline.csv`, "utf8")).classes;
const hist = parseHistogramCsv(readFileSync(`${here}examples/skua-histograms.csv`, "utf8")).bins;
const technology = JSON.parse(readFileSync(`${here}examples/skua-technology.json`, "utf8")) as Technology;

// 20 classes: the four Skua classes in five invented variants each, every one with a 64-bin histogram.
const classes: WireClass[] = [];
for (let v = 0; v < 5; v++) {
  for (const c of base) {
    const f = 1 + 0.1 * v;
    const src = hist[c.name]!;
    const bins = Array.from({ length: 64 }, (_, i) => {
      const b = src[Math.floor((i * src.length) / 64)]!;
      return { lengthM: b.lengthM * (1 + (i % 3) * 0.01), count: b.count / 1.33 };
    });
    classes.push({ ...c, name: `${c.name}-${v}`, widthM: c.widthM * f, spacingM: c.spacingM * f, histogram: bins });
  }
}
const settings: ScenarioSettings = { ...baselineSettings("full", technology), s: 1 / 0.7 };

function timeIt(fn: () => void, minMs: number): { perCallMs: number; calls: number } {
  for (let i = 0; i < 3; i++) fn();
  let calls = 0;
  const t0 = performance.now();
  let t = t0;
  while (t - t0 < minMs) { fn(); calls++; t = performance.now(); }
  return { perCallMs: (t - t0) / calls, calls };
}

// ---------- bare, hand-inlined loop of the same formulas (full level, Miller 1) ----------
let sink = 0;
function bareClass(wc: WireClass, st: ScenarioSettings, level: ModelLevel, withDist: boolean): number {
  const s = st.s;
  const w = wc.widthM / s;
  const t = wc.thicknessM / s;
  const sp = wc.spacingM / s;
  const hb = wc.ildBelowM === null ? null : wc.ildBelowM / s;
  const ha = wc.ildAboveM === null ? null : wc.ildAboveM / s;
  const barrierScales = level === "ideal" ? true : st.barrierScales;
  const bar = barrierScales ? wc.barrierM / s : wc.barrierM;
  const L = wc.meanLengthM / st.sL;
  const eps = EPSILON_0_F_PER_M * wc.k;
  const h = (hb ?? ha)!;
  const h2 = hb !== null ? ha : null;
  let c: number;
  if (level === "ideal") c = eps * (w / h + (h2 !== null ? w / h2 : 0));
  else if (h2 === null) {
    const wh = w / h;
    if (level === "fringe") {
      const u = (2 * h) / t;
      c = eps * (Math.max(0, (w - t / 2) / h) + (2 * Math.PI) / Math.log(1 + u + Math.sqrt(u * (u + 2))));
    } else {
      const th = t / h;
      const c1 = 1.15 * wh + 2.8 * Math.pow(th, 0.222);
      const c21 = Math.max(0, (0.03 * wh + 0.83 * th - 0.07 * Math.pow(th, 0.222)) * Math.pow(sp / h, -1.34));
      const fr = c1 - wh;
      const fg = SPLIT_FIT.onePlane.a * Math.pow(sp / h, SPLIT_FIT.onePlane.b);
      const g = wh + Math.pow(Math.pow(fr, -4) + Math.pow(fg, -4), -0.25);
      c = eps * (g + 2 * ((c1 + 2 * c21 - g) / 2));
    }
  } else {
    const plates = w / h + w / h2;
    const b = h + t + h2;
    const g0 = 1 / (1 - t / b);
    const fIso = (4 / Math.PI) * (2 * g0 * Math.log(g0 + 1) - (g0 - 1) * Math.log(g0 * g0 - 1));
    if (level === "fringe") c = eps * (plates + fIso);
    else {
      const tp = SPLIT_FIT.twoPlane;
      const fGap = tp.a * (Math.pow(sp / h, tp.b) + Math.pow(sp / h2, tp.b));
      const g = plates + Math.pow(Math.pow(fIso, -4) + Math.pow(fGap, -4), -0.25);
      const q = tp.couple;
      const sb = sp / b;
      const cc = Math.max(0, (q[0] * t) / sp + q[1] + (q[2] * t) / b + (q[3] * w) / b + q[4] * Math.log(sb)) * Math.exp(-Math.PI * sb);
      c = eps * (g + 2 * cc);
    }
  }
  const metal = getMetal(wc.metal);
  const wc2 = w - 2 * bar;
  const hc = t - bar;
  let rho = metal.resistivityOhmM;
  if (level === "full") {
    const lam = metal.meanFreePathM;
    const R = metal.grainReflection;
    rho *= mayadasShatzkesRatio((lam / Math.min(wc2, hc)) * (R / (1 - R))) + 0.375 * metal.steinhoglC * (1 - metal.specularity) * lam * (1 / wc2 + 1 / hc);
  }
  const r = rho / (wc2 * hc);
  const Rt = r * L;
  const Ct = c * L;
  const rd = level === "ideal" ? 0 : wc.driverOhm;
  const cl = level === "ideal" ? 0 : wc.loadF;
  const delay = level === "ideal" ? SAKURAI_DISTRIBUTED_COEFF * Rt * Ct : SAKURAI_DISTRIBUTED_COEFF * Rt * Ct + LN2 * (rd * Ct + rd * cl + Rt * cl);
  const r0 = technology.repeaterR0Ohm;
  const c0 = technology.repeaterC0F;
  const kStar = Math.sqrt((REPEATER_B * Rt * Ct) / (REPEATER_A * r0 * c0));
  const hOpt = Math.sqrt((r0 * Ct) / (Rt * c0));
  sink += kStar + hOpt + (Ct + cl) * st.supplyV * st.supplyV;
  if (!withDist || !wc.histogram) return delay;
  const rc0 = r0 * c0;
  const hFixed = 2 * REPEATER_A * Math.sqrt(rc0 * r * c);
  let over = 0, reps = 0, sum = 0, n = 0, cs = 0;
  for (const bin of wc.histogram) {
    const l = bin.lengthM / st.sL;
    const R = r * l, C = c * l, rc = R * C;
    let d = SAKURAI_DISTRIBUTED_COEFF * rc + LN2 * (rd * C + rd * cl + R * cl);
    const ks = Math.sqrt((REPEATER_B * rc) / (REPEATER_A * rc0));
    let ins = 0;
    if (ks > 1) {
      let k = Math.floor(ks);
      if (REPEATER_A * (k + 1) * rc0 + (REPEATER_B * rc) / (k + 1) < REPEATER_A * k * rc0 + (REPEATER_B * rc) / k) k++;
      const rep = hFixed * l + REPEATER_A * k * rc0 + (REPEATER_B * rc) / k;
      if (k >= 2 && rep < d) { d = rep; ins = k - 1; }
    }
    if (d > technology.delayBudgetS) over += bin.count;
    reps += ins * bin.count; sum += d * bin.count; n += bin.count; cs += C * bin.count;
  }
  sink += over + reps + sum / n + cs;
  return delay;
}

const baseSt = baselineSettings("full", technology);
const bareScenario = () => { for (const wc of classes) { bareClass(wc, baseSt, "full", true); bareClass(wc, settings, "full", true); } };
const engineScenario = () => { sink += evaluateScenario({ classes, technology, settings }).totals.scenario.powerW; };

const xs = Array.from({ length: 200 }, (_, i) => 1 + (3 * i) / 199);
const bareSweep = () => {
  for (const level of MODEL_LEVELS) {
    const st = { ...settings, level, barrierScales: level !== "full" };
    for (const wc of classes) for (const x of xs) { st.s = x; try { sink += bareClass(wc, st, level, false); } catch { /* skipped */ } }
  }
};
const engineSweep = () => { sink += sweep({ classes, technology, settings, variable: "s", metric: "delay", from: 1, to: 4, points: 200 }).length; };

// The machine may be shared: alternate engine and bare runs in rounds and keep each one's best round.
function best(a: () => void, b: () => void, rounds: number, msPerRound: number): [{ perCallMs: number }, { perCallMs: number }] {
  let ea = Infinity;
  let eb = Infinity;
  for (let r = 0; r < rounds; r++) {
    ea = Math.min(ea, timeIt(a, msPerRound).perCallMs);
    eb = Math.min(eb, timeIt(b, msPerRound).perCallMs);
  }
  return [{ perCallMs: ea }, { perCallMs: eb }];
}
// warm both paths up first so that the JIT has settled before anything is measured
timeIt(engineScenario, 1500);
timeIt(bareScenario, 1000);
timeIt(engineSweep, 1500);
timeIt(bareSweep, 1000);
const [evE, evB] = best(engineScenario, bareScenario, 6, 300);
const [swE, swB] = best(engineSweep, bareSweep, 6, 400);

const rows: [string, string, string, string][] = [
  ["full scenario, 20 classes × 64 bins (baseline + scenario)", `${(1000 / evE.perCallMs).toFixed(0)} eval/s`, `${(1000 / evB.perCallMs).toFixed(0)} eval/s`, (evE.perCallMs / evB.perCallMs).toFixed(2)],
  ["sweep, 200 points × 20 classes × 4 levels", `${swE.perCallMs.toFixed(2)} ms`, `${swB.perCallMs.toFixed(2)} ms`, (swE.perCallMs / swB.perCallMs).toFixed(2)],
];
console.log("Plateau scaling engine benchmark (one core; engine vs bare hand-inlined loop of the same formulas; best of 6 alternating rounds)");
console.log("");
const head = ["work", "engine", "bare loop", "engine/bare (aim ≤ 1.5)"];
const widths = head.map((h, i) => Math.max(h.length, ...rows.map((r) => r[i]!.length)));
console.log(head.map((h, i) => h.padEnd(widths[i]!)).join(" | "));
console.log(widths.map((w) => "-".repeat(w)).join("-|-"));
for (const r of rows) console.log(r.map((c, i) => (i === 0 ? c.padEnd(widths[i]!) : c.padStart(widths[i]!))).join(" | "));
console.log("");
const field = await benchField();
for (const line of field.lines) console.log(line);
console.log(`field check at the default grid: ${field.ms.toFixed(1)} ms, error ${(field.relErr * 100).toFixed(2)}%, ${field.cells} cells (aim ≤ 250 ms at < 1%)`);
if (sink === 42) console.log("");

/**
 * Live-feel benchmark of the scenario editor (`npm run bench:ui`; issue 13, item 14). Builds when no build exists in
 * PLATEAU_DIST_DIR (default .next), starts `next start` on a temporary SQLite file seeded with the invented demo team
 * (lib/demo/seed.ts), signs in as the demo editor and opens the demo's air-gap scenario in headless Chromium
 * (playwright-core, /usr/bin/chromium or CHROMIUM_PATH) at 1440 × 1000.
 *
 * It drags the S slider with real mouse events (press on the thumb, move step by step, release) and measures in the
 * page, from each mouse move's timestamp (its `pointermove` event) to the first frame painted after the DOM shows the new value:
 *   - slider → table: the results table holds the evaluation of the new S (`data-results-key`),
 *   - slider → table + chart: the sweep charts show the same S too (`data-sweep-key`).
 * "Painted" is taken as a task queued from the requestAnimationFrame callback of the frame that first shows the change
 * (it runs after that frame's paint). The bare baseline is the same measurement on an empty page with one range
 * input whose `input` handler writes the value into the page (the browser's own input → paint latency), in the same run.
 * Also prints the editor's first-load JS: the gzip sum of the <script src> of the page's HTML (as
 * tests/e2e/workspace.test.ts counts it).
 *
 * Aims (issue 13, item 14): table + chart ≤ 16 ms median and ≤ 33 ms p95; first-load JS ≤ 150 kB gzip.
 * BENCH_STEPS (default 40) slider steps per pass, BENCH_PASSES (default 3) passes; the first pass warms up and is
 * not counted. No assertion: a benchmark prints figures, the shared machine's load moves them.
 */
import "../../lib/demo/server-only-hook";
import { spawnSync } from "node:child_process";
import fs from "node:fs";
import path from "node:path";
import zlib from "node:zlib";
import type { Page } from "playwright-core";
import { launchBrowser } from "../helpers/browser";
import { startServer } from "../helpers/next-server";

const STEPS = Number(process.env.BENCH_STEPS ?? 40);
const PASSES = Number(process.env.BENCH_PASSES ?? 3);
const distDir = process.env.PLATEAU_DIST_DIR || ".next";

if (!fs.existsSync(path.join(distDir, "BUILD_ID"))) {
  console.log(`No build in ${distDir}: running next build…`);
  const r = spawnSync("npx", ["next", "build"], {
    stdio: ["ignore", "inherit", "inherit"],
    env: { ...process.env, NODE_ENV: "production", NEXT_TELEMETRY_DISABLED: "1" },
  });
  if (r.status !== 0) throw new Error(`next build failed (exit ${r.status})`);
}

// imported after the server-only hook is registered
const { openDatabase } = await import("@/db/connect");
const { seedDemo, DEMO_USERS } = await import("@/lib/demo/seed");

type Sample = { table: number; both: number };

/** Installed in the page: records each input event and resolves `__benchNext()` when the watched state is painted. */
function installProbe() {
  type W = Window & {
    __benchArm: () => void;
    __benchNext: () => Promise<{ table: number; both: number } | null>;
  };
  const w = window as unknown as W;
  let armed: { prev: string | null; t0: number | null; table: number; done: (v: { table: number; both: number } | null) => void } | null = null;
  let pending: Promise<{ table: number; both: number } | null> = Promise.resolve(null);
  const state = () => {
    const r = document.querySelector("[data-results-key]")?.getAttribute("data-results-key") ?? null;
    const s = document.querySelector("[data-sweep-key]")?.getAttribute("data-sweep-key") ?? null;
    return { r, s };
  };
  // capture on window: runs before React's listener on the root
  // the mouse move that moves the thumb (its timestamp: when the browser received it), else the input event
  for (const type of ["pointermove", "input"])
    window.addEventListener(
      type,
      (ev) => {
        if (armed && armed.t0 === null) armed.t0 = ev.timeStamp;
      },
      true,
    );
  const afterPaint = (f: () => void) => {
    const ch = new MessageChannel();
    ch.port1.onmessage = () => f();
    ch.port2.postMessage(0);
  };
  w.__benchArm = () => {
    const prev = state().r;
    pending = new Promise((done) => {
      armed = { prev, t0: null, table: 0, done };
      const started = performance.now();
      const tick = () => {
        const a = armed!;
        if (performance.now() - started > 5000) {
          armed = null;
          return done(null);
        }
        const { r, s } = state();
        const changed = a.t0 !== null && r !== null && r !== a.prev;
        if (changed && !a.table) afterPaint(() => (a.table = performance.now() - a.t0!));
        if (changed && r === s)
          afterPaint(() => {
            const table = a.table || performance.now() - a.t0!;
            armed = null;
            done({ table, both: performance.now() - a.t0! });
          });
        else requestAnimationFrame(tick);
      };
      requestAnimationFrame(tick);
    });
  };
  w.__benchNext = () => pending;
}

/** The bare page: one range input whose handler writes its value into the page (input → paint of the browser alone). */
const BARE = `<!doctype html><meta charset="utf-8"><body style="font:14px sans-serif;padding:40px">
<label>S <input type="range" min="0.5" max="4" step="any" value="1.2" style="width:240px" data-testid="s-slider"></label>
<p data-results-key="" data-sweep-key="">value</p>
<script>
const i = document.querySelector("input"), p = document.querySelector("p");
i.addEventListener("input", () => { const v = Math.round(Number(i.value) * 100) / 100; p.textContent = "S = " + v; p.dataset.resultsKey = p.dataset.sweepKey = String(v); });
</script>`;

/** Drag the S slider: press on the thumb, then move right and back in `steps` steps of `dx` px, timing each. */
async function drag(page: Page, steps: number, dx: number): Promise<Sample[]> {
  const slider = page.locator("[data-testid=s-slider]").first();
  await slider.scrollIntoViewIfNeeded();
  const box = (await slider.boundingBox())!;
  const { min, max, value } = await slider.evaluate((el: HTMLInputElement) => ({ min: +el.min, max: +el.max, value: +el.value }));
  const y = box.y + box.height / 2;
  // the thumb's centre (the track is inset by half a thumb, ~8 px)
  let x = box.x + 8 + ((value - min) / (max - min)) * (box.width - 16);
  await page.mouse.move(x, y);
  await page.mouse.down();
  const out: Sample[] = [];
  for (let i = 0; i < steps; i++) {
    x += i < steps / 2 ? dx : -dx;
    await page.evaluate(() => (window as unknown as { __benchArm: () => void }).__benchArm());
    await page.mouse.move(x, y);
    const r = await page.evaluate(() => (window as unknown as { __benchNext: () => Promise<Sample | null> }).__benchNext());
    if (r) out.push(r);
    // the next step after a short pause (a hand moves every few frames; the page settles the deferred charts)
    await page.waitForTimeout(40);
  }
  await page.mouse.up();
  return out;
}

function stats(xs: number[]) {
  const s = [...xs].sort((a, b) => a - b);
  const q = (p: number) => s[Math.min(s.length - 1, Math.max(0, Math.ceil(p * s.length) - 1))] ?? NaN;
  return {
    median: s.length % 2 ? s[(s.length - 1) / 2]! : (s[s.length / 2 - 1]! + s[s.length / 2]!) / 2,
    p95: q(0.95),
    max: s[s.length - 1] ?? NaN,
    n: s.length,
  };
}
const fmt = (x: number) => x.toFixed(1).padStart(6);

const server = await startServer();
const browser = await launchBrowser();
try {
  const knex = openDatabase(server.dbPath);
  let seeded: Awaited<ReturnType<typeof seedDemo>>;
  try {
    seeded = await seedDemo(knex);
  } finally {
    await knex.destroy();
  }
  const editor = DEMO_USERS.find((u) => u.role === "editor")!;
  const signIn = await fetch(`${server.baseUrl}/api/auth/sign-in`, {
    method: "POST",
    headers: { "content-type": "application/json", origin: server.baseUrl },
    body: JSON.stringify({ email: editor.email, password: editor.password }),
  });
  if (signIn.status !== 200) throw new Error(`sign-in: ${signIn.status} ${await signIn.text()}`);
  const cookie = signIn.headers
    .getSetCookie()
    .find((c) => c.startsWith("plateau_session="))!
    .split(";")[0]!;
  // the demo's air-gap scenario (shrink + air gaps on intermediate), as tests/e2e/workspace.test.ts uses
  const sid = seeded.scenarioIds![1]!;
  const pagePath = `/teams/${seeded.teamId}/scenarios/${sid}`;

  // first-load JS: the <script src> of the server's HTML (nomodule polyfills left out)
  const html = await (await fetch(server.baseUrl + pagePath, { headers: { cookie } })).text();
  const scripts = [...html.matchAll(/<script([^>]*?)src="([^"]+)"([^>]*)>/g)]
    .filter((m) => !/nomodule/i.test(m[1]! + m[3]!))
    .map((m) => new URL(m[2]!.replace(/&amp;/g, "&"), server.baseUrl).href);
  let gz = 0;
  for (const src of scripts) gz += zlib.gzipSync(Buffer.from(await (await fetch(src)).arrayBuffer())).length;

  const ctx = await browser.newContext({ viewport: { width: 1440, height: 1000 } });
  const [name, value] = cookie.split("=");
  await ctx.addCookies([{ name: name!, value: value!, url: server.baseUrl }]);
  // tsx (esbuild keepNames) wraps named functions in __name(): give the page that helper for the probe
  const NAME_SHIM = "globalThis.__name = (f) => f;";
  await ctx.addInitScript(NAME_SHIM);
  // where the time of a step goes: when each evaluation request is posted to the engine worker and when its answer
  // arrives (the worker's own compute time comes with the answer, elapsedMs)
  await ctx.addInitScript(() => {
    const log: { sent: number; got?: number; compute?: number }[] = [];
    (window as unknown as { __evalLog: typeof log }).__evalLog = log;
    const Base = window.Worker;
    window.Worker = class extends Base {
      constructor(url: string | URL, opts?: WorkerOptions) {
        super(url, opts);
        const byId = new Map<number, (typeof log)[number]>();
        const post = this.postMessage.bind(this);
        this.postMessage = ((msg: { kind?: string; id: number }, t?: Transferable[]) => {
          if (msg?.kind === "evaluate") {
            const e = { sent: performance.now() };
            log.push(e);
            byId.set(msg.id, e);
          }
          return post(msg, t as Transferable[]);
        }) as Worker["postMessage"];
        this.addEventListener("message", (ev: MessageEvent<{ id: number; kind: string; elapsedMs?: number }>) => {
          const e = byId.get(ev.data.id);
          if (e) Object.assign(e, { got: performance.now(), compute: ev.data.elapsedMs });
        });
      }
    };
  });
  const page = await ctx.newPage();
  const errors: string[] = [];
  page.on("pageerror", (e) => errors.push(String(e)));

  // the bare baseline
  await page.setContent(BARE);
  await page.evaluate(NAME_SHIM);
  await page.evaluate(installProbe);
  const bare: Sample[] = [];
  for (let p = 0; p < PASSES; p++) {
    const r = await drag(page, STEPS, 3);
    if (p > 0) bare.push(...r);
  }

  await page.goto(`${server.baseUrl}${pagePath}?metric=delay&from=0.5&to=4`);
  await page.waitForFunction(
    () => {
      const r = document.querySelector("[data-results-key]")?.getAttribute("data-results-key");
      const s = document.querySelector("[data-sweep-key]")?.getAttribute("data-sweep-key");
      return !!r && r === s && document.querySelectorAll(".sweep-chart path").length > 0;
    },
    undefined,
    { timeout: 60_000 },
  );
  await page.evaluate(installProbe);
  // as a user who watches both: the slider near the top of the window, the sweep charts below it
  const inView = await page.evaluate(() => {
    const slider = document.querySelector("[data-testid=s-slider]")!.getBoundingClientRect();
    window.scrollTo(0, slider.top + window.scrollY - 40);
    const chart = document.querySelector(".sweep-chart")!.getBoundingClientRect();
    return { chartTop: Math.round(chart.top), chartBottom: Math.round(chart.bottom), height: window.innerHeight };
  });
  const editorSamples: Sample[] = [];
  let missed = 0;
  // BENCH_PROFILE=1: a CPU profile of the main thread over the counted passes, summed per function (self time);
  // BENCH_TRACE=1: a Chrome trace of them, time per event kind (style, layout, paint, scripts) on each thread
  const cdp = process.env.BENCH_PROFILE === "1" ? await ctx.newCDPSession(page) : null;
  const trace = process.env.BENCH_TRACE === "1";
  for (let p = 0; p < PASSES; p++) {
    if (p === 1 && trace) await browser.startTracing(page, { categories: ["devtools.timeline", "disabled-by-default-devtools.timeline", "v8.execute"] });
    if (p === 1 && cdp) {
      await cdp.send("Profiler.enable");
      await cdp.send("Profiler.setSamplingInterval", { interval: 200 });
      await cdp.send("Profiler.start");
    }
    const r = await drag(page, STEPS, 3);
    missed += STEPS - r.length;
    if (p > 0) editorSamples.push(...r);
  }
  const evals = await page.evaluate(() =>
    (window as unknown as { __evalLog: { sent: number; got?: number; compute?: number }[] }).__evalLog.filter(
      (e) => e.got !== undefined && e.compute !== undefined,
    ),
  );
  if (process.env.BENCH_PROFILE === "1" || trace)
    console.log(
      `engine worker, evaluate: request → answer median ${stats(evals.map((e) => e.got! - e.sent)).median.toFixed(1)} ms, of which computing median ${stats(evals.map((e) => e.compute!)).median.toFixed(1)} ms (n=${evals.length})`,
    );
  if (trace) {
    type Ev = { name: string; ph: string; dur?: number; tid: number; pid: number; args?: { name?: string } };
    const events = (JSON.parse((await browser.stopTracing()).toString()) as { traceEvents: Ev[] }).traceEvents;
    const threads = new Map<string, string>();
    for (const e of events) if (e.ph === "M" && e.name === "thread_name") threads.set(`${e.pid}:${e.tid}`, e.args?.name ?? "?");
    const sums = new Map<string, number>();
    for (const e of events) {
      if (e.ph !== "X" || !e.dur) continue;
      const t = threads.get(`${e.pid}:${e.tid}`) ?? "?";
      if (!/CrRendererMain|DedicatedWorker|Compositor|Raster/.test(t)) continue;
      const k = `${t.replace(/thread.*$/, "")} ${e.name}`;
      sums.set(k, (sums.get(k) ?? 0) + e.dur / 1000);
    }
    console.log("\nTrace over the counted passes (ms per thread and event; events nest, so a parent includes its children):");
    for (const [k, v] of [...sums].sort((a, b) => b[1] - a[1]).slice(0, 30)) console.log(`${v.toFixed(1).padStart(8)}  ${k}`);
  }
  if (cdp) {
    const { profile } = await cdp.send("Profiler.stop");
    const self = new Map<string, number>();
    const dt = new Map<number, number>();
    profile.samples?.forEach((id, i) => dt.set(id, (dt.get(id) ?? 0) + (profile.timeDeltas?.[i] ?? 0)));
    for (const n of profile.nodes) {
      const f = n.callFrame;
      const k = `${f.functionName || "(anonymous)"} ${f.url.split("/").pop()}:${f.lineNumber}`;
      self.set(k, (self.get(k) ?? 0) + (dt.get(n.id) ?? 0) / 1000);
    }
    const total = [...self.values()].reduce((a, b) => a + b, 0);
    console.log(`\nMain-thread CPU profile over the counted passes (self time, ms; total ${total.toFixed(0)} ms):`);
    for (const [k, v] of [...self].sort((a, b) => b[1] - a[1]).slice(0, 25)) console.log(`${v.toFixed(1).padStart(8)}  ${k}`);
  }
  if (errors.length) throw new Error(`page errors: ${errors.join("; ")}`);

  const line = (label: string, xs: number[]) => {
    const s = stats(xs);
    return `${label.padEnd(34)} median ${fmt(s.median)} ms   p95 ${fmt(s.p95)} ms   max ${fmt(s.max)} ms   (n=${s.n})`;
  };
  console.log(`\nScenario editor, demo air-gap scenario, ${STEPS} S steps × ${PASSES - 1} counted passes (1440 × 1000, headless Chromium)`);
  console.log(
    line(
      "bare page: input → paint",
      bare.map((s) => s.both),
    ),
  );
  console.log(
    line(
      "editor: slider → table",
      editorSamples.map((s) => s.table),
    ),
  );
  console.log(
    line(
      "editor: slider → table + chart",
      editorSamples.map((s) => s.both),
    ),
  );
  const bm = stats(bare.map((s) => s.both)).median;
  console.log(
    `ratios to the bare page (median): table ${(stats(editorSamples.map((s) => s.table)).median / bm).toFixed(2)}×, table + chart ${(stats(editorSamples.map((s) => s.both)).median / bm).toFixed(2)}×`,
  );
  console.log(
    `(the first sweep chart spans y ${inView.chartTop}–${inView.chartBottom} px of the ${inView.height} px window: ${inView.chartBottom <= inView.height ? "in view" : inView.chartTop < inView.height ? "partly in view" : "below the window"})`,
  );
  if (missed) console.log(`(${missed} steps changed nothing within 5 s and are not counted)`);
  console.log(`editor first-load JS: ${(gz / 1024).toFixed(1)} kB gzip in ${scripts.length} scripts`);
  console.log("Aims (issue 13, item 14): table + chart ≤ 16 ms median, ≤ 33 ms p95; first-load JS ≤ 150 kB gzip.");
} finally {
  await browser.close();
  await server.stop();
}

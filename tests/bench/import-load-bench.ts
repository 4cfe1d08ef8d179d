/**
 * Imports under load (`npm run bench:import-load`; issue 12 finding 13). Builds when no build exists in
 * PLATEAU_DIST_DIR (default .next), starts `next start` on a temporary SQLite file, seeds through the HTTP API (a
 * user, a team, the demo's Skua baseline and first scenario for evaluate, and four baselines of the CSV template that
 * take the imports), then measures with autocannon (BENCH_CONNECTIONS, default 10, BENCH_SECONDS, default 5):
 *   GET /api/health and POST /api/scenarios/[id]/evaluate, idle; then the same while four clients each import a
 *   200,000-row length-histogram CSV (mode=replace, with the baseline's version) again and again.
 * Prints p50/p99 of both phases and the ratio loaded/idle, and the imports finished meanwhile.
 * Aim: p99 under load ≤ 2× idle p99 (CSV parsing and validation run in a worker thread, lib/import/off-thread.ts).
 */
import fs from "node:fs";
import { autocannon, benchClient, distDir, fmt, seedSkua, startBenchServer, type CannonResult } from "./bench-server";

const SECONDS = Number(process.env.BENCH_SECONDS ?? 5);
const CONNECTIONS = Number(process.env.BENCH_CONNECTIONS ?? 10);
const ROWS = Number(process.env.BENCH_IMPORT_ROWS ?? 200_000);
const IMPORTERS = 4;

/** The next-server process: `next start` itself or the child it forks (Linux /proc; the spawned pid elsewhere). */
function serverPid(pid: number): number {
  try {
    for (const t of fs.readdirSync(`/proc/${pid}/task`)) {
      const kids = fs.readFileSync(`/proc/${pid}/task/${t}/children`, "utf8").trim();
      if (kids) return serverPid(Number(kids.split(/\s+/)[0]));
    }
  } catch {
    /* not Linux */
  }
  return pid;
}

/**
 * CPU time (ms, user + system) of the server's main thread (the event loop: its thread id is the process id) and of
 * all its threads. Less sensitive to other load on the machine than latency: it shows where the import work runs.
 */
function threadCpuMs(pid: number): { main: number; all: number } {
  let main = 0;
  let all = 0;
  try {
    for (const t of fs.readdirSync(`/proc/${pid}/task`)) {
      const stat = fs.readFileSync(`/proc/${pid}/task/${t}/stat`, "utf8");
      const f = stat.slice(stat.lastIndexOf(")") + 2).split(" ");
      const ms = (Number(f[11]) + Number(f[12])) * 10; // utime, stime in USER_HZ = 100
      all += ms;
      if (Number(t) === pid) main += ms;
    }
  } catch {
    /* gone, or not Linux */
  }
  return { main, all };
}

const { base, server, stop } = await startBenchServer("import-load");
const client = benchClient(base);
const { call } = client;
const must = <T = any>(status: number, p: Promise<{ status: number; json: unknown }>, what: string) => client.must<T>(status, p, what);
try {
  const { teamId, scenarioId } = await seedSkua(client, { histograms: false });

  const template = fs.readFileSync("public/templates/wire-classes-template.csv", "utf8");
  const targets: string[] = [];
  for (let i = 0; i < IMPORTERS; i++)
    targets.push((await must(201, call("POST", `/api/teams/${teamId}/baselines/import?name=Load%20${i}`, template, "text/csv"), "baseline")).baseline.id);
  const names = ((await must(200, call("GET", `/api/baselines/${targets[0]}`), "baseline")).baseline.classes as { name: string }[]).map((c) => c.name);
  let csv = "class,length_um,count\n";
  for (let i = 0; i < ROWS; i++) csv += `${names[i % names.length]},${(1 + Math.floor(i / names.length) * 0.25).toFixed(2)},${1 + (i % 7)}\n`;
  const csvBytes = Buffer.from(csv);

  const measure = async () => {
    const out: Record<string, CannonResult> = {};
    for (const [name, method, p, body] of [
      ["GET  /api/health", "GET", "/api/health", undefined],
      ["POST /api/scenarios/[id]/evaluate", "POST", `/api/scenarios/${scenarioId}/evaluate`, "{}"],
    ] as const) {
      const headers = client.headersFor(method, method !== "GET");
      out[name] = await autocannon({ url: base + p, method, headers, body, connections: CONNECTIONS, duration: SECONDS });
    }
    return out;
  };

  // warm-up: every route's code loaded once, one import through the thread
  await must(200, call("POST", `/api/baselines/${targets[0]}/histograms?mode=replace&dryRun=1`, csvBytes, "text/csv"), "warm-up import");
  await measure();
  const pid = serverPid(server.pid!);
  const idle0 = threadCpuMs(pid);
  const idle = await measure();
  const idle1 = threadCpuMs(pid);

  let stop = false;
  let imports = 0;
  let importMs = 0;
  const importer = async (baselineId: string) => {
    while (!stop) {
      const v = (await must(200, call("GET", `/api/baselines/${baselineId}`), "version")).baseline.version as number;
      const t0 = performance.now();
      await must(200, call("POST", `/api/baselines/${baselineId}/histograms?mode=replace&version=${v}`, csvBytes, "text/csv"), "import");
      importMs += performance.now() - t0;
      imports += 1;
    }
  };
  const running = targets.map((id) => importer(id));
  await new Promise((r) => setTimeout(r, 1000)); // the four imports under way
  const load0 = threadCpuMs(pid);
  const imports0 = imports;
  const loaded = await measure();
  const load1 = threadCpuMs(pid);
  const importsDuring = imports - imports0;
  stop = true;
  await Promise.all(running);

  console.log(
    `\nImports under load — ${IMPORTERS} clients importing ${ROWS.toLocaleString("en-US")}-row histogram CSVs (${(csvBytes.length / 1e6).toFixed(1)} MB) in a loop; autocannon ${CONNECTIONS} connections, ${SECONDS} s per target; build ${distDir}`,
  );
  console.log(
    `  ${"target".padEnd(36)} ${"idle p50".padStart(9)} ${"idle p99".padStart(9)} ${"load p50".padStart(9)} ${"load p99".padStart(9)} ${"p99 load/idle".padStart(14)}`,
  );
  let worst = 0;
  for (const name of Object.keys(idle)) {
    const a = idle[name]!;
    const b = loaded[name]!;
    const ratio = b.latency.p99 / a.latency.p99;
    worst = Math.max(worst, ratio);
    const bad = b.non2xx + b.errors + b.timeouts + a.non2xx + a.errors + a.timeouts;
    console.log(
      `  ${name.padEnd(36)} ${fmt(a.latency.p50).padStart(9)} ${fmt(a.latency.p99).padStart(9)} ${fmt(b.latency.p50).padStart(9)} ${fmt(b.latency.p99).padStart(9)} ${(fmt(ratio, 2) + " ×").padStart(14)}${bad ? `   (${bad} failed requests)` : ""}`,
    );
    if (bad) process.exitCode = 1;
  }
  console.log(
    `  imports finished: ${imports} (mean ${fmt(importMs / Math.max(1, imports), 0)} ms each, upload to stored), ${importsDuring} of them while measuring`,
  );
  // raw CPU of the two windows (same autocannon load): under load, the import work shows up on the event-loop thread
  // when it parses there, and on the other threads (the import workers) when it does not
  console.log(
    `  server CPU (ms) idle window: event-loop thread ${fmt(idle1.main - idle0.main, 0)}, other threads ${fmt(idle1.all - idle0.all - (idle1.main - idle0.main), 0)}; ` +
      `window under load: event-loop thread ${fmt(load1.main - load0.main, 0)}, other threads ${fmt(load1.all - load0.all - (load1.main - load0.main), 0)}`,
  );
  console.log(`  Aim: p99 under load ≤ 2× idle p99 — worst ratio ${fmt(worst, 2)} ×.`);
} finally {
  await stop();
}

/**
 * API and page throughput benchmark (`npm run bench:api`). Builds when no build exists in PLATEAU_DIST_DIR
 * (default .next), starts `next start` on a temporary SQLite file, seeds it through the HTTP API only
 * (a user, a team, the demo's Skua baseline with its histograms — a new baseline gets the demo's technology —
 * and the first demo scenario),
 * signs in, then runs autocannon against each target in turn with the session cookie:
 *   GET /api/health (the bare baseline: one `select 1`), POST /api/scenarios/[id]/evaluate,
 *   the team home and the scenario editor page.
 * Prints req/s, p50 and p99 latency, the server's CPU time per request (less sensitive to other load on the
 * machine than latency), and each target's ratios to the health route measured in the same run.
 * Aim (issue 9): evaluate p99 ≤ 2× health p99.
 * BENCH_SECONDS (default 5) per target, BENCH_CONNECTIONS (default 20).
 */
import fs from "node:fs";
import { autocannon, benchClient, distDir, fmt, seedSkua, startBenchServer, type CannonResult } from "./bench-server";

const SECONDS = Number(process.env.BENCH_SECONDS ?? 5);
const CONNECTIONS = Number(process.env.BENCH_CONNECTIONS ?? 20);

/** CPU time (ms, user + system) used so far by the server and its child processes (Linux /proc; 0 elsewhere). */
function serverCpuMs(pid: number): number {
  const tick = 10; // USER_HZ = 100 on Linux
  let total = 0;
  const visit = (p: number) => {
    try {
      const stat = fs.readFileSync(`/proc/${p}/stat`, "utf8");
      const f = stat.slice(stat.lastIndexOf(")") + 2).split(" ");
      total += (Number(f[11]) + Number(f[12])) * tick; // utime, stime
      for (const t of fs.readdirSync(`/proc/${p}/task`)) {
        const kids = fs.readFileSync(`/proc/${p}/task/${t}/children`, "utf8").trim();
        for (const k of kids ? kids.split(/\s+/) : []) visit(Number(k));
      }
    } catch {
      /* gone, or not Linux */
    }
  };
  visit(pid);
  return total;
}

const { base, server, stop } = await startBenchServer("api-bench");
const client = benchClient(base);
const { call, must } = client;
try {
  // Seed through the API, from the demo's own data files (scaling/examples).
  const { email, password, teamId, scenarioId } = await seedSkua(client, { histograms: true });
  const scenario = { id: scenarioId };

  // Sign in afresh: the measured requests carry this session.
  client.signOut();
  await must(200, call("POST", "/api/auth/sign-in", JSON.stringify({ email, password })), "sign-in");

  const targets: { name: string; method: string; path: string; body?: string }[] = [
    { name: "GET  /api/health", method: "GET", path: "/api/health" },
    { name: "POST /api/scenarios/[id]/evaluate", method: "POST", path: `/api/scenarios/${scenario.id}/evaluate`, body: "{}" },
    { name: "GET  team home page", method: "GET", path: `/teams/${teamId}` },
    { name: "GET  scenario editor page", method: "GET", path: `/teams/${teamId}/scenarios/${scenario.id}` },
  ];
  for (const t of targets) {
    const r = await call(t.method, t.path, t.body);
    if (r.status !== 200) throw new Error(`${t.name}: ${r.status} ${JSON.stringify(r.json).slice(0, 300)}`);
  }

  console.log(`\nAPI benchmark — autocannon, ${CONNECTIONS} connections, ${SECONDS} s per target (after a 2 s warm-up), build ${distDir}`);
  console.log(
    `  ${"target".padEnd(36)} ${"req/s".padStart(8)} ${"p50 ms".padStart(8)} ${"p99 ms".padStart(8)} ${"server CPU ms/req".padStart(18)}   ${"p99/health".padStart(10)} ${"req/s vs health".padStart(15)}`,
  );
  let health: CannonResult | undefined;
  for (const t of targets) {
    const headers = client.headersFor(t.method, t.body !== undefined);
    const opts = { url: base + t.path, method: t.method, headers, body: t.body, connections: CONNECTIONS };
    await autocannon({ ...opts, duration: 2 });
    const cpu0 = serverCpuMs(server.pid!);
    const r = await autocannon({ ...opts, duration: SECONDS });
    const cpuPerReq = (serverCpuMs(server.pid!) - cpu0) / Math.max(1, r["2xx"] + r.non2xx);
    health ??= r;
    const bad = r.non2xx + r.errors + r.timeouts;
    console.log(
      `  ${t.name.padEnd(36)} ${fmt(r.requests.average).padStart(8)} ${fmt(r.latency.p50).padStart(8)} ${fmt(r.latency.p99).padStart(8)} ${fmt(cpuPerReq, 2).padStart(18)}   ${(fmt(r.latency.p99 / health.latency.p99, 2) + " ×").padStart(10)} ${(fmt(r.requests.average / health.requests.average, 2) + " ×").padStart(15)}${bad ? `   (${r.non2xx} non-2xx, ${r.errors} errors, ${r.timeouts} timeouts)` : ""}`,
    );
    if (bad) process.exitCode = 1;
  }
  console.log("  Aim: evaluate p99 ≤ 2× health p99.");
} finally {
  await stop();
}

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
import { spawn, spawnSync } from "node:child_process";
import fs from "node:fs";
import { createRequire } from "node:module";
import net from "node:net";
import os from "node:os";
import path from "node:path";

// autocannon ships no types: the part of its API used here.
interface CannonResult {
  requests: { average: number };
  latency: { p50: number; p99: number };
  non2xx: number;
  errors: number;
  timeouts: number;
  "2xx": number;
}
type Cannon = (opts: {
  url: string;
  method?: string;
  headers?: Record<string, string>;
  body?: string;
  connections: number;
  duration: number;
}) => Promise<CannonResult>;
const autocannon = createRequire(import.meta.url)("autocannon") as Cannon;

const SECONDS = Number(process.env.BENCH_SECONDS ?? 5);
const CONNECTIONS = Number(process.env.BENCH_CONNECTIONS ?? 20);
const distDir = process.env.PLATEAU_DIST_DIR || ".next";

if (!fs.existsSync(path.join(distDir, "BUILD_ID"))) {
  console.log(`No build in ${distDir}: running next build…`);
  const r = spawnSync("npx", ["next", "build"], {
    stdio: ["ignore", "inherit", "inherit"],
    env: { ...process.env, NODE_ENV: "production", NEXT_TELEMETRY_DISABLED: "1" },
  });
  if (r.status !== 0) throw new Error(`next build failed (exit ${r.status})`);
}

const freePort = () =>
  new Promise<number>((resolve, reject) => {
    const s = net.createServer().listen(0, "127.0.0.1", () => {
      const a = s.address();
      s.close(() => (typeof a === "object" && a ? resolve(a.port) : reject(new Error("no port"))));
    });
  });

const dir = fs.mkdtempSync(path.join(os.tmpdir(), "plateau-api-bench-"));
const port = await freePort();
const base = `http://127.0.0.1:${port}`;
const server = spawn(process.execPath, ["node_modules/next/dist/bin/next", "start", "-p", String(port), "-H", "127.0.0.1"], {
  env: {
    ...process.env,
    NODE_ENV: "production",
    NEXT_TELEMETRY_DISABLED: "1",
    PLATEAU_DB: path.join(dir, "bench.sqlite"),
    PLATEAU_PUBLIC_URL: base,
    PLATEAU_TEST: "1",
  },
  stdio: ["ignore", "ignore", "pipe"],
});
let serverLog = "";
server.stderr?.on("data", (d) => (serverLog = (serverLog + d).slice(-4000)));

let cookie = "";
async function call(method: string, p: string, body?: string, type = "application/json"): Promise<{ status: number; json: unknown }> {
  const headers: Record<string, string> = { cookie };
  if (method !== "GET") headers.origin = base;
  if (body !== undefined) headers["content-type"] = type;
  const r = await fetch(base + p, { method, headers, body, redirect: "manual" });
  for (const c of r.headers.getSetCookie()) if (c.startsWith("plateau_session=")) cookie = c.split(";")[0]!;
  const text = await r.text();
  let json: unknown;
  try {
    json = text ? JSON.parse(text) : undefined;
  } catch {
    json = text.slice(0, 300);
  }
  return { status: r.status, json };
}
/** The JSON answer of a call that must answer `status` (typed as the caller expects it). */
async function expect<T = unknown>(status: number, p: Promise<{ status: number; json: unknown }>, what: string): Promise<T> {
  const r = await p;
  if (r.status !== status) throw new Error(`${what}: expected ${status}, got ${r.status} ${JSON.stringify(r.json).slice(0, 300)}`);
  return r.json as T;
}

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

function fmt(n: number, digits = 1) {
  return n.toFixed(digits);
}

try {
  for (let i = 0; ; i++) {
    try {
      if ((await fetch(`${base}/api/health`)).ok) break;
    } catch {
      /* starting */
    }
    if (i > 240 || server.exitCode !== null) throw new Error(`server did not start:\n${serverLog}`);
    await new Promise((r) => setTimeout(r, 250));
  }

  // Seed through the API, from the demo's own data files (scaling/examples).
  const examples = (f: string) => fs.readFileSync(path.join("scaling/examples", f), "utf8");
  const email = `bench-${Date.now()}@example.test`;
  const password = "correct horse battery staple 42";
  await expect(201, call("POST", "/api/auth/sign-up", JSON.stringify({ email, password, name: "Bench" })), "sign-up");
  const { team } = await expect<{ team: { id: string } }>(201, call("POST", "/api/teams", JSON.stringify({ name: "Bench team" })), "team");
  const teamId = team.id;
  const created = await expect<{ baseline: { id: string } }>(
    201,
    call("POST", `/api/teams/${teamId}/baselines/import?name=${encodeURIComponent("Skua (bench)")}`, examples("skua-baseline.csv"), "text/csv"),
    "baseline import",
  );
  const baselineId = created.baseline.id;
  await expect(
    200,
    call("POST", `/api/baselines/${baselineId}/histograms?mode=replace&version=1`, examples("skua-histograms.csv"), "text/csv"),
    "histogram import",
  );
  const demo = (JSON.parse(examples("skua-scenarios.json")) as { name: string; notes: string; settings: unknown }[])[0]!;
  const { scenario } = await expect<{ scenario: { id: string } }>(
    201,
    call("POST", `/api/teams/${teamId}/scenarios`, JSON.stringify({ baselineId, name: demo.name, notes: demo.notes, settings: demo.settings })),
    "scenario",
  );

  // Sign in afresh: the measured requests carry this session.
  cookie = "";
  await expect(200, call("POST", "/api/auth/sign-in", JSON.stringify({ email, password })), "sign-in");

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
    const headers: Record<string, string> = { cookie };
    if (t.method !== "GET") headers.origin = base;
    if (t.body !== undefined) headers["content-type"] = "application/json";
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
  server.kill("SIGTERM");
  await new Promise((r) => setTimeout(r, 300));
  fs.rmSync(dir, { recursive: true, force: true });
}

/**
 * What the HTTP benchmarks share (`npm run bench:api`, `npm run bench:import-load`): a build in PLATEAU_DIST_DIR
 * (made when missing), one `next start` on a temporary SQLite file, a cookie-keeping client, the demo's seed through
 * the HTTP API only (scaling/examples), autocannon's types, and the server's CPU time from Linux /proc.
 */
import { spawn, spawnSync, type ChildProcess } from "node:child_process";
import fs from "node:fs";
import { createRequire } from "node:module";
import net from "node:net";
import os from "node:os";
import path from "node:path";

// autocannon ships no types: the part of its API used here.
export interface CannonResult {
  latency: { p50: number; p99: number };
  requests: { average: number };
  "2xx": number;
  non2xx: number;
  errors: number;
  timeouts: number;
}
type Cannon = (opts: {
  url: string;
  method?: string;
  headers?: Record<string, string>;
  body?: string;
  connections: number;
  duration: number;
}) => Promise<CannonResult>;
export const autocannon = createRequire(import.meta.url)("autocannon") as Cannon;

export const distDir = process.env.PLATEAU_DIST_DIR || ".next";

export const fmt = (n: number, digits = 1) => n.toFixed(digits);

/** Runs `next build` into `distDir` when it holds no build. */
export function ensureBuild(): void {
  if (fs.existsSync(path.join(distDir, "BUILD_ID"))) return;
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

export interface BenchServer {
  base: string;
  server: ChildProcess;
  /** Stops the server and removes its temporary folder. */
  stop(): Promise<void>;
}

/** `next start` on a free loopback port with a fresh SQLite file in a temporary folder named after `name`; waits for /api/health. */
export async function startBenchServer(name: string): Promise<BenchServer> {
  ensureBuild();
  const dir = fs.mkdtempSync(path.join(os.tmpdir(), `plateau-${name}-`));
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
  let log = "";
  server.stderr?.on("data", (d) => (log = (log + d).slice(-4000)));
  const stop = async () => {
    server.kill("SIGTERM");
    await new Promise((r) => setTimeout(r, 300));
    fs.rmSync(dir, { recursive: true, force: true });
  };
  try {
    for (let i = 0; ; i++) {
      try {
        if ((await fetch(`${base}/api/health`)).ok) break;
      } catch {
        /* starting */
      }
      if (i > 240 || server.exitCode !== null) throw new Error(`server did not start:\n${log}`);
      await new Promise((r) => setTimeout(r, 250));
    }
  } catch (e) {
    await stop();
    throw e;
  }
  return { base, server, stop };
}

/** A client that keeps the session cookie and sends Origin on writes, as a browser would. */
export function benchClient(base: string) {
  let cookie = "";
  async function call(method: string, p: string, body?: BodyInit, type = "application/json"): Promise<{ status: number; json: unknown }> {
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
  async function must<T = unknown>(status: number, p: Promise<{ status: number; json: unknown }>, what: string): Promise<T> {
    const r = await p;
    if (r.status !== status) throw new Error(`${what}: expected ${status}, got ${r.status} ${JSON.stringify(r.json).slice(0, 300)}`);
    return r.json as T;
  }
  /** Headers for autocannon carrying this client's session (and Origin and JSON type on writes). */
  const headersFor = (method: string, json: boolean): Record<string, string> => {
    const h: Record<string, string> = { cookie };
    if (method !== "GET") h.origin = base;
    if (json) h["content-type"] = "application/json";
    return h;
  };
  return { call, must, headersFor, signOut: () => (cookie = "") };
}
export type BenchClient = ReturnType<typeof benchClient>;

export const examples = (f: string) => fs.readFileSync(path.join("scaling/examples", f), "utf8");

/**
 * Seeds through the HTTP API from the demo's own data files: a user (signed in), a team, the Skua baseline (with its
 * histograms when asked) and the first demo scenario.
 */
export async function seedSkua(c: BenchClient, opts: { histograms: boolean }) {
  const email = `bench-${Date.now()}@example.test`;
  const password = "correct horse battery staple 42";
  await c.must(201, c.call("POST", "/api/auth/sign-up", JSON.stringify({ email, password, name: "Bench" })), "sign-up");
  const { team } = await c.must<{ team: { id: string } }>(201, c.call("POST", "/api/teams", JSON.stringify({ name: "Bench team" })), "team");
  const created = await c.must<{ baseline: { id: string } }>(
    201,
    c.call("POST", `/api/teams/${team.id}/baselines/import?name=${encodeURIComponent("Skua (bench)")}`, examples("skua-baseline.csv"), "text/csv"),
    "baseline import",
  );
  const baselineId = created.baseline.id;
  if (opts.histograms)
    await c.must(
      200,
      c.call("POST", `/api/baselines/${baselineId}/histograms?mode=replace&version=1`, examples("skua-histograms.csv"), "text/csv"),
      "histogram import",
    );
  const demo = (JSON.parse(examples("skua-scenarios.json")) as { name: string; notes: string; settings: unknown }[])[0]!;
  const { scenario } = await c.must<{ scenario: { id: string } }>(
    201,
    c.call("POST", `/api/teams/${team.id}/scenarios`, JSON.stringify({ baselineId, name: demo.name, notes: demo.notes, settings: demo.settings })),
    "scenario",
  );
  return { email, password, teamId: team.id, baselineId, scenarioId: scenario.id };
}

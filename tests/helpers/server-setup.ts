import { spawn, spawnSync, type ChildProcess } from "node:child_process";
import fs from "node:fs";
import net from "node:net";
import os from "node:os";
import path from "node:path";
import type { TestProject } from "vitest/node";

declare module "vitest" {
  export interface ProvidedContext {
    baseUrl: string;
    dbPath: string;
  }
}

function freePort(): Promise<number> {
  return new Promise((resolve, reject) => {
    const srv = net.createServer();
    srv.listen(0, "127.0.0.1", () => {
      const addr = srv.address();
      srv.close(() => (typeof addr === "object" && addr ? resolve(addr.port) : reject(new Error("no port"))));
    });
  });
}

export interface StartedServer {
  baseUrl: string;
  dbPath: string;
  log: () => string;
  stop: () => void;
}

/**
 * `next start` on a free loopback port with a fresh temporary SQLite file and the in-process fake SMTP server,
 * once the build exists. `env` adds to (or, with undefined values, removes from) the server's environment.
 */
export async function startServer(env: Record<string, string | undefined> = {}): Promise<StartedServer> {
  const dir = fs.mkdtempSync(path.join(os.tmpdir(), "plateau-http-"));
  const dbPath = path.join(dir, "test.sqlite");
  const port = await freePort();
  const baseUrl = `http://127.0.0.1:${port}`;
  const merged: Record<string, string | undefined> = {
    ...process.env,
    NODE_ENV: "production",
    PLATEAU_DB: dbPath,
    PLATEAU_PUBLIC_URL: baseUrl,
    PLATEAU_TEST: "1",
    ...env,
  };
  for (const k of Object.keys(merged)) if (merged[k] === undefined) delete merged[k];
  const child: ChildProcess = spawn("npx", ["next", "start", "-p", String(port), "-H", "127.0.0.1"], {
    env: merged as NodeJS.ProcessEnv,
    stdio: ["ignore", "pipe", "pipe"],
    detached: true,
  });
  let log = "";
  child.stdout?.on("data", (d) => (log += d));
  child.stderr?.on("data", (d) => (log += d));
  const stop = () => {
    if (child.pid) {
      try {
        process.kill(-child.pid, "SIGTERM");
      } catch {
        /* already gone */
      }
    }
    if (process.env.PLATEAU_KEEP_TEST_DB !== "1") fs.rmSync(dir, { recursive: true, force: true });
  };
  const deadline = Date.now() + 60_000;
  for (;;) {
    try {
      const r = await fetch(`${baseUrl}/api/health`);
      if (r.ok) break;
    } catch {
      /* not up yet */
    }
    if (Date.now() > deadline || child.exitCode !== null) {
      stop();
      throw new Error(`next start did not become healthy:\n${log.slice(-4000)}`);
    }
    await new Promise((r) => setTimeout(r, 250));
  }
  return { baseUrl, dbPath, log: () => log, stop };
}

/**
 * Build once (unless PLATEAU_SKIP_BUILD=1 and a build exists), then start the shared test server.
 *
 * The test client stands in for a reverse proxy on loopback (PLATEAU_TRUSTED_PROXIES=127.0.0.1): a test that
 * sends `x-forwarded-for: <address>` is seen as that client, so tests that fail sign-ins on purpose stay
 * apart, just as clients behind a real proxy would be. Without that header the client is 127.0.0.1. What a
 * server WITHOUT trusted proxies does with a spoofed header is tested on a second server of its own
 * (tests/app/client-address.test.ts).
 */
export default async function setup(project: TestProject) {
  process.env.NEXT_TELEMETRY_DISABLED = "1";
  const distDir = process.env.PLATEAU_DIST_DIR || ".next";
  const built = fs.existsSync(path.join(distDir, "BUILD_ID"));
  if (!(process.env.PLATEAU_SKIP_BUILD === "1" && built)) {
    const r = spawnSync("npx", ["next", "build"], {
      stdio: ["ignore", "inherit", "inherit"],
      env: { ...process.env, NODE_ENV: "production" },
    });
    if (r.status !== 0) throw new Error(`next build failed (exit ${r.status})`);
  }
  const server = await startServer({ PLATEAU_TRUSTED_PROXIES: "127.0.0.1" });
  project.provide("baseUrl", server.baseUrl);
  project.provide("dbPath", server.dbPath);
  return () => {
    const log = server.log();
    server.stop();
    if (process.env.PLATEAU_SERVER_LOG === "1") console.log(log);
  };
}

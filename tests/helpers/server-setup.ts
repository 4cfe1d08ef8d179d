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

/**
 * Build once (unless PLATEAU_SKIP_BUILD=1 and a build exists), then start `next start` on a free
 * loopback port with a fresh temporary SQLite file and the in-process fake SMTP server.
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
  const dir = fs.mkdtempSync(path.join(os.tmpdir(), "plateau-http-"));
  const dbPath = path.join(dir, "test.sqlite");
  const port = await freePort();
  const baseUrl = `http://127.0.0.1:${port}`;
  const child: ChildProcess = spawn("npx", ["next", "start", "-p", String(port), "-H", "127.0.0.1"], {
    env: { ...process.env, NODE_ENV: "production", PLATEAU_DB: dbPath, PLATEAU_PUBLIC_URL: baseUrl, PLATEAU_TEST: "1" },
    stdio: ["ignore", "pipe", "pipe"],
    detached: true,
  });
  let log = "";
  child.stdout?.on("data", (d) => (log += d));
  child.stderr?.on("data", (d) => (log += d));
  const deadline = Date.now() + 60_000;
  for (;;) {
    try {
      const r = await fetch(`${baseUrl}/api/health`);
      if (r.ok) break;
    } catch {
      /* not up yet */
    }
    if (Date.now() > deadline || child.exitCode !== null) {
      throw new Error(`next start did not become healthy:\n${log.slice(-4000)}`);
    }
    await new Promise((r) => setTimeout(r, 250));
  }
  project.provide("baseUrl", baseUrl);
  project.provide("dbPath", dbPath);
  return () => {
    if (child.pid) {
      try {
        process.kill(-child.pid, "SIGTERM");
      } catch {
        /* already gone */
      }
    }
    if (process.env.PLATEAU_KEEP_TEST_DB !== "1") fs.rmSync(dir, { recursive: true, force: true });
    if (process.env.PLATEAU_SERVER_LOG === "1") console.log(log);
  };
}

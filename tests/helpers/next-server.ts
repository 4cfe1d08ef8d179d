import { spawn, type ChildProcess } from "node:child_process";
import fs from "node:fs";
import net from "node:net";
import os from "node:os";
import path from "node:path";

export function freePort(): Promise<number> {
  return new Promise((resolve, reject) => {
    const srv = net.createServer();
    srv.listen(0, "127.0.0.1", () => {
      const addr = srv.address();
      srv.close(() => (typeof addr === "object" && addr ? resolve(addr.port) : reject(new Error("no port"))));
    });
  });
}

export interface RunningServer {
  baseUrl: string;
  dbPath: string;
  /** Everything the server printed so far. */
  log: () => string;
  /** Stop the server and (unless PLATEAU_KEEP_TEST_DB=1) remove its temporary database. */
  stop: () => Promise<void>;
}

/**
 * `next start` of the existing build (PLATEAU_DIST_DIR) on a free loopback port with a fresh temporary SQLite file,
 * the in-process fake SMTP server and PLATEAU_TEST=1. `env` adds or overrides settings; a function receives the base
 * URL first (e.g. to derive PLATEAU_PUBLIC_URL from the port); an undefined value removes a setting.
 */
export async function startServer(
  env: Record<string, string | undefined> | ((baseUrl: string) => Record<string, string | undefined>) = {},
): Promise<RunningServer> {
  const dir = fs.mkdtempSync(path.join(os.tmpdir(), "plateau-http-"));
  const dbPath = path.join(dir, "test.sqlite");
  const port = await freePort();
  const baseUrl = `http://127.0.0.1:${port}`;
  const extra = typeof env === "function" ? env(baseUrl) : env;
  // an undefined value removes the setting from the server's environment (e.g. no PLATEAU_PUBLIC_URL)
  const merged: Record<string, string | undefined> = {
    ...process.env,
    NODE_ENV: "production",
    PLATEAU_DB: dbPath,
    PLATEAU_PUBLIC_URL: baseUrl,
    PLATEAU_TEST: "1",
    ...extra,
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
  const exited = new Promise<void>((r) => child.once("exit", () => r()));
  const stop = async () => {
    if (child.pid && child.exitCode === null) {
      try {
        process.kill(-child.pid, "SIGTERM");
      } catch {
        /* already gone */
      }
      await Promise.race([exited, new Promise((r) => setTimeout(r, 5000))]);
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
      await stop();
      throw new Error(`next start did not become healthy:\n${log.slice(-4000)}`);
    }
    await new Promise((r) => setTimeout(r, 250));
  }
  return { baseUrl, dbPath, log: () => log, stop };
}

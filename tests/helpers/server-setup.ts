import { spawnSync } from "node:child_process";
import fs from "node:fs";
import path from "node:path";
import type { TestProject } from "vitest/node";
import { startServer } from "./next-server";

declare module "vitest" {
  export interface ProvidedContext {
    baseUrl: string;
    dbPath: string;
  }
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
  return async () => {
    await server.stop();
    if (process.env.PLATEAU_SERVER_LOG === "1") console.log(server.log());
  };
}

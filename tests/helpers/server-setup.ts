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
  const server = await startServer();
  project.provide("baseUrl", server.baseUrl);
  project.provide("dbPath", server.dbPath);
  return async () => {
    await server.stop();
    if (process.env.PLATEAU_SERVER_LOG === "1") console.log(server.log());
  };
}

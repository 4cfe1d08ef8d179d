/**
 * CSV import benchmark (part of `npm run bench`): a 1,000,000-row length-histogram CSV (~25 MB),
 *  1. a bare papaparse parse of the file (the reference),
 *  2. lib/import directly on a file stream into a temporary SQLite file, in a child process (time, peak RSS):
 *     parse + validate into per-class typed arrays, then one transaction writing one class_histograms row per class,
 *  3. end to end over HTTP against `next start` when a build exists (PLATEAU_DIST_DIR or .next): upload →
 *     validated → stored, with the server process's peak RSS (VmHWM).
 * Aims (issue 5): import ≤ 3× the bare parse, peak RSS ≤ 400 MB.
 */
import { spawn, spawnSync } from "node:child_process";
import fs from "node:fs";
import http from "node:http";
import net from "node:net";
import os from "node:os";
import path from "node:path";
import Papa from "papaparse";

const ROWS = Number(process.env.BENCH_ROWS ?? 1_000_000);
const CLASSES = ["local", "intermediate", "semi-global", "global"];
const dir = fs.mkdtempSync(path.join(os.tmpdir(), "plateau-import-bench-"));
const csv = path.join(dir, "histograms.csv");

function generate(): number {
  const fd = fs.openSync(csv, "w");
  let buf = "class,length_um,count\n";
  const per = Math.ceil(ROWS / CLASSES.length);
  let n = 0;
  for (const c of CLASSES) {
    for (let i = 1; i <= per && n < ROWS; i++, n++) {
      buf += `${c},${(i * 0.25).toFixed(2)},${((i * 7919) % 997) + 1}\n`;
      if (buf.length > 1 << 16) {
        fs.writeSync(fd, buf);
        buf = "";
      }
    }
  }
  fs.writeSync(fd, buf);
  fs.closeSync(fd);
  return fs.statSync(csv).size;
}

async function bareParse(): Promise<{ ms: number; rows: number }> {
  const t0 = performance.now();
  let rows = 0;
  await new Promise<void>((resolve, reject) =>
    Papa.parse(fs.createReadStream(csv, { encoding: "utf8", highWaterMark: 64 * 1024 }) as unknown as File, {
      chunk: (r: Papa.ParseResult<unknown>) => {
        rows += r.data.length;
      },
      complete: () => resolve(),
      error: (e: Error) => reject(e),
    }),
  );
  return { ms: performance.now() - t0, rows: rows - 1 };
}

function libImport(): {
  parseMs: number;
  storeMs: number;
  totalMs: number;
  checkpointMs: number;
  rows: number;
  stored: number;
  peakRssMiB: number;
} {
  const r = spawnSync("npx", ["tsx", "--conditions=react-server", "tests/bench/import-bench-child.ts", csv, path.join(dir, "lib.sqlite"), CLASSES.join(",")], {
    encoding: "utf8",
  });
  if (r.status !== 0) throw new Error(`child failed: ${r.stderr}`);
  return JSON.parse(r.stdout.trim().split("\n").pop()!);
}

const freePort = () =>
  new Promise<number>((resolve) => {
    const s = net.createServer().listen(0, "127.0.0.1", () => {
      const a = s.address();
      s.close(() => resolve(typeof a === "object" && a ? a.port : 0));
    });
  });

function hwmMiB(pid: number): number {
  // the server and any child processes it started
  let best = 0;
  const visit = (p: number) => {
    try {
      const kb = Number(/VmHWM:\s+(\d+) kB/.exec(fs.readFileSync(`/proc/${p}/status`, "utf8"))?.[1] ?? 0);
      best = Math.max(best, kb / 1024);
      for (const t of fs.readdirSync(`/proc/${p}/task`)) {
        const kids = fs.readFileSync(`/proc/${p}/task/${t}/children`, "utf8").trim();
        for (const k of kids ? kids.split(/\s+/) : []) visit(Number(k));
      }
    } catch {
      /* gone */
    }
  };
  visit(pid);
  return best;
}

async function endToEnd(): Promise<null | {
  uploadToStoredMs: number;
  serverPeakRssMiB: number;
  serverRssBeforeMiB: number;
  status: number;
  body: string;
}> {
  const distDir = process.env.PLATEAU_DIST_DIR || ".next";
  if (!fs.existsSync(path.join(distDir, "BUILD_ID"))) return null;
  const port = await freePort();
  const base = `http://127.0.0.1:${port}`;
  const server = spawn(process.execPath, ["node_modules/next/dist/bin/next", "start", "-p", String(port), "-H", "127.0.0.1"], {
    env: { ...process.env, NODE_ENV: "production", PLATEAU_DB: path.join(dir, "http.sqlite"), PLATEAU_PUBLIC_URL: base },
    stdio: "ignore",
  });
  try {
    for (let i = 0; ; i++) {
      try {
        if ((await fetch(`${base}/api/health`)).ok) break;
      } catch {
        /* starting */
      }
      if (i > 240) throw new Error("server did not start");
      await new Promise((r) => setTimeout(r, 250));
    }
    let cookie = "";
    const call = async (method: string, p: string, body: BodyInit, type: string) => {
      const r = await fetch(base + p, { method, body, headers: { "content-type": type, origin: base, cookie } });
      for (const c of r.headers.getSetCookie()) if (c.startsWith("plateau_session=")) cookie = c.split(";")[0]!;
      return r;
    };
    await call(
      "POST",
      "/api/auth/sign-up",
      JSON.stringify({ email: `bench-${Date.now()}@example.test`, password: "correct horse battery staple 42", name: "Bench" }),
      "application/json",
    );
    const team = (await (await call("POST", "/api/teams", JSON.stringify({ name: "Bench" }), "application/json")).json()) as {
      team: { id: string };
    };
    const b = (await (
      await call("POST", `/api/teams/${team.team.id}/baselines/import?name=Bench`, fs.readFileSync("public/templates/wire-classes-template.csv"), "text/csv")
    ).json()) as { baseline: { id: string } };
    // warm-up: load the histogram route's code once (a one-row dry run), so the timing is the import's
    const warm = await call("POST", `/api/baselines/${b.baseline.id}/histograms?mode=replace&dryRun=1`, "class,length_um,count\nlocal,1,1\n", "text/csv");
    if (warm.status !== 200) throw new Error(`warm-up failed: ${warm.status} ${await warm.text()}`);
    const before = hwmMiB(server.pid!);
    const t0 = performance.now();
    const res = await new Promise<{ status: number; body: string }>((resolve, reject) => {
      const req = http.request(
        {
          host: "127.0.0.1",
          port,
          method: "POST",
          path: `/api/baselines/${b.baseline.id}/histograms?mode=replace&version=1`, // a baseline made by an import is at version 1
          headers: { "content-type": "text/csv", "content-length": fs.statSync(csv).size, cookie, origin: base },
        },
        (r) => {
          let body = "";
          r.on("data", (d) => (body += d));
          r.on("end", () => resolve({ status: r.statusCode ?? 0, body }));
        },
      );
      req.on("error", reject);
      fs.createReadStream(csv).pipe(req);
    });
    const ms = performance.now() - t0;
    return {
      uploadToStoredMs: ms,
      serverPeakRssMiB: hwmMiB(server.pid!),
      serverRssBeforeMiB: before,
      status: res.status,
      body: res.body.slice(0, 300),
    };
  } finally {
    server.kill("SIGTERM");
  }
}

const bytes = generate();
console.log(`\nCSV import benchmark — ${ROWS.toLocaleString("en-US")} histogram rows, ${(bytes / 1e6).toFixed(1)} MB (${csv})`);
const bare = await bareParse();
console.log(`  bare papaparse parse            ${bare.ms.toFixed(0).padStart(7)} ms   (${bare.rows.toLocaleString("en-US")} rows)`);
const lib = libImport();
console.log(
  `  lib/import (child process)      ${lib.totalMs.toFixed(0).padStart(7)} ms   = parse+validate ${lib.parseMs.toFixed(0)} ms + store ${lib.storeMs.toFixed(0)} ms; ${lib.stored.toLocaleString("en-US")} bins stored in class_histograms`,
);
console.log(`      (then the deferred WAL checkpoint, after the answer: ${lib.checkpointMs.toFixed(0)} ms)`);
console.log(
  `      ratio to bare parse         ${(lib.totalMs / bare.ms).toFixed(2).padStart(7)} ×   (aim ≤ 3×; parse+validate alone ${(lib.parseMs / bare.ms).toFixed(2)} ×)`,
);
console.log(`      child peak RSS (VmHWM)      ${lib.peakRssMiB.toFixed(0).padStart(7)} MiB (aim ≤ 400 MB)`);
const e2e = await endToEnd();
if (!e2e) console.log("  HTTP end to end                 skipped: no build in PLATEAU_DIST_DIR (or .next); run `next build` first");
else {
  console.log(`  HTTP upload → validated → stored ${e2e.uploadToStoredMs.toFixed(0).padStart(6)} ms   (status ${e2e.status})`);
  console.log(`      ratio to bare parse         ${(e2e.uploadToStoredMs / bare.ms).toFixed(2).padStart(7)} ×`);
  console.log(
    `      server peak RSS (VmHWM)     ${e2e.serverPeakRssMiB.toFixed(0).padStart(7)} MiB (before the upload ${e2e.serverRssBeforeMiB.toFixed(0)} MiB; aim ≤ 400 MB)`,
  );
  if (e2e.status !== 200) console.log(`      answer: ${e2e.body}`);
}
fs.rmSync(dir, { recursive: true, force: true });

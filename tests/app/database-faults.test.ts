import { spawn, type ChildProcess } from "node:child_process";
import fs from "node:fs";
import net from "node:net";
import os from "node:os";
import path from "node:path";
import Database from "better-sqlite3";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { openDatabase } from "@/db/connect";
import { migrateLatest } from "@/db/migrate";
import { Client, GOOD_PASSWORD, uniqueEmail } from "../helpers/http";

// Issue 12 finding 15: database failures answer 503 with Retry-After and the JSON error body, /api/health says
// whether the database can be written, and a server started on a read-only file recovers once it is writable —
// without a restart. RFC 9110 §15.6.4 (503 Service Unavailable) and §10.2.3 (Retry-After).
//
// This file starts its own `next start` (reusing the HTTP project's build) on its own database, so the shared test
// server is never disturbed. How the faults are made, honestly:
// - read-only file: the tests run as root here, and root writes through any file mode, so when the runner is root the
//   server runs as the unprivileged user `nobody` (util-linux `setpriv`), for whom mode 0444 is a real read-only file;
//   as any other user, the server simply runs as that user. No flag in the app pretends the file is read-only.
// - locked database: the test takes SQLite's write lock from another connection (BEGIN IMMEDIATE) and holds it past
//   the app's busy timeout (5 s), as a backup tool or a second process would.

const NOBODY = 65534;
const asRoot = process.getuid?.() === 0;
let dir = "";
let dbPath = "";
let child: ChildProcess | undefined;
let log = "";
let baseUrl = "";

function freePort(): Promise<number> {
  return new Promise((resolve, reject) => {
    const srv = net.createServer();
    srv.listen(0, "127.0.0.1", () => {
      const addr = srv.address();
      srv.close(() => (typeof addr === "object" && addr ? resolve(addr.port) : reject(new Error("no port"))));
    });
  });
}

const dbFiles = () => [dbPath, `${dbPath}-wal`, `${dbPath}-shm`].filter((f) => fs.existsSync(f));
const chmodAll = (mode: number) => {
  for (const f of dbFiles()) fs.chmodSync(f, mode);
};

beforeAll(async () => {
  dir = fs.mkdtempSync(path.join(os.tmpdir(), "plateau-dbfault-"));
  fs.chmodSync(dir, 0o777); // SQLite creates its -wal and -shm files beside the database
  dbPath = path.join(dir, "app.sqlite");
  // a migrated database, then made read-only for the server's user
  const knex = openDatabase(dbPath);
  await migrateLatest(knex);
  await knex.destroy();
  if (asRoot) for (const f of dbFiles()) fs.chownSync(f, NOBODY, NOBODY);
  chmodAll(0o444);

  const port = await freePort();
  baseUrl = `http://127.0.0.1:${port}`;
  const next = [path.resolve("node_modules/next/dist/bin/next"), "start", "-p", String(port), "-H", "127.0.0.1"];
  const [cmd, args] = asRoot
    ? ["setpriv", ["--reuid", String(NOBODY), "--regid", String(NOBODY), "--clear-groups", process.execPath, ...next]]
    : [process.execPath, next];
  child = spawn(cmd, args as string[], {
    env: { ...process.env, NODE_ENV: "production", PLATEAU_DB: dbPath, PLATEAU_PUBLIC_URL: baseUrl, PLATEAU_TEST: "1", HOME: dir },
    stdio: ["ignore", "pipe", "pipe"],
    detached: true,
  });
  child.stdout?.on("data", (d) => (log += d));
  child.stderr?.on("data", (d) => (log += d));
  const deadline = Date.now() + 60_000;
  for (;;) {
    try {
      await fetch(`${baseUrl}/api/health`);
      break; // any answer: the server is up (healthy or not)
    } catch {
      /* not listening yet */
    }
    if (Date.now() > deadline || child.exitCode !== null) throw new Error(`next start did not come up:\n${log.slice(-4000)}`);
    await new Promise((r) => setTimeout(r, 250));
  }
}, 120_000);

afterAll(() => {
  if (child?.pid) {
    try {
      process.kill(-child.pid, "SIGTERM");
    } catch {
      /* gone */
    }
  }
  if (process.env.PLATEAU_SERVER_LOG === "1") console.log(log);
  if (dir) fs.rmSync(dir, { recursive: true, force: true });
});

async function expect503(res: { status: number; headers: Headers; json: any; text: string }) {
  expect(res.status, res.text).toBe(503);
  expect(res.headers.get("retry-after")).toMatch(/^[1-9]\d*$/);
  expect(res.headers.get("content-type")).toMatch(/^application\/json/);
}

const teams = () => {
  const d = new Database(dbPath, { readonly: true, fileMustExist: true });
  try {
    return (d.prepare("select count(*) as n from teams").get() as { n: number }).n;
  } finally {
    d.close();
  }
};

describe("database faults (issue 12 finding 15)", () => {
  it("started on a read-only file: health and writes answer JSON 503 with Retry-After, then recover once it is writable, same process", async () => {
    const pid = child!.pid;
    const c = new Client(baseUrl);
    const health = await c.get("/api/health");
    await expect503(health);
    expect(health.json.error ?? health.json.database).toBeDefined();
    const signUp = await c.post("/api/auth/sign-up", { email: uniqueEmail(), password: GOOD_PASSWORD, name: "Read Only" });
    await expect503(signUp);
    expect(signUp.json.error.code).toBe("database_unavailable");
    expect(signUp.json.error.message).toMatch(/nothing was stored/);

    // permissions restored (the file and the -wal/-shm SQLite made beside it): no restart
    chmodAll(0o644);
    let h = await c.get("/api/health");
    for (let i = 0; i < 40 && h.status !== 200; i++) {
      await new Promise((r) => setTimeout(r, 250));
      h = await c.get("/api/health");
    }
    expect(h.status, h.text).toBe(200);
    expect(h.json).toEqual({ ok: true, database: { migrated: true, writable: true } });
    const ok = await c.post("/api/auth/sign-up", { email: uniqueEmail(), password: GOOD_PASSWORD, name: "Writable Again" });
    expect(ok.status, ok.text).toBe(201);
    const t = await c.post("/api/teams", { name: "After recovery" });
    expect(t.status, t.text).toBe(201);
    expect(child!.exitCode).toBeNull();
    expect(child!.pid).toBe(pid);
  }, 60_000);

  it("a write lock held by another process past the busy timeout: writes and health answer 503, nothing half-written; then writes work", async () => {
    const c = new Client(baseUrl);
    expect((await c.post("/api/auth/sign-up", { email: uniqueEmail(), password: GOOD_PASSWORD, name: "Locked Out" })).status).toBe(201);
    const before = teams();
    const holder = new Database(dbPath);
    holder.exec("BEGIN IMMEDIATE");
    try {
      const t = await c.post("/api/teams", { name: "While locked" });
      await expect503(t);
      expect(t.json.error).toMatchObject({ code: "database_unavailable", message: expect.stringMatching(/busy/) });
      const h = await c.get("/api/health");
      await expect503(h);
      expect(h.json).toMatchObject({ ok: false, database: { writable: false } });
    } finally {
      holder.exec("ROLLBACK");
      holder.close();
    }
    expect(teams()).toBe(before);
    const t = await c.post("/api/teams", { name: "After the lock" });
    expect(t.status, t.text).toBe(201);
    // health probes the database at most once a second: the next probe sees the lock gone
    let h = await c.get("/api/health");
    for (let i = 0; i < 12 && h.status !== 200; i++) {
      await new Promise((r) => setTimeout(r, 250));
      h = await c.get("/api/health");
    }
    expect(h.status, h.text).toBe(200);
  }, 60_000);
});

// Structural checks (source scans, not behaviour): where writes, audit rows and lib imports may live.
import { describe, expect, it } from "vitest";
import fs from "node:fs";
import path from "node:path";

const ROOT = path.resolve(__dirname, "../..");
const SKIP = new Set(["node_modules", ".git", "data", "migrations", "tests", "public", "docs"]);

function sources(dir = ROOT): string[] {
  const out: string[] = [];
  for (const e of fs.readdirSync(dir, { withFileTypes: true })) {
    if (e.name.startsWith(".") || SKIP.has(e.name)) continue;
    const p = path.join(dir, e.name);
    if (e.isDirectory()) out.push(...sources(p));
    else if (/\.(ts|tsx|mts|mjs|js)$/.test(e.name)) out.push(p);
  }
  return out;
}

const rel = (p: string) => path.relative(ROOT, p).split(path.sep).join("/");
const files = sources().map((p) => ({ path: rel(p), text: fs.readFileSync(p, "utf8") }));

describe("structure: one write path", () => {
  it("finds the source tree (sanity: the scan sees the app, db and lib)", () => {
    const paths = files.map((f) => f.path);
    expect(paths).toContain("db/audit.ts");
    expect(paths).toContain("db/writes/baselines.ts");
    expect(paths).toContain("app/api/teams/route.ts");
    expect(paths.length).toBeGreaterThan(100);
  });

  it("only db/audit.ts names the audit_log table in code (SQL strings, query builders): every audit row goes through writeAudit", () => {
    const offenders = files.filter((f) => f.path !== "db/audit.ts" && /["'`][^"'`\n]*\baudit_log\b/.test(f.text)).map((f) => f.path);
    expect(offenders).toEqual([]);
  });

  it("writeAudit is called only by the write modules (db/writes/*)", () => {
    const offenders = files
      .filter((f) => f.path !== "db/audit.ts" && !f.path.startsWith("db/writes/") && /\bwriteAudit\b|["']@\/db\/audit["']/.test(f.text))
      .map((f) => f.path);
    expect(offenders).toEqual([]);
  });

  it("db/ imports only types from lib/", () => {
    const statements = /^\s*(?:import|export)\b[^;]*?["']@\/lib\/[^"']*["']/gms;
    const offenders = files
      .filter((f) => f.path.startsWith("db/"))
      .flatMap((f) =>
        [...f.text.matchAll(statements)]
          .map((m) => m[0].trim())
          .filter((st) => !/^(import|export)\s+type\b/.test(st))
          .map((st) => `${f.path}: ${st}`),
      );
    expect(offenders).toEqual([]);
    // the scan itself sees type imports (so an empty list above means something)
    expect(files.find((f) => f.path === "db/writes/baselines.ts")!.text).toMatch(statements);
  });

  it("route handlers open no transactions: they call one write function of db/writes", () => {
    const offenders = files.filter((f) => f.path.startsWith("app/") && /\.transaction\(/.test(f.text)).map((f) => f.path);
    expect(offenders).toEqual([]);
  });

  it("the CSV import pipeline (lib/import) builds no HTTP answers: apiRoute does", () => {
    const offenders = files.filter((f) => f.path.startsWith("lib/import/") && /\bResponse\.json\(|new Response\(/.test(f.text)).map((f) => f.path);
    expect(offenders).toEqual([]);
  });

  it("no SQL outside db/: no query builder on a table name, no raw SQL in app, lib, components or scaling", () => {
    const sql = /\b(?:db|trx|conn|knex|q)\(\s*["'`]|\.raw\(|\.transaction\(/;
    const offenders = files.filter((f) => !f.path.startsWith("db/") && !f.path.endsWith("knexfile.ts") && sql.test(f.text)).map((f) => f.path);
    expect(offenders).toEqual([]);
    // the pattern does find the queries where they belong
    expect(files.find((f) => f.path === "db/queries/teams.ts")!.text).toMatch(sql);
  });

  it("lib/scaling imports nothing outside itself (no app code, framework, database or I/O; decimal.js, pure, for exact units)", () => {
    const imports = /^\s*(?:import|export)\b[^;]*?from\s+["']([^"']+)["']/gms;
    const offenders = files
      .filter((f) => f.path.startsWith("lib/scaling/"))
      .flatMap((f) =>
        [...f.text.matchAll(imports)]
          .map((m) => m[1]!)
          .filter((spec) => !spec.startsWith("./") && spec !== "decimal.js")
          .map((spec) => `${f.path}: ${spec}`),
      );
    expect(offenders).toEqual([]);
  });
});

import { createHash } from "node:crypto";
import fs from "node:fs";
import http from "node:http";
import Database from "better-sqlite3";
import { expect, inject } from "vitest";
import { type Client, signedUpClient, userWithTeam } from "../helpers/http";

export const TEMPLATE_CLASSES = fs.readFileSync("public/templates/wire-classes-template.csv", "utf8");
export const TEMPLATE_HISTOGRAMS = fs.readFileSync("public/templates/length-histograms-template.csv", "utf8");
export const HEADER =
  "class,tier,width_nm,thickness_nm,spacing_nm,ild_below_nm,ild_above_nm,barrier_nm,metal,k,net_count,mean_length_um,driver_ohm,load_ff,activity";
export const ROW_LOCAL = "local,local,24,48,24,30,30,2,Cu,2.7,1200000,4,8000,0.4,0.15";
export const ROW_GLOBAL = "global,global,400,800,400,400,,5,Cu,3.0,4000,1500,300,5.0,0.1";

const TABLES = ["baselines", "wire_classes", "class_histograms", "baseline_revisions", "baseline_warnings", "audit_log"] as const;

/** Row counts and a content checksum of the tables an import touches. */
export function dbState(): { counts: Record<string, number>; checksum: string } {
  const db = new Database(inject("dbPath"), { readonly: true, fileMustExist: true });
  try {
    const counts: Record<string, number> = {};
    const h = createHash("sha256");
    for (const t of TABLES) {
      // other tests' sign-ups and team creations write audit rows too: only baseline entries count here
      const where = t === "audit_log" ? " where entity_type = 'baseline'" : "";
      counts[t] = (db.prepare(`select count(*) as n from ${t}${where}`).get() as { n: number }).n;
      for (const row of db.prepare(`select * from ${t}${where} order by rowid`).iterate()) h.update(JSON.stringify(row));
    }
    return { counts, checksum: h.digest("hex") };
  } finally {
    db.close();
  }
}

/** Direct SQL read for assertions. */
export function sql<T = Record<string, unknown>>(query: string, ...params: unknown[]): T[] {
  const db = new Database(inject("dbPath"), { readonly: true, fileMustExist: true });
  try {
    return db.prepare(query).all(...params) as T[];
  } finally {
    db.close();
  }
}

/** Add a user to a team with a role (test setup; invites are the platform's feature, tested there). */
export function addMember(teamId: string, userId: string, role: "owner" | "editor" | "viewer"): void {
  const db = new Database(inject("dbPath"), { fileMustExist: true });
  try {
    db.pragma("busy_timeout = 5000");
    db.prepare("insert into memberships (team_id, user_id, role, created_at) values (?, ?, ?, ?)").run(teamId, userId, role, Date.now());
  } finally {
    db.close();
  }
}

/** POST a CSV body as text/csv. */
export async function postCsv(c: Client, path: string, text: string | Uint8Array, type = "text/csv") {
  return c.req("POST", await withVersion(c, path), undefined, { headers: { "content-type": type }, raw: text as BodyInit });
}

/**
 * An import into a baseline carries the version the client loaded (`&version=N`, required unless dryRun). Tests
 * that are not about versions act like a client that has just loaded the baseline: this adds its current version
 * (read through the API as that client) to a storing import URL that gives none. The version tests give their own.
 */
export async function withVersion(c: Client, path: string): Promise<string> {
  const m = /^\/api\/baselines\/([^/?]+)\/(?:import|histograms)\?(.*)$/.exec(path);
  if (!m) return path;
  const q = new URLSearchParams(m[2]);
  if (q.has("version") || q.get("dryRun") === "1" || q.get("dryRun") === "true") return path;
  const b = await c.get(`/api/baselines/${m[1]}`);
  return b.status === 200 ? `${path}&version=${b.json.baseline.version}` : path;
}

/** An owner with a team and a baseline holding the template classes. */
export async function ownerWithBaseline(name = "Skua") {
  const u = await userWithTeam();
  const r = await postCsv(u.client, `/api/teams/${u.teamId}/baselines/import?name=${encodeURIComponent(name)}`, TEMPLATE_CLASSES);
  if (r.status !== 201) throw new Error(`baseline import failed: ${r.status} ${r.text}`);
  return { ...u, baselineId: r.json.baseline.id as string };
}

export async function memberClient(teamId: string, role: "editor" | "viewer") {
  const m = await signedUpClient();
  addMember(teamId, m.userId, role);
  return m.client;
}

/** What a bad-file case expects of the first listed issue (`value` only when given; `message` exact or a pattern). */
export type ExpectedIssue = { line: number | null; column: string | null; value?: string | null; message: RegExp | string };

/** A bad-file case: its name, the body to upload and the first issue the answer must list. */
export type BadCsvCase = [string, string | Uint8Array, ExpectedIssue];

/** Checks the first issue of a 400 `invalid_csv` answer against the expected line, column, value and reason. */
export function expectFirstIssue(first: { line: number | null; column: string | null; value: unknown; message: string }, expected: ExpectedIssue) {
  expect(first.line).toBe(expected.line);
  expect(first.column).toBe(expected.column);
  if (expected.value !== undefined) expect(first.value).toBe(expected.value);
  if (typeof expected.message === "string") expect(first.message).toBe(expected.message);
  else expect(first.message).toMatch(expected.message);
}

/** A raw POST of CSV to `url` as `c` over node:http (not fetch), so a test controls how and when the body is written. */
export function rawCsvPost(c: Client, url: URL, headers: Record<string, string>, onResponse?: (res: http.IncomingMessage) => void): http.ClientRequest {
  return http.request(
    {
      host: url.hostname,
      port: url.port,
      path: url.pathname + url.search,
      method: "POST",
      agent: false,
      headers: { "content-type": "text/csv", cookie: c.cookie, origin: c.baseUrl, ...headers },
    },
    onResponse,
  );
}

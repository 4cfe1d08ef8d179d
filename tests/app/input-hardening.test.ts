import type Database from "better-sqlite3";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { Client, GOOD_PASSWORD, uniqueEmail, userWithTeam } from "../helpers/http";
import { countRows, openTestDb } from "../helpers/db-file";
import { makeWorkspace } from "../helpers/reports";
import { HEADER, postCsv } from "./import-helpers";

// Issue 12 findings 5 (prototype names as catalogue keys), 10 (text hygiene), 12 (share links show only the report's
// classes) and 14 (imports take the baseline's version).

let db: Database.Database;
beforeAll(() => {
  db = openTestDb();
});
afterAll(() => db.close());

async function workspace() {
  const owner = await userWithTeam("Hardening Team");
  const ws = await makeWorkspace(owner.client, owner.teamId);
  const b = await owner.client.get(`/api/baselines/${ws.baselineId}`);
  return { owner, ...ws, baseline: b.json.baseline };
}

const revisions = (baselineId: string) => countRows(db, "baseline_revisions", "baseline_id = ?", baselineId);
const scenarioRevisions = (scenarioId: string) => countRows(db, "scenario_revisions", "scenario_id = ?", scenarioId);

describe("finding 5: prototype names are not metals (own-property catalogue lookups; OWASP ASVS 4.0.3 5.1.3 allow lists)", () => {
  const NAMES = ["constructor", "__proto__", "toString", "hasOwnProperty", "valueOf"];

  it.each(NAMES)("classes: metal %j → 400 naming classes.0.metal, nothing stored", async (metal) => {
    const w = await workspace();
    const before = revisions(w.baselineId);
    const classes = w.baseline.classes.map(({ id, position: _p, histogramBins: _h, ...c }: Record<string, unknown>) => ({ id, ...c }));
    const r = await w.owner.client.put(`/api/baselines/${w.baselineId}/classes`, {
      version: w.baseline.version,
      classes: [{ ...classes[0], metal }, ...classes.slice(1)],
    });
    expect(r.status, r.text).toBe(400);
    expect(r.json.error.fields["classes.0.metal"]).toEqual([expect.stringMatching(/^Metal must be one of Cu, /)]);
    expect(revisions(w.baselineId)).toBe(before);
    const stored = db.prepare("select count(*) as n from wire_classes where baseline_id = ? and metal = ?").get(w.baselineId, metal) as { n: number };
    expect(stored.n).toBe(0);
  });

  it.each(NAMES)("scenario settings, overrides and evaluate: metal %j → 400 naming the field, nothing stored", async (metal) => {
    const w = await workspace();
    const created = await w.owner.client.post(`/api/teams/${w.owner.teamId}/scenarios`, {
      baselineId: w.baselineId,
      name: `Fill ${metal}`,
      settings: { metal },
    });
    expect(created.status, created.text).toBe(400);
    expect(created.json.error.fields["settings.metal"]).toBeDefined();
    const id = w.scenarioIds[0]!;
    const s = (await w.owner.client.get(`/api/scenarios/${id}`)).json.scenario;
    const before = scenarioRevisions(id);
    const patched = await w.owner.client.patch(`/api/scenarios/${id}`, {
      version: s.version,
      settings: { ...s.settings, overrides: { [w.classNames[0]!]: { metal } } },
    });
    expect(patched.status, patched.text).toBe(400);
    expect(patched.json.error.fields[`settings.overrides.${w.classNames[0]}.metal`]).toBeDefined();
    expect(scenarioRevisions(id)).toBe(before);
    const ev = await w.owner.client.post(`/api/scenarios/${id}/evaluate`, { settings: { ...s.settings, metal } });
    expect(ev.status, ev.text).toBe(400);
    expect(ev.json.error.fields["settings.metal"]).toBeDefined();
  });

  it("materials: a block keyed by a prototype name → 400 naming technology.materials.<key>", async () => {
    const w = await workspace();
    const before = revisions(w.baselineId);
    for (const key of ["constructor", "toString", "__proto__"]) {
      const body = `{"version":${w.baseline.version},"technology":${JSON.stringify(w.baseline.technology).replace(/}$/, `,"materials":{${JSON.stringify(key)}:{"specularity":0.3}}}`)}}`;
      const r = await w.owner.client.req("PATCH", `/api/baselines/${w.baselineId}`, undefined, { headers: { "content-type": "application/json" }, raw: body });
      expect(r.status, `${key}: ${r.text}`).toBe(400);
      expect(Object.keys(r.json.error.fields)).toEqual([`technology.materials.${key}`]);
    }
    expect(revisions(w.baselineId)).toBe(before);
  });

  it("report composition: a prototype name is not a class (400), and reports of the workspace compose fine", async () => {
    const w = await workspace();
    const bad = await w.owner.client.post(`/api/teams/${w.owner.teamId}/reports`, {
      baselineId: w.baselineId,
      scenarioIds: w.scenarioIds.slice(0, 2),
      title: "R",
      classNames: ["constructor"],
    });
    expect(bad.status, bad.text).toBe(400);
    expect(bad.json.error.fields.classNames).toBeDefined();
    const ok = await w.owner.client.post(`/api/teams/${w.owner.teamId}/reports`, {
      baselineId: w.baselineId,
      scenarioIds: w.scenarioIds.slice(0, 2),
      title: "R",
    });
    expect(ok.status, ok.text).toBe(201);
  });
});

describe("finding 10: names and notes refuse control characters and invalid Unicode (400 naming the field)", () => {
  const BAD = [
    ["NUL", "a\u0000b", /U\+0000/],
    ["ESC", "a\u001bb", /U\+001B/],
    ["C1 NEL", "a\u0085b", /U\+0085/],
    ["lone high surrogate", "a\ud800b", /unpaired surrogate U\+D800/],
    ["lone low surrogate", "a\udc00b", /unpaired surrogate U\+DC00/],
  ] as const;

  it.each(BAD)("%s: team, baseline, scenario, report and display names, notes and descriptions", async (_label, bad, pattern) => {
    const w = await workspace();
    const teamsBefore = countRows(db, "teams");
    const team = await w.owner.client.post("/api/teams", { name: `Team ${bad}` });
    expect(team.status).toBe(400);
    expect(team.json.error.fields.name).toEqual([expect.stringMatching(pattern)]);
    expect(team.json.error.fields.name[0]).toMatch(/^Team name /);
    expect(countRows(db, "teams")).toBe(teamsBefore);

    const baselinesBefore = countRows(db, "baselines");
    for (const body of [{ name: `B ${bad}` }, { name: "ok", description: `line 1\n${bad}` }]) {
      const r = await w.owner.client.post(`/api/teams/${w.owner.teamId}/baselines`, body);
      expect(r.status, r.text).toBe(400);
      expect(Object.keys(r.json.error.fields)).toEqual([Object.keys(body).at(-1)]);
    }
    expect(countRows(db, "baselines")).toBe(baselinesBefore);

    const id = w.scenarioIds[0]!;
    const s = (await w.owner.client.get(`/api/scenarios/${id}`)).json.scenario;
    const revs = scenarioRevisions(id);
    for (const [field, value] of [
      ["name", `S ${bad}`],
      ["notes", `first\n\t${bad}`],
    ]) {
      const r = await w.owner.client.patch(`/api/scenarios/${id}`, { version: s.version, [field!]: value });
      expect(r.status, r.text).toBe(400);
      expect(r.json.error.fields[field!]).toEqual([expect.stringMatching(pattern)]);
    }
    expect(scenarioRevisions(id)).toBe(revs);

    const reportsBefore = countRows(db, "reports");
    for (const [field, value] of [
      ["title", `T ${bad}`],
      ["audienceNote", bad],
    ]) {
      const r = await w.owner.client.post(`/api/teams/${w.owner.teamId}/reports`, {
        baselineId: w.baselineId,
        scenarioIds: w.scenarioIds.slice(0, 2),
        title: "T",
        [field!]: value,
      });
      expect(r.status, r.text).toBe(400);
      expect(r.json.error.fields[field!]).toEqual([expect.stringMatching(pattern)]);
    }
    expect(countRows(db, "reports")).toBe(reportsBefore);

    const usersBefore = countRows(db, "users");
    const su = await new Client().post("/api/auth/sign-up", { email: uniqueEmail(), password: GOOD_PASSWORD, name: `N ${bad}` });
    expect(su.status).toBe(400);
    expect(su.json.error.fields.name).toEqual([expect.stringMatching(pattern)]);
    expect(countRows(db, "users")).toBe(usersBefore);
  });

  it("class names in JSON and in CSV imports", async () => {
    const w = await workspace();
    const classes = w.baseline.classes.map(({ id, position: _p, histogramBins: _h, ...c }: Record<string, unknown>) => ({ id, ...c }));
    const r = await w.owner.client.put(`/api/baselines/${w.baselineId}/classes`, {
      version: w.baseline.version,
      classes: [{ ...classes[0], name: "M1\u0000" }, ...classes.slice(1)],
    });
    expect(r.status).toBe(400);
    expect(r.json.error.fields["classes.0.name"]).toEqual(["Class name must not contain control characters: U+0000 at character 3."]);
    const before = revisions(w.baselineId);
    const csv = await postCsv(
      w.owner.client,
      `/api/baselines/${w.baselineId}/import?mode=merge`,
      `${HEADER}\nlo\u0007cal,local,24,48,24,30,30,2,Cu,2.7,1200000,4,8000,0.4,0.15\n`,
    );
    expect(csv.status, csv.text).toBe(400);
    expect(csv.json.error.errors[0]).toMatchObject({
      line: 2,
      column: "class",
      message: "Class name must not contain control characters: U+0007 at character 3.",
    });
    expect(revisions(w.baselineId)).toBe(before);
  });

  it("multi-line notes keep tabs and line breaks; well-formed text of any script is stored as sent", async () => {
    const w = await workspace();
    const id = w.scenarioIds[0]!;
    const s = (await w.owner.client.get(`/api/scenarios/${id}`)).json.scenario;
    const notes = "Zeile 1\n\tLigne 2 – 中文 😀\r\nend";
    const r = await w.owner.client.patch(`/api/scenarios/${id}`, { version: s.version, name: "Ünïcode 😀 name", notes });
    expect(r.status, r.text).toBe(200);
    expect(db.prepare("select notes, name from scenarios where id = ?").get(id)).toEqual({ notes, name: "Ünïcode 😀 name" });
  });
});

describe("finding 12: a share link exposes exactly the classes the report shows", () => {
  it("a report composed for one class: share JSON, share page and stored document hold nothing of the others", async () => {
    const w = await workspace();
    const [local, mid, global] = w.classNames as [string, string, string];
    const c = await w.owner.client.post(`/api/teams/${w.owner.teamId}/reports`, {
      baselineId: w.baselineId,
      scenarioIds: w.scenarioIds,
      title: "Local only",
      classNames: [local],
    });
    expect(c.status, c.text).toBe(201);
    const id = c.json.report.id as string;
    const l = await w.owner.client.post(`/api/reports/${id}/share-links`, {});
    const token = (l.json.url as string).split("/r/")[1]!;
    const anon = new Client();
    const share = await anon.get(`/api/share/${token}`);
    expect(share.status).toBe(200);
    const f = share.json.report.frozen;
    expect(f.classNames).toEqual([local]);
    expect(f.baseline.classes.map((x: { name: string }) => x.name)).toEqual([local]);
    for (const o of f.options) {
      expect(o.evaluation.classes.map((x: { name: string }) => x.name)).toEqual([local]);
      expect(Object.keys(o.settings.overrides).every((n) => n === local)).toBe(true);
    }
    // the answer and the page mention no other class anywhere (names, overrides, flags, sweeps)
    for (const other of [mid, global]) expect(share.text).not.toContain(other);
    const page = await anon.get(`/r/${token}/report`);
    expect(page.status).toBe(200);
    expect(page.text).toContain(local);
    for (const other of [mid, global]) expect(page.text).not.toContain(other);
    const stored = JSON.parse((db.prepare("select frozen from reports where id = ?").get(id) as { frozen: string }).frozen);
    expect(stored.baseline.classes.map((x: { name: string }) => x.name)).toEqual([local]);
    expect(JSON.stringify(stored)).not.toContain(global);
  });

  it("a report frozen before the rule (every class stored) is shown restricted to its classes on every read", async () => {
    const w = await workspace();
    const [local, mid, global] = w.classNames as [string, string, string];
    const c = await w.owner.client.post(`/api/teams/${w.owner.teamId}/reports`, { baselineId: w.baselineId, scenarioIds: w.scenarioIds, title: "Old style" });
    const id = c.json.report.id as string;
    // what an older server stored for classNames: ["<local>"]: every class, with the choice recorded
    const row = db.prepare("select frozen from reports where id = ?").get(id) as { frozen: string };
    const doc = JSON.parse(row.frozen);
    expect(doc.baseline.classes).toHaveLength(3);
    db.prepare("update reports set frozen = ? where id = ?").run(
      JSON.stringify({ ...doc, classNames: [local], sweeps: doc.sweeps.filter((s: { className: string }) => s.className === local) }),
      id,
    );
    const l = await w.owner.client.post(`/api/reports/${id}/share-links`, {});
    const token = (l.json.url as string).split("/r/")[1]!;
    const share = await new Client().get(`/api/share/${token}`);
    expect(share.status).toBe(200);
    for (const other of [mid, global]) expect(share.text).not.toContain(other);
    const page = await new Client().get(`/r/${token}/report`);
    for (const other of [mid, global]) expect(page.text).not.toContain(other);
    const team = await w.owner.client.get(`/teams/${w.owner.teamId}/reports/${id}`);
    expect(team.status).toBe(200);
    for (const other of [mid, global]) expect(team.text).not.toContain(other);
  });
});

describe("finding 14: imports take the baseline's version (409 stale_version when stale)", () => {
  const row = (name: string) => `${name},local,24,48,24,30,30,2,Cu,2.7,1200000,4,8000,0.4,0.15`;

  it.each(["import", "histograms"])("/%s: no version → 400, stale → 409 with currentVersion and nothing stored, current → 200", async (kind) => {
    const w = await workspace();
    const v = w.baseline.version as number;
    const body = kind === "import" ? `${HEADER}\n${row(w.classNames[0]!)}\n` : `class,length_um,count\n${w.classNames[0]},1,5\n`;
    const url = `/api/baselines/${w.baselineId}/${kind}?mode=merge`;
    const before = revisions(w.baselineId);
    const none = await w.owner.client.req("POST", url, undefined, { headers: { "content-type": "text/csv" }, raw: body });
    expect(none.status, none.text).toBe(400);
    expect(none.json.error.fields.version).toEqual(["version is required (the baseline version you loaded): add ?version=N."]);
    const junk = await postCsv(w.owner.client, `${url}&version=abc`, body);
    expect(junk.status).toBe(400);
    expect(junk.json.error.fields.version).toBeDefined();
    // someone else saves the baseline: the importer's version is now stale
    const other = await w.owner.client.patch(`/api/baselines/${w.baselineId}`, { version: v, description: "changed meanwhile" });
    expect(other.status, other.text).toBe(200);
    const afterOther = revisions(w.baselineId);
    expect(afterOther).toBe(before + 1);
    const stale = await postCsv(w.owner.client, `${url}&version=${v}`, body);
    expect(stale.status, stale.text).toBe(409);
    expect(stale.json.error).toMatchObject({ code: "stale_version", currentVersion: v + 1 });
    expect(revisions(w.baselineId)).toBe(afterOther);
    const ok = await postCsv(w.owner.client, `${url}&version=${v + 1}`, body);
    expect(ok.status, ok.text).toBe(200);
    expect(ok.json.version).toBe(v + 2);
    // a dry run stores nothing and needs no version
    const dry = await w.owner.client.req("POST", `${url}&dryRun=1`, undefined, { headers: { "content-type": "text/csv" }, raw: body });
    expect(dry.status, dry.text).toBe(200);
  });

  it("two concurrent imports from the same loaded version: one is stored, the other answers 409", async () => {
    const w = await workspace();
    const v = w.baseline.version as number;
    const url = `/api/baselines/${w.baselineId}/import?mode=replace&version=${v}`;
    const [a, b] = await Promise.all([
      postCsv(w.owner.client, url, `${HEADER}\n${row("only-a")}\n`),
      postCsv(w.owner.client, url, `${HEADER}\n${row("only-b")}\n`),
    ]);
    expect([a.status, b.status].sort()).toEqual([200, 409]);
    const names = (db.prepare("select name from wire_classes where baseline_id = ?").all(w.baselineId) as { name: string }[]).map((r) => r.name);
    expect(names).toEqual([a.status === 200 ? "only-a" : "only-b"]);
  });
});

import { createHash, randomBytes } from "node:crypto";
import { spawnSync } from "node:child_process";
import fs from "node:fs";
import os from "node:os";
import path from "node:path";
import type Database from "better-sqlite3";
import Papa from "papaparse";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { Client, userWithTeam } from "../helpers/http";
import { countRows, openTestDb } from "../helpers/db-file";
import { addMember } from "../helpers/members";
import { decodeQuotedPrintable, makeWorkspace } from "../helpers/reports";

let db: Database.Database;
beforeAll(() => {
  db = openTestDb();
});
afterAll(() => db.close());

type Owner = Awaited<ReturnType<typeof userWithTeam>>;

async function setup() {
  const owner = await userWithTeam("Reports Team");
  const ws = await makeWorkspace(owner.client, owner.teamId);
  return { owner, ...ws };
}

async function compose(o: Owner, body: Record<string, unknown>) {
  return o.client.post(`/api/teams/${o.teamId}/reports`, body);
}

const reports = () => countRows(db, "reports");

describe("POST /api/teams/[teamId]/reports (compose and freeze)", () => {
  it("freezes inputs, per-option evaluations, sweeps, engine version and model levels into one document", async () => {
    const { owner, baselineId, scenarioIds, classNames } = await setup();
    const r = await compose(owner, {
      baselineId,
      scenarioIds,
      title: "Next node options",
      audienceNote: "For the review",
      classNames: [classNames[2], classNames[1]],
      metrics: ["energy", "delay"],
    });
    expect(r.status, r.text).toBe(201);
    const rep = r.json.report;
    expect(rep.version).toBe(1);
    expect(rep.frozen.engineVersion).toMatch(/^\d+\.\d+\.\d+$/);
    expect(rep.frozen.modelLevels).toEqual(["ideal", "fringe", "coupled", "full"]);
    expect(rep.frozen.options.map((o: { key: string }) => o.key)).toEqual(["A", "B", "C"]);
    expect(rep.frozen.options.map((o: { scenarioId: string }) => o.scenarioId)).toEqual(scenarioIds);
    // Table order follows the baseline, metrics a fixed order, whatever order they were picked in.
    expect(rep.frozen.classNames).toEqual([classNames[1], classNames[2]]);
    expect(rep.frozen.metrics).toEqual(["delay", "energy"]);
    // Only the chosen classes are frozen (issue 12 finding 12: a share link must show no more than the report).
    expect(rep.frozen.baseline.classes.map((c: { name: string }) => c.name)).toEqual([classNames[1], classNames[2]]);
    expect(rep.frozen.options[0].evaluation.classes.map((c: { name: string }) => c.name)).toEqual([classNames[1], classNames[2]]);
    // Sweeps of the chosen classes: one curve per option plus option A without size effects, each option marked at its S.
    expect(rep.frozen.sweeps.map((s: { className: string }) => s.className)).toEqual([classNames[1], classNames[2]]);
    const sw = rep.frozen.sweeps[0];
    expect(sw.series.map((s: { key: string }) => s.key).sort()).toEqual(["A", "B", "C", "reference"]);
    expect(sw.marks).toHaveLength(3);
    expect(sw.marks[0].x).toBeCloseTo(1 / 0.7, 9);
    // The air gap (option B) lowers the intermediate class's capacitance and delay against the plain shrink (A).
    const mid = (k: number) => rep.frozen.options[k].evaluation.classes.find((c: { name: string }) => c.name === classNames[1]);
    expect(mid(1).scenario.cFPerM).toBeLessThan(mid(0).scenario.cFPerM);
    expect(mid(1).scenario.delayS).toBeLessThan(mid(0).scenario.delayS);
    // Headlines computed from the frozen document, in plain words.
    expect(rep.summary.headlines).toHaveLength(3);
    expect(rep.summary.headlines[0].sentence).toMatch(/^Option A (cuts|raises|leaves) the worst-class delay/);
    expect(rep.summary.verdicts[0].sentence).toContain(`(${classNames[1]}): Option B is fastest`);
    // Stored as one row, listed, readable.
    const row = db.prepare("select frozen, engine_version, series_id, version, team_id from reports where id = ?").get(rep.id) as {
      frozen: string;
      engine_version: string;
      version: number;
      team_id: string;
    };
    expect(JSON.parse(row.frozen)).toEqual(rep.frozen);
    expect(row.engine_version).toBe(rep.frozen.engineVersion);
    expect(row.team_id).toBe(owner.teamId);
    const list = await owner.client.get(`/api/teams/${owner.teamId}/reports`);
    expect(list.status).toBe(200);
    expect(list.json.reports.map((x: { id: string }) => x.id)).toContain(rep.id);
    const audit = db.prepare("select count(*) as n from audit_log where action = 'report.create' and entity_id = ?").get(rep.id) as {
      n: number;
    };
    expect(audit.n).toBe(1);
  });

  const INVALID = "Some fields are not valid.";
  it.each([
    ["one scenario", (w: { scenarioIds: string[] }) => ({ scenarioIds: w.scenarioIds.slice(0, 1) }), 400, INVALID, "scenarioIds", "Pick at least 2 scenarios."],
    [
      "five scenarios",
      (w: { scenarioIds: string[] }) => ({ scenarioIds: [...w.scenarioIds, "x1", "x2"] }),
      400,
      INVALID,
      "scenarioIds",
      "Pick at most 4 scenarios.",
    ],
    [
      "the same scenario twice",
      (w: { scenarioIds: string[] }) => ({ scenarioIds: [w.scenarioIds[0], w.scenarioIds[0]] }),
      400,
      INVALID,
      "scenarioIds",
      "Each scenario can appear only once.",
    ],
    ["an empty title", () => ({ title: "  " }), 400, INVALID, "title", "Title is required."],
    ["an unknown metric", () => ({ metrics: ["delay", "vibes"] }), 400, INVALID, "metrics.1", "Metric must be one of"],
    ["an unknown class", () => ({ classNames: ["M99"] }), 400, "Unknown class: M99.", "classNames", "Unknown class: M99."],
    ["an unknown field", () => ({ teamId: "x" }), 400, INVALID, "", "Unrecognized key"],
    [
      "an unknown scenario",
      (w: { scenarioIds: string[] }) => ({ scenarioIds: [w.scenarioIds[0], "nope"] }),
      404,
      "Scenario not found.",
      "scenarioIds",
      "Scenario not found.",
    ],
    ["an unknown baseline", () => ({ baselineId: "nope" }), 404, "Baseline not found.", "baselineId", "Baseline not found."],
  ] as const)("rejects %s and stores nothing", async (_name, patch, status, top, field, message) => {
    const { owner, baselineId, scenarioIds } = await setup();
    const before = reports();
    const r = await compose(owner, { baselineId, scenarioIds, title: "T", ...patch({ scenarioIds }) });
    expect(r.status, r.text).toBe(status);
    expect(r.json.error.message).toBe(top);
    expect((r.json.error.fields?.[field] ?? []).join(" ")).toContain(message);
    expect(reports()).toBe(before);
  });

  it("rejects scenarios of another baseline (400) and of another team (404), storing nothing", async () => {
    const { owner, baselineId, scenarioIds } = await setup();
    const other = await makeWorkspace(owner.client, owner.teamId);
    const before = reports();
    const mixed = await compose(owner, { baselineId, scenarioIds: [scenarioIds[0], other.scenarioIds[0]], title: "Mixed" });
    expect(mixed.status).toBe(400);
    expect(mixed.json.error.message).toMatch(/belongs to another baseline/);
    const stranger = await userWithTeam("Other Team");
    const theirs = await makeWorkspace(stranger.client, stranger.teamId);
    const foreign = await compose(owner, { baselineId, scenarioIds: [scenarioIds[0], theirs.scenarioIds[0]], title: "Foreign" });
    expect(foreign.status).toBe(404);
    expect(foreign.json.error.message).toBe("Scenario not found.");
    const foreignBaseline = await compose(owner, { baselineId: theirs.baselineId, scenarioIds: theirs.scenarioIds, title: "Foreign" });
    expect(foreignBaseline.status).toBe(404);
    expect(foreignBaseline.json.error.message).toBe("Baseline not found.");
    expect(reports()).toBe(before);
  });

  it("enforces roles: viewer reads but cannot compose (403), another team gets 404, signed out 401", async () => {
    const { owner, baselineId, scenarioIds } = await setup();
    const made = await compose(owner, { baselineId, scenarioIds: scenarioIds.slice(0, 2), title: "Roles" });
    expect(made.status).toBe(201);
    const id = made.json.report.id;
    const viewer = await addMember(owner.client, owner.teamId, "viewer");
    const before = reports();
    const v = await viewer.client.post(`/api/teams/${owner.teamId}/reports`, { baselineId, scenarioIds, title: "Nope" });
    expect(v.status).toBe(403);
    expect(v.json.error.code).toBe("forbidden");
    expect(reports()).toBe(before);
    expect((await viewer.client.get(`/api/reports/${id}`)).status).toBe(200);
    expect((await viewer.client.get(`/api/teams/${owner.teamId}/reports`)).status).toBe(200);
    expect((await viewer.client.post(`/api/reports/${id}/refresh`)).status).toBe(403);
    expect((await viewer.client.post(`/api/reports/${id}/share-links`, {})).status).toBe(403);
    expect((await viewer.client.get(`/api/reports/${id}/share-links`)).status).toBe(403);
    expect((await viewer.client.post(`/api/reports/${id}/email`, { to: ["a@example.test"] })).status).toBe(403);
    expect((await viewer.client.del(`/api/reports/${id}`)).status).toBe(403);
    const stranger = await userWithTeam("Elsewhere");
    for (const p of [`/api/reports/${id}`, `/api/reports/${id}/export.csv`, `/api/reports/${id}/pdf`, `/api/teams/${owner.teamId}/reports`]) {
      const r = await stranger.client.get(p);
      expect(r.status, p).toBe(404);
    }
    expect((await stranger.client.post(`/api/teams/${owner.teamId}/reports`, { baselineId, scenarioIds, title: "x" })).status).toBe(404);
    expect((await new Client().get(`/api/reports/${id}`)).status).toBe(401);
    expect(reports()).toBe(before);
  });

  it("deletes: an editor who is not the author gets 403, the author and owners may", async () => {
    const { owner, baselineId, scenarioIds } = await setup();
    const editor = await addMember(owner.client, owner.teamId, "editor");
    const byOwner = (await compose(owner, { baselineId, scenarioIds: scenarioIds.slice(0, 2), title: "Owner's" })).json.report.id;
    const byEditor = (await editor.client.post(`/api/teams/${owner.teamId}/reports`, { baselineId, scenarioIds: scenarioIds.slice(1), title: "Editor's" })).json
      .report.id;
    const denied = await editor.client.del(`/api/reports/${byOwner}`);
    expect(denied.status).toBe(403);
    expect(denied.json.error.message).toBe("Only the report's author or a team owner can delete it.");
    expect(countRows(db, "reports", "id = ?", byOwner)).toBe(1);
    expect((await editor.client.del(`/api/reports/${byEditor}`)).status).toBe(204);
    expect((await owner.client.del(`/api/reports/${byOwner}`)).status).toBe(204);
    expect(countRows(db, "reports", "id in (?, ?)", byOwner, byEditor)).toBe(0);
    expect((await owner.client.get(`/api/reports/${byOwner}`)).status).toBe(404);
  });
});

describe("frozen reports and refresh", () => {
  it("a report is unchanged after its scenario changes; refresh makes a new version and keeps the old", async () => {
    const { owner, baselineId, scenarioIds, classNames } = await setup();
    const made = await compose(owner, { baselineId, scenarioIds, title: "Frozen" });
    expect(made.status).toBe(201);
    const id = made.json.report.id;
    const first = await owner.client.get(`/api/reports/${id}`);
    const storedBefore = (db.prepare("select frozen from reports where id = ?").get(id) as { frozen: string }).frozen;

    // Change option A's scenario through the workspace API: a much harder shrink.
    const sc = await owner.client.get(`/api/scenarios/${scenarioIds[0]}`);
    expect(sc.status, sc.text).toBe(200);
    const patched = await owner.client.patch(`/api/scenarios/${scenarioIds[0]}`, {
      version: sc.json.scenario.version,
      settings: { s: 2, sL: 1 },
    });
    expect(patched.status, patched.text).toBe(200);

    const again = await owner.client.get(`/api/reports/${id}`);
    expect(again.status).toBe(200);
    expect(again.json.report.frozen).toEqual(first.json.report.frozen);
    expect(again.json.report.summary).toEqual(first.json.report.summary);
    expect((db.prepare("select frozen from reports where id = ?").get(id) as { frozen: string }).frozen).toBe(storedBefore);

    const refreshed = await owner.client.post(`/api/reports/${id}/refresh`);
    expect(refreshed.status, refreshed.text).toBe(201);
    expect(refreshed.json.report.version).toBe(2);
    expect(refreshed.json.report.seriesId).toBe(first.json.report.seriesId);
    const v2 = await owner.client.get(`/api/reports/${refreshed.json.report.id}`);
    const optA = (r: typeof v2) => r.json.report.frozen.options[0];
    expect(optA(v2).settings.s).toBe(2);
    expect(optA(first).settings.s).toBeCloseTo(1 / 0.7, 12);
    const delay = (r: typeof v2) => optA(r).evaluation.classes.find((c: { name: string }) => c.name === classNames[2]).scenario.delayS;
    expect(delay(v2)).toBeGreaterThan(delay(first));
    expect(v2.json.versions.map((v: { version: number }) => v.version)).toEqual([2, 1]);
    // The old version is still there, unchanged.
    const old = await owner.client.get(`/api/reports/${id}`);
    expect(old.json.report.frozen).toEqual(first.json.report.frozen);
    const list = await owner.client.get(`/api/teams/${owner.teamId}/reports`);
    const item = list.json.reports.find((x: { seriesId: string }) => x.seriesId === first.json.report.seriesId);
    expect(item).toMatchObject({ id: refreshed.json.report.id, version: 2, versions: 2 });
  });

  it("refresh answers 409 when a scenario of the report was deleted, and stores nothing", async () => {
    const { owner, baselineId, scenarioIds } = await setup();
    const id = (await compose(owner, { baselineId, scenarioIds, title: "Gone" })).json.report.id;
    const del = await owner.client.del(`/api/scenarios/${scenarioIds[2]}`);
    expect([200, 204]).toContain(del.status);
    const before = reports();
    const r = await owner.client.post(`/api/reports/${id}/refresh`);
    expect(r.status).toBe(409);
    expect(r.json.error.message).toMatch(/deleted since this report was made/);
    expect(reports()).toBe(before);
    expect((await owner.client.get(`/api/reports/${id}`)).status).toBe(200);
  });
});

describe("share links", () => {
  async function reportWithLink() {
    const s = await setup();
    const id = (await compose(s.owner, { baselineId: s.baselineId, scenarioIds: s.scenarioIds, title: "Shared options" })).json.report.id as string;
    const l = await s.owner.client.post(`/api/reports/${id}/share-links`, {});
    expect(l.status, l.text).toBe(201);
    const token = (l.json.url as string).split("/r/")[1]!;
    return { ...s, id, link: l.json.link, url: l.json.url as string, token };
  }

  it("stores only the token's hash, expires in 14 days by default, and opens signed out", async () => {
    const { id, link, url, token, owner, baselineId, scenarioIds } = await reportWithLink();
    expect(url).toMatch(/^http:\/\/127\.0\.0\.1:\d+\/r\/[A-Za-z0-9_-]{43}$/);
    expect(Buffer.from(token, "base64url")).toHaveLength(32);
    const row = db.prepare("select * from share_links where id = ?").get(link.id) as Record<string, unknown>;
    expect(row.token_hash).toBe(createHash("sha256").update(token).digest("hex"));
    expect(JSON.stringify(row)).not.toContain(token);
    expect(Number(row.expires_at) - Number(row.created_at)).toBe(14 * 24 * 3600 * 1000);

    const anon = new Client();
    const api = await anon.get(`/api/share/${token}`);
    expect(api.status).toBe(200);
    expect(api.json.report.title).toBe("Shared options");
    expect(api.json.report.frozen.options).toHaveLength(3);
    // Nothing else of the team: no ids of the team, baseline, scenarios or report, no author.
    for (const secret of [owner.teamId, baselineId, ...scenarioIds, id, owner.email, owner.userId]) expect(api.text).not.toContain(secret);

    const hop = await anon.req("GET", `/r/${token}`);
    expect(hop.status).toBe(303);
    expect(hop.headers.get("location")).toBe(`/r/${token}/report`);
    const page = await anon.get(`/r/${token}/report`);
    expect(page.status).toBe(200);
    expect(page.text).toContain("Shared options");
    expect(page.text).toContain("Side by side, per class");
    expect(page.text).toContain("Caution.");
    for (const secret of [owner.teamId, baselineId, ...scenarioIds, owner.email]) expect(page.text).not.toContain(secret);
    expect(page.text).not.toMatch(/href="\/teams/);
    // Sweep figures mark each stretch where a model is outside its range: one band per run of flagged points (frozen flags)
    type P = { flags?: unknown[] };
    const runs = (pts: P[]) => pts.filter((p, i) => (p.flags?.length ?? 0) > 0 && !((pts[i - 1]?.flags?.length ?? 0) > 0)).length;
    const expected = (api.json.report.frozen.sweeps as { series: { points: P[] }[] }[]).reduce(
      (n, sw) => n + sw.series.reduce((m, se) => m + runs(se.points), 0),
      0,
    );
    expect(expected).toBeGreaterThan(0);
    expect(page.text.match(/data-outside-range=""/g)?.length ?? 0).toBe(expected);
    expect(page.text).toContain("outside model range");
    // The link is not a session: the team's API stays closed.
    expect((await anon.get(`/api/reports/${id}`)).status).toBe(401);
    expect((await anon.get(`/api/teams/${owner.teamId}/reports`)).status).toBe(401);
    expect((await anon.get(`/print/reports/${id}`)).status).toBe(404);
    expect(db.prepare("select last_used_at from share_links where id = ?").get(link.id)).toMatchObject({
      last_used_at: expect.any(Number),
    });
    const listed = await owner.client.get(`/api/reports/${id}/share-links`);
    expect(listed.json.links[0]).toMatchObject({ id: link.id, status: "active" });
    expect(listed.text).not.toContain(token);
  });

  it("answers 410 once expired", async () => {
    const { link, token } = await reportWithLink();
    db.prepare("update share_links set expires_at = ? where id = ?").run(Date.now() - 1000, link.id);
    const anon = new Client();
    const api = await anon.get(`/api/share/${token}`);
    expect(api.status).toBe(410);
    expect(api.json.error.message).toBe("This share link has expired. Ask the sender for a new one.");
    const page = await anon.get(`/r/${token}`);
    expect(page.status).toBe(410);
    expect(page.text).toContain("This share link has expired");
    expect(page.text).not.toContain("Shared options");
    const deep = await anon.get(`/r/${token}/report`);
    expect([303, 307]).toContain(deep.status);
    expect(deep.headers.get("location")).toMatch(new RegExp(`/r/${token}$`));
  });

  it("answers 404 once revoked; only editors revoke", async () => {
    const { id, link, token, owner } = await reportWithLink();
    const viewer = await addMember(owner.client, owner.teamId, "viewer");
    expect((await viewer.client.del(`/api/reports/${id}/share-links/${link.id}`)).status).toBe(403);
    expect((await new Client().get(`/api/share/${token}`)).status).toBe(200);
    const r = await owner.client.del(`/api/reports/${id}/share-links/${link.id}`);
    expect(r.status).toBe(204);
    const anon = new Client();
    const api = await anon.get(`/api/share/${token}`);
    expect(api.status).toBe(404);
    expect(api.json.error.message).toBe("Share link not found.");
    expect((await anon.get(`/r/${token}`)).status).toBe(404);
    expect((await anon.get(`/r/${token}/report`)).status).toBe(404);
    expect((await owner.client.del(`/api/reports/${id}/share-links/nope`)).status).toBe(404);
    const listed = await owner.client.get(`/api/reports/${id}/share-links`);
    expect(listed.json.links[0]).toMatchObject({ id: link.id, status: "revoked", revokedAt: expect.any(Number) });
  });

  it("answers 404 to guessed and malformed tokens", async () => {
    await reportWithLink();
    const anon = new Client();
    for (const t of [randomBytes(32).toString("base64url"), "abc", "A".repeat(43), `${"a".repeat(42)}%00`]) {
      expect((await anon.get(`/api/share/${t}`)).status, t).toBe(404);
      expect((await anon.get(`/r/${t}`)).status, t).toBe(404);
    }
  });

  it("rejects an expiry above 90 days and stores nothing", async () => {
    const { id, owner } = await reportWithLink();
    const before = countRows(db, "share_links");
    const r = await owner.client.post(`/api/reports/${id}/share-links`, { expiresInDays: 91 });
    expect(r.status).toBe(400);
    expect(r.json.error.fields.expiresInDays).toEqual(["Expiry must be at most 90 days."]);
    expect(countRows(db, "share_links")).toBe(before);
    const ok = await owner.client.post(`/api/reports/${id}/share-links`, { expiresInDays: 90 });
    expect(ok.status).toBe(201);
    expect(ok.json.link.expiresAt - ok.json.link.createdAt).toBe(90 * 24 * 3600 * 1000);
  });
});

describe("POST /api/reports/[id]/email", () => {
  it("sends one message per address with the summary and a working share link, each in the outbox and caught by the fake server", async () => {
    const { owner, baselineId, scenarioIds } = await setup();
    const id = (await compose(owner, { baselineId, scenarioIds, title: "Mailed report" })).json.report.id;
    const links = countRows(db, "share_links", "report_id = ?", id);
    const to = [`dir-${Date.now()}@example.test`, `pm-${Date.now()}@example.test`];
    const r = await owner.client.post(`/api/reports/${id}/email`, {
      to: [to[0], ` ${to[1]!.toUpperCase()} `, to[0]],
      message: "Please read before Friday.",
    });
    expect(r.status, r.text).toBe(200);
    expect(r.json).toMatchObject({ sent: 2, failed: 0 });
    expect(countRows(db, "share_links", "report_id = ?", id)).toBe(links + 1);
    for (const address of to) {
      const out = db.prepare("select * from outbox where kind = 'report' and to_addresses like ? order by id desc").get(`%${address}%`) as Record<
        string,
        string
      >;
      expect(out).toBeTruthy();
      expect(out.status).toBe("sent");
      expect(out.subject).toBe("Plateau report: Mailed report");
      expect(out.text_body).toContain("Please read before Friday.");
      expect(out.text_body).toMatch(/Option A (cuts|raises|leaves) the worst-class delay/);
      const captured = db.prepare("select * from captured_mail where outbox_id = ?").get(out.id) as Record<string, string>;
      expect(captured).toBeTruthy();
      expect(captured.envelope_to).toContain(address);
      const body = decodeQuotedPrintable(String(captured.raw));
      const m = body.match(/http:\/\/127\.0\.0\.1:\d+\/r\/([A-Za-z0-9_-]{43})/);
      expect(m, "share link in the captured mail").toBeTruthy();
      const share = await new Client().get(`/api/share/${m![1]}`);
      expect(share.status).toBe(200);
      expect(share.json.report.title).toBe("Mailed report");
    }
  });

  it.each([
    ["a bad address", { to: ["ok@example.test", "not-an-address"] }, "to.1", '"not-an-address" is not an e-mail address.'],
    ["no address", { to: [] }, "to", "Add at least one address."],
    ["21 addresses", { to: Array.from({ length: 21 }, (_, i) => `p${i}@example.test`) }, "to", "Send to at most 20 addresses at a time."],
  ] as const)("rejects %s with 400 and sends and stores nothing", async (_n, body, field, message) => {
    const { owner, baselineId, scenarioIds } = await setup();
    const id = (await compose(owner, { baselineId, scenarioIds, title: "Not mailed" })).json.report.id;
    const [outbox, links] = [countRows(db, "outbox"), countRows(db, "share_links")];
    const r = await owner.client.post(`/api/reports/${id}/email`, body);
    expect(r.status).toBe(400);
    expect(r.json.error.fields[field]).toEqual([message]);
    expect(countRows(db, "outbox")).toBe(outbox);
    expect(countRows(db, "share_links")).toBe(links);
  });
});

describe("GET /api/reports/[id]/export.csv", () => {
  it("puts units in the headers and neutralises formula-like names", async () => {
    const owner = await userWithTeam("CSV team");
    const evil = ['=HYPERLINK("http://x.test","click")', "+cmd|' /C calc'!A0", "@SUM(A1:A9)"] as [string, string, string];
    const ws = await makeWorkspace(owner.client, owner.teamId, { classNames: evil, scenarioNames: ["-2+3", "=1+1", "+1 more"] });
    const made = await compose(owner, { baselineId: ws.baselineId, scenarioIds: ws.scenarioIds, title: "=cmd()" });
    expect(made.status, made.text).toBe(201);
    const viewer = await addMember(owner.client, owner.teamId, "viewer");
    const r = await viewer.client.get(`/api/reports/${made.json.report.id}/export.csv`);
    expect(r.status).toBe(200);
    expect(r.headers.get("content-type")).toBe("text/csv; charset=utf-8");
    expect(r.headers.get("content-disposition")).toMatch(/^attachment; filename="cmd v1\.csv"/);
    const blocks = r.text.split("\r\n\r\n");
    const table = Papa.parse<string[]>(blocks[0]!, { skipEmptyLines: true }).data;
    const totals = Papa.parse<string[]>(blocks[1]!, { skipEmptyLines: true }).data;
    expect(table[0]).toEqual(
      expect.arrayContaining([
        "width_nm",
        "length_um",
        "r_ohm",
        "c_ff",
        "rc_ps",
        "delay_ps",
        "delay_change_pct",
        "energy_fj",
        "class_power_uw",
        "over_budget_pct",
      ]),
    );
    expect(totals[0]).toEqual(
      expect.arrayContaining(["worst_class_delay_ps", "mean_net_delay_ps", "total_wire_capacitance_pf", "switching_energy_pj", "repeaters"]),
    );
    expect(table).toHaveLength(1 + 3 * 4);
    // The repeater and temperature columns carry the frozen engine-2 results of each row (baseline row of the first class).
    const head = table[0]!;
    const frozen = (await viewer.client.get(`/api/reports/${made.json.report.id}`)).json.report.frozen;
    const first = frozen.options[0].evaluation.classes.find((c: { name: string }) => c.name === frozen.classNames[0]).baseline;
    const baseRow = table[1]!;
    expect(Number(baseRow[head.indexOf("repeater_count")])).toBe(first.repeaterCount);
    expect(Number(baseRow[head.indexOf("temperature_c")])).toBe(first.temperatureC);
    expect(Number(baseRow[head.indexOf("repeater_area_um2")])).toBeCloseTo(first.repeaterAreaM2 / 1e-12, 4);
    expect(Number(baseRow[head.indexOf("repeater_energy_fj")])).toBeCloseTo(first.repeaterEnergyJ / 1e-15, 4);
    for (const cell of [...table.slice(1), ...totals.slice(1)].flat()) {
      // A cell may start with - only as a number; nothing else may start like a formula.
      if (/^[=+\-@\t\r]/.test(cell)) expect(Number.isFinite(Number(cell)), cell).toBe(true);
    }
    const cells = table.flat();
    expect(cells).toContain(`'${evil[0]}`);
    expect(cells).toContain(`'${evil[1]}`);
    expect(cells).toContain(`'${evil[2]}`);
    expect(cells).toContain("'-2+3");
    expect(cells).toContain("'=1+1");
    expect(cells).toContain("'+1 more");
    expect(totals.flat()).toContain("'=cmd()");
  });
});

const HAS_PDFTOTEXT = fs.existsSync("/usr/bin/pdftotext");

describe("GET /api/reports/[id]/pdf", () => {
  // CI installs poppler-utils (.ci/run); there the missing tool is a failure, never a silent pass.
  it.runIf(process.env.CI)("pdftotext is present in CI", () => {
    expect(HAS_PDFTOTEXT, "pdftotext (Debian poppler-utils) is required in CI").toBe(true);
  });

  it.skipIf(!HAS_PDFTOTEXT)(
    "renders the report to a PDF that contains its table text (needs /usr/bin/pdftotext)",
    async () => {
      const { owner, baselineId, scenarioIds, classNames } = await setup();
      const id = (await compose(owner, { baselineId, scenarioIds, title: "Printable options" })).json.report.id;
      const res = await fetch(`${owner.client.baseUrl}/api/reports/${id}/pdf`, { headers: { cookie: owner.client.cookie } });
      expect(res.status).toBe(200);
      expect(res.headers.get("content-type")).toBe("application/pdf");
      const buf = Buffer.from(await res.arrayBuffer());
      expect(buf.subarray(0, 5).toString()).toBe("%PDF-");
      const dir = fs.mkdtempSync(path.join(os.tmpdir(), "plateau-pdf-"));
      const file = path.join(dir, "report.pdf");
      fs.writeFileSync(file, buf);
      const out = spawnSync("/usr/bin/pdftotext", ["-layout", file, "-"], { encoding: "utf8" });
      fs.rmSync(dir, { recursive: true, force: true });
      expect(out.status).toBe(0);
      const text = out.stdout.replace(/\s+/g, " ");
      expect(text).toContain("Printable options");
      expect(text).toContain("Side by side, per class");
      expect(text).toContain("Delay at mean length (ps)");
      for (const c of classNames) expect(text).toContain(c);
      expect(text).toContain("Plain shrink 0.7x");
      expect(text).toContain("Caution.");
      expect(text).toMatch(/Page 1 of \d+/);
      // The print view the renderer opens is closed to anyone without a session or its short-lived token.
      expect((await new Client().get(`/print/reports/${id}?t=${Date.now() + 60000}.forged`)).status).toBe(404);
    },
    90_000,
  );
});

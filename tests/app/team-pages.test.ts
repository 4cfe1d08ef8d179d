import { afterAll, beforeAll, describe, expect, it } from "vitest";
import type Database from "better-sqlite3";
import { Client, userWithTeam } from "../helpers/http";
import { openTestDb } from "../helpers/db-file";
import { addMember } from "../helpers/members";
import { createBaseline } from "./workspace-helpers";

// The pages' side of the access rules (getTeamContext, the app shell, the outbox scope) and the evaluate
// route's access check: the answers a browser gets, whatever query serves them.

let db: Database.Database;
beforeAll(() => {
  db = openTestDb();
});
afterAll(() => db.close());

const titleOf = (html: string) => /<title>([^<]*)<\/title>/.exec(html)?.[1];

async function teamWithScenario(teamName: string) {
  const owner = await userWithTeam(teamName);
  const baseline = await createBaseline(owner.client, owner.teamId, `${teamName} baseline`);
  const s = await owner.client.post(`/api/teams/${owner.teamId}/scenarios`, { baselineId: baseline.id, name: `${teamName} scenario` });
  expect(s.status, s.text).toBe(201);
  return { ...owner, baselineId: baseline.id, scenarioId: s.json.scenario.id as string };
}

describe("team pages: the membership gate", () => {
  it("signed out: team pages redirect to sign-in", async () => {
    const a = await teamWithScenario("Gate Signed Out");
    for (const p of [`/teams/${a.teamId}`, `/teams/${a.teamId}/scenarios/${a.scenarioId}`]) {
      const r = await new Client().get(p);
      expect(r.status, p).toBe(307);
      expect(r.headers.get("location"), p).toMatch(/^\/sign-in(\?|$)/);
      expect(r.text, p).not.toContain("Gate Signed Out");
    }
  });

  it("members see the team's pages with its name and their role; the shell lists only their own teams", async () => {
    const a = await teamWithScenario("Gate Alpha");
    const viewer = await addMember(a.client, a.teamId, "viewer", "Val Viewer");
    const home = await viewer.client.get(`/teams/${a.teamId}`);
    expect(home.status).toBe(200);
    expect(titleOf(home.text)).toBe("Gate Alpha · Plateau");
    expect(home.text).toContain("You are <!-- -->a viewer");
    const other = await userWithTeam("Gate Elsewhere");
    const teams = await viewer.client.get("/teams");
    expect(teams.status).toBe(200);
    expect(teams.text).toContain("Gate Alpha");
    expect(teams.text).not.toContain("Gate Elsewhere");
    expect((await other.client.get("/teams")).text).not.toContain("Gate Alpha");
    for (const p of ["/baselines", `/baselines/${a.baselineId}`, "/scenarios", `/scenarios/${a.scenarioId}`, "/reports", "/settings"]) {
      const r = await viewer.client.get(`/teams/${a.teamId}${p}`);
      expect(r.status, p).toBe(200);
    }
    const editor = await a.client.get(`/teams/${a.teamId}/scenarios/${a.scenarioId}`);
    expect(titleOf(editor.text)).toBe("Gate Alpha scenario · Scenario · Plateau");
    const baseline = await a.client.get(`/teams/${a.teamId}/baselines/${a.baselineId}`);
    expect(titleOf(baseline.text)).toBe("Gate Alpha baseline · Baseline · Plateau");
  });

  it("another team's pages answer 404; a team's page for another team's scenario or baseline shows not-found", async () => {
    const a = await teamWithScenario("Gate Beta");
    const b = await teamWithScenario("Gate Gamma");
    for (const p of [`/teams/${a.teamId}`, `/teams/${a.teamId}/settings`, `/teams/${a.teamId}/scenarios/${a.scenarioId}`, `/teams/no-such-team`]) {
      const r = await b.client.get(p);
      expect(r.status, p).toBe(404);
      expect(r.text, p).not.toContain("Gate Beta");
    }
    // Under the team's own (streamed) pages the answer is the page's not-found view, never the other team's row.
    for (const [p, what] of [
      [`/teams/${b.teamId}/scenarios/${a.scenarioId}`, "Scenario not found"],
      [`/teams/${b.teamId}/baselines/${a.baselineId}`, "Baseline not found"],
    ] as const) {
      const r = await b.client.get(p);
      expect(r.text, p).toContain(what);
      expect(r.text, p).not.toContain("Gate Beta");
      expect(titleOf(r.text), p).not.toContain("Gate Beta");
    }
  });

  it("a member removed from the team loses its pages at once", async () => {
    const a = await teamWithScenario("Gate Delta");
    const editor = await addMember(a.client, a.teamId, "editor");
    expect((await editor.client.get(`/teams/${a.teamId}`)).status).toBe(200);
    const del = await a.client.del(`/api/teams/${a.teamId}/members/${editor.userId}`);
    expect(del.status, del.text).toBe(200);
    expect((await editor.client.get(`/teams/${a.teamId}`)).status).toBe(404);
    expect((await editor.client.get("/teams")).text).not.toContain("Gate Delta");
  });
});

describe("outbox page (production server without PLATEAU_DEMO): does not exist", () => {
  // Issue 13, item 13: in production the page answers 404 to everyone, an owner of a demo team included, and the
  // account menu has no link to it. Development and the demo: tests/app/outbox.test.ts.
  it("answers 404 to an owner of an ordinary team and of a demo team, and the menu has no Outbox link", async () => {
    const plain = await userWithTeam("Outbox Plain");
    const invite = await plain.client.post(`/api/teams/${plain.teamId}/invites`, { email: "outbox-plain-guest@example.test", role: "viewer" });
    expect(invite.status, invite.text).toBe(201);
    expect((await plain.client.get("/dev/outbox")).status).toBe(404);
    const demo = await userWithTeam("Outbox Demo");
    db.prepare("update teams set is_demo = 1 where id = ?").run(demo.teamId);
    expect((await demo.client.get("/dev/outbox")).status).toBe(404);
    const home = await demo.client.get(`/teams/${demo.teamId}`);
    expect(home.status).toBe(200);
    expect(home.text).toMatch(/showOutbox\\?":false/);
  });
});

describe("POST /api/scenarios/[id]/evaluate: access", () => {
  it("401 signed out, 404 for another team's or a missing scenario, 200 for a viewer", async () => {
    const a = await teamWithScenario("Evaluate Access");
    const outsider = await userWithTeam("Evaluate Outsider");
    const viewer = await addMember(a.client, a.teamId, "viewer");
    const signedOut = await new Client().post(`/api/scenarios/${a.scenarioId}/evaluate`);
    expect(signedOut.status).toBe(401);
    const foreign = await outsider.client.post(`/api/scenarios/${a.scenarioId}/evaluate`);
    const missing = await outsider.client.post(`/api/scenarios/no-such-scenario/evaluate`);
    expect([foreign.status, missing.status]).toEqual([404, 404]);
    expect(foreign.json).toEqual(missing.json);
    const ok = await viewer.client.post(`/api/scenarios/${a.scenarioId}/evaluate`);
    expect(ok.status, ok.text).toBe(200);
    expect(ok.json).toMatchObject({ baselineVersion: 1, scenarioVersion: 1, evaluation: expect.any(Object) });
  });
});

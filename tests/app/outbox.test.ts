import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { Client, GOOD_PASSWORD, uniqueEmail, verificationTokenFor, verifyEmail } from "../helpers/http";
import { openTestDb } from "../helpers/db-file";
import { startServer, type RunningServer } from "../helpers/next-server";

// Issue 13, item 13: in the demo (`npm run demo` starts `next start` with PLATEAU_DEMO=1) and in development every
// owner reads their team's captured mail on /dev/outbox, and every user the mail they caused (their confirmation
// link). A plain production server has no such page: tests/app/team-pages.test.ts. Development (`next dev`, where
// NODE_ENV is not "production") takes the same path: tests/lib/mail-rules.test.ts checks outboxEnabled.

let demo: RunningServer;
beforeAll(async () => {
  demo = await startServer({ PLATEAU_DEMO: "1" });
});
afterAll(async () => {
  await demo?.stop();
});

async function signUp(name: string, opts: { verify?: boolean } = {}) {
  const client = new Client(demo.baseUrl);
  const email = uniqueEmail("outbox");
  const r = await client.post("/api/auth/sign-up", { email, password: GOOD_PASSWORD, name });
  expect(r.status, r.text).toBe(201);
  if (opts.verify !== false) await verifyEmail(client, email, demo.dbPath);
  return { client, email, userId: r.json.user.id as string };
}

async function teamOf(u: { client: Client }, name: string): Promise<string> {
  const t = await u.client.post("/api/teams", { name });
  expect(t.status, t.text).toBe(201);
  return t.json.team.id as string;
}

describe("outbox page on a demo server (PLATEAU_DEMO=1)", () => {
  it("shows an owner of an ordinary team that team's mail and their own, and nobody else's", async () => {
    const a = await signUp("Ada Owner");
    const aTeam = await teamOf(a, "Ordinary Outbox A");
    const b = await signUp("Bo Owner");
    const bTeam = await teamOf(b, "Ordinary Outbox B");
    const guestA = uniqueEmail("guest-a");
    const guestB = uniqueEmail("guest-b");
    expect((await a.client.post(`/api/teams/${aTeam}/invites`, { email: guestA, role: "viewer" })).status).toBe(201);
    expect((await b.client.post(`/api/teams/${bTeam}/invites`, { email: guestB, role: "viewer" })).status).toBe(201);

    const page = await a.client.get("/dev/outbox");
    expect(page.status).toBe(200);
    expect(page.text).toContain(guestA);
    expect(page.text).toContain("Invitation to join the team &quot;Ordinary Outbox A&quot; on Plateau");
    expect(page.text).toContain(a.email); // A's own confirmation mail
    expect(page.text).not.toContain(guestB);
    expect(page.text).not.toContain(b.email);
    // The account menu links to it.
    expect((await a.client.get(`/teams/${aTeam}`)).text).toMatch(/showOutbox\\?":true/);
  });

  it("a new, unconfirmed user reads their confirmation link there, and the notice points to it", async () => {
    const u = await signUp("Nia New", { verify: false });
    const token = verificationTokenFor(u.email, demo.dbPath);
    const teams = await u.client.get("/teams");
    expect(teams.text).toContain("Confirm your e-mail address.");
    expect(teams.text).toContain('href="/dev/outbox"');
    const page = await u.client.get("/dev/outbox");
    expect(page.status).toBe(200);
    expect(page.text).toContain(`/verify-email/${token}`);
  });

  it("a member who owns nothing sees only their own mail, not the team's invites", async () => {
    const owner = await signUp("Olu Owner");
    const team = await teamOf(owner, "Outbox Members");
    const other = uniqueEmail("other-guest");
    expect((await owner.client.post(`/api/teams/${team}/invites`, { email: other, role: "viewer" })).status).toBe(201);
    const viewer = await signUp("Vic Viewer");
    const db = openTestDb(demo.dbPath);
    db.prepare("insert into memberships (team_id, user_id, role, created_at) values (?, ?, 'viewer', ?)").run(team, viewer.userId, Date.now());
    db.close();
    expect((await viewer.client.get(`/teams/${team}`)).status).toBe(200);
    const page = await viewer.client.get("/dev/outbox");
    expect(page.status).toBe(200);
    expect(page.text).toContain(viewer.email);
    expect(page.text).not.toContain(other);
    expect((await new Client(demo.baseUrl).get("/dev/outbox")).status).toBe(307);
  });
});

import { afterAll, beforeAll, describe, expect, inject, it } from "vitest";
import type Database from "better-sqlite3";
import { Client, GOOD_PASSWORD, signedUpClient, uniqueEmail, userWithTeam } from "../helpers/http";
import { countRows, openTestDb } from "../helpers/db-file";
import { inviteToken } from "../helpers/members";
import { makeWorkspace } from "../helpers/reports";

let db: Database.Database;
beforeAll(() => {
  db = openTestDb();
});
afterAll(() => db.close());

const DAY_MS = 24 * 60 * 60 * 1000;
let ipCounter = 0;
const freshIp = () => `192.0.2.${(++ipCounter % 250) + 1}`;
const signIn = (c: Client, email: string, password: string) =>
  c.req("POST", "/api/auth/sign-in", { email, password }, { headers: { "x-forwarded-for": freshIp() } });
const sessionId = (c: Client) => c.cookie.split("=")[1]!;

describe("issue 12 finding 3: ?next= on /sign-in and /sign-up goes only to our own paths", () => {
  // OWASP ASVS 4.0.3 5.1.5. The first used to redirect to "/\t/evil.example" (a browser makes it http://evil.example/),
  // the next two answered 500 (an invalid character in the Location header).
  const cases = ["/%09/evil.example", "/%0a/x", "/%E3%80%82/x", "//evil.example", "/%5Cevil.example", "https://evil.example", "/\\evil.example"];
  for (const page of ["/sign-in", "/sign-up"]) {
    for (const next of cases) {
      it(`${page}?next=${next} sends a signed-in user home`, async () => {
        const { client } = await signedUpClient();
        const r = await client.get(`${page}?next=${next}`);
        expect(r.status).toBe(307);
        expect(r.headers.get("location")).toBe("/teams");
      });
    }
    it(`${page}?next= keeps a same-origin path`, async () => {
      const { client } = await signedUpClient();
      const r = await client.get(`${page}?next=${encodeURIComponent("/teams/abc?tab=members")}`);
      expect(r.status).toBe(307);
      expect(r.headers.get("location")).toBe("/teams/abc?tab=members");
    });
  }
});

describe("issue 12 finding 7: links and the Origin check use PLATEAU_PUBLIC_URL, never the request's host", () => {
  it("an invite and a share link made with a forged X-Forwarded-Host carry PLATEAU_PUBLIC_URL (issue 13 item 1)", async () => {
    const o = await userWithTeam("Hosts");
    const baseUrl = inject("baseUrl");
    const forged = { "x-forwarded-host": "evil.example", "x-forwarded-proto": "https" };
    const inv = await o.client.req("POST", `/api/teams/${o.teamId}/invites`, { email: uniqueEmail("i"), role: "viewer" }, { headers: forged });
    expect(inv.status, inv.text).toBe(201);
    const body = (db.prepare("select text_body from outbox where id = ?").get(inv.json.mail.outboxId) as { text_body: string }).text_body;
    // Used to read https://evil.example/invite/<token>.
    expect(body).toContain(`${baseUrl}/invite/`);
    expect(body).not.toContain("evil.example");
    const ws = await makeWorkspace(o.client, o.teamId);
    const rep = await o.client.post(`/api/teams/${o.teamId}/reports`, { baselineId: ws.baselineId, scenarioIds: ws.scenarioIds, title: "Host check" });
    expect(rep.status, rep.text).toBe(201);
    const link = await o.client.req("POST", `/api/reports/${rep.json.report.id}/share-links`, {}, { headers: { "x-forwarded-host": "localhost:4100" } });
    expect(link.status, link.text).toBe(201);
    expect(link.json.url.startsWith(`${baseUrl}/r/`)).toBe(true);
  });

  it("Origin must match scheme, host and port: https://, another port, or a forged X-Forwarded-Host are refused", async () => {
    const { client } = await signedUpClient();
    const base = new URL(inject("baseUrl"));
    const before = countRows(db, "teams");
    const wrong = [
      `https://${base.host}`, // used to pass: the scheme was ignored
      `http://${base.hostname}:1`,
      "http://evil.example",
    ];
    for (const origin of wrong) {
      const r = await client.req("POST", "/api/teams", { name: "Nope" }, { headers: { origin, "x-forwarded-host": new URL(origin).host } });
      expect(r.status, origin).toBe(403);
      expect(r.json.error.code).toBe("bad_origin");
    }
    expect(countRows(db, "teams")).toBe(before);
    expect((await client.post("/api/teams", { name: "Yes" })).status).toBe(201);
  });
});

describe("issue 12 finding 8: a wrong-account invite accept does not reveal the invited address", () => {
  it("neither the API answer nor the invite page shows the address to another signed-in user", async () => {
    const o = await userWithTeam();
    const invited = uniqueEmail("invited");
    const token = await inviteToken(o.client, o.teamId, invited, "viewer");
    const other = await signedUpClient();
    const r = await other.client.post("/api/invites/accept", { token });
    expect(r.status).toBe(403);
    expect(r.text).not.toContain(invited);
    const page = await other.client.get(`/invite/${token}`);
    expect(page.status).toBe(200);
    expect(page.text).toContain("sent to a different e-mail address");
    expect(page.text).not.toContain(invited);
    const anon = await new Client().get(`/invite/${token}`);
    expect(anon.text).not.toContain(invited);
  });
});

describe("issue 12 finding 9: sessions", () => {
  it("the session cookie lives as long as the session (Max-Age = 7 days idle; it was a browser-session cookie)", async () => {
    const c = new Client();
    const r = await c.post("/api/auth/sign-up", { email: uniqueEmail(), password: GOOD_PASSWORD, name: "N" });
    const cookie = r.headers.getSetCookie().find((x) => x.startsWith("plateau_session="))!;
    const maxAge = Number(/Max-Age=(\d+)/i.exec(cookie)?.[1]);
    const row = db.prepare("select expires_at, created_at from sessions where id = ?").get(sessionId(c)) as { expires_at: number; created_at: number };
    expect(Math.abs(maxAge - (row.expires_at - Date.now() / 1000))).toBeLessThan(5);
    expect(maxAge).toBeGreaterThan(7 * 86400 - 60);
    expect(maxAge).toBeLessThanOrEqual(7 * 86400);
    expect(Math.abs(row.created_at - Date.now())).toBeLessThan(60_000);
  });

  it("OWASP ASVS 4.0.3 3.3.1: a session ends 30 days after sign-in however active it was", async () => {
    const { client } = await signedUpClient();
    const id = sessionId(client);
    // Active yesterday (expiry still days ahead) but created 30 days and a minute ago.
    db.prepare("update sessions set created_at = ?, expires_at = ? where id = ?").run(
      Date.now() - 30 * DAY_MS - 60_000,
      Math.floor((Date.now() + 6 * DAY_MS) / 1000),
      id,
    );
    const r = await client.get("/api/me");
    expect(r.status).toBe(401);
    expect(countRows(db, "sessions", "id = ?", id)).toBe(0);
  });

  it("an extension near the absolute end stops at it, and the refreshed cookie's Max-Age says so", async () => {
    const { client } = await signedUpClient();
    const id = sessionId(client);
    const created = Date.now() - 29 * DAY_MS;
    db.prepare("update sessions set created_at = ?, expires_at = ? where id = ?").run(created, Math.floor((Date.now() + DAY_MS) / 1000), id);
    const r = await client.get("/api/me");
    expect(r.status).toBe(200);
    const row = db.prepare("select expires_at from sessions where id = ?").get(id) as { expires_at: number };
    expect(row.expires_at).toBeLessThanOrEqual(Math.floor((created + 30 * DAY_MS) / 1000));
    const cookie = r.headers.getSetCookie().find((x) => x.startsWith("plateau_session="));
    if (cookie) expect(Number(/Max-Age=(\d+)/i.exec(cookie)?.[1])).toBeLessThanOrEqual(86400);
  });
});

describe("issue 12 finding 9: change password, sign out everywhere", () => {
  it("changing the password ends the user's other sessions and keeps this one", async () => {
    const { client: a, email, userId } = await signedUpClient();
    const b = new Client();
    expect((await signIn(b, email, GOOD_PASSWORD)).status).toBe(200);
    const newPassword = "tidal copper meander 77";
    const r = await a.post("/api/auth/password", { currentPassword: GOOD_PASSWORD, newPassword });
    expect(r.status, r.text).toBe(200);
    expect(r.json).toEqual({ ok: true, endedSessions: 1 });
    expect((await a.get("/api/me")).status).toBe(200);
    expect((await b.get("/api/me")).status).toBe(401);
    expect((await signIn(new Client(), email, GOOD_PASSWORD)).status).toBe(401);
    expect((await signIn(new Client(), email, newPassword)).status).toBe(200);
    expect(countRows(db, "audit_log", "action = 'user.password_change' and entity_id = ?", userId)).toBe(1);
  });

  it("refuses a wrong current password, a common or too-short new one, with the field named and nothing changed", async () => {
    const { client, userId } = await signedUpClient();
    const hash = () => (db.prepare("select password_hash from users where id = ?").get(userId) as { password_hash: string }).password_hash;
    const before = hash();
    const cases: [Record<string, unknown>, string, RegExp][] = [
      [{ currentPassword: "not my password 1", newPassword: "tidal copper meander 77" }, "currentPassword", /not your current password/],
      [{ currentPassword: GOOD_PASSWORD, newPassword: "qwertyuiop" }, "newPassword", /most common passwords/],
      [{ currentPassword: GOOD_PASSWORD, newPassword: "short" }, "newPassword", /at least 10/],
      [{ currentPassword: GOOD_PASSWORD, newPassword: GOOD_PASSWORD }, "newPassword", /different from the current/],
    ];
    for (const [body, field, msg] of cases) {
      const r = await client.req("POST", "/api/auth/password", body, { headers: { "x-forwarded-for": freshIp() } });
      expect(r.status, r.text).toBe(400);
      expect(r.json.error.fields[field][0]).toMatch(msg);
    }
    expect(hash()).toBe(before);
    expect((await new Client().post("/api/auth/password", { currentPassword: GOOD_PASSWORD, newPassword: "tidal copper meander 77" })).status).toBe(401);
  });

  it("sign-up refuses a common password (it used to accept 1234567890)", async () => {
    const r = await new Client().post("/api/auth/sign-up", { email: uniqueEmail(), password: "1234567890", name: "N" });
    expect(r.status).toBe(400);
    expect(r.json.error.fields.password[0]).toMatch(/most common passwords/);
  });

  it("sign out everywhere ends every session of the user, this one included", async () => {
    const { client: a, email, userId } = await signedUpClient();
    const b = new Client();
    expect((await signIn(b, email, GOOD_PASSWORD)).status).toBe(200);
    const other = await signedUpClient();
    const r = await a.post("/api/auth/sign-out-everywhere");
    expect(r.status).toBe(200);
    expect(a.cookie).toBe("");
    expect((await b.get("/api/me")).status).toBe(401);
    expect(countRows(db, "sessions", "user_id = ?", userId)).toBe(0);
    expect((await other.client.get("/api/me")).status).toBe(200);
    expect((await new Client().post("/api/auth/sign-out-everywhere")).status).toBe(401);
  });
});

describe("issue 12 finding 9: password reset by e-mail link", () => {
  function resetLink(email: string): { link: string; token: string } {
    const row = db
      .prepare(
        "select o.text_body, c.raw from outbox o join captured_mail c on c.outbox_id = o.id where o.kind = 'password_reset' and o.to_addresses = ? order by o.id desc",
      )
      .get(email) as { text_body: string; raw: string } | undefined;
    const m = row?.text_body.match(/(https?:\/\/\S+\/reset-password\?token=([A-Za-z0-9_-]{43}))/);
    if (!m) throw new Error(`no reset mail for ${email}`);
    expect(row!.raw).toContain("Reset your Plateau password");
    return { link: m[1]!, token: m[2]! };
  }

  it("mails a single-use link (only its hash stored), answers unknown addresses the same, and the link ends every session", async () => {
    const { client, email, userId } = await signedUpClient();
    const ask = await new Client().post("/api/auth/password-reset", { email: email.toUpperCase() });
    const unknown = await new Client().post("/api/auth/password-reset", { email: uniqueEmail("nobody") });
    expect(ask.status).toBe(202);
    expect(unknown.status).toBe(202);
    expect(unknown.json).toEqual(ask.json);
    const { link, token } = resetLink(email);
    expect(link.startsWith(`${inject("baseUrl")}/reset-password?token=`)).toBe(true);
    const stored = db.prepare("select token_hash, expires_at, created_at from password_resets where user_id = ?").all(userId) as {
      token_hash: string;
      expires_at: number;
      created_at: number;
    }[];
    expect(stored).toHaveLength(1);
    expect(stored[0]!.token_hash).toMatch(/^[0-9a-f]{64}$/);
    expect(stored[0]!.token_hash).not.toContain(token);
    expect(stored[0]!.expires_at - stored[0]!.created_at).toBe(60 * 60 * 1000);
    const page = await new Client().get(`/reset-password?token=${token}`);
    expect(page.status).toBe(200);
    expect(page.text).toMatch(/<meta name="referrer" content="no-referrer"/);

    const weak = await new Client().post("/api/auth/password-reset/confirm", { token, password: "password123" });
    expect(weak.status).toBe(400);
    expect(weak.json.error.fields.password[0]).toMatch(/most common/);
    const newPassword = "harbour lantern quartz 5";
    const r = await new Client().post("/api/auth/password-reset/confirm", { token, password: newPassword });
    expect(r.status, r.text).toBe(200);
    expect((await client.get("/api/me")).status).toBe(401);
    expect((await signIn(new Client(), email, GOOD_PASSWORD)).status).toBe(401);
    expect((await signIn(new Client(), email, newPassword)).status).toBe(200);
    const again = await new Client().post("/api/auth/password-reset/confirm", { token, password: "yet another phrase 88" });
    expect(again.status).toBe(400);
    expect(again.json.error.fields.token[0]).toMatch(/not valid, was already used or has expired/);
    expect((await signIn(new Client(), email, newPassword)).status).toBe(200);
  });

  it("an expired link (over 1 hour) or a made-up token changes nothing", async () => {
    const { email, userId } = await signedUpClient();
    expect((await new Client().post("/api/auth/password-reset", { email })).status).toBe(202);
    const { token } = resetLink(email);
    db.prepare("update password_resets set expires_at = ? where user_id = ?").run(Date.now() - 1, userId);
    const hash = () => (db.prepare("select password_hash from users where id = ?").get(userId) as { password_hash: string }).password_hash;
    const before = hash();
    const r = await new Client().post("/api/auth/password-reset/confirm", { token, password: "harbour lantern quartz 5" });
    expect(r.status).toBe(400);
    const forged = await new Client().post("/api/auth/password-reset/confirm", { token: "A".repeat(43), password: "harbour lantern quartz 5" });
    expect(forged.status).toBe(400);
    const malformed = await new Client().post("/api/auth/password-reset/confirm", { token: "short", password: "harbour lantern quartz 5" });
    expect(malformed.status).toBe(400);
    expect(malformed.json.error.fields.token[0]).toMatch(/incomplete/);
    expect(hash()).toBe(before);
  });

  it("mails at most 3 links per account an hour", async () => {
    const { email } = await signedUpClient();
    for (let i = 0; i < 5; i++) expect((await new Client().post("/api/auth/password-reset", { email })).status).toBe(202);
    expect(countRows(db, "outbox", "kind = 'password_reset' and to_addresses = ?", email)).toBe(3);
  });
});

import { afterAll, beforeAll, describe, expect, it } from "vitest";
import type Database from "better-sqlite3";
import { Client, GOOD_PASSWORD, signedUpClient, uniqueEmail } from "../helpers/http";
import { countRows, openTestDb } from "../helpers/db-file";

let db: Database.Database;
beforeAll(() => {
  db = openTestDb();
});
afterAll(() => db.close());

const users = () => countRows(db, "users");
let ipCounter = 0;
/** A distinct client address per test, so throttling in one test never touches another. */
const freshIp = () => `198.51.100.${(++ipCounter % 250) + 1}`;

describe("POST /api/auth/sign-up", () => {
  it("creates the account, signs in and normalises the e-mail to lower case", async () => {
    const c = new Client();
    const email = uniqueEmail("MixedCase").replace("MixedCase", "Mixed.Case");
    const r = await c.post("/api/auth/sign-up", { email: `  ${email.toUpperCase()} `, password: GOOD_PASSWORD, name: "Ada Lane" });
    expect(r.status).toBe(201);
    expect(r.json.user).toEqual({ id: expect.any(String), email: email.toLowerCase(), name: "Ada Lane", emailVerified: false });
    expect(r.headers.get("set-cookie")).toMatch(/plateau_session=[^;]+;.*HttpOnly/i);
    expect(r.headers.get("set-cookie")).toMatch(/SameSite=Lax/i);
    const me = await c.get("/api/me");
    expect(me.status).toBe(200);
    expect(me.json).toEqual({ user: r.json.user, teams: [] });
    const row = db.prepare("select email, password_hash from users where id = ?").get(r.json.user.id) as {
      email: string;
      password_hash: string;
    };
    expect(row.email).toBe(email.toLowerCase());
    expect(row.password_hash).toMatch(/^scrypt\$32768\$8\$1\$/);
    expect(row.password_hash).not.toContain(GOOD_PASSWORD);
  });

  it("rejects a duplicate e-mail (any letter case) with 409 and stores nothing", async () => {
    const { email } = await signedUpClient();
    const before = users();
    const r = await new Client().post("/api/auth/sign-up", { email: email.toUpperCase(), password: GOOD_PASSWORD, name: "Second" });
    expect(r.status).toBe(409);
    expect(r.json.error.code).toBe("conflict");
    expect(r.json.error.message).toMatch(/already exists/);
    expect(r.json.error.fields.email[0]).toMatch(/already exists/);
    expect(users()).toBe(before);
  });

  const bad: [string, Record<string, unknown>, string, RegExp][] = [
    ["a short password", { password: "short1" }, "password", /at least 10 characters/],
    ["an over-long password", { password: "x".repeat(100) + "y".repeat(29) }, "password", /at most 128 characters/],
    ["a password of one repeated character", { password: "aaaaaaaaaaaaaa" }, "password", /more than one distinct character/],
    ["a malformed e-mail", { email: "not-an-email" }, "email", /valid e-mail address/],
    ["an e-mail with two @", { email: "a@b@example.com" }, "email", /valid e-mail address/],
    ["a missing name", { name: "" }, "name", /Enter your name/],
    ["a password that is a number", { password: 12345678901 }, "password", /Choose a password/],
  ];
  for (const [what, patch, field, msg] of bad) {
    it(`rejects ${what} with 400 and a field message, storing nothing`, async () => {
      const before = users();
      const body = { email: uniqueEmail(), password: GOOD_PASSWORD, name: "N", ...patch };
      const r = await new Client().post("/api/auth/sign-up", body);
      expect(r.status).toBe(400);
      expect(r.json.error.code).toBe("invalid_input");
      expect(r.json.error.fields[field]?.[0]).toMatch(msg);
      expect(r.headers.get("set-cookie") ?? "").not.toMatch(/plateau_session=[^;]/);
      expect(users()).toBe(before);
    });
  }

  it("rejects a password equal to the e-mail", async () => {
    const before = users();
    const email = uniqueEmail();
    const r = await new Client().post("/api/auth/sign-up", { email, password: email.toUpperCase(), name: "N" });
    expect(r.status).toBe(400);
    expect(r.json.error.fields.password[0]).toMatch(/must not be your e-mail/);
    expect(users()).toBe(before);
  });

  it("answers 415 to a form-encoded body", async () => {
    const before = users();
    const r = await new Client().req("POST", "/api/auth/sign-up", undefined, {
      headers: { "content-type": "application/x-www-form-urlencoded" },
      raw: `email=${encodeURIComponent(uniqueEmail())}&password=x&name=y`,
    });
    expect(r.status).toBe(415);
    expect(r.json.error.message).toBe("Send the body as application/json.");
    expect(users()).toBe(before);
  });

  it("answers 413 to an oversized JSON body", async () => {
    const before = users();
    const r = await new Client().post("/api/auth/sign-up", {
      email: uniqueEmail(),
      password: GOOD_PASSWORD,
      name: "N",
      pad: "x".repeat(40_000),
    });
    expect(r.status).toBe(413);
    expect(r.json.error.code).toBe("payload_too_large");
    expect(r.json.error.message).toMatch(/larger than the limit of 16 KiB/);
    expect(users()).toBe(before);
  });

  it("answers 400 to malformed JSON", async () => {
    const before = users();
    const r = await new Client().req("POST", "/api/auth/sign-up", undefined, {
      headers: { "content-type": "application/json" },
      raw: "{not json",
    });
    expect(r.status).toBe(400);
    expect(r.json.error.message).toBe("The body is not valid JSON.");
    expect(users()).toBe(before);
  });

  it("answers 403 to a cross-site Origin", async () => {
    const before = users();
    const r = await new Client().req(
      "POST",
      "/api/auth/sign-up",
      { email: uniqueEmail(), password: GOOD_PASSWORD, name: "N" },
      { headers: { origin: "https://evil.example" } },
    );
    expect(r.status).toBe(403);
    expect(r.json.error).toEqual({ code: "bad_origin", message: "Cross-site requests are not accepted." });
    expect(users()).toBe(before);
  });
});

describe("POST /api/auth/sign-in", () => {
  it("signs in with the right password (e-mail in any case)", async () => {
    const { email, userId } = await signedUpClient("Sam");
    const c = new Client();
    const r = await c.req("POST", "/api/auth/sign-in", { email: email.toUpperCase(), password: GOOD_PASSWORD }, { headers: { "x-forwarded-for": freshIp() } });
    expect(r.status).toBe(200);
    expect(r.json.user).toEqual({ id: userId, email, name: "Sam", emailVerified: true });
    expect((await c.get("/api/me")).json.user.id).toBe(userId);
  });

  it("gives the same answer for a wrong password and an unknown e-mail", async () => {
    const { email } = await signedUpClient();
    const wrong = await new Client().req("POST", "/api/auth/sign-in", { email, password: "wrong password 123" }, { headers: { "x-forwarded-for": freshIp() } });
    const unknown = await new Client().req(
      "POST",
      "/api/auth/sign-in",
      { email: uniqueEmail("nobody"), password: "wrong password 123" },
      { headers: { "x-forwarded-for": freshIp() } },
    );
    expect(wrong.status).toBe(401);
    expect(unknown.status).toBe(401);
    expect(wrong.json).toEqual({ error: { code: "invalid_credentials", message: "E-mail or password is wrong." } });
    expect(unknown.json).toEqual(wrong.json);
    expect(wrong.headers.get("set-cookie") ?? "").not.toMatch(/plateau_session=[^;]/);
  });

  it("refuses an over-long password with 400 before any work", async () => {
    const r = await new Client().post("/api/auth/sign-in", { email: uniqueEmail(), password: "p".repeat(129) });
    expect(r.status).toBe(400);
    expect(r.json.error.fields.password[0]).toMatch(/at most 128/);
  });

  it("locks an account after 5 failures, even for the right password, without revealing whether it exists", async () => {
    const { email } = await signedUpClient();
    const ghost = uniqueEmail("ghost");
    const statuses: number[] = [];
    const ghostStatuses: number[] = [];
    for (let i = 0; i < 5; i++) {
      statuses.push(
        (await new Client().req("POST", "/api/auth/sign-in", { email, password: `wrong password ${i}` }, { headers: { "x-forwarded-for": freshIp() } })).status,
      );
      ghostStatuses.push(
        (await new Client().req("POST", "/api/auth/sign-in", { email: ghost, password: `wrong password ${i}` }, { headers: { "x-forwarded-for": freshIp() } }))
          .status,
      );
    }
    expect(statuses).toEqual([401, 401, 401, 401, 429]);
    expect(ghostStatuses).toEqual(statuses);
    const right = await new Client().req("POST", "/api/auth/sign-in", { email, password: GOOD_PASSWORD }, { headers: { "x-forwarded-for": freshIp() } });
    const ghostRight = await new Client().req(
      "POST",
      "/api/auth/sign-in",
      { email: ghost, password: GOOD_PASSWORD },
      { headers: { "x-forwarded-for": freshIp() } },
    );
    expect(right.status).toBe(429);
    expect(right.json.error.code).toBe("too_many_attempts");
    expect(right.json.error.message).toMatch(/^Too many failed sign-in attempts\. Wait 1[45] minutes, then try again\.$/);
    expect(Number(right.headers.get("retry-after"))).toBeGreaterThan(800);
    expect(ghostRight.status).toBe(429);
    expect(ghostRight.json.error.message).toBe(right.json.error.message);
    expect(right.headers.get("set-cookie") ?? "").not.toMatch(/plateau_session=[^;]/);
    const row = db.prepare("select locked_until from sign_in_throttle where key = ?").get(`account:${email}`) as { locked_until: number };
    expect(row.locked_until).toBeGreaterThan(Date.now());
  });

  it("locks a client address after 20 failures across accounts, other addresses unaffected", async () => {
    const ip = freshIp();
    let last = 0;
    for (let i = 0; i < 20; i++) {
      last = (
        await new Client().req(
          "POST",
          "/api/auth/sign-in",
          { email: uniqueEmail("spray"), password: "wrong password 1" },
          { headers: { "x-forwarded-for": `${ip}, 10.0.0.1` } },
        )
      ).status;
    }
    expect(last).toBe(429);
    const { email } = await signedUpClient();
    const blocked = await new Client().req("POST", "/api/auth/sign-in", { email, password: GOOD_PASSWORD }, { headers: { "x-forwarded-for": ip } });
    expect(blocked.status).toBe(429);
    const elsewhere = await new Client().req("POST", "/api/auth/sign-in", { email, password: GOOD_PASSWORD }, { headers: { "x-forwarded-for": freshIp() } });
    expect(elsewhere.status).toBe(200);
  });

  it("a success clears the account's failure count", async () => {
    const { email } = await signedUpClient();
    const ip = freshIp();
    const send = (password: string) => new Client().req("POST", "/api/auth/sign-in", { email, password }, { headers: { "x-forwarded-for": ip } });
    for (let i = 0; i < 4; i++) expect((await send("wrong password x")).status).toBe(401);
    expect((await send(GOOD_PASSWORD)).status).toBe(200);
    expect(countRows(db, "sign_in_throttle", "key = ?", `account:${email}`)).toBe(0);
    expect((await send("wrong password x")).status).toBe(401);
  });
});

describe("sessions", () => {
  it("GET /api/me without a session answers 401", async () => {
    const r = await new Client().get("/api/me");
    expect(r.status).toBe(401);
    expect(r.json).toEqual({ error: { code: "unauthorized", message: "Sign in first." } });
  });

  it("a forged session cookie answers 401", async () => {
    const c = new Client();
    c.cookie = "plateau_session=forgedforgedforgedforged";
    expect((await c.get("/api/me")).status).toBe(401);
  });

  it("an expired session answers 401", async () => {
    const { client } = await signedUpClient();
    const id = client.cookie.split("=")[1]!;
    expect((await client.get("/api/me")).status).toBe(200);
    db.prepare("update sessions set expires_at = ? where id = ?").run(Math.floor(Date.now() / 1000) - 60, id);
    const r = await client.get("/api/me");
    expect(r.status).toBe(401);
    expect(r.json.error.message).toBe("Sign in first.");
  });

  it("sign-out ends the session server-side (the old cookie stops working)", async () => {
    const { client } = await signedUpClient();
    const old = client.cookie;
    const r = await client.post("/api/auth/sign-out");
    expect(r.status).toBe(200);
    expect(client.cookie).toBe("");
    const replay = new Client();
    replay.cookie = old;
    expect((await replay.get("/api/me")).status).toBe(401);
    expect(countRows(db, "sessions", "id = ?", old.split("=")[1])).toBe(0);
  });

  it("sign-out from another site is refused", async () => {
    const { client } = await signedUpClient();
    const r = await client.req("POST", "/api/auth/sign-out", {}, { headers: { origin: "http://evil.example" } });
    expect(r.status).toBe(403);
    expect((await client.get("/api/me")).status).toBe(200);
  });
});

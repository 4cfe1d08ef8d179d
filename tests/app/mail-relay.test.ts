import { createHash } from "node:crypto";
import { afterAll, beforeAll, describe, expect, inject, it } from "vitest";
import type Database from "better-sqlite3";
import { Client, signedUpClient, userWithTeam, verificationTokenFor, verifyEmail } from "../helpers/http";
import { countRows, openTestDb } from "../helpers/db-file";
import { addMember, inviteToken } from "../helpers/members";
import { makeWorkspace } from "../helpers/reports";

// Issue 12, finding 6: Plateau must not be a spam relay. A verified address before invites or report e-mails, through
// a confirmation link that is random, stored only as a hash, single use and short-lived (OWASP ASVS 4.0.3 2.3.1:
// activation codes securely random and expiring after a short time); per-user and per-team sending limits (ASVS
// 4.0.3 11.1.4: anti-automation against excessive business-logic calls), answered with 429 and Retry-After
// (RFC 6585 §4, RFC 9110 §10.2.3); and a fixed invite subject.

let db: Database.Database;
beforeAll(() => {
  db = openTestDb();
});
afterAll(() => db.close());

const sha256 = (s: string) => createHash("sha256").update(s).digest("hex");

async function reportOf(o: { client: Client; teamId: string }): Promise<string> {
  const ws = await makeWorkspace(o.client, o.teamId);
  const r = await o.client.post(`/api/teams/${o.teamId}/reports`, { baselineId: ws.baselineId, scenarioIds: ws.scenarioIds, title: "Relay check" });
  expect(r.status, r.text).toBe(201);
  return r.json.report.id as string;
}

const addresses = (n: number, tag: string) => Array.from({ length: n }, (_, i) => `${tag}-${i}-${Date.now().toString(36)}@example.test`);

describe("e-mail verification", () => {
  it("sign-up mails a single-use 24-hour link (only its hash stored); the link confirms the address once", async () => {
    const u = await signedUpClient("Vera Verify", { verify: false });
    expect((await u.client.get("/api/me")).json.user).toMatchObject({ email: u.email, emailVerified: false });
    const out = db.prepare("select * from outbox where kind = 'verify_email' and to_addresses = ?").all(u.email) as Record<string, unknown>[];
    expect(out).toHaveLength(1);
    expect(out[0]).toMatchObject({ team_id: null, user_id: u.userId, status: "sent", subject: "Confirm your e-mail address for Plateau" });
    const token = verificationTokenFor(u.email);
    expect(String(out[0]!.text_body)).toContain(`${inject("baseUrl")}/verify-email/${token}`);
    expect(Buffer.from(token, "base64url")).toHaveLength(32);
    const row = db.prepare("select * from email_verifications where user_id = ?").get(u.userId) as Record<string, number | string | null>;
    expect(row.token_hash).toBe(sha256(token));
    expect(JSON.stringify(row)).not.toContain(token);
    expect(Number(row.expires_at) - Number(row.created_at)).toBe(24 * 3600 * 1000);

    // The link's page only shows a button; opening it changes nothing.
    const page = await new Client().get(`/verify-email/${token}`);
    expect(page.status).toBe(200);
    expect(page.text).toContain("Confirm my address");
    expect((db.prepare("select email_verified_at from users where id = ?").get(u.userId) as { email_verified_at: number | null }).email_verified_at).toBe(null);

    // No session needed: the token proves the address.
    const ok = await new Client().post("/api/auth/verify-email", { token });
    expect(ok.status, ok.text).toBe(200);
    expect(ok.json).toEqual({ verified: true, email: u.email });
    expect((await u.client.get("/api/me")).json.user.emailVerified).toBe(true);
    expect(countRows(db, "audit_log", "user_id = ? and action = 'user.verify_email'", u.userId)).toBe(1);
    const again = await new Client().post("/api/auth/verify-email", { token });
    expect(again.status).toBe(409);
    expect(again.json.error.message).toBe("This confirmation link has already been used. Your address was confirmed then.");
    expect(countRows(db, "audit_log", "user_id = ? and action = 'user.verify_email'", u.userId)).toBe(1);
  });

  it("an unknown link answers 404, an expired one 410, and neither confirms anything", async () => {
    const u = await signedUpClient("Ezra Expired", { verify: false });
    const unknown = await new Client().post("/api/auth/verify-email", { token: "A".repeat(43) });
    expect(unknown.status).toBe(404);
    expect(unknown.json.error.code).toBe("not_found");
    const token = verificationTokenFor(u.email);
    db.prepare("update email_verifications set expires_at = ? where token_hash = ?").run(Date.now() - 1, sha256(token));
    const expired = await new Client().post("/api/auth/verify-email", { token });
    expect(expired.status).toBe(410);
    expect(expired.json.error).toMatchObject({ code: "link_expired" });
    expect((await u.client.get("/api/me")).json.user.emailVerified).toBe(false);
    expect(countRows(db, "email_verifications", "user_id = ? and used_at is not null", u.userId)).toBe(0);
    const bad = await new Client().post("/api/auth/verify-email", { token: "" });
    expect(bad.status).toBe(400);
    expect(bad.json.error.fields.token).toEqual(["The confirmation token is missing."]);
  });

  it("'send the link again' is paced (429 with Retry-After), works after a minute, and refuses a confirmed account", async () => {
    const u = await signedUpClient("Rhea Resend", { verify: false });
    const links = () => countRows(db, "email_verifications", "user_id = ?", u.userId);
    expect(links()).toBe(1);
    const tooSoon = await u.client.post("/api/auth/verify-email/resend");
    expect(tooSoon.status).toBe(429);
    expect(tooSoon.json.error.code).toBe("verification_rate_limited");
    const wait = Number(tooSoon.headers.get("retry-after"));
    expect(wait).toBeGreaterThanOrEqual(1);
    expect(wait).toBeLessThanOrEqual(60);
    expect(links()).toBe(1);
    // A minute later (the earlier send moved back in time): a new link, and the old one still works once.
    db.prepare("update email_verifications set created_at = created_at - 61000 where user_id = ?").run(u.userId);
    const first = verificationTokenFor(u.email);
    const resent = await u.client.post("/api/auth/verify-email/resend");
    expect(resent.status, resent.text).toBe(200);
    expect(resent.json.mail.status).toBe("sent");
    expect(links()).toBe(2);
    const second = verificationTokenFor(u.email);
    expect(second).not.toBe(first);
    // At most five links a day.
    db.prepare("update email_verifications set created_at = created_at - 61000 where user_id = ?").run(u.userId);
    for (let i = 0; i < 3; i++) {
      expect((await u.client.post("/api/auth/verify-email/resend")).status).toBe(200);
      db.prepare("update email_verifications set created_at = created_at - 61000 where user_id = ?").run(u.userId);
    }
    expect(links()).toBe(5);
    const sixth = await u.client.post("/api/auth/verify-email/resend");
    expect(sixth.status).toBe(429);
    expect(Number(sixth.headers.get("retry-after"))).toBeGreaterThan(23 * 3600);
    expect(links()).toBe(5);
    await verifyEmail(u.client, u.email);
    const done = await u.client.post("/api/auth/verify-email/resend");
    expect(done.status).toBe(409);
    expect((await new Client().post("/api/auth/verify-email/resend")).status).toBe(401);
  });

  it("accepting an invite confirms the address it was sent to", async () => {
    const o = await userWithTeam("Invite Proves");
    const member = await addMember(o.client, o.teamId, "editor");
    expect((await member.client.get("/api/me")).json.user.emailVerified).toBe(true);
  });
});

describe("sending needs a verified address (403 email_unverified)", () => {
  it("an unverified owner cannot invite; nothing is stored or sent; after confirming, the same request succeeds", async () => {
    const o = await userWithTeam("Unverified Owner", { verify: false });
    const before = [countRows(db, "invites", "team_id = ?", o.teamId), countRows(db, "outbox", "team_id = ?", o.teamId)];
    const r = await o.client.post(`/api/teams/${o.teamId}/invites`, { email: "someone@example.test", role: "viewer" });
    expect(r.status).toBe(403);
    expect(r.json.error.code).toBe("email_unverified");
    expect(r.json.error.message).toBe(
      `Confirm your e-mail address (${o.email}) before sending invites or report e-mails: open the link we sent you, or send a new one from the notice at the top of the page.`,
    );
    expect([countRows(db, "invites", "team_id = ?", o.teamId), countRows(db, "outbox", "team_id = ?", o.teamId)]).toEqual(before);
    // The app shell shows the notice with the resend button.
    const page = await o.client.get(`/teams/${o.teamId}`);
    expect(page.text).toContain("Confirm your e-mail address.");
    expect(page.text).toContain("Send the link again");
    await verifyEmail(o.client, o.email);
    expect((await o.client.get(`/teams/${o.teamId}`)).text).not.toContain("Send the link again");
    expect((await o.client.post(`/api/teams/${o.teamId}/invites`, { email: "someone@example.test", role: "viewer" })).status).toBe(201);
  });

  it("an unverified editor cannot e-mail a report: no share link, no outbox row", async () => {
    const o = await userWithTeam("Unverified Sender");
    const id = await reportOf(o);
    // An editor who signed up but joined without an invite link is unverified (set directly: invites confirm).
    const editor = await signedUpClient("Ed Unverified", { verify: false });
    db.prepare("insert into memberships (team_id, user_id, role, created_at) values (?, ?, 'editor', ?)").run(o.teamId, editor.userId, Date.now());
    const before = [countRows(db, "share_links", "report_id = ?", id), countRows(db, "outbox", "team_id = ?", o.teamId)];
    const r = await editor.client.post(`/api/reports/${id}/email`, { to: ["dir@example.test"], message: "Buy now" });
    expect(r.status).toBe(403);
    expect(r.json.error.code).toBe("email_unverified");
    expect([countRows(db, "share_links", "report_id = ?", id), countRows(db, "outbox", "team_id = ?", o.teamId)]).toEqual(before);
  });
});

describe("sending limits (429 mail_rate_limited with Retry-After)", () => {
  it("per user: 40 invites and report e-mails an hour; the request over it is refused whole and stores nothing", async () => {
    const o = await userWithTeam("Busy Sender");
    const id = await reportOf(o);
    for (const batch of [addresses(20, "a"), addresses(19, "b")]) {
      const r = await o.client.post(`/api/reports/${id}/email`, { to: batch });
      expect(r.status, r.text).toBe(200);
    }
    expect((await o.client.post(`/api/teams/${o.teamId}/invites`, { email: addresses(1, "fortieth")[0], role: "viewer" })).status).toBe(201);
    const before = [
      countRows(db, "share_links", "report_id = ?", id),
      countRows(db, "outbox", "team_id = ?", o.teamId),
      countRows(db, "invites", "team_id = ?", o.teamId),
    ];
    const over = await o.client.post(`/api/reports/${id}/email`, { to: addresses(1, "c") });
    expect(over.status).toBe(429);
    expect(over.json.error.code).toBe("mail_rate_limited");
    expect(over.json.error.message).toMatch(/^You can send at most 40 invites and report e-mails per hour \(one per recipient\)/);
    const retry = Number(over.headers.get("retry-after"));
    expect(retry).toBeGreaterThan(3000);
    expect(retry).toBeLessThanOrEqual(3600);
    const invite = await o.client.post(`/api/teams/${o.teamId}/invites`, { email: "late@example.test", role: "viewer" });
    expect(invite.status).toBe(429);
    expect(Number(invite.headers.get("retry-after"))).toBeGreaterThan(3000);
    expect([
      countRows(db, "share_links", "report_id = ?", id),
      countRows(db, "outbox", "team_id = ?", o.teamId),
      countRows(db, "invites", "team_id = ?", o.teamId),
    ]).toEqual(before);
    // An hour later (the sends moved back in time) the same request goes through.
    db.prepare("update outbox set created_at = created_at - 3600000 where user_id = ?").run(o.userId);
    expect((await o.client.post(`/api/reports/${id}/email`, { to: addresses(1, "d") })).status).toBe(200);
  });

  it("concurrent requests cannot pass the per-user limit together", async () => {
    const o = await userWithTeam("Racing Sender");
    const id = await reportOf(o);
    const answers = await Promise.all(Array.from({ length: 4 }, (_, i) => o.client.post(`/api/reports/${id}/email`, { to: addresses(15, `race${i}`) })));
    const ok = answers.filter((a) => a.status === 200).length;
    expect(answers.map((a) => a.status).sort()).toEqual([200, 200, 429, 429]);
    expect(ok * 15).toBe(countRows(db, "outbox", "user_id = ? and kind = 'report'", o.userId));
  });

  it("per team: 100 an hour across its members", async () => {
    const o = await userWithTeam("Busy Team");
    const id = await reportOf(o);
    const editors = [await addMember(o.client, o.teamId, "editor"), await addMember(o.client, o.teamId, "editor")];
    for (const e of editors) {
      for (const tag of ["x", "y"]) expect((await e.client.post(`/api/reports/${id}/email`, { to: addresses(20, tag) })).status).toBe(200);
    }
    // 2 invites + 80 reports so far; the owner sends 18 more: 100.
    expect((await o.client.post(`/api/reports/${id}/email`, { to: addresses(18, "z") })).status).toBe(200);
    expect(countRows(db, "outbox", "team_id = ? and kind in ('invite', 'report')", o.teamId)).toBe(100);
    const over = await o.client.post(`/api/reports/${id}/email`, { to: addresses(1, "over") });
    expect(over.status).toBe(429);
    expect(over.json.error.message).toMatch(/^This team can send at most 100 invites and report e-mails per hour/);
    expect(Number(over.headers.get("retry-after"))).toBeGreaterThan(3000);
    expect(countRows(db, "outbox", "team_id = ? and kind in ('invite', 'report')", o.teamId)).toBe(100);
  });
});

describe("invite subject", () => {
  it("is fixed wording with the team name quoted, on one line, without control characters, at most 60 characters of name", async () => {
    const o = await userWithTeam("Subject Team");
    // A name stored before names were checked for control characters (issue 12, finding 10), set directly.
    const name = `Prize\r\nBcc: victim@example.test\u202E "claim" now ${"x".repeat(80)}`;
    db.prepare("update teams set name = ? where id = ?").run(name, o.teamId);
    const r = await o.client.post(`/api/teams/${o.teamId}/invites`, { email: addresses(1, "subject")[0], role: "viewer" });
    expect(r.status, r.text).toBe(201);
    const out = db.prepare("select subject, text_body from outbox where id = ?").get(r.json.mail.outboxId) as { subject: string; text_body: string };
    const quoted = `Prize Bcc: victim@example.test 'claim' now ${"x".repeat(60 - 43 - 1)}…`;
    expect(out.subject).toBe(`Invitation to join the team "${quoted}" on Plateau`);
    expect(Array.from(quoted)).toHaveLength(60);
    expect(out.text_body.split("\n")[0]).toBe(`Test User invited you to join the team "${quoted}" on Plateau as a viewer.`);
    const raw = (db.prepare("select raw from captured_mail where outbox_id = ?").get(r.json.mail.outboxId) as { raw: string }).raw;
    const head = raw.slice(0, raw.search(/\r?\n\r?\n/));
    expect(head).not.toMatch(/^Bcc:/im);
  });

  it("the token from an invite mail still works after the new subject (helpers read the body)", async () => {
    const o = await userWithTeam("Subject Token");
    const token = await inviteToken(o.client, o.teamId, addresses(1, "tok")[0]!, "viewer");
    expect(token).toMatch(/^[A-Za-z0-9_-]{43}$/);
  });
});

import { createHash } from "node:crypto";
import { afterAll, beforeAll, describe, expect, inject, it } from "vitest";
import type Database from "better-sqlite3";
import { Client, GOOD_PASSWORD, signedUpClient, uniqueEmail, userWithTeam } from "../helpers/http";
import { countRows, openTestDb } from "../helpers/db-file";
import { addMember, inviteLinkFromOutbox, inviteToken } from "../helpers/members";

let db: Database.Database;
beforeAll(() => {
  db = openTestDb();
});
afterAll(() => db.close());

const memberships = (teamId: string) => countRows(db, "memberships", "team_id = ?", teamId);
const invitesOf = (teamId: string) => countRows(db, "invites", "team_id = ?", teamId);

async function signUpAs(email: string) {
  const c = new Client();
  const r = await c.post("/api/auth/sign-up", { email, password: GOOD_PASSWORD, name: "Invitee" });
  expect(r.status).toBe(201);
  return { client: c, userId: r.json.user.id as string };
}

describe("POST /api/teams/[teamId]/invites", () => {
  it("stores a hashed single-use token, e-mails an absolute link through the local mail catcher", async () => {
    const o = await userWithTeam("Harbour Wiring");
    const email = uniqueEmail("invitee");
    const before = Date.now();
    const r = await o.client.post(`/api/teams/${o.teamId}/invites`, { email: email.toUpperCase(), role: "viewer" });
    expect(r.status).toBe(201);
    expect(r.json.invite).toMatchObject({ email, role: "viewer", status: "pending" });
    expect(r.json.invite.expiresAt - r.json.invite.createdAt).toBe(7 * 24 * 3600 * 1000);
    expect(r.json.invite.createdAt).toBeGreaterThanOrEqual(before);
    expect(r.json.mail.status).toBe("sent");
    expect(JSON.stringify(r.json)).not.toMatch(/token/i);

    const { link, token } = inviteLinkFromOutbox(r.json.mail.outboxId);
    expect(link).toBe(`${inject("baseUrl")}/invite/${token}`);
    expect(Buffer.from(token, "base64url").length).toBeGreaterThanOrEqual(16);
    const row = db.prepare("select * from invites where id = ?").get(r.json.invite.id) as Record<string, unknown>;
    expect(row.token_hash).toBe(createHash("sha256").update(token).digest("hex"));
    expect(JSON.stringify(row)).not.toContain(token);

    const outbox = db.prepare("select * from outbox where id = ?").get(r.json.mail.outboxId) as Record<string, unknown>;
    expect(outbox).toMatchObject({ team_id: o.teamId, kind: "invite", to_addresses: email, status: "sent" });
    expect(outbox.subject).toBe('Invitation to join the team "Harbour Wiring" on Plateau');
    const captured = db.prepare("select * from captured_mail where outbox_id = ?").all(r.json.mail.outboxId) as Record<string, string>[];
    expect(captured).toHaveLength(1);
    expect(captured[0]!.envelope_to).toBe(email);
    expect(captured[0]!.subject).toBe(outbox.subject);
    expect(captured[0]!.raw).toContain(`X-Plateau-Outbox: ${r.json.mail.outboxId}`);
    expect(String(captured[0]!.raw).replace(/=\r?\n/g, "")).toContain(`/invite/${token}`);
    expect(countRows(db, "audit_log", "team_id = ? and action = 'invite.create'", o.teamId)).toBe(1);
  });

  it("only owners invite: editors and viewers get 403, outsiders 404, no session 401 — nothing stored or sent", async () => {
    const o = await userWithTeam();
    const editor = await addMember(o.client, o.teamId, "editor");
    const viewer = await addMember(o.client, o.teamId, "viewer");
    const outsider = await signedUpClient();
    const before = [invitesOf(o.teamId), countRows(db, "outbox")];
    const body = { email: uniqueEmail(), role: "editor" };
    expect((await editor.client.post(`/api/teams/${o.teamId}/invites`, body)).status).toBe(403);
    expect((await viewer.client.post(`/api/teams/${o.teamId}/invites`, body)).status).toBe(403);
    expect((await outsider.client.post(`/api/teams/${o.teamId}/invites`, body)).status).toBe(404);
    expect((await new Client().post(`/api/teams/${o.teamId}/invites`, body)).status).toBe(401);
    expect((await editor.client.get(`/api/teams/${o.teamId}/invites`)).status).toBe(403);
    expect([invitesOf(o.teamId), countRows(db, "outbox")]).toEqual(before);
  });

  it("rejects a malformed e-mail, an unknown role and an existing member; nothing stored", async () => {
    const o = await userWithTeam();
    const editor = await addMember(o.client, o.teamId, "editor");
    const before = [invitesOf(o.teamId), countRows(db, "outbox")];
    const badEmail = await o.client.post(`/api/teams/${o.teamId}/invites`, { email: "someone@", role: "editor" });
    expect(badEmail.status).toBe(400);
    expect(badEmail.json.error.fields.email[0]).toMatch(/valid e-mail/);
    const badRole = await o.client.post(`/api/teams/${o.teamId}/invites`, { email: uniqueEmail(), role: "admin" });
    expect(badRole.status).toBe(400);
    expect(badRole.json.error.fields.role[0]).toBe("Choose owner, editor or viewer.");
    const member = await o.client.post(`/api/teams/${o.teamId}/invites`, { email: editor.email, role: "viewer" });
    expect(member.status).toBe(409);
    expect(member.json.error.message).toBe(`${editor.email} is already a member of this team.`);
    const wrongType = await o.client.req("POST", `/api/teams/${o.teamId}/invites`, undefined, {
      headers: { "content-type": "multipart/form-data; boundary=x" },
      raw: "--x--",
    });
    expect(wrongType.status).toBe(415);
    const big = await o.client.post(`/api/teams/${o.teamId}/invites`, { email: uniqueEmail(), role: "viewer", pad: "z".repeat(10_000) });
    expect(big.status).toBe(413);
    expect([invitesOf(o.teamId), countRows(db, "outbox")]).toEqual(before);
  });

  it("GET lists invites with status for owners", async () => {
    const o = await userWithTeam();
    const email = uniqueEmail();
    await inviteToken(o.client, o.teamId, email, "editor");
    const r = await o.client.get(`/api/teams/${o.teamId}/invites`);
    expect(r.status).toBe(200);
    expect(r.json.invites).toHaveLength(1);
    expect(r.json.invites[0]).toMatchObject({ email, role: "editor", status: "pending" });
  });
});

describe("POST /api/invites/accept", () => {
  it("adds the membership with the invited role, once", async () => {
    const o = await userWithTeam();
    const email = uniqueEmail();
    const token = await inviteToken(o.client, o.teamId, email, "editor");
    const u = await signUpAs(email);
    const r = await u.client.post("/api/invites/accept", { token });
    expect(r.status).toBe(200);
    expect(r.json.team).toEqual({ id: o.teamId, name: "Test Team", role: "editor" });
    expect((await u.client.get("/api/me")).json.teams).toEqual([{ id: o.teamId, name: "Test Team", role: "editor", isDemo: false }]);
    expect(countRows(db, "audit_log", "team_id = ? and action = 'invite.accept'", o.teamId)).toBe(1);
    const list = await o.client.get(`/api/teams/${o.teamId}/invites`);
    expect(list.json.invites[0].status).toBe("accepted");

    // Used: a second use (even by a different signed-in account) is refused.
    const again = await u.client.post("/api/invites/accept", { token });
    expect(again.status).toBe(409);
    expect(again.json.error.message).toMatch(/already been used/);
    const other = await signedUpClient();
    const byOther = await other.client.post("/api/invites/accept", { token });
    expect(byOther.status).toBe(409);
    expect(memberships(o.teamId)).toBe(2);
  });

  it("needs a session (401) and the invited address (403); nothing changes", async () => {
    const o = await userWithTeam();
    const email = uniqueEmail();
    const token = await inviteToken(o.client, o.teamId, email, "viewer");
    const before = memberships(o.teamId);
    const anon = await new Client().post("/api/invites/accept", { token });
    expect(anon.status).toBe(401);
    const wrong = await signedUpClient();
    const r = await wrong.client.post("/api/invites/accept", { token });
    expect(r.status).toBe(403);
    // Issue 12 finding 8: the answer no longer echoes the invited address (it read "This invite was sent to <address>").
    expect(r.json.error).toEqual({
      code: "invite_email_mismatch",
      message: "This invite was sent to a different e-mail address. Sign in with the address the invite was sent to, then open the link again.",
    });
    expect(r.text).not.toContain(email);
    expect(memberships(o.teamId)).toBe(before);
    expect((db.prepare("select accepted_at from invites where team_id = ?").get(o.teamId) as { accepted_at: number | null }).accepted_at).toBeNull();
  });

  it("a forged or malformed token answers 404", async () => {
    const u = await signedUpClient();
    const forged = await u.client.post("/api/invites/accept", { token: Buffer.alloc(32, 7).toString("base64url") });
    expect(forged.status).toBe(404);
    expect(forged.json.error.message).toMatch(/^This invite link is not valid\./);
    const empty = await u.client.post("/api/invites/accept", { token: "" });
    expect(empty.status).toBe(400);
    expect(empty.json.error.fields.token[0]).toBe("The invite token is missing.");
    expect((await u.client.get("/api/me")).json.teams).toEqual([]);
  });

  it("an expired token answers 410 and adds nobody", async () => {
    const o = await userWithTeam();
    const email = uniqueEmail();
    const token = await inviteToken(o.client, o.teamId, email, "editor");
    db.prepare("update invites set expires_at = ? where team_id = ?").run(Date.now() - 1000, o.teamId);
    const u = await signUpAs(email);
    const r = await u.client.post("/api/invites/accept", { token });
    expect(r.status).toBe(410);
    expect(r.json.error).toEqual({
      code: "invite_expired",
      message: "This invite has expired (invites last 7 days). Ask the team's owner to send a new one.",
    });
    expect(memberships(o.teamId)).toBe(1);
  });

  it("a revoked invite answers 409; revoking is owner-only, audited, and once", async () => {
    const o = await userWithTeam();
    const editor = await addMember(o.client, o.teamId, "editor");
    const email = uniqueEmail();
    const r = await o.client.post(`/api/teams/${o.teamId}/invites`, { email, role: "viewer" });
    const { token } = inviteLinkFromOutbox(r.json.mail.outboxId);
    const id = r.json.invite.id;
    const byEditor = await editor.client.del(`/api/teams/${o.teamId}/invites/${id}`);
    expect(byEditor.status).toBe(403);
    const del = await o.client.del(`/api/teams/${o.teamId}/invites/${id}`);
    expect(del.status).toBe(200);
    expect(countRows(db, "audit_log", "team_id = ? and action = 'invite.revoke'", o.teamId)).toBe(1);
    const twice = await o.client.del(`/api/teams/${o.teamId}/invites/${id}`);
    expect(twice.status).toBe(409);
    expect(twice.json.error.message).toBe("This invite was already revoked.");
    const u = await signUpAs(email);
    const acc = await u.client.post("/api/invites/accept", { token });
    expect(acc.status).toBe(409);
    expect(acc.json.error.message).toBe("This invite was withdrawn by the team's owner. Ask them for a new one.");
    expect(memberships(o.teamId)).toBe(2);
    // Another team's owner cannot revoke by id.
    const other = await userWithTeam();
    expect((await other.client.del(`/api/teams/${o.teamId}/invites/${id}`)).status).toBe(404);
    expect((await o.client.del(`/api/teams/${o.teamId}/invites/nosuchinvite0000000`)).status).toBe(404);
  });

  it("a new invite to the same address replaces the earlier link", async () => {
    const o = await userWithTeam();
    const email = uniqueEmail();
    const first = await inviteToken(o.client, o.teamId, email, "viewer");
    const second = await inviteToken(o.client, o.teamId, email, "editor");
    const u = await signUpAs(email);
    expect((await u.client.post("/api/invites/accept", { token: first })).status).toBe(409);
    const ok = await u.client.post("/api/invites/accept", { token: second });
    expect(ok.status).toBe(200);
    expect(ok.json.team.role).toBe("editor");
  });

  it("the invite page is reachable signed out and offers sign-in and sign-up", async () => {
    const o = await userWithTeam("Page Team");
    const email = uniqueEmail();
    const token = await inviteToken(o.client, o.teamId, email, "viewer");
    const page = await new Client().get(`/invite/${token}`);
    expect(page.status).toBe(200);
    expect(page.text).toContain("Page Team");
    expect(page.text).toContain(`/sign-up?next=${encodeURIComponent(`/invite/${token}`)}`);
    const bad = await new Client().get(`/invite/not-a-real-token`);
    expect(bad.text).toContain("This invite link is not valid");
  });
});

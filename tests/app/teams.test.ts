import { afterAll, beforeAll, describe, expect, it } from "vitest";
import type Database from "better-sqlite3";
import { Client, signedUpClient, userWithTeam } from "../helpers/http";
import { countRows, openTestDb } from "../helpers/db-file";
import { addMember } from "../helpers/members";

let db: Database.Database;
beforeAll(() => {
  db = openTestDb();
});
afterAll(() => db.close());

const roleOf = (teamId: string, userId: string) =>
  (db.prepare("select role from memberships where team_id = ? and user_id = ?").get(teamId, userId) as { role: string } | undefined)?.role;
const teamName = (teamId: string) => (db.prepare("select name from teams where id = ?").get(teamId) as { name: string }).name;
const auditCount = (teamId: string, action: string) => countRows(db, "audit_log", "team_id = ? and action = ?", teamId, action);

describe("teams", () => {
  it("POST /api/teams creates a team with the creator as owner, listed in /api/teams and /api/me", async () => {
    const { client, userId } = await signedUpClient();
    const r = await client.post("/api/teams", { name: "  Wiring Group  " });
    expect(r.status).toBe(201);
    expect(r.json.team).toEqual({ id: expect.any(String), name: "Wiring Group", role: "owner", isDemo: false });
    const id = r.json.team.id;
    expect(roleOf(id, userId)).toBe("owner");
    expect(auditCount(id, "team.create")).toBe(1);
    expect((await client.get("/api/teams")).json.teams).toEqual([{ id, name: "Wiring Group", role: "owner", isDemo: false }]);
    expect((await client.get("/api/me")).json.teams).toEqual([{ id, name: "Wiring Group", role: "owner", isDemo: false }]);
    const one = await client.get(`/api/teams/${id}`);
    expect(one.status).toBe(200);
    expect(one.json.team).toEqual({ id, name: "Wiring Group", isDemo: false, role: "owner" });
  });

  it("POST /api/teams without a session answers 401 and creates nothing", async () => {
    const before = countRows(db, "teams");
    const r = await new Client().post("/api/teams", { name: "Nope" });
    expect(r.status).toBe(401);
    expect(r.json.error.message).toBe("Sign in first.");
    expect(countRows(db, "teams")).toBe(before);
  });

  for (const [what, body, msg] of [
    ["an empty name", { name: "   " }, /Enter a team name/],
    ["a name over 80 characters", { name: "n".repeat(81) }, /at most 80/],
    ["a missing name", {}, /Enter a team name/],
  ] as const) {
    it(`POST /api/teams rejects ${what} with 400, storing nothing`, async () => {
      const { client } = await signedUpClient();
      const before = [countRows(db, "teams"), countRows(db, "memberships")];
      const r = await client.post("/api/teams", body);
      expect(r.status).toBe(400);
      expect(r.json.error.fields.name[0]).toMatch(msg);
      expect([countRows(db, "teams"), countRows(db, "memberships")]).toEqual(before);
    });
  }

  it("POST /api/teams: 415 wrong content type, 413 oversized, 403 bad Origin — nothing stored", async () => {
    const { client } = await signedUpClient();
    const before = countRows(db, "teams");
    const r415 = await client.req("POST", "/api/teams", undefined, { headers: { "content-type": "text/plain" }, raw: '{"name":"x"}' });
    expect(r415.status).toBe(415);
    expect(r415.json.error.message).toBe("Send the body as application/json.");
    const r413 = await client.post("/api/teams", { name: "x", pad: "y".repeat(20_000) });
    expect(r413.status).toBe(413);
    expect(r413.json.error.code).toBe("payload_too_large");
    const r403 = await client.req("POST", "/api/teams", { name: "x" }, { headers: { origin: "https://attacker.example" } });
    expect(r403.status).toBe(403);
    expect(r403.json.error.code).toBe("bad_origin");
    expect(countRows(db, "teams")).toBe(before);
  });

  it("GET/PATCH /api/teams/[teamId] of another team answer 404, the same as an unknown id", async () => {
    const a = await userWithTeam("Team A");
    const b = await userWithTeam("Team B");
    const cross = await a.client.get(`/api/teams/${b.teamId}`);
    const unknown = await a.client.get(`/api/teams/doesnotexist0000000`);
    expect(cross.status).toBe(404);
    expect(cross.json).toEqual({ error: { code: "not_found", message: "Team not found." } });
    expect(unknown.json).toEqual(cross.json);
    const patch = await a.client.patch(`/api/teams/${b.teamId}`, { name: "Hijacked" });
    expect(patch.status).toBe(404);
    expect(teamName(b.teamId)).toBe("Team B");
    expect((await a.client.get(`/api/teams/${b.teamId}/members`)).status).toBe(404);
    expect((await new Client().get(`/api/teams/${b.teamId}`)).status).toBe(401);
  });

  it("PATCH /api/teams/[teamId] renames for owners only", async () => {
    const o = await userWithTeam("Old name");
    const editor = await addMember(o.client, o.teamId, "editor");
    const viewer = await addMember(o.client, o.teamId, "viewer");
    for (const m of [editor, viewer]) {
      const r = await m.client.patch(`/api/teams/${o.teamId}`, { name: "Renamed by non-owner" });
      expect(r.status).toBe(403);
      expect(r.json.error.message).toBe("Your role in this team does not allow this.");
    }
    expect(teamName(o.teamId)).toBe("Old name");
    const bad = await o.client.patch(`/api/teams/${o.teamId}`, { name: "" });
    expect(bad.status).toBe(400);
    expect(teamName(o.teamId)).toBe("Old name");
    const ok = await o.client.patch(`/api/teams/${o.teamId}`, { name: "New name" });
    expect(ok.status).toBe(200);
    expect(ok.json.team.name).toBe("New name");
    expect(teamName(o.teamId)).toBe("New name");
    expect(auditCount(o.teamId, "team.rename")).toBe(1);
  });
});

describe("members", () => {
  it("GET members: any member sees the list; outsiders get 404", async () => {
    const o = await userWithTeam();
    const viewer = await addMember(o.client, o.teamId, "viewer", "Vera Viewer");
    const r = await viewer.client.get(`/api/teams/${o.teamId}/members`);
    expect(r.status).toBe(200);
    expect(r.json.members.map((m: { role: string }) => m.role)).toEqual(["owner", "viewer"]);
    expect(r.json.members[1]).toEqual({
      userId: viewer.userId,
      email: viewer.email,
      name: "Vera Viewer",
      role: "viewer",
      joinedAt: expect.any(Number),
    });
    expect(r.json.you).toEqual({ userId: viewer.userId, role: "viewer" });
    expect(JSON.stringify(r.json)).not.toMatch(/password|scrypt/);
    const outsider = await signedUpClient();
    expect((await outsider.client.get(`/api/teams/${o.teamId}/members`)).status).toBe(404);
  });

  it("PATCH role: owners change roles (audited); editors and viewers get 403 and nothing changes", async () => {
    const o = await userWithTeam();
    const editor = await addMember(o.client, o.teamId, "editor");
    const viewer = await addMember(o.client, o.teamId, "viewer");
    const byEditor = await editor.client.patch(`/api/teams/${o.teamId}/members/${viewer.userId}`, { role: "owner" });
    expect(byEditor.status).toBe(403);
    expect(byEditor.json.error.code).toBe("forbidden");
    const selfPromote = await viewer.client.patch(`/api/teams/${o.teamId}/members/${viewer.userId}`, { role: "owner" });
    expect(selfPromote.status).toBe(403);
    expect(roleOf(o.teamId, viewer.userId)).toBe("viewer");
    const ok = await o.client.patch(`/api/teams/${o.teamId}/members/${viewer.userId}`, { role: "editor" });
    expect(ok.status).toBe(200);
    expect(ok.json.member.role).toBe("editor");
    expect(roleOf(o.teamId, viewer.userId)).toBe("editor");
    expect(auditCount(o.teamId, "member.role_change")).toBe(1);
  });

  it("PATCH role: an invalid role is 400; an unknown member or another team's member is 404", async () => {
    const o = await userWithTeam();
    const editor = await addMember(o.client, o.teamId, "editor");
    const bad = await o.client.patch(`/api/teams/${o.teamId}/members/${editor.userId}`, { role: "admin" });
    expect(bad.status).toBe(400);
    expect(bad.json.error.fields.role[0]).toBe("Choose owner, editor or viewer.");
    expect(roleOf(o.teamId, editor.userId)).toBe("editor");
    const other = await userWithTeam();
    const foreign = await o.client.patch(`/api/teams/${o.teamId}/members/${other.userId}`, { role: "viewer" });
    expect(foreign.status).toBe(404);
    expect(foreign.json.error.message).toBe("Member not found.");
    const crossTeam = await o.client.patch(`/api/teams/${other.teamId}/members/${other.userId}`, { role: "viewer" });
    expect(crossTeam.status).toBe(404);
    expect(crossTeam.json.error.message).toBe("Team not found.");
    expect(roleOf(other.teamId, other.userId)).toBe("owner");
  });

  it("the last owner cannot be demoted; with a second owner it works", async () => {
    const o = await userWithTeam();
    const r = await o.client.patch(`/api/teams/${o.teamId}/members/${o.userId}`, { role: "editor" });
    expect(r.status).toBe(409);
    expect(r.json.error.message).toBe("A team needs at least one owner. Make another member an owner first.");
    expect(roleOf(o.teamId, o.userId)).toBe("owner");
    expect(auditCount(o.teamId, "member.role_change")).toBe(0);
    const second = await addMember(o.client, o.teamId, "owner");
    const ok = await o.client.patch(`/api/teams/${o.teamId}/members/${o.userId}`, { role: "editor" });
    expect(ok.status).toBe(200);
    expect(roleOf(o.teamId, o.userId)).toBe("editor");
    // Now `second` is the last owner.
    const again = await second.client.patch(`/api/teams/${o.teamId}/members/${second.userId}`, { role: "viewer" });
    expect(again.status).toBe(409);
    expect(roleOf(o.teamId, second.userId)).toBe("owner");
  });

  it("DELETE member: owners remove others, members leave, non-owners cannot remove others, the last owner cannot leave", async () => {
    const o = await userWithTeam();
    const editor = await addMember(o.client, o.teamId, "editor");
    const viewer = await addMember(o.client, o.teamId, "viewer");
    const byEditor = await editor.client.del(`/api/teams/${o.teamId}/members/${viewer.userId}`);
    expect(byEditor.status).toBe(403);
    expect(byEditor.json.error.message).toBe("Only owners can remove other members.");
    expect(roleOf(o.teamId, viewer.userId)).toBe("viewer");

    const lastOwner = await o.client.del(`/api/teams/${o.teamId}/members/${o.userId}`);
    expect(lastOwner.status).toBe(409);
    expect(lastOwner.json.error.message).toMatch(/last owner/);
    expect(roleOf(o.teamId, o.userId)).toBe("owner");

    const leave = await viewer.client.del(`/api/teams/${o.teamId}/members/${viewer.userId}`);
    expect(leave.status).toBe(200);
    expect(roleOf(o.teamId, viewer.userId)).toBeUndefined();
    expect(auditCount(o.teamId, "member.leave")).toBe(1);
    expect((await viewer.client.get(`/api/teams/${o.teamId}`)).status).toBe(404);

    const remove = await o.client.del(`/api/teams/${o.teamId}/members/${editor.userId}`);
    expect(remove.status).toBe(200);
    expect(roleOf(o.teamId, editor.userId)).toBeUndefined();
    expect(auditCount(o.teamId, "member.remove")).toBe(1);
    expect((await o.client.del(`/api/teams/${o.teamId}/members/${editor.userId}`)).status).toBe(404);
  });

  it("DELETE member without a session is 401, from another site is 403", async () => {
    const o = await userWithTeam();
    const viewer = await addMember(o.client, o.teamId, "viewer");
    expect((await new Client().del(`/api/teams/${o.teamId}/members/${viewer.userId}`)).status).toBe(401);
    const r = await o.client.req("DELETE", `/api/teams/${o.teamId}/members/${viewer.userId}`, undefined, {
      headers: { origin: "https://evil.example" },
    });
    expect(r.status).toBe(403);
    expect(roleOf(o.teamId, viewer.userId)).toBe("viewer");
  });
});

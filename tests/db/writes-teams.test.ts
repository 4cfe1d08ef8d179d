import { afterAll, beforeAll, describe, expect, it } from "vitest";
import type { Knex } from "knex";
import { ConflictError, NotFoundError } from "@/db/errors";
import { getInvite, inviteStatus } from "@/db/queries/invites";
import { getMember, getTeam, listMembers } from "@/db/queries/teams";
import { getUserByEmail } from "@/db/queries/users";
import { acceptInvite, addMember, changeMemberRole, createInvite, createTeam, removeMember, renameTeam, revokeInvite } from "@/db/writes/teams";
import { EMAIL_TAKEN, signUpUser } from "@/db/writes/users";
import { auditRows, counts, newUser, ownerWithTeam, refuseInsert, tempDb } from "../helpers/temp-db";

let db: Knex;
let close: () => Promise<void>;
beforeAll(async () => ({ db, close } = await tempDb("writes-teams")));
afterAll(async () => close());

const TABLES = ["users", "teams", "memberships", "invites", "audit_log"] as const;
const DAY = 24 * 60 * 60 * 1000;

describe("db/writes/users", () => {
  it("sign-up stores the user with a user.sign_up row; a taken address is a ConflictError on email and stores nothing", async () => {
    const u = await signUpUser(db, { email: "ada@example.test", name: "Ada", passwordHash: "h" });
    expect(await getUserByEmail(db, "ada@example.test")).toMatchObject({ id: u.id, name: "Ada", passwordHash: "h" });
    expect(await auditRows(db, { entity_id: u.id })).toEqual([
      { action: "user.sign_up", entity_type: "user", entity_id: u.id, user_id: u.id, team_id: null, detail: null },
    ]);
    const before = await counts(db, TABLES);
    const err = await signUpUser(db, { email: "ada@example.test", name: "Other", passwordHash: "h" }).catch((e: unknown) => e);
    expect(err).toBeInstanceOf(ConflictError);
    expect((err as ConflictError).fields).toEqual({ email: [EMAIL_TAKEN] });
    expect(await counts(db, TABLES)).toEqual(before);
  });

  it("a refused audit insert leaves no user behind", async () => {
    const before = await counts(db, TABLES);
    const undo = await refuseInsert(db, "audit_log", "new.action = 'user.sign_up'");
    try {
      await expect(signUpUser(db, { email: "gone@example.test", name: "Gone", passwordHash: "h" })).rejects.toThrow(/refused by the test/);
    } finally {
      await undo();
    }
    expect(await counts(db, TABLES)).toEqual(before);
  });
});

describe("db/writes/teams: team and members", () => {
  it("create makes the creator owner with team.create; rename writes team.rename", async () => {
    const u = await newUser(db, "Founder");
    const team = await createTeam(db, { name: "Kestrel", ownerId: u.userId });
    expect((await listMembers(db, team.id)).map((m) => [m.userId, m.role])).toEqual([[u.userId, "owner"]]);
    expect(await renameTeam(db, { teamId: team.id, userId: u.userId, name: "Kestrel Labs" })).toMatchObject({
      id: team.id,
      name: "Kestrel Labs",
    });
    expect((await getTeam(db, team.id))!.name).toBe("Kestrel Labs");
    expect((await auditRows(db, { team_id: team.id })).map((r) => [r.action, r.detail])).toEqual([
      ["team.create", { name: "Kestrel" }],
      ["team.rename", { from: "Kestrel", to: "Kestrel Labs" }],
    ]);
    await expect(renameTeam(db, { teamId: "no-team", userId: u.userId, name: "X" })).rejects.toBeInstanceOf(NotFoundError);
  });

  it("create: a refused audit insert leaves neither the team nor the owner's membership", async () => {
    const u = await newUser(db);
    const before = await counts(db, TABLES);
    const undo = await refuseInsert(db, "audit_log", "new.action = 'team.create'");
    try {
      await expect(createTeam(db, { name: "Doomed", ownerId: u.userId })).rejects.toThrow(/refused by the test/);
    } finally {
      await undo();
    }
    expect(await counts(db, TABLES)).toEqual(before);
  });

  it("role change: audited; the same role is a no-op; the last owner cannot be demoted (ConflictError, nothing written)", async () => {
    const o = await ownerWithTeam(db);
    const m = await newUser(db);
    await addMember(db, { teamId: o.teamId, userId: m.userId, role: "viewer", actorId: o.userId });
    expect(await changeMemberRole(db, { teamId: o.teamId, actorId: o.userId, userId: m.userId, role: "editor" })).toMatchObject({
      userId: m.userId,
      role: "editor",
    });
    expect(await changeMemberRole(db, { teamId: o.teamId, actorId: o.userId, userId: m.userId, role: "editor" })).toMatchObject({
      role: "editor",
    });
    const before = await counts(db, TABLES);
    await expect(changeMemberRole(db, { teamId: o.teamId, actorId: o.userId, userId: o.userId, role: "viewer" })).rejects.toThrow(
      "A team needs at least one owner. Make another member an owner first.",
    );
    await expect(changeMemberRole(db, { teamId: o.teamId, actorId: o.userId, userId: "nobody", role: "viewer" })).rejects.toThrow("Member not found.");
    expect(await counts(db, TABLES)).toEqual(before);
    expect((await getMember(db, o.teamId, o.userId))!.role).toBe("owner");
    expect((await auditRows(db, { team_id: o.teamId, entity_id: m.userId })).map((r) => [r.action, r.detail])).toEqual([
      ["member.add", { role: "viewer" }],
      ["member.role_change", { from: "viewer", to: "editor" }],
    ]);
  });

  it("role change: a refused audit insert rolls the role back", async () => {
    const o = await ownerWithTeam(db);
    const m = await newUser(db);
    await addMember(db, { teamId: o.teamId, userId: m.userId, role: "viewer", actorId: o.userId });
    const undo = await refuseInsert(db, "audit_log", "new.action = 'member.role_change'");
    try {
      await expect(changeMemberRole(db, { teamId: o.teamId, actorId: o.userId, userId: m.userId, role: "owner" })).rejects.toThrow(/refused by the test/);
    } finally {
      await undo();
    }
    expect((await getMember(db, o.teamId, m.userId))!.role).toBe("viewer");
  });

  it("remove and leave: member.remove / member.leave; the last owner can do neither", async () => {
    const o = await ownerWithTeam(db);
    const [a, b] = [await newUser(db), await newUser(db)];
    await addMember(db, { teamId: o.teamId, userId: a.userId, role: "editor", actorId: o.userId });
    await addMember(db, { teamId: o.teamId, userId: b.userId, role: "viewer", actorId: o.userId });
    await removeMember(db, { teamId: o.teamId, actorId: o.userId, userId: a.userId });
    await removeMember(db, { teamId: o.teamId, actorId: b.userId, userId: b.userId });
    await expect(removeMember(db, { teamId: o.teamId, actorId: o.userId, userId: o.userId })).rejects.toThrow(
      "You are the team's last owner: make another member an owner before you leave.",
    );
    await expect(removeMember(db, { teamId: o.teamId, actorId: o.userId, userId: a.userId })).rejects.toBeInstanceOf(NotFoundError);
    expect((await listMembers(db, o.teamId)).map((m) => m.userId)).toEqual([o.userId]);
    const rows = (await auditRows(db, { team_id: o.teamId })).filter((r) => r.action === "member.remove" || r.action === "member.leave");
    expect(rows.map((r) => [r.action, r.entity_id, r.user_id])).toEqual([
      ["member.remove", a.userId, o.userId],
      ["member.leave", b.userId, b.userId],
    ]);
  });
});

describe("db/writes/teams: invites", () => {
  it("create revokes the earlier open invite to the address; revoke and accept are audited; a member's address is refused", async () => {
    const o = await ownerWithTeam(db);
    const guest = await newUser(db, "Guest");
    const now = Date.now();
    const p = { teamId: o.teamId, invitedBy: o.userId, email: guest.email, role: "editor" as const, expiresAt: now + 7 * DAY, now };
    const first = await createInvite(db, { ...p, tokenHash: "hash-1" });
    expect(first.team.id).toBe(o.teamId);
    const second = await createInvite(db, { ...p, tokenHash: "hash-2" });
    expect(inviteStatus((await getInvite(db, o.teamId, first.invite.id))!)).toBe("revoked");
    await expect(revokeInvite(db, { teamId: o.teamId, userId: o.userId, inviteId: first.invite.id })).rejects.toThrow("This invite was already revoked.");
    expect(await acceptInvite(db, { inviteId: second.invite.id, userId: guest.userId })).toEqual({
      teamId: o.teamId,
      teamName: first.team.name,
      role: "editor",
    });
    expect((await getMember(db, o.teamId, guest.userId))!.role).toBe("editor");
    await expect(acceptInvite(db, { inviteId: second.invite.id, userId: guest.userId })).rejects.toBeInstanceOf(ConflictError);
    await expect(revokeInvite(db, { teamId: o.teamId, userId: o.userId, inviteId: second.invite.id })).rejects.toThrow(
      "This invite was already accepted; remove the member instead.",
    );
    const before = await counts(db, TABLES);
    await expect(createInvite(db, { ...p, tokenHash: "hash-3" })).rejects.toMatchObject({
      fields: { email: [`${guest.email} is already a member of this team.`] },
    });
    expect(await counts(db, TABLES)).toEqual(before);
    const rows = (await auditRows(db, { team_id: o.teamId })).filter((r) => r.action.startsWith("invite."));
    expect(rows.map((r) => [r.action, r.entity_id])).toEqual([
      ["invite.create", first.invite.id],
      ["invite.create", second.invite.id],
      ["invite.accept", second.invite.id],
    ]);
    expect(rows[1]!.detail).toEqual({ email: guest.email, role: "editor", replaced: 1 });
  });

  it("accept: a refused audit insert leaves the invite open and no membership; an expired invite is a ConflictError", async () => {
    const o = await ownerWithTeam(db);
    const guest = await newUser(db, "Guest");
    const now = Date.now();
    const { invite } = await createInvite(db, {
      teamId: o.teamId,
      invitedBy: o.userId,
      email: guest.email,
      role: "viewer",
      tokenHash: `h-${now}`,
      expiresAt: now + DAY,
      now,
    });
    const undo = await refuseInsert(db, "audit_log", "new.action = 'invite.accept'");
    try {
      await expect(acceptInvite(db, { inviteId: invite.id, userId: guest.userId })).rejects.toThrow(/refused by the test/);
    } finally {
      await undo();
    }
    expect(inviteStatus((await getInvite(db, o.teamId, invite.id))!)).toBe("pending");
    expect(await getMember(db, o.teamId, guest.userId)).toBeUndefined();
    await db("invites")
      .where({ id: invite.id })
      .update({ expires_at: now - 1 });
    await expect(acceptInvite(db, { inviteId: invite.id, userId: guest.userId })).rejects.toBeInstanceOf(ConflictError);
    expect(await getMember(db, o.teamId, guest.userId)).toBeUndefined();
    // an expired invite can still be revoked
    await revokeInvite(db, { teamId: o.teamId, userId: o.userId, inviteId: invite.id });
    expect(inviteStatus((await getInvite(db, o.teamId, invite.id))!)).toBe("revoked");
  });
});

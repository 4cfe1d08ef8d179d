import "server-only";
import type { Knex } from "knex";
import type { Role } from "@/lib/access";
import { writeAudit } from "@/db/audit";
import { ConflictError, NotFoundError, fieldError } from "@/db/errors";
import { newId } from "@/db/ids";
import { inviteStatus, toInvite, type Invite, type InviteRow } from "@/db/queries/invites";
import { countOwners, getMember, getTeam, type Member, type Team } from "@/db/queries/teams";

/**
 * Every write of the team aggregate: the team, its memberships and its invites. Each function is one
 * transaction that checks the rules that depend on stored data (the last owner, an invite's state,
 * an existing membership) and writes its audit row; on any error nothing is stored.
 */

type Conn = Knex | Knex.Transaction;

export const LAST_OWNER = "A team needs at least one owner. Make another member an owner first.";
const LAST_OWNER_LEAVING = "You are the team's last owner: make another member an owner before you leave.";
const INVITE_USED = "This invite has already been used. Ask the team's owner for a new one if you still need access.";

async function insertMembership(trx: Knex.Transaction, m: { teamId: string; userId: string; role: Role; now?: number }): Promise<void> {
  await trx("memberships").insert({ team_id: m.teamId, user_id: m.userId, role: m.role, created_at: m.now ?? Date.now() });
}

// ---------------------------------------------------------------------------------------------
// Team

/** A team with its creator as owner and a "team.create" audit row. */
export async function createTeam(conn: Conn, p: { name: string; ownerId: string; isDemo?: boolean; detail?: Record<string, unknown> }): Promise<Team> {
  return conn.transaction(async (trx) => {
    const now = Date.now();
    const team: Team = { id: newId(), name: p.name, isDemo: !!p.isDemo, createdAt: now };
    await trx("teams").insert({ id: team.id, name: team.name, is_demo: team.isDemo ? 1 : 0, created_by: p.ownerId, created_at: now });
    await insertMembership(trx, { teamId: team.id, userId: p.ownerId, role: "owner", now });
    await writeAudit(trx, {
      teamId: team.id,
      userId: p.ownerId,
      action: "team.create",
      entityType: "team",
      entityId: team.id,
      detail: { name: team.name, ...p.detail },
      at: now,
    });
    return team;
  });
}

export async function renameTeam(conn: Conn, p: { teamId: string; userId: string; name: string }): Promise<Team> {
  return conn.transaction(async (trx) => {
    const before = await getTeam(trx, p.teamId);
    if (!before) throw new NotFoundError("Team");
    await trx("teams").where({ id: p.teamId }).update({ name: p.name });
    await writeAudit(trx, {
      teamId: p.teamId,
      userId: p.userId,
      action: "team.rename",
      entityType: "team",
      entityId: p.teamId,
      detail: { from: before.name, to: p.name },
    });
    return { ...before, name: p.name };
  });
}

// ---------------------------------------------------------------------------------------------
// Members

/** Add a member directly (the demo seeder; people join through invites): a "member.add" audit row by `actorId`. */
export async function addMember(
  conn: Conn,
  p: { teamId: string; userId: string; role: Role; actorId: string; detail?: Record<string, unknown> },
): Promise<void> {
  await conn.transaction(async (trx) => {
    if (await trx("memberships").where({ team_id: p.teamId, user_id: p.userId }).first("role"))
      throw new ConflictError("This user is already a member of the team.");
    await insertMembership(trx, p);
    await writeAudit(trx, {
      teamId: p.teamId,
      userId: p.actorId,
      action: "member.add",
      entityType: "user",
      entityId: p.userId,
      detail: { role: p.role, ...p.detail },
    });
  });
}

/** Change a member's role; the last owner cannot be demoted. Returns the member (unchanged, and not audited, when the role is the same). */
export async function changeMemberRole(conn: Conn, p: { teamId: string; actorId: string; userId: string; role: Role }): Promise<Member> {
  return conn.transaction(async (trx) => {
    const m = await getMember(trx, p.teamId, p.userId);
    if (!m) throw new NotFoundError("Member");
    if (m.role === p.role) return m;
    if (m.role === "owner" && (await countOwners(trx, p.teamId)) <= 1) throw new ConflictError(LAST_OWNER);
    await trx("memberships").where({ team_id: p.teamId, user_id: p.userId }).update({ role: p.role });
    await writeAudit(trx, {
      teamId: p.teamId,
      userId: p.actorId,
      action: "member.role_change",
      entityType: "user",
      entityId: p.userId,
      detail: { from: m.role, to: p.role },
    });
    return { ...m, role: p.role };
  });
}

/** Remove a member ("member.remove"), or leave when `actorId` is the member ("member.leave"); never the last owner. */
export async function removeMember(conn: Conn, p: { teamId: string; actorId: string; userId: string }): Promise<void> {
  const self = p.actorId === p.userId;
  await conn.transaction(async (trx) => {
    const m = await getMember(trx, p.teamId, p.userId);
    if (!m) throw new NotFoundError("Member");
    if (m.role === "owner" && (await countOwners(trx, p.teamId)) <= 1) throw new ConflictError(self ? LAST_OWNER_LEAVING : LAST_OWNER);
    await trx("memberships").where({ team_id: p.teamId, user_id: p.userId }).delete();
    await writeAudit(trx, {
      teamId: p.teamId,
      userId: p.actorId,
      action: self ? "member.leave" : "member.remove",
      entityType: "user",
      entityId: p.userId,
      detail: { role: m.role, email: m.email },
    });
  });
}

// ---------------------------------------------------------------------------------------------
// Invites (the token is made by the caller; only its hash is stored)

/**
 * A new invite to `email` ("invite.create"). One open invite per address: earlier open ones are revoked.
 * An address that is already a member is a ConflictError on `email`. Returns the invite and its team.
 */
export async function createInvite(
  conn: Conn,
  p: { teamId: string; invitedBy: string; email: string; role: Role; tokenHash: string; expiresAt: number; now?: number },
): Promise<{ invite: Invite; team: Team }> {
  const now = p.now ?? Date.now();
  return conn.transaction(async (trx) => {
    const team = await getTeam(trx, p.teamId);
    if (!team) throw new NotFoundError("Team");
    const member = await trx("memberships as m")
      .join("users as u", "u.id", "m.user_id")
      .where({ "m.team_id": p.teamId, "u.email": p.email })
      .first("m.user_id");
    if (member) {
      const msg = `${p.email} is already a member of this team.`;
      throw new ConflictError(msg, fieldError("email", msg));
    }
    const replaced = await trx("invites")
      .where({ team_id: p.teamId, email: p.email })
      .whereNull("accepted_at")
      .whereNull("revoked_at")
      .update({ revoked_at: now });
    const row: InviteRow & { token_hash: string } = {
      id: newId(),
      team_id: p.teamId,
      email: p.email,
      role: p.role,
      token_hash: p.tokenHash,
      invited_by: p.invitedBy,
      created_at: now,
      expires_at: p.expiresAt,
      accepted_at: null,
      accepted_by: null,
      revoked_at: null,
    };
    await trx("invites").insert(row);
    const invite = toInvite(row);
    await writeAudit(trx, {
      teamId: p.teamId,
      userId: p.invitedBy,
      action: "invite.create",
      entityType: "invite",
      entityId: invite.id,
      detail: { email: invite.email, role: invite.role, replaced },
      at: now,
    });
    return { invite, team };
  });
}

/** Revoke an open (or expired) invite ("invite.revoke"); an accepted or already revoked one is a ConflictError. */
export async function revokeInvite(conn: Conn, p: { teamId: string; userId: string; inviteId: string }): Promise<void> {
  await conn.transaction(async (trx) => {
    const row: InviteRow | undefined = await trx("invites").where({ team_id: p.teamId, id: p.inviteId }).first();
    if (!row) throw new NotFoundError("Invite");
    const invite = toInvite(row);
    const status = inviteStatus(invite);
    if (status === "accepted") throw new ConflictError("This invite was already accepted; remove the member instead.");
    if (status === "revoked") throw new ConflictError("This invite was already revoked.");
    await trx("invites").where({ id: p.inviteId }).whereNull("accepted_at").whereNull("revoked_at").update({ revoked_at: Date.now() });
    await writeAudit(trx, {
      teamId: p.teamId,
      userId: p.userId,
      action: "invite.revoke",
      entityType: "invite",
      entityId: p.inviteId,
      detail: { email: invite.email },
    });
  });
}

/**
 * Accept an invite for `userId` ("invite.accept"): marks it used and adds the membership. The caller has
 * checked the invite's state and address; here an invite used, revoked or expired meanwhile, or a
 * membership that exists already, is a ConflictError.
 */
export async function acceptInvite(conn: Conn, p: { inviteId: string; userId: string }): Promise<{ teamId: string; teamName: string; role: Role }> {
  return conn.transaction(async (trx) => {
    const now = Date.now();
    const row: InviteRow | undefined = await trx("invites").where({ id: p.inviteId }).first();
    if (!row) throw new NotFoundError("Invite");
    const n = await trx("invites")
      .where({ id: p.inviteId })
      .whereNull("accepted_at")
      .whereNull("revoked_at")
      .andWhere("expires_at", ">", now)
      .update({ accepted_at: now, accepted_by: p.userId });
    if (n !== 1) throw new ConflictError(INVITE_USED);
    if (await trx("memberships").where({ team_id: row.team_id, user_id: p.userId }).first("role"))
      throw new ConflictError("You are already a member of this team.");
    await insertMembership(trx, { teamId: row.team_id, userId: p.userId, role: row.role, now });
    // The invite's link was mailed to this address and only that address accepts it: that proves the address,
    // as a verification link would.
    const verified = await trx("users").where({ id: p.userId, email: row.email }).whereNull("email_verified_at").update({ email_verified_at: now });
    await writeAudit(trx, {
      teamId: row.team_id,
      userId: p.userId,
      action: "invite.accept",
      entityType: "invite",
      entityId: p.inviteId,
      detail: { role: row.role, ...(verified ? { emailVerified: true } : {}) },
      at: now,
    });
    const team = await getTeam(trx, row.team_id);
    return { teamId: row.team_id, teamName: team?.name ?? "", role: row.role };
  });
}

import "server-only";
import type { Knex } from "knex";
import { newId } from "@/lib/ids";
import type { Role } from "@/lib/access";

type Q = Knex | Knex.Transaction;

export interface Invite {
  id: string;
  teamId: string;
  email: string;
  role: Role;
  invitedBy: string | null;
  createdAt: number;
  expiresAt: number;
  acceptedAt: number | null;
  acceptedBy: string | null;
  revokedAt: number | null;
}

type InviteRow = {
  id: string;
  team_id: string;
  email: string;
  role: Role;
  invited_by: string | null;
  created_at: number;
  expires_at: number;
  accepted_at: number | null;
  accepted_by: string | null;
  revoked_at: number | null;
};

const COLUMNS = ["id", "team_id", "email", "role", "invited_by", "created_at", "expires_at", "accepted_at", "accepted_by", "revoked_at"];

function toInvite(r: InviteRow): Invite {
  return {
    id: r.id,
    teamId: r.team_id,
    email: r.email,
    role: r.role,
    invitedBy: r.invited_by,
    createdAt: r.created_at,
    expiresAt: r.expires_at,
    acceptedAt: r.accepted_at,
    acceptedBy: r.accepted_by,
    revokedAt: r.revoked_at,
  };
}

export async function insertInvite(q: Q, i: { teamId: string; email: string; role: Role; tokenHash: string; invitedBy: string; expiresAt: number; now?: number }): Promise<Invite> {
  const row: InviteRow & { token_hash: string } = {
    id: newId(),
    team_id: i.teamId,
    email: i.email,
    role: i.role,
    token_hash: i.tokenHash,
    invited_by: i.invitedBy,
    created_at: i.now ?? Date.now(),
    expires_at: i.expiresAt,
    accepted_at: null,
    accepted_by: null,
    revoked_at: null,
  };
  await q("invites").insert(row);
  return toInvite(row);
}

/** Invites of a team, newest first (the last 200). */
export async function listInvites(q: Q, teamId: string): Promise<Invite[]> {
  const rows = await q("invites").where({ team_id: teamId }).orderBy("created_at", "desc").limit(200).select(COLUMNS);
  return rows.map(toInvite);
}

export async function getInvite(q: Q, teamId: string, inviteId: string): Promise<Invite | undefined> {
  const row = await q("invites").where({ team_id: teamId, id: inviteId }).first(COLUMNS);
  return row ? toInvite(row) : undefined;
}

export async function getInviteByTokenHash(q: Q, tokenHash: string): Promise<Invite | undefined> {
  const row = await q("invites").where({ token_hash: tokenHash }).first(COLUMNS);
  return row ? toInvite(row) : undefined;
}

/** Revoke every still-open invite of `email` to the team (a new invite replaces them). */
export async function revokeOpenInvitesFor(q: Q, teamId: string, email: string, now = Date.now()): Promise<number> {
  return q("invites").where({ team_id: teamId, email }).whereNull("accepted_at").whereNull("revoked_at").update({ revoked_at: now });
}

/** Revoke one open invite; false when it was already used or revoked. */
export async function revokeInvite(q: Q, inviteId: string, now = Date.now()): Promise<boolean> {
  const n = await q("invites").where({ id: inviteId }).whereNull("accepted_at").whereNull("revoked_at").update({ revoked_at: now });
  return n === 1;
}

/** Mark an open, unexpired invite accepted; false when someone else got there first. */
export async function markInviteAccepted(q: Q, inviteId: string, userId: string, now = Date.now()): Promise<boolean> {
  const n = await q("invites")
    .where({ id: inviteId })
    .whereNull("accepted_at")
    .whereNull("revoked_at")
    .andWhere("expires_at", ">", now)
    .update({ accepted_at: now, accepted_by: userId });
  return n === 1;
}

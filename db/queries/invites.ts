import "server-only";
import type { Knex } from "knex";
import type { Role } from "@/lib/access";

// Reads of invites and the DTOs they produce. Writes: db/writes/teams.ts (invites belong to the team).

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

export type InviteRow = {
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

export type InviteStatus = "pending" | "accepted" | "revoked" | "expired";

export function inviteStatus(i: Pick<Invite, "acceptedAt" | "revokedAt" | "expiresAt">, now = Date.now()): InviteStatus {
  if (i.acceptedAt !== null) return "accepted";
  if (i.revokedAt !== null) return "revoked";
  if (i.expiresAt <= now) return "expired";
  return "pending";
}

const COLUMNS = ["id", "team_id", "email", "role", "invited_by", "created_at", "expires_at", "accepted_at", "accepted_by", "revoked_at"];

export function toInvite(r: InviteRow): Invite {
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

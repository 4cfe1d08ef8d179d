import "server-only";
import type { Knex } from "knex";
import type { Role } from "@/lib/access";

// Reads of teams and memberships and the DTOs they produce. Writes: db/writes/teams.ts.

type Q = Knex | Knex.Transaction;

export interface Team {
  id: string;
  name: string;
  isDemo: boolean;
  createdAt: number;
}
export interface TeamWithRole extends Team {
  role: Role;
}
export interface Member {
  userId: string;
  email: string;
  name: string;
  role: Role;
  joinedAt: number;
}

type TeamRow = { id: string; name: string; is_demo: number; created_at: number };
const toTeam = (r: TeamRow): Team => ({ id: r.id, name: r.name, isDemo: r.is_demo === 1, createdAt: r.created_at });

export async function getTeam(q: Q, teamId: string): Promise<Team | undefined> {
  const row = await q<TeamRow>("teams").where({ id: teamId }).first("id", "name", "is_demo", "created_at");
  return row ? toTeam(row) : undefined;
}

/** The user's teams with their role, oldest membership first. */
export async function listTeamsOfUser(q: Q, userId: string): Promise<TeamWithRole[]> {
  const rows = await q("memberships as m")
    .join("teams as t", "t.id", "m.team_id")
    .where("m.user_id", userId)
    .orderBy([
      { column: "m.created_at", order: "asc" },
      { column: "t.name", order: "asc" },
    ])
    .select("t.id", "t.name", "t.is_demo", "t.created_at", "m.role");
  return rows.map((r: TeamRow & { role: Role }) => ({ ...toTeam(r), role: r.role }));
}

export async function listMembers(q: Q, teamId: string): Promise<Member[]> {
  const rows = await q("memberships as m")
    .join("users as u", "u.id", "m.user_id")
    .where("m.team_id", teamId)
    .orderByRaw("case m.role when 'owner' then 0 when 'editor' then 1 else 2 end, u.name collate nocase, u.email")
    .select("u.id as user_id", "u.email", "u.name", "m.role", "m.created_at");
  return rows.map((r: { user_id: string; email: string; name: string; role: Role; created_at: number }) => ({
    userId: r.user_id,
    email: r.email,
    name: r.name,
    role: r.role,
    joinedAt: r.created_at,
  }));
}

export async function getMember(q: Q, teamId: string, userId: string): Promise<Member | undefined> {
  const members = await q("memberships as m")
    .join("users as u", "u.id", "m.user_id")
    .where({ "m.team_id": teamId, "m.user_id": userId })
    .select("u.id as user_id", "u.email", "u.name", "m.role", "m.created_at");
  const r = members[0] as { user_id: string; email: string; name: string; role: Role; created_at: number } | undefined;
  return r ? { userId: r.user_id, email: r.email, name: r.name, role: r.role, joinedAt: r.created_at } : undefined;
}

export async function countOwners(q: Q, teamId: string): Promise<number> {
  const row = (await q("memberships").where({ team_id: teamId, role: "owner" }).count({ n: "*" }).first()) as { n: number } | undefined;
  return Number(row?.n ?? 0);
}

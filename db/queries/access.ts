import "server-only";
import type { Knex } from "knex";
import type { Role } from "@/lib/access";

// The reads behind the access check (lib/access.ts): a user's role in a team.

type Q = Knex | Knex.Transaction;

/** The user's role in the team, or undefined when they are not a member (or there is no such team). */
export async function getMembershipRole(q: Q, teamId: string, userId: string): Promise<Role | undefined> {
  const row = (await q("memberships").where({ team_id: teamId, user_id: userId }).first("role")) as { role: Role } | undefined;
  return row?.role;
}

import "server-only";
import { db, ready } from "@/db/client";
import { validateRequest, type AuthUser } from "@/lib/auth";
import { forbidden, notFound, unauthorized } from "@/lib/api";

export type Role = "owner" | "editor" | "viewer";
export const ROLES: readonly Role[] = ["owner", "editor", "viewer"];
const RANK: Record<Role, number> = { viewer: 1, editor: 2, owner: 3 };

export function roleAtLeast(role: Role, min: Role): boolean {
  return RANK[role] >= RANK[min];
}

/** The signed-in user or a 401 ApiError. */
export async function requireApiUser(): Promise<AuthUser> {
  const { user } = await validateRequest();
  if (!user) throw unauthorized();
  return user;
}

export async function getMembershipRole(teamId: string, userId: string): Promise<Role | undefined> {
  await ready();
  const row = await db("memberships").where({ team_id: teamId, user_id: userId }).first("role");
  return row?.role as Role | undefined;
}

export interface TeamAccess {
  user: AuthUser;
  teamId: string;
  role: Role;
}

/**
 * The one access check for team-scoped work (route handlers and server actions alike):
 * no session → 401; not a member (or no such team) → 404, so other teams' ids reveal nothing;
 * role below `min` → 403.
 */
export async function requireTeamRole(teamId: string, min: Role, what = "Team"): Promise<TeamAccess> {
  const user = await requireApiUser();
  const role = await getMembershipRole(teamId, user.id);
  if (!role) throw notFound(what);
  if (!roleAtLeast(role, min)) throw forbidden();
  return { user, teamId, role };
}

/**
 * Access to a resource that belongs to a team: look up its team id with `teamIdOf`
 * (undefined when the row does not exist), then apply requireTeamRole. Missing rows and
 * other teams' rows both answer 404 with the same message.
 */
export async function requireResourceRole(
  teamIdOf: () => Promise<string | undefined>,
  min: Role,
  what: string,
): Promise<TeamAccess> {
  const user = await requireApiUser();
  const teamId = await teamIdOf();
  if (!teamId) throw notFound(what);
  const role = await getMembershipRole(teamId, user.id);
  if (!role) throw notFound(what);
  if (!roleAtLeast(role, min)) throw forbidden();
  return { user, teamId, role };
}

/** Append to the audit log (inside the caller's transaction when one is passed). */
export async function audit(
  entry: { teamId: string | null; userId: string | null; action: string; entityType?: string; entityId?: string; detail?: unknown },
  trx = db,
): Promise<void> {
  await trx("audit_log").insert({
    team_id: entry.teamId,
    user_id: entry.userId,
    action: entry.action,
    entity_type: entry.entityType ?? null,
    entity_id: entry.entityId ?? null,
    detail: entry.detail === undefined ? null : JSON.stringify(entry.detail),
    at: Date.now(),
  });
}

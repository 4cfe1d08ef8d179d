import "server-only";
import { cache } from "react";
import { db, ready } from "@/db/client";
import { getMembershipRole as membershipRole } from "@/db/queries/access";
import { listTeamsOfUser, type TeamWithRole } from "@/db/queries/teams";
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

/** The user's role in the team, or undefined when they are not a member (or there is no such team). */
export async function getMembershipRole(teamId: string, userId: string): Promise<Role | undefined> {
  await ready();
  return membershipRole(db, teamId, userId);
}

/**
 * The user's teams with their role, read once per page render (React `cache`): the shell's team switcher,
 * the membership gate of /teams/[teamId] pages (getTeamContext) and the outbox scope all answer from this
 * one query. Outside a render (route handlers) `cache` does not memoise, so API checks use getMembershipRole.
 */
export const teamsOfUser = cache(async (userId: string): Promise<TeamWithRole[]> => {
  await ready();
  return listTeamsOfUser(db, userId);
});

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
export async function requireResourceRole(teamIdOf: () => Promise<string | undefined>, min: Role, what: string): Promise<TeamAccess> {
  const { resource: _teamOnly, ...access } = await requireResource(
    async () => {
      const teamId = await teamIdOf();
      return teamId ? { teamId } : undefined;
    },
    min,
    what,
  );
  return access;
}

/**
 * requireResourceRole for a handler that needs the row itself: `load` reads it (undefined when it does not
 * exist) and the check uses its `teamId`, so the row is read once. Same answers: 401, then 404 for a missing
 * row or another team's, then 403.
 */
export async function requireResource<T extends { teamId: string }>(
  load: () => Promise<T | undefined>,
  min: Role,
  what: string,
): Promise<TeamAccess & { resource: T }> {
  const user = await requireApiUser();
  const resource = await load();
  if (!resource) throw notFound(what);
  const role = await getMembershipRole(resource.teamId, user.id);
  if (!role) throw notFound(what);
  if (!roleAtLeast(role, min)) throw forbidden();
  return { user, teamId: resource.teamId, role, resource };
}

import "server-only";
import { notFound, redirect } from "next/navigation";
import { cache } from "react";
import { teamsOfUser, type Role } from "@/lib/access";
import { validateRequest, type AuthUser } from "@/lib/auth";

export interface TeamContext {
  user: AuthUser;
  team: { id: string; name: string; isDemo: boolean };
  role: Role;
}

/** The signed-in user or a redirect to /sign-in (pages and layouts; API routes use requireApiUser). */
export async function requirePageUser(next?: string): Promise<AuthUser> {
  const { user } = await validateRequest();
  if (!user) redirect(next ? `/sign-in?next=${encodeURIComponent(next)}` : "/sign-in");
  return user;
}

/**
 * For pages under /teams/[teamId]: signed out → /sign-in; not a member or no such team → notFound()
 * (same answer either way, like the API's 404). Cached per request, so layout and page share one lookup;
 * the team and role come from the request's one teams-of-user read, which the app shell makes anyway.
 */
export const getTeamContext = cache(async (teamId: string): Promise<TeamContext> => {
  const user = await requirePageUser(`/teams/${encodeURIComponent(teamId)}`);
  const team = (await teamsOfUser(user.id)).find((t) => t.id === teamId);
  if (!team) notFound();
  return { user, team: { id: team.id, name: team.name, isDemo: team.isDemo }, role: team.role };
});

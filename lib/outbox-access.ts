import "server-only";
import { teamsOfUser } from "@/lib/access";

/**
 * Who may read the outbox page: everyone signed in outside production (all mail), and in production
 * only owners of a demo team (that team's mail). null = no access. Answers from the request's one
 * teams-of-user read (the shell asks on every page).
 */
export async function outboxScope(userId: string): Promise<{ teamIds?: string[] } | null> {
  if (process.env.NODE_ENV !== "production") return {};
  const teamIds = (await teamsOfUser(userId)).filter((t) => t.role === "owner" && t.isDemo).map((t) => t.id);
  return teamIds.length ? { teamIds } : null;
}

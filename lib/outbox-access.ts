import "server-only";
import { db } from "@/db/client";
import { listOwnedDemoTeamIds } from "@/db/queries/teams";

/**
 * Who may read the outbox page: everyone signed in outside production (all mail), and in production
 * only owners of a demo team (that team's mail). null = no access.
 */
export async function outboxScope(userId: string): Promise<{ teamIds?: string[] } | null> {
  if (process.env.NODE_ENV !== "production") return {};
  const teamIds = await listOwnedDemoTeamIds(db, userId);
  return teamIds.length ? { teamIds } : null;
}

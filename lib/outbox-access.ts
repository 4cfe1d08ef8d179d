import "server-only";
import { teamsOfUser } from "@/lib/access";
import { outboxEnabled } from "@/lib/mail/rules";

/**
 * What the signed-in user may read on the outbox page: the mail of every team they own, and every message they
 * caused themselves (their account's confirmation links, the reports they sent). null = no page. Answers from the
 * request's one teams-of-user read (the shell asks on every page).
 */
export async function outboxScope(userId: string): Promise<{ teamIds: string[]; userId: string } | null> {
  if (!outboxEnabled(process.env)) return null;
  const teamIds = (await teamsOfUser(userId)).filter((t) => t.role === "owner").map((t) => t.id);
  return { teamIds, userId };
}

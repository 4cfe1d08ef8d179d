import type { ReactNode } from "react";
import { getTeamContext } from "@/lib/team-context";

// Membership gate for every page under /teams/[teamId]; pages call getTeamContext too (cached per request).
export default async function TeamLayout({ children, params }: { children: ReactNode; params: Promise<{ teamId: string }> }) {
  const { teamId } = await params;
  await getTeamContext(teamId);
  return children;
}

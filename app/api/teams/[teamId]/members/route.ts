import { db } from "@/db/client";
import { listMembers } from "@/db/queries/teams";
import { requireTeamRole } from "@/lib/access";
import { apiRoute } from "@/lib/api";

export const GET = apiRoute<{ teamId: string }>(async (_req, { teamId }) => {
  const a = await requireTeamRole(teamId, "viewer");
  const members = await listMembers(db, teamId);
  return Response.json({ members, you: { userId: a.user.id, role: a.role } });
});

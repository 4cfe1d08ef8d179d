import { db } from "@/db/client";
import { getTeam } from "@/db/queries/teams";
import { renameTeam } from "@/db/writes/teams";
import { requireTeamRole } from "@/lib/access";
import { apiRoute, notFound, readJson } from "@/lib/api";
import { teamSchema } from "@/lib/validation/team";

type P = { teamId: string };

export const GET = apiRoute<P>(async (_req, { teamId }) => {
  const a = await requireTeamRole(teamId, "viewer");
  const team = await getTeam(db, teamId);
  if (!team) throw notFound("Team");
  return Response.json({ team: { id: team.id, name: team.name, isDemo: team.isDemo, role: a.role } });
});

export const PATCH = apiRoute<P>(async (req, { teamId }) => {
  const a = await requireTeamRole(teamId, "owner");
  const input = await readJson(req, teamSchema, 16 * 1024);
  const team = await renameTeam(db, { teamId, userId: a.user.id, name: input.name });
  return Response.json({ team: { id: team.id, name: team.name, isDemo: team.isDemo, role: a.role } });
});

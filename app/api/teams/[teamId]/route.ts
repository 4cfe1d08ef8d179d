import { db } from "@/db/client";
import { getTeam, renameTeam } from "@/db/queries/teams";
import { audit, requireTeamRole } from "@/lib/access";
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
  const team = await db.transaction(async (trx) => {
    const before = await getTeam(trx, teamId);
    if (!before) throw notFound("Team");
    await renameTeam(trx, teamId, input.name);
    await audit({ teamId, userId: a.user.id, action: "team.rename", entityType: "team", entityId: teamId, detail: { from: before.name, to: input.name } }, trx);
    return { ...before, name: input.name };
  });
  return Response.json({ team: { id: team.id, name: team.name, isDemo: team.isDemo, role: a.role } });
});

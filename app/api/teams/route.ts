import { db } from "@/db/client";
import { insertTeamWithOwner, listTeamsOfUser } from "@/db/queries/teams";
import { audit, requireApiUser } from "@/lib/access";
import { apiRoute, readJson } from "@/lib/api";
import { teamSchema } from "@/lib/validation/team";

export const GET = apiRoute(async () => {
  const user = await requireApiUser();
  const teams = await listTeamsOfUser(db, user.id);
  return Response.json({ teams: teams.map((t) => ({ id: t.id, name: t.name, role: t.role, isDemo: t.isDemo })) });
});

export const POST = apiRoute(async (req) => {
  const user = await requireApiUser();
  const input = await readJson(req, teamSchema, 16 * 1024);
  const team = await db.transaction(async (trx) => {
    const t = await insertTeamWithOwner(trx, { name: input.name, ownerId: user.id });
    await audit({ teamId: t.id, userId: user.id, action: "team.create", entityType: "team", entityId: t.id, detail: { name: t.name } }, trx);
    return t;
  });
  return Response.json({ team: { id: team.id, name: team.name, role: "owner", isDemo: team.isDemo } }, { status: 201 });
});

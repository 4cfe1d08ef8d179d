import { db } from "@/db/client";
import { listTeamsOfUser } from "@/db/queries/teams";
import { createTeam } from "@/db/writes/teams";
import { requireApiUser } from "@/lib/access";
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
  const team = await createTeam(db, { name: input.name, ownerId: user.id });
  return Response.json({ team: { id: team.id, name: team.name, role: "owner", isDemo: team.isDemo } }, { status: 201 });
});

import { db } from "@/db/client";
import { listTeamsOfUser } from "@/db/queries/teams";
import { requireApiUser } from "@/lib/access";
import { apiRoute } from "@/lib/api";
import { publicUser } from "@/lib/users";

export const GET = apiRoute(async () => {
  const user = await requireApiUser();
  const teams = await listTeamsOfUser(db, user.id);
  return Response.json({ user: publicUser(user), teams: teams.map((t) => ({ id: t.id, name: t.name, role: t.role, isDemo: t.isDemo })) });
});

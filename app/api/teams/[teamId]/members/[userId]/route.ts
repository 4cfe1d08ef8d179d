import { db } from "@/db/client";
import { changeMemberRole, removeMember } from "@/db/writes/teams";
import { requireTeamRole } from "@/lib/access";
import { apiRoute, forbidden, readJson } from "@/lib/api";
import { memberRoleSchema } from "@/lib/validation/team";

type P = { teamId: string; userId: string };

export const PATCH = apiRoute<P>(async (req, { teamId, userId }) => {
  const a = await requireTeamRole(teamId, "owner");
  const { role } = await readJson(req, memberRoleSchema, 4 * 1024);
  const member = await changeMemberRole(db, { teamId, actorId: a.user.id, userId, role });
  return Response.json({ member });
});

/** Owners remove anyone; every member may remove themselves (leave). The last owner can do neither. */
export const DELETE = apiRoute<P>(async (_req, { teamId, userId }) => {
  const a = await requireTeamRole(teamId, "viewer");
  if (a.user.id !== userId && a.role !== "owner") throw forbidden("Only owners can remove other members.");
  await removeMember(db, { teamId, actorId: a.user.id, userId });
  return Response.json({ ok: true });
});

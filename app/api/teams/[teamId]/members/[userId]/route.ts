import { db } from "@/db/client";
import { countOwners, deleteMember, getMember, setMemberRole } from "@/db/queries/teams";
import { audit, requireTeamRole } from "@/lib/access";
import { apiRoute, conflict, forbidden, notFound, readJson } from "@/lib/api";
import { memberRoleSchema } from "@/lib/validation/team";

type P = { teamId: string; userId: string };

const LAST_OWNER = "A team needs at least one owner. Make another member an owner first.";

export const PATCH = apiRoute<P>(async (req, { teamId, userId }) => {
  const a = await requireTeamRole(teamId, "owner");
  const { role } = await readJson(req, memberRoleSchema, 4 * 1024);
  const member = await db.transaction(async (trx) => {
    const m = await getMember(trx, teamId, userId);
    if (!m) throw notFound("Member");
    if (m.role === role) return m;
    if (m.role === "owner" && (await countOwners(trx, teamId)) <= 1) throw conflict(LAST_OWNER);
    await setMemberRole(trx, teamId, userId, role);
    await audit({ teamId, userId: a.user.id, action: "member.role_change", entityType: "user", entityId: userId, detail: { from: m.role, to: role } }, trx);
    return { ...m, role };
  });
  return Response.json({ member });
});

/** Owners remove anyone; every member may remove themselves (leave). The last owner can do neither. */
export const DELETE = apiRoute<P>(async (_req, { teamId, userId }) => {
  const a = await requireTeamRole(teamId, "viewer");
  const self = a.user.id === userId;
  if (!self && a.role !== "owner") throw forbidden("Only owners can remove other members.");
  await db.transaction(async (trx) => {
    const m = await getMember(trx, teamId, userId);
    if (!m) throw notFound("Member");
    if (m.role === "owner" && (await countOwners(trx, teamId)) <= 1) {
      throw conflict(self ? "You are the team's last owner: make another member an owner before you leave." : LAST_OWNER);
    }
    await deleteMember(trx, teamId, userId);
    await audit({ teamId, userId: a.user.id, action: self ? "member.leave" : "member.remove", entityType: "user", entityId: userId, detail: { role: m.role, email: m.email } }, trx);
  });
  return Response.json({ ok: true });
});

import type { Metadata } from "next";
import { db } from "@/db/client";
import { listInvites } from "@/db/queries/invites";
import { listMembers } from "@/db/queries/teams";
import { TeamSettings } from "@/components/teams/team-settings";
import { publicInvite } from "@/lib/invites";
import { getTeamContext } from "@/lib/team-context";

export const metadata: Metadata = { title: "Team settings" };

export default async function TeamSettingsPage({ params }: { params: Promise<{ teamId: string }> }) {
  const { teamId } = await params;
  const { user, team, role } = await getTeamContext(teamId);
  const members = await listMembers(db, teamId);
  // Invites (addresses, status) are for owners only, like GET /api/teams/[teamId]/invites.
  const invites = role === "owner" ? (await listInvites(db, teamId)).map((i) => publicInvite(i)) : null;
  return (
    <div className="space-y-4">
      <h1 className="text-xl font-semibold text-ink">Team settings</h1>
      <TeamSettings
        teamId={teamId}
        teamName={team.name}
        role={role}
        userId={user.id}
        members={{ members, you: { userId: user.id, role } }}
        invites={invites ? { invites } : null}
      />
    </div>
  );
}

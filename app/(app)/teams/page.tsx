import type { Metadata } from "next";
import Link from "next/link";
import { redirect } from "next/navigation";
import { CreateTeamForm } from "@/components/teams/create-team-form";
import { Badge, Card, EmptyState } from "@/components/ui/card";
import { teamsOfUser } from "@/lib/access";
import { requirePageUser } from "@/lib/team-context";

export const metadata: Metadata = { title: "Your teams" };

export default async function TeamsPage({ searchParams }: { searchParams: Promise<{ landing?: string }> }) {
  const user = await requirePageUser("/teams");
  const teams = await teamsOfUser(user.id);
  const only = teams.length === 1 ? teams[0] : undefined;
  if (only && (await searchParams).landing === "1") redirect(`/teams/${only.id}`);
  return (
    <div className="space-y-6">
      <h1 className="text-xl font-semibold text-ink">Your teams</h1>
      {teams.length === 0 ? (
        <EmptyState title="You are not in a team yet">
          Create one below and you become its owner, or open the invite link a team owner sent you by e-mail.
        </EmptyState>
      ) : (
        <Card>
          <ul className="divide-y divide-rule">
            {teams.map((t) => (
              <li key={t.id} className="flex items-center justify-between gap-3 py-2">
                <Link href={`/teams/${t.id}`} className="font-medium text-copper-dark hover:underline">
                  {t.name}
                </Link>
                <span className="flex items-center gap-2">
                  {t.isDemo ? <Badge tone="warn">demo data (invented)</Badge> : null}
                  <Badge>{t.role}</Badge>
                </span>
              </li>
            ))}
          </ul>
        </Card>
      )}
      <Card title="New team">
        <CreateTeamForm />
      </Card>
    </div>
  );
}

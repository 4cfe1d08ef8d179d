import type { Metadata } from "next";
import Link from "next/link";
import type { ReactNode } from "react";
import { db } from "@/db/client";
import { getTeamHome } from "@/db/queries/home";
import { ButtonLink } from "@/components/ui/button";
import { Badge, EmptyState, Notice } from "@/components/ui/card";
import { roleAtLeast } from "@/lib/access";
import { getTeamContext } from "@/lib/team-context";

export async function generateMetadata({ params }: { params: Promise<{ teamId: string }> }): Promise<Metadata> {
  const { team } = await getTeamContext((await params).teamId);
  return { title: team.name };
}

const dateFmt = new Intl.DateTimeFormat("en-GB", { day: "numeric", month: "short", year: "numeric", timeZone: "UTC" });
const when = (ms: number) => dateFmt.format(new Date(ms));

function Section({ title, count, href, linkLabel, children }: { title: string; count: number; href: string; linkLabel: string; children: ReactNode }) {
  return (
    <section aria-labelledby={`h-${title}`} className="rounded-lg border border-rule bg-panel">
      <header className="flex items-center justify-between border-b border-rule px-4 py-2.5">
        <h2 id={`h-${title}`} className="text-sm font-semibold text-ink">
          {title} <span className="ml-1 font-normal text-muted tabular">({count})</span>
        </h2>
        <Link href={href} className="text-sm text-copper-dark hover:underline">
          {linkLabel}
        </Link>
      </header>
      <div className="p-4">{children}</div>
    </section>
  );
}

export default async function TeamHomePage({ params }: { params: Promise<{ teamId: string }> }) {
  const { teamId } = await params;
  const { team, role } = await getTeamContext(teamId);
  const home = await getTeamHome(db, teamId);
  const base = `/teams/${teamId}`;
  const canEdit = roleAtLeast(role, "editor");

  return (
    <div className="space-y-6">
      <div className="flex flex-wrap items-baseline justify-between gap-3">
        <div>
          <h1 className="text-xl font-semibold text-ink">{team.name}</h1>
          <p className="text-sm text-muted">
            You are {role === "owner" ? "an owner" : role === "editor" ? "an editor" : "a viewer"} · {home.counts.members} member
            {home.counts.members === 1 ? "" : "s"}
          </p>
        </div>
        {team.isDemo ? <Badge tone="warn">Demo team: all data here is invented</Badge> : null}
      </div>
      {role === "owner" && home.counts.members === 1 ? (
        <Notice>
          You are the only member.{" "}
          <Link href={`${base}/settings`} className="font-medium text-copper-dark underline-offset-2 hover:underline">
            Invite colleagues
          </Link>{" "}
          as editors (they change baselines, scenarios and reports) or viewers (read only).
        </Notice>
      ) : null}
      {role === "viewer" ? <Notice>You can read everything in this team; ask an owner if you need to edit.</Notice> : null}

      <div className="grid gap-6 lg:grid-cols-3">
        <Section title="Baselines" count={home.counts.baselines} href={`${base}/baselines`} linkLabel="All baselines">
          {home.baselines.length === 0 ? (
            <EmptyState title="No baselines yet" action={canEdit ? <ButtonLink href={`${base}/baselines`}>Create a baseline</ButtonLink> : undefined}>
              {canEdit
                ? "Import your design's wire classes from a CSV (a template with plausible invented values is provided), or start from an empty class table."
                : "An editor or owner of this team can create the first baseline."}
            </EmptyState>
          ) : (
            <ul className="divide-y divide-rule text-sm">
              {home.baselines.map((b) => (
                <li key={b.id} className="flex items-center justify-between gap-2 py-1.5">
                  <Link href={`${base}/baselines/${b.id}`} className="font-medium text-copper-dark hover:underline">
                    {b.name}
                  </Link>
                  <span className="text-xs text-muted tabular">
                    {b.classCount} class{b.classCount === 1 ? "" : "es"} · {when(b.updatedAt)}
                  </span>
                </li>
              ))}
            </ul>
          )}
        </Section>

        <Section title="Scenarios" count={home.counts.scenarios} href={`${base}/scenarios`} linkLabel="All scenarios">
          {home.scenarios.length === 0 ? (
            <EmptyState
              title="No scenarios yet"
              action={canEdit && home.counts.baselines > 0 ? <ButtonLink href={`${base}/scenarios`}>Create a scenario</ButtonLink> : undefined}
            >
              {home.counts.baselines === 0
                ? "Scenarios are what-ifs on a baseline: create a baseline first."
                : canEdit
                  ? "Create a scenario from one of your baselines and set its scale factors S and S_L."
                  : "An editor or owner of this team can create scenarios."}
            </EmptyState>
          ) : (
            <ul className="divide-y divide-rule text-sm">
              {home.scenarios.map((s) => (
                <li key={s.id} className="flex items-center justify-between gap-2 py-1.5">
                  <Link href={`${base}/scenarios/${s.id}`} className="font-medium text-copper-dark hover:underline">
                    {s.name}
                  </Link>
                  <span className="text-xs text-muted">
                    on {s.baselineName} · {when(s.updatedAt)}
                  </span>
                </li>
              ))}
            </ul>
          )}
        </Section>

        <Section title="Reports" count={home.counts.reports} href={`${base}/reports`} linkLabel="All reports">
          {home.reports.length === 0 ? (
            <EmptyState
              title="No reports yet"
              action={canEdit && home.counts.scenarios > 0 ? <ButtonLink href={`${base}/reports`}>Compose a report</ButtonLink> : undefined}
            >
              {home.counts.scenarios === 0
                ? "A report compares a baseline with 2–4 scenarios: create scenarios first."
                : canEdit
                  ? "Compose a report to compare a baseline with 2–4 scenarios and share it."
                  : "An editor or owner of this team can compose reports."}
            </EmptyState>
          ) : (
            <ul className="divide-y divide-rule text-sm">
              {home.reports.map((r) => (
                <li key={r.id} className="flex items-center justify-between gap-2 py-1.5">
                  <Link href={`${base}/reports/${r.id}`} className="font-medium text-copper-dark hover:underline">
                    {r.title}
                  </Link>
                  <span className="text-xs text-muted tabular">
                    v{r.version} · {when(r.createdAt)}
                  </span>
                </li>
              ))}
            </ul>
          )}
        </Section>
      </div>
    </div>
  );
}

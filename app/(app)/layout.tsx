import Link from "next/link";
import type { ReactNode } from "react";
import { AccountMenu, SectionNav, TeamSwitcher } from "@/components/shell/app-nav";
import { VerifyEmailBanner } from "@/components/shell/verify-email-banner";
import { Wordmark } from "@/components/shell/wordmark";
import { teamsOfUser } from "@/lib/access";
import { outboxScope } from "@/lib/outbox-access";
import { requirePageUser } from "@/lib/team-context";
import { signOutAction } from "./actions";

// The app shell: every page under (app) needs a session and reads per-user data.
export const dynamic = "force-dynamic";

export default async function AppLayout({ children }: { children: ReactNode }) {
  const user = await requirePageUser();
  // One read of the user's teams per request: the switcher, the outbox scope and the team pages' gate share it.
  const [teams, scope] = await Promise.all([teamsOfUser(user.id), outboxScope(user.id)]);
  return (
    <div className="flex min-h-screen flex-col">
      <a
        href="#main"
        className="sr-only focus:not-sr-only focus:absolute focus:left-2 focus:top-2 focus:z-50 focus:rounded focus:bg-panel focus:px-3 focus:py-2"
      >
        Skip to content
      </a>
      <header className="no-print sticky top-0 z-20 border-b border-rule bg-panel/95 backdrop-blur">
        <div className="mx-auto flex max-w-7xl flex-wrap items-center gap-x-4 gap-y-2 px-4 py-2">
          <Link href="/teams" aria-label="Plateau: your teams" className="rounded">
            <Wordmark />
          </Link>
          <TeamSwitcher teams={teams.map((t) => ({ id: t.id, name: t.name, role: t.role, isDemo: t.isDemo }))} />
          <SectionNav />
          <div className="ml-auto">
            <AccountMenu name={user.name} email={user.email} showOutbox={scope !== null} signOut={signOutAction} />
          </div>
        </div>
      </header>
      {user.emailVerified ? null : <VerifyEmailBanner email={user.email} showOutbox={scope !== null} />}
      <main id="main" className="mx-auto w-full max-w-7xl flex-1 px-4 py-6">
        {children}
      </main>
    </div>
  );
}

import type { Metadata } from "next";
import Link from "next/link";
import { db, ready } from "@/db/client";
import { getInviteByTokenHash } from "@/db/queries/invites";
import { getTeam } from "@/db/queries/teams";
import { AcceptInvite } from "@/components/invites/accept-invite";
import { Wordmark } from "@/components/shell/wordmark";
import { ButtonLink } from "@/components/ui/button";
import { Notice } from "@/components/ui/card";
import { getMembershipRole } from "@/lib/access";
import { validateRequest } from "@/lib/auth";
import { inviteStatus } from "@/db/queries/invites";
import { hashInviteToken } from "@/lib/invites";

export const metadata: Metadata = { title: "Team invite", robots: { index: false } };
export const dynamic = "force-dynamic";

const ROLE_WORDS = { owner: "an owner", editor: "an editor", viewer: "a viewer" } as const;

export default async function InvitePage({ params }: { params: Promise<{ token: string }> }) {
  const { token } = await params;
  await ready();
  const invite = token.length <= 200 ? await getInviteByTokenHash(db, hashInviteToken(token)) : undefined;
  const team = invite ? await getTeam(db, invite.teamId) : undefined;
  const { user } = await validateRequest();
  const here = `/invite/${encodeURIComponent(token)}`;

  let body: React.ReactNode;
  if (!invite || !team) {
    body = <Notice tone="bad">This invite link is not valid. Check that you copied the whole link, or ask the team&apos;s owner for a new invite.</Notice>;
  } else {
    const status = inviteStatus(invite);
    if (status === "accepted")
      body = <Notice tone="bad">This invite has already been used. Ask the team&apos;s owner for a new one if you still need access.</Notice>;
    else if (status === "revoked") body = <Notice tone="bad">This invite was withdrawn by the team&apos;s owner. Ask them for a new one.</Notice>;
    else if (status === "expired")
      body = <Notice tone="bad">This invite has expired (invites last 7 days). Ask the team&apos;s owner to send a new one.</Notice>;
    else {
      const intro = (
        <p className="text-sm text-ink">
          You are invited to join <strong>{team.name}</strong> as {ROLE_WORDS[invite.role]}.
        </p>
      );
      if (!user) {
        // The invited address is not shown or filled in: a forwarded link must not reveal it (issue 12 finding 8).
        const q = `?next=${encodeURIComponent(here)}`;
        body = (
          <div className="space-y-4">
            {intro}
            <p className="text-sm text-muted">Sign in, or create an account, with the e-mail address this invite was sent to, then come back here to accept.</p>
            <div className="flex gap-2">
              <ButtonLink href={`/sign-up${q}`}>Create account</ButtonLink>
              <ButtonLink variant="secondary" href={`/sign-in${q}`}>
                Sign in
              </ButtonLink>
            </div>
          </div>
        );
      } else if (await getMembershipRole(team.id, user.id)) {
        body = (
          <div className="space-y-4">
            <Notice>You are already a member of {team.name}.</Notice>
            <ButtonLink href={`/teams/${team.id}`}>Open {team.name}</ButtonLink>
          </div>
        );
      } else if (user.email !== invite.email) {
        body = (
          <div className="space-y-4">
            {intro}
            <Notice tone="warn">
              This invite was sent to a different e-mail address than yours ({user.email}). Sign out, then sign in (or sign up) with the address the invite was
              sent to.
            </Notice>
          </div>
        );
      } else {
        body = (
          <div className="space-y-4">
            {intro}
            <AcceptInvite token={token} teamName={team.name} />
          </div>
        );
      }
    }
  }

  return (
    <div className="flex min-h-screen flex-col items-center px-4 py-12">
      <Link href="/" className="mb-8 rounded" aria-label="Plateau home">
        <Wordmark className="text-lg" />
      </Link>
      <main className="w-full max-w-md rounded-lg border border-rule bg-panel p-6 shadow-sm">
        <h1 className="mb-4 text-lg font-semibold text-ink">Team invite</h1>
        {body}
      </main>
    </div>
  );
}

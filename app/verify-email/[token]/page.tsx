import type { Metadata } from "next";
import Link from "next/link";
import { db, ready } from "@/db/client";
import { getEmailVerificationByTokenHash, getUserById, type EmailVerification, type UserRecord } from "@/db/queries/users";
import { ConfirmEmail } from "@/components/auth/confirm-email";
import { Wordmark } from "@/components/shell/wordmark";
import { ButtonLink } from "@/components/ui/button";
import { Notice } from "@/components/ui/card";
import { hashVerificationToken } from "@/lib/email-verification";

export const metadata: Metadata = { title: "Confirm your e-mail address", robots: { index: false }, referrer: "no-referrer" };
export const dynamic = "force-dynamic";

/** What the page offers for a link: a button, "already confirmed", "expired" or "not valid". */
function linkState(v: EmailVerification | undefined, user: UserRecord | undefined, now = Date.now()): "open" | "done" | "expired" | "invalid" {
  if (!v || !user || user.email !== v.email) return "invalid";
  if (v.usedAt !== null) return "done";
  if (v.expiresAt <= now) return user.emailVerifiedAt !== null ? "done" : "expired";
  return "open";
}

/**
 * The page a confirmation link opens. Opening it changes nothing (mail scanners fetch links); the button posts the
 * token to /api/auth/verify-email, which needs no session.
 */
export default async function VerifyEmailPage({ params }: { params: Promise<{ token: string }> }) {
  const { token } = await params;
  await ready();
  const v = token.length <= 200 ? await getEmailVerificationByTokenHash(db, hashVerificationToken(token)) : undefined;
  const user = v ? await getUserById(db, v.userId) : undefined;

  const state = linkState(v, user);
  let body: React.ReactNode;
  if (state === "invalid" || !v) {
    body = <Notice tone="bad">This confirmation link is not valid. Check that you copied the whole link, or send a new one after signing in.</Notice>;
  } else if (state === "done") {
    body = (
      <div className="space-y-4">
        <Notice tone="good">{user?.emailVerifiedAt != null ? `${v.email} is confirmed.` : "This confirmation link has already been used."}</Notice>
        <ButtonLink href="/teams">Go to your teams</ButtonLink>
      </div>
    );
  } else if (state === "expired") {
    body = (
      <Notice tone="bad">
        This confirmation link has expired (links last 24 hours). <Link href="/sign-in">Sign in</Link> and send a new one from the notice at the top of the
        page.
      </Notice>
    );
  } else {
    body = (
      <div className="space-y-4">
        <p className="text-sm text-ink">
          Confirm that <strong>{v.email}</strong> is your address on Plateau. Then you can send invites and report e-mails.
        </p>
        <ConfirmEmail token={token} />
      </div>
    );
  }

  return (
    <div className="flex min-h-screen flex-col items-center px-4 py-12">
      <Link href="/" className="mb-8 rounded" aria-label="Plateau home">
        <Wordmark className="text-lg" />
      </Link>
      <main className="w-full max-w-md rounded-lg border border-rule bg-panel p-6 shadow-sm">
        <h1 className="mb-4 text-lg font-semibold text-ink">Confirm your e-mail address</h1>
        {body}
      </main>
    </div>
  );
}

import type { Metadata } from "next";
import Link from "next/link";
import { ResetPasswordForm } from "@/components/auth/account-forms";
import { Notice } from "@/components/ui/card";

// The token is in this page's URL: send no Referer anywhere from here.
export const metadata: Metadata = { title: "Choose a new password", referrer: "no-referrer" };

export default async function ResetPasswordPage({ searchParams }: { searchParams: Promise<Record<string, string | string[] | undefined>> }) {
  const sp = await searchParams;
  const token = typeof sp.token === "string" && /^[A-Za-z0-9_-]{43}$/.test(sp.token) ? sp.token : null;
  return (
    <>
      <h1 className="mb-4 text-lg font-semibold text-ink">Choose a new password</h1>
      {token ? (
        <ResetPasswordForm token={token} />
      ) : (
        <Notice tone="bad">
          This reset link is incomplete. Open the whole link from the e-mail, or{" "}
          <Link className="text-copper-dark underline" href="/forgot-password">
            ask for a new one
          </Link>
          .
        </Notice>
      )}
    </>
  );
}

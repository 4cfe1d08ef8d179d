import type { Metadata } from "next";
import { redirect } from "next/navigation";
import { AuthForm } from "@/components/auth/auth-form";
import { Notice } from "@/components/ui/card";
import { validateRequest } from "@/lib/auth";
import { safeNext } from "@/lib/safe-next";

export const metadata: Metadata = { title: "Sign in" };

export default async function SignInPage({ searchParams }: { searchParams: Promise<Record<string, string | string[] | undefined>> }) {
  const sp = await searchParams;
  const next = safeNext(sp.next);
  const { user } = await validateRequest();
  if (user) redirect(next);
  return (
    <>
      <h1 className="mb-4 text-lg font-semibold text-ink">Sign in</h1>
      {sp.reset === "1" ? (
        <div className="mb-4">
          <Notice tone="good" role="status">
            Your password was changed and every session was signed out. Sign in with the new password.
          </Notice>
        </div>
      ) : null}
      <AuthForm mode="sign-in" next={next} email={typeof sp.email === "string" ? sp.email : ""} />
    </>
  );
}

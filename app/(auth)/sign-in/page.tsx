import type { Metadata } from "next";
import { redirect } from "next/navigation";
import { AuthForm } from "@/components/auth/auth-form";
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
      <AuthForm mode="sign-in" next={next} email={typeof sp.email === "string" ? sp.email : ""} />
    </>
  );
}

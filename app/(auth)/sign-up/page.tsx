import type { Metadata } from "next";
import { redirect } from "next/navigation";
import { AuthForm } from "@/components/auth/auth-form";
import { validateRequest } from "@/lib/auth";
import { safeNext } from "@/lib/safe-next";

export const metadata: Metadata = { title: "Create an account" };

export default async function SignUpPage({ searchParams }: { searchParams: Promise<Record<string, string | string[] | undefined>> }) {
  const sp = await searchParams;
  const next = safeNext(sp.next);
  const { user } = await validateRequest();
  if (user) redirect(next);
  return (
    <>
      <h1 className="mb-1 text-lg font-semibold text-ink">Create your account</h1>
      <p className="mb-4 text-sm text-muted">Then start a team, or accept an invite to one.</p>
      <AuthForm mode="sign-up" next={next} email={typeof sp.email === "string" ? sp.email : ""} />
    </>
  );
}

import type { Metadata } from "next";
import { ForgotPasswordForm } from "@/components/auth/account-forms";

export const metadata: Metadata = { title: "Forgot password" };

export default async function ForgotPasswordPage({ searchParams }: { searchParams: Promise<Record<string, string | string[] | undefined>> }) {
  const sp = await searchParams;
  return (
    <>
      <h1 className="mb-1 text-lg font-semibold text-ink">Forgot your password?</h1>
      <p className="mb-4 text-sm text-muted">Enter your e-mail address and we will send you a link to choose a new one.</p>
      <ForgotPasswordForm email={typeof sp.email === "string" ? sp.email.slice(0, 254) : ""} />
    </>
  );
}

import type { Metadata } from "next";
import { ChangePasswordForm, SignOutEverywhere } from "@/components/auth/account-forms";
import { Card } from "@/components/ui/card";
import { PageHeader } from "@/components/ui/page-header";
import { requirePageUser } from "@/lib/team-context";

export const metadata: Metadata = { title: "Account" };

export default async function AccountPage() {
  const user = await requirePageUser("/account");
  return (
    <div className="space-y-6">
      <PageHeader title="Account">
        Signed in as {user.name} ({user.email}). Sessions end after 7 days without use and 30 days after signing in.
      </PageHeader>
      <Card title="Change password">
        <p className="mb-4 text-sm text-muted">Changing your password signs you out everywhere else; this browser stays signed in.</p>
        <ChangePasswordForm />
      </Card>
      <Card title="Sessions">
        <p className="mb-4 text-sm text-muted">Signed in on a computer you no longer use? Sign out of every browser and device, this one included.</p>
        <SignOutEverywhere />
      </Card>
    </div>
  );
}

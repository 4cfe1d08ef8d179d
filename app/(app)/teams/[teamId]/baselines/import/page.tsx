import type { Metadata } from "next";
import Link from "next/link";
import { CsvImport } from "@/components/import/csv-import";
import { Notice } from "@/components/ui/card";
import { roleAtLeast } from "@/lib/access";
import { getTeamContext } from "@/lib/team-context";

export const metadata: Metadata = { title: "New baseline from CSV" };

export default async function NewBaselineImportPage({ params }: { params: Promise<{ teamId: string }> }) {
  const { teamId } = await params;
  const { role } = await getTeamContext(teamId);
  return (
    <div className="space-y-4">
      <div>
        <p className="text-xs text-muted">
          <Link href={`/teams/${teamId}/baselines`} className="hover:underline">
            Baselines
          </Link>
        </p>
        <h1 className="text-xl font-semibold text-ink">New baseline from a wire-class CSV</h1>
        <p className="mt-1 max-w-prose text-sm text-muted">
          One row per wire class. Length histograms can be added on the new baseline&apos;s import page afterwards.
        </p>
      </div>
      {roleAtLeast(role, "editor") ? (
        <CsvImport
          target={{ kind: "new-baseline", teamId }}
          classNames={[]}
          existingClassCount={0}
          doneHref={null}
          templateHref="/templates/wire-classes-template.csv"
        />
      ) : (
        <Notice tone="warn">Your role in this team is viewer: creating baselines needs an editor or owner.</Notice>
      )}
    </div>
  );
}

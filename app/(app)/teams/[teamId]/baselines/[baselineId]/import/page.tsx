import type { Metadata } from "next";
import Link from "next/link";
import { notFound } from "next/navigation";
import { cache } from "react";
import { db } from "@/db/client";
import { getBaseline } from "@/db/queries/baselines";
import { listClasses } from "@/db/queries/wire-classes";
import { CsvImport } from "@/components/import/csv-import";
import { Notice } from "@/components/ui/card";
import { roleAtLeast } from "@/lib/access";
import { getTeamContext } from "@/lib/team-context";

// Metadata and page share one read per request.
const loadBaseline = cache((id: string) => getBaseline(db, id));

export async function generateMetadata({
  params,
  searchParams,
}: {
  params: Promise<{ teamId: string; baselineId: string }>;
  searchParams: Promise<{ kind?: string }>;
}): Promise<Metadata> {
  const { teamId, baselineId } = await params;
  const what = (await searchParams).kind === "histograms" ? "Import length histograms" : "Import wire classes";
  await getTeamContext(teamId);
  const b = await loadBaseline(baselineId);
  return { title: b && b.teamId === teamId ? `${what} · ${b.name}` : what };
}

const tabClass = (active: boolean) =>
  `rounded-md px-3 py-1.5 text-sm font-medium ${active ? "bg-copper-soft text-copper-dark" : "text-muted hover:bg-rule/50 hover:text-ink"}`;

/** Import wire classes (default) or length histograms (`?kind=histograms`) into an existing baseline. */
export default async function BaselineImportPage({
  params,
  searchParams,
}: {
  params: Promise<{ teamId: string; baselineId: string }>;
  searchParams: Promise<{ kind?: string }>;
}) {
  const { teamId, baselineId } = await params;
  const { kind: kindParam } = await searchParams;
  const { role } = await getTeamContext(teamId);
  const baseline = await loadBaseline(baselineId);
  if (!baseline || baseline.teamId !== teamId) notFound();
  const classes = await listClasses(db, baselineId);
  const kind = kindParam === "histograms" ? "histograms" : "classes";
  const base = `/teams/${teamId}/baselines/${baselineId}`;
  return (
    <div className="space-y-4">
      <div>
        <p className="text-xs text-muted">
          <Link href={`/teams/${teamId}/baselines`} className="hover:underline">
            Baselines
          </Link>{" "}
          /{" "}
          <Link href={base} className="hover:underline">
            {baseline.name}
          </Link>
        </p>
        <h1 className="text-xl font-semibold text-ink">Import CSV into {baseline.name}</h1>
      </div>
      <nav aria-label="What to import" className="flex gap-1">
        <Link href={`${base}/import`} className={tabClass(kind === "classes")} aria-current={kind === "classes" ? "page" : undefined}>
          Wire classes
        </Link>
        <Link href={`${base}/import?kind=histograms`} className={tabClass(kind === "histograms")} aria-current={kind === "histograms" ? "page" : undefined}>
          Length histograms
        </Link>
      </nav>
      <p className="max-w-3xl text-sm text-muted">
        {kind === "histograms" ? (
          <>
            Rows of <code className="font-mono text-xs text-ink">class, length_um, count</code>: one row per length bin, many per class. Each class named must
            already be in this baseline ({classes.length ? classes.map((c) => c.name).join(", ") : "none yet"}). With histograms, delay distributions, nets over
            the budget and repeater totals use the bins instead of the mean length.
          </>
        ) : (
          <>
            One row per wire class, with the unit in each column name (<code className="font-mono text-xs text-ink">width_nm</code>,{" "}
            <code className="font-mono text-xs text-ink">mean_length_um</code>, …). After the file is checked you choose to replace the class table or merge
            into it; this baseline has {classes.length} class{classes.length === 1 ? "" : "es"} now.
          </>
        )}
      </p>
      {!roleAtLeast(role, "editor") ? (
        <Notice tone="warn">Your role in this team is viewer: you can read and export this baseline, but importing needs an editor or owner.</Notice>
      ) : kind === "histograms" && classes.length === 0 ? (
        <Notice tone="warn">This baseline has no wire classes yet. Import the classes first; histogram rows name a class.</Notice>
      ) : (
        <CsvImport
          key={kind}
          target={{ kind, baselineId, version: baseline.version }}
          classNames={classes.map((c) => c.name)}
          existingClassCount={classes.length}
          doneHref={base}
          templateHref={kind === "histograms" ? "/templates/length-histograms-template.csv" : "/templates/wire-classes-template.csv"}
        />
      )}
      <p className="text-xs text-muted">
        Export what is stored now:{" "}
        <a className="text-copper-dark underline" href={`/api/baselines/${baselineId}/export.csv`}>
          wire classes (CSV)
        </a>{" "}
        ·{" "}
        <a className="text-copper-dark underline" href={`/api/baselines/${baselineId}/histograms/export.csv`}>
          length histograms (CSV)
        </a>
        . Formats:{" "}
        <Link className="text-copper-dark underline" href="/help/csv">
          CSV reference
        </Link>
        .
      </p>
    </div>
  );
}

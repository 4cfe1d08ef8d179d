import "server-only";
import type { Knex } from "knex";
import { listClasses } from "@/db/queries/wire-classes";
import { importHistograms } from "@/db/writes/baselines";
import { InvalidCsvError } from "./errors";
import type { BaselineImportRequest } from "./types";
import { MAX_IMPORT_BYTES } from "./limits";
import { parseHistogramsOffThread } from "./off-thread";
import { formatScaled } from "@/lib/scaling/client";

/** What a histogram import answers (the route sends it as JSON): per-class totals, warnings, and the new version once stored. */
export type HistogramImportResult = Awaited<ReturnType<typeof runHistogramImport>>;

/**
 * The whole histogram import of one request: stream-parse and validate against the baseline's
 * classes in the import thread (lib/import/off-thread.ts), collecting bins per class in typed arrays (the database
 * untouched, no connection held while the client uploads: a request killed mid-upload stores nothing), then, unless
 * it is a dry run, store one row per class in one short transaction. An invalid file throws InvalidCsvError.
 */
export async function runHistogramImport(db: Knex, p: BaselineImportRequest) {
  const classes = await listClasses(db, p.baselineId);
  const names = classes.map((c) => c.name);
  const { parsed, bins } = await parseHistogramsOffThread(p.source, names, p.maxBytes ?? MAX_IMPORT_BYTES);
  if (!parsed.ok) throw new InvalidCsvError(parsed.errors, parsed.errorCount, parsed.rows);
  const netCount = new Map(classes.map((c) => [c.name, c.netCount]));
  const perClass = parsed.perClass.map((t) => ({
    name: t.name,
    bins: t.bins,
    nets: t.nets,
    minLengthUm: Number(formatScaled(t.minLengthM, -6)),
    maxLengthUm: Number(formatScaled(t.maxLengthM, -6)),
    classNetCount: netCount.get(t.name) ?? null,
  }));
  const warningItems = perClass
    .filter((c) => c.classNetCount !== null && c.classNetCount !== c.nets)
    .map((c) => ({
      className: c.name,
      message: `Class "${c.name}": the histogram holds ${c.nets.toLocaleString("en-US")} nets, the class table says ${c.classNetCount!.toLocaleString("en-US")}; distribution results use the histogram.`,
    }));
  const warnings = warningItems.map((w) => w.message);
  const summaryBody = { mode: p.mode, rows: parsed.rows, bytes: parsed.bytes, delimiter: parsed.delimiter, classes: perClass, warnings };
  if (p.dryRun) return { ok: true as const, dryRun: true, stored: false as const, ...summaryBody };
  const summary = `Imported length histograms from CSV (${p.mode}): ${parsed.rows.toLocaleString("en-US")} bins in ${perClass.length} class${perClass.length === 1 ? "" : "es"}`;
  const r = await importHistograms(db, {
    baselineId: p.baselineId,
    teamId: p.teamId,
    userId: p.userId,
    mode: p.mode,
    version: p.version,
    classNames: names,
    histograms: bins,
    summary,
    warnings: warningItems,
    detail: { mode: p.mode, rows: parsed.rows, bytes: parsed.bytes, classes: perClass.map((c) => c.name) },
  });
  return { ok: true as const, dryRun: false, stored: true as const, version: r.version, ...summaryBody };
}

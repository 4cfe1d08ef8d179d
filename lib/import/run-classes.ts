import "server-only";
import type { Knex } from "knex";
import { listClasses } from "@/db/queries/wire-classes";
import { createBaselineFromImport, importWireClasses } from "@/db/writes/baselines";
import type { Technology } from "@/lib/scaling";
import { MAX_CLASSES } from "@/lib/validation/wire-class";
import { InvalidCsvError } from "./errors";
import type { BaselineImportRequest } from "./types";
import { MAX_IMPORT_BYTES } from "./limits";
import { parseWireClassesOffThread } from "./off-thread";
import type { ImportedClass } from "./wire-classes";

function summaryOf(classes: ImportedClass[]) {
  return classes.map((c) => ({ name: c.name, tier: c.tier, netCount: c.netCount }));
}

/** What a classes import answers (the route sends it as JSON): the file's summary, and the new version once stored. */
export type WireClassImportResult = Awaited<ReturnType<typeof runWireClassImport>>;
/** What a new-baseline import answers; `stored` → 201 with `baseline`. */
export type NewBaselineImportResult = Awaited<ReturnType<typeof runNewBaselineImport>>;

/**
 * Classes import into an existing baseline: validate (an invalid file throws InvalidCsvError and
 * nothing is stored), then, unless it is a dry run, one transaction (db/writes/baselines.ts).
 */
export async function runWireClassImport(db: Knex, p: BaselineImportRequest) {
  const parsed = await parseWireClassesOffThread(p.source, p.maxBytes ?? MAX_IMPORT_BYTES);
  if (!parsed.ok) throw new InvalidCsvError(parsed.errors, parsed.errorCount, parsed.rows);
  const existing = await listClasses(db, p.baselineId);
  const existingNames = new Set(existing.map((c) => c.name.toLowerCase()));
  const incoming = new Set(parsed.classes.map((c) => c.name.toLowerCase()));
  const added = parsed.classes.filter((c) => !existingNames.has(c.name.toLowerCase())).map((c) => c.name);
  const updated = parsed.classes.filter((c) => existingNames.has(c.name.toLowerCase())).map((c) => c.name);
  const removed = p.mode === "replace" ? existing.filter((c) => !incoming.has(c.name.toLowerCase())).map((c) => c.name) : [];
  const body = {
    mode: p.mode,
    rows: parsed.rows,
    bytes: parsed.bytes,
    delimiter: parsed.delimiter,
    classes: summaryOf(parsed.classes),
    added,
    updated,
    removed,
  };
  if (p.dryRun) return { ok: true as const, dryRun: true, stored: false as const, ...body };
  const parts = [`${parsed.classes.length} class${parsed.classes.length === 1 ? "" : "es"}`];
  if (added.length) parts.push(`added ${added.join(", ")}`);
  if (removed.length) parts.push(`removed ${removed.join(", ")}`);
  const r = await importWireClasses(db, {
    baselineId: p.baselineId,
    teamId: p.teamId,
    userId: p.userId,
    mode: p.mode,
    version: p.version,
    classes: parsed.classes,
    maxClasses: MAX_CLASSES,
    summary: `Imported wire classes from CSV (${p.mode}): ${parts.join("; ")}`,
    detail: { mode: p.mode, rows: parsed.rows, added, updated, removed },
  });
  return { ok: true as const, dryRun: false, stored: true as const, version: r.version, classCount: r.classCount, ...body };
}

/** A new baseline from a classes CSV with the given technology (editable afterwards). */
export async function runNewBaselineImport(
  db: Knex,
  p: {
    teamId: string;
    userId: string;
    name: string;
    technology: Technology;
    dryRun: boolean;
    source: AsyncIterable<Uint8Array>;
    maxBytes?: number;
  },
) {
  const parsed = await parseWireClassesOffThread(p.source, p.maxBytes ?? MAX_IMPORT_BYTES);
  if (!parsed.ok) throw new InvalidCsvError(parsed.errors, parsed.errorCount, parsed.rows);
  const body = { rows: parsed.rows, bytes: parsed.bytes, delimiter: parsed.delimiter, classes: summaryOf(parsed.classes) };
  if (p.dryRun) return { ok: true as const, dryRun: true, stored: false as const, ...body };
  const id = await createBaselineFromImport(db, {
    teamId: p.teamId,
    userId: p.userId,
    name: p.name,
    technology: p.technology,
    classes: parsed.classes,
    summary: `Created from a CSV import with ${parsed.classes.length} classes`,
    detail: { rows: parsed.rows, name: p.name },
  });
  return { ok: true as const, dryRun: false, stored: true as const, baseline: { id, name: p.name, teamId: p.teamId }, ...body };
}

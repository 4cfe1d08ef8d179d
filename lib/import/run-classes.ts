import "server-only";
import type { Knex } from "knex";
import { createBaselineFromImport, storeWireClasses } from "@/db/queries/import";
import { DEFAULT_TECHNOLOGY } from "@/db/queries/baselines";
import { listClasses } from "@/db/queries/wire-classes";
import { MAX_CLASSES } from "@/lib/validation/wire-class";
import type { ImportMode } from "@/lib/validation/import";
import { MAX_IMPORT_BYTES } from "./limits";
import { invalidCsvResponse } from "./respond";
import { parseWireClassStream, type ImportedClass } from "./wire-classes";

function summaryOf(classes: ImportedClass[]) {
  return classes.map((c) => ({ name: c.name, tier: c.tier, netCount: c.netCount }));
}

/** Classes import into an existing baseline: validate (nothing stored on any error), then one transaction. */
export async function runWireClassImport(
  db: Knex,
  p: { baselineId: string; teamId: string; userId: string; mode: ImportMode; dryRun: boolean; source: AsyncIterable<Uint8Array>; maxBytes?: number },
): Promise<Response> {
  const parsed = await parseWireClassStream(p.source, { maxBytes: p.maxBytes ?? MAX_IMPORT_BYTES });
  if (!parsed.ok) return invalidCsvResponse({ errors: parsed.errors, errorCount: parsed.errorCount, rows: parsed.rows });
  const existing = await listClasses(db, p.baselineId);
  const existingNames = new Set(existing.map((c) => c.name.toLowerCase()));
  const incoming = new Set(parsed.classes.map((c) => c.name.toLowerCase()));
  const added = parsed.classes.filter((c) => !existingNames.has(c.name.toLowerCase())).map((c) => c.name);
  const updated = parsed.classes.filter((c) => existingNames.has(c.name.toLowerCase())).map((c) => c.name);
  const removed = p.mode === "replace" ? existing.filter((c) => !incoming.has(c.name.toLowerCase())).map((c) => c.name) : [];
  const body = { mode: p.mode, rows: parsed.rows, bytes: parsed.bytes, delimiter: parsed.delimiter, classes: summaryOf(parsed.classes), added, updated, removed };
  if (p.dryRun) return Response.json({ ok: true, dryRun: true, stored: false, ...body });
  const parts = [`${parsed.classes.length} class${parsed.classes.length === 1 ? "" : "es"}`];
  if (added.length) parts.push(`added ${added.join(", ")}`);
  if (removed.length) parts.push(`removed ${removed.join(", ")}`);
  const r = await storeWireClasses(db, {
    baselineId: p.baselineId,
    teamId: p.teamId,
    userId: p.userId,
    mode: p.mode,
    classes: parsed.classes,
    maxClasses: MAX_CLASSES,
    summary: `Imported wire classes from CSV (${p.mode}): ${parts.join("; ")}`,
    detail: { mode: p.mode, rows: parsed.rows, added, updated, removed },
  });
  return Response.json({ ok: true, dryRun: false, stored: true, version: r.version, classCount: r.classCount, ...body });
}

/** A new baseline from a classes CSV (default technology, editable afterwards). */
export async function runNewBaselineImport(
  db: Knex,
  p: { teamId: string; userId: string; name: string; dryRun: boolean; source: AsyncIterable<Uint8Array>; maxBytes?: number },
): Promise<Response> {
  const parsed = await parseWireClassStream(p.source, { maxBytes: p.maxBytes ?? MAX_IMPORT_BYTES });
  if (!parsed.ok) return invalidCsvResponse({ errors: parsed.errors, errorCount: parsed.errorCount, rows: parsed.rows });
  const body = { rows: parsed.rows, bytes: parsed.bytes, delimiter: parsed.delimiter, classes: summaryOf(parsed.classes) };
  if (p.dryRun) return Response.json({ ok: true, dryRun: true, stored: false, ...body });
  const id = await createBaselineFromImport(db, {
    teamId: p.teamId,
    userId: p.userId,
    name: p.name,
    technology: DEFAULT_TECHNOLOGY,
    classes: parsed.classes,
    summary: `Created from a CSV import with ${parsed.classes.length} classes`,
    detail: { rows: parsed.rows, name: p.name },
  });
  return Response.json({ ok: true, dryRun: false, stored: true, baseline: { id, name: p.name, teamId: p.teamId }, ...body }, { status: 201 });
}

import "server-only";
import { randomUUID } from "node:crypto";
import type { Knex } from "knex";
import type { LengthBin, Technology } from "@/lib/scaling";
import type { WireClassInput } from "@/lib/validation/wire-class";
import type { ImportMode } from "@/lib/validation/import";
import { writeAudit } from "@/db/audit";
import { ImportConflictError, InvalidInputError, NotFoundError, StaleVersionError, fieldError } from "@/db/errors";
import { encodeHistogram, histogramRow, sortedHistogram, type HistogramColumns } from "@/db/histogram-blob";
import { baselineNameTaken, freeBaselineName, getBaseline } from "@/db/queries/baselines";
import { listClasses } from "@/db/queries/wire-classes";

/**
 * Every write of the baseline aggregate: the baseline row, its class table, its length histograms, its
 * revisions and its audit rows. Each function is one transaction that checks the version (versioned
 * edits), bumps it, writes the revision snapshot and the audit row; on any error nothing is stored.
 * Callers pass validated input (zod in the route) and the Knex instance (or an outer transaction).
 */

type Conn = Knex | Knex.Transaction;

/** A class row as written: the validated input without a row id. */
export type NewWireClass = Omit<WireClassInput, "id">;

/** What a new baseline holds. */
export interface NewBaseline {
  name: string;
  description?: string;
  technology: Technology;
  classes?: readonly NewWireClass[];
  /** Length histograms by class name, bins in any order (the demo seeder); classes without one get none. */
  histograms?: Readonly<Record<string, readonly LengthBin[]>>;
}

const NAME_TAKEN = "A baseline with this name already exists in the team.";

// ---------------------------------------------------------------------------------------------
// Shared steps (always inside the caller's transaction)

async function insertBaselineRow(
  trx: Knex.Transaction,
  p: { id: string; teamId: string; userId: string; name: string; description: string; technology: Technology; isDemo: boolean },
): Promise<void> {
  const now = Date.now();
  await trx("baselines").insert({
    id: p.id,
    team_id: p.teamId,
    name: p.name,
    description: p.description,
    technology: JSON.stringify(p.technology),
    is_demo: p.isDemo ? 1 : 0,
    version: 1,
    created_by: p.userId,
    created_at: now,
    updated_by: p.userId,
    updated_at: now,
  });
}

/**
 * Bump the version. With `expected`, only if the stored version still equals it (else StaleVersionError,
 * version 0 when the row is gone); without (scripts: the demo seeder, benchmarks), unconditionally. The import
 * routes always pass the version the client loaded (`?version=N`).
 */
async function bumpVersion(
  trx: Knex.Transaction,
  id: string,
  teamId: string,
  userId: string,
  expected?: number,
  extra: Record<string, unknown> = {},
): Promise<number> {
  if (expected === undefined) {
    const row = await trx("baselines").where({ id, team_id: teamId }).first("version");
    if (!row) throw new ImportConflictError("The baseline was deleted during the upload.");
    expected = Number(row.version);
  }
  const n = await trx("baselines")
    .where({ id, team_id: teamId, version: expected })
    .update({ ...extra, version: expected + 1, updated_by: userId, updated_at: Date.now() });
  if (n === 0) {
    const row = await trx("baselines").where({ id, team_id: teamId }).first("version");
    throw new StaleVersionError("This baseline", row?.version ?? 0, expected);
  }
  return expected + 1;
}

/** The revision row of `version`: a summary and a snapshot of name, description, technology and classes. */
async function writeRevision(trx: Knex.Transaction, baselineId: string, version: number, userId: string, summary: string): Promise<void> {
  const b = await getBaseline(trx, baselineId);
  const classes = await listClasses(trx, baselineId);
  const snapshot = JSON.stringify({
    name: b?.name,
    description: b?.description,
    technology: b?.technology,
    classes: classes.map(({ histogramBins: _h, ...c }) => c),
  });
  await trx("baseline_revisions").insert({ baseline_id: baselineId, version, user_id: userId, at: Date.now(), summary, snapshot });
}

/** A wire class as its `wire_classes` row (without the id); exported for tests that insert rows directly. */
export function classRow(baselineId: string, position: number, c: NewWireClass) {
  return {
    baseline_id: baselineId,
    position,
    name: c.name,
    tier: c.tier,
    width_m: c.widthM,
    thickness_m: c.thicknessM,
    spacing_m: c.spacingM,
    ild_below_m: c.ildBelowM,
    ild_above_m: c.ildAboveM,
    barrier_m: c.barrierM,
    metal: c.metal,
    k: c.k,
    net_count: c.netCount,
    mean_length_m: c.meanLengthM,
    driver_ohm: c.driverOhm,
    load_f: c.loadF,
    activity: c.activity,
    vias_per_net: c.viasPerNet ?? null,
    via_ohm: c.viaOhm ?? null,
    via_width_m: c.viaWidthM ?? null,
    via_height_m: c.viaHeightM ?? null,
    k_gap: c.kGap ?? null,
    gap_fraction: c.gapFraction ?? null,
  };
}

/**
 * Replace a baseline's classes. A row whose `id` (or, without an id, whose name) matches an existing
 * class is updated in place so its histogram survives; other existing classes are deleted (their
 * histograms cascade); the rest are inserted.
 */
async function replaceClasses(trx: Knex.Transaction, baselineId: string, classes: readonly WireClassInput[]): Promise<void> {
  const existing: { id: string; name: string }[] = await trx("wire_classes").where({ baseline_id: baselineId }).select("id", "name");
  const byId = new Map(existing.map((e) => [e.id, e]));
  const byName = new Map(existing.map((e) => [e.name.toLowerCase(), e]));
  const claimed = new Set<string>();
  const plan = classes.map((c) => {
    let keep = c.id ? byId.get(c.id) : undefined;
    if (!keep && !c.id) {
      const named = byName.get(c.name.toLowerCase());
      if (named && !classes.some((o) => o.id === named.id)) keep = named;
    }
    if (keep && claimed.has(keep.id)) keep = undefined;
    if (keep) claimed.add(keep.id);
    return { input: c, keepId: keep?.id };
  });
  const drop = existing.filter((e) => !claimed.has(e.id)).map((e) => e.id);
  if (drop.length) await trx("wire_classes").whereIn("id", drop).delete();
  // Park kept rows under unique temporary names so renames and swaps never trip unique(baseline_id, name).
  for (const p of plan)
    if (p.keepId)
      await trx("wire_classes")
        .where({ id: p.keepId })
        .update({ name: `\u0000${p.keepId}` });
  let position = 0;
  for (const p of plan) {
    const { id: _ignored, ...c } = p.input;
    const row = classRow(baselineId, position++, c);
    if (p.keepId) await trx("wire_classes").where({ id: p.keepId }).update(row);
    else await trx("wire_classes").insert({ id: randomUUID(), ...row });
  }
}

/** Copy classes and their histograms to another baseline. */
async function copyClasses(trx: Knex.Transaction, fromBaselineId: string, toBaselineId: string): Promise<void> {
  const rows: (Record<string, unknown> & { id: string })[] = await trx("wire_classes").where({ baseline_id: fromBaselineId }).orderBy("position");
  for (const r of rows) {
    const newId = randomUUID();
    await trx("wire_classes").insert({ ...r, id: newId, baseline_id: toBaselineId });
    await trx.raw(
      "insert into class_histograms (class_id, bin_count, net_count, lengths_m, counts) select ?, bin_count, net_count, lengths_m, counts from class_histograms where class_id = ?",
      [newId, r.id],
    );
  }
}

function describeTechnologyChange(before: Technology, after: Technology): string[] {
  const labels: Record<keyof Technology, string> = {
    supplyV: "supply",
    clockHz: "clock",
    repeaterR0Ohm: "repeater R0",
    repeaterC0F: "repeater C0",
    delayBudgetS: "delay budget",
    delayModel: "delay model",
    capacitanceModel: "capacitance model",
    temperatureC: "temperature",
    minRepeaterGain: "minimum repeater gain",
    repeaterOutputCRatio: "repeater output-capacitance ratio",
    repeaterAreaM2: "repeater area",
    repeaterLeakageW: "repeater leakage",
    materials: "materials",
    materialsSource: "materials source",
  };
  // JSON comparison: `materials` is an object; a field left out and one set to its absent value compare equal
  return (Object.keys(labels) as (keyof Technology)[]).filter((k) => JSON.stringify(before[k]) !== JSON.stringify(after[k])).map((k) => labels[k]);
}

// ---------------------------------------------------------------------------------------------
// Workspace edits

/** A new baseline with its classes (and, for seeds, histograms), its first revision and a "baseline.create" audit row. */
export async function createBaseline(
  conn: Conn,
  p: { teamId: string; userId: string; baseline: NewBaseline; isDemo?: boolean; summary?: string },
): Promise<string> {
  const id = randomUUID();
  const b = p.baseline;
  const classes = b.classes ?? [];
  await conn.transaction(async (trx) => {
    if (await baselineNameTaken(trx, p.teamId, b.name)) throw new InvalidInputError(NAME_TAKEN, fieldError("name", NAME_TAKEN));
    await insertBaselineRow(trx, {
      id,
      teamId: p.teamId,
      userId: p.userId,
      name: b.name,
      description: b.description ?? "",
      technology: b.technology,
      isDemo: !!p.isDemo,
    });
    await replaceClasses(
      trx,
      id,
      classes.map((c) => ({ ...c })),
    );
    if (b.histograms) {
      const rows: { id: string; name: string }[] = await trx("wire_classes").where({ baseline_id: id }).select("id", "name");
      for (const r of rows) {
        const bins = b.histograms[r.name] ?? [];
        if (bins.length === 0) continue;
        const h = sortedHistogram(bins);
        await trx("class_histograms").insert(histogramRow(r.id, h.lengthsM, h.counts));
      }
    }
    await writeRevision(trx, id, 1, p.userId, p.summary ?? `Created with ${classes.length} classes`);
    await writeAudit(trx, {
      teamId: p.teamId,
      userId: p.userId,
      action: "baseline.create",
      entityType: "baseline",
      entityId: id,
      detail: { name: b.name, classes: classes.length },
    });
  });
  return id;
}

/** Versioned edit of name, description and technology. Returns the new version. */
export async function updateBaseline(
  conn: Conn,
  p: { id: string; teamId: string; userId: string; version: number; name?: string; description?: string; technology?: Technology },
): Promise<number> {
  return conn.transaction(async (trx) => {
    if (p.name !== undefined && (await baselineNameTaken(trx, p.teamId, p.name, p.id))) throw new InvalidInputError(NAME_TAKEN, fieldError("name", NAME_TAKEN));
    const before = await getBaseline(trx, p.id);
    if (!before) throw new StaleVersionError("This baseline", 0, p.version);
    if (before.teamId !== p.teamId) throw new NotFoundError("Baseline");
    const extra: Record<string, unknown> = {};
    const changes: string[] = [];
    if (p.name !== undefined && p.name !== before.name) {
      extra.name = p.name;
      changes.push(`renamed to "${p.name}"`);
    }
    if (p.description !== undefined && p.description !== before.description) {
      extra.description = p.description;
      changes.push("description");
    }
    if (p.technology) {
      extra.technology = JSON.stringify(p.technology);
      const t = describeTechnologyChange(before.technology, p.technology);
      if (t.length) changes.push(`technology: ${t.join(", ")}`);
    }
    const version = await bumpVersion(trx, p.id, p.teamId, p.userId, p.version, extra);
    await writeRevision(trx, p.id, version, p.userId, changes.length ? `Changed ${changes.join("; ")}` : "Saved without changes");
    const fields = (["name", "description", "technology"] as const).filter((k) => p[k] !== undefined);
    await writeAudit(trx, {
      teamId: p.teamId,
      userId: p.userId,
      action: "baseline.update",
      entityType: "baseline",
      entityId: p.id,
      detail: { version, fields },
    });
    return version;
  });
}

/** Versioned replacement of the whole class table (rows with a known id keep it and their histogram). Returns the new version. */
export async function replaceBaselineClasses(
  conn: Conn,
  p: { id: string; teamId: string; userId: string; version: number; classes: readonly WireClassInput[] },
): Promise<number> {
  return conn.transaction(async (trx) => {
    const before = await listClasses(trx, p.id);
    const version = await bumpVersion(trx, p.id, p.teamId, p.userId, p.version);
    await replaceClasses(trx, p.id, p.classes);
    const beforeNames = new Set(before.map((c) => c.name));
    const afterNames = new Set(p.classes.map((c) => c.name));
    const added = p.classes.filter((c) => !beforeNames.has(c.name)).map((c) => c.name);
    const removed = before.filter((c) => !afterNames.has(c.name)).map((c) => c.name);
    const parts = [`${p.classes.length} classes`];
    if (added.length) parts.push(`added ${added.join(", ")}`);
    if (removed.length) parts.push(`removed ${removed.join(", ")}`);
    await writeRevision(trx, p.id, version, p.userId, `Edited class table (${parts.join("; ")})`);
    await writeAudit(trx, {
      teamId: p.teamId,
      userId: p.userId,
      action: "baseline.classes_update",
      entityType: "baseline",
      entityId: p.id,
      detail: { version, classes: p.classes.length },
    });
    return version;
  });
}

/** Copy a baseline with its classes and histograms (not its scenarios); without a name, "X (copy)". Returns the new id. */
export async function duplicateBaseline(conn: Conn, p: { id: string; teamId: string; userId: string; name?: string }): Promise<string> {
  const id = randomUUID();
  await conn.transaction(async (trx) => {
    const src = await getBaseline(trx, p.id);
    if (!src || src.teamId !== p.teamId) throw new NotFoundError("Baseline");
    const name = p.name ?? (await freeBaselineName(trx, src.teamId, src.name));
    if (await baselineNameTaken(trx, src.teamId, name)) throw new InvalidInputError(NAME_TAKEN, fieldError("name", NAME_TAKEN));
    await insertBaselineRow(trx, {
      id,
      teamId: src.teamId,
      userId: p.userId,
      name,
      description: src.description,
      technology: src.technology,
      isDemo: false,
    });
    await copyClasses(trx, p.id, id);
    await writeRevision(trx, id, 1, p.userId, `Duplicated from "${src.name}"`);
    await writeAudit(trx, {
      teamId: src.teamId,
      userId: p.userId,
      action: "baseline.create",
      entityType: "baseline",
      entityId: id,
      detail: { name, duplicatedFrom: p.id },
    });
  });
  return id;
}

/** Delete a baseline (its classes, histograms, revisions and scenarios cascade). */
export async function deleteBaseline(conn: Conn, p: { id: string; teamId: string; userId: string }): Promise<void> {
  await conn.transaction(async (trx) => {
    const row = await trx("baselines").where({ id: p.id, team_id: p.teamId }).first("name");
    if (!row) throw new NotFoundError("Baseline");
    await trx("baselines").where({ id: p.id }).delete();
    await writeAudit(trx, {
      teamId: p.teamId,
      userId: p.userId,
      action: "baseline.delete",
      entityType: "baseline",
      entityId: p.id,
      detail: { name: row.name },
    });
  });
}

// ---------------------------------------------------------------------------------------------
// CSV imports (validated before: nothing touches the database until the whole file is valid)

/** A new baseline holding the imported classes ("baseline.created_from_import"); a taken name is an ImportConflictError. */
export async function createBaselineFromImport(
  conn: Conn,
  p: {
    teamId: string;
    userId: string;
    name: string;
    technology: Technology;
    classes: readonly NewWireClass[];
    summary: string;
    detail: unknown;
  },
): Promise<string> {
  const id = randomUUID();
  await conn.transaction(async (trx) => {
    if (await baselineNameTaken(trx, p.teamId, p.name)) throw new ImportConflictError(`A baseline named "${p.name}" already exists in this team.`);
    await insertBaselineRow(trx, {
      id,
      teamId: p.teamId,
      userId: p.userId,
      name: p.name,
      description: "",
      technology: p.technology,
      isDemo: false,
    });
    await replaceClasses(
      trx,
      id,
      p.classes.map((c) => ({ ...c })),
    );
    await writeRevision(trx, id, 1, p.userId, p.summary);
    await writeAudit(trx, {
      teamId: p.teamId,
      userId: p.userId,
      action: "baseline.created_from_import",
      entityType: "baseline",
      entityId: id,
      detail: p.detail,
    });
  });
  return id;
}

/**
 * Store imported classes. replace: the file becomes the class table (classes of the same name keep
 * their id and histogram; others are deleted); merge: file rows update classes of the same name
 * (case-insensitive) and new ones are appended; classes absent from the file stay.
 */
export async function importWireClasses(
  conn: Conn,
  p: {
    baselineId: string;
    teamId: string;
    userId: string;
    mode: ImportMode;
    classes: readonly NewWireClass[];
    summary: string;
    detail: unknown;
    maxClasses: number;
    /** The baseline version the client loaded: StaleVersionError when it moved on (absent only for scripts). */
    version?: number;
  },
): Promise<{ version: number; classCount: number }> {
  return conn.transaction(async (trx) => {
    let list: WireClassInput[];
    if (p.mode === "replace") list = p.classes.map((c) => ({ ...c }));
    else {
      const existing = await listClasses(trx, p.baselineId);
      const incoming = new Map(p.classes.map((c) => [c.name.toLowerCase(), c]));
      list = existing.map(({ histogramBins: _h, position: _p, histogram: _g, id, ...c }) => {
        const repl = incoming.get(c.name.toLowerCase());
        if (repl) incoming.delete(c.name.toLowerCase());
        return { ...(repl ?? c), id } as WireClassInput;
      });
      for (const c of p.classes) if (incoming.has(c.name.toLowerCase())) list.push({ ...c });
    }
    if (list.length > p.maxClasses) throw new ImportConflictError(`A baseline holds at most ${p.maxClasses} classes; this import would make ${list.length}.`);
    const version = await bumpVersion(trx, p.baselineId, p.teamId, p.userId, p.version);
    await replaceClasses(trx, p.baselineId, list);
    await writeRevision(trx, p.baselineId, version, p.userId, p.summary);
    await writeAudit(trx, {
      teamId: p.teamId,
      userId: p.userId,
      action: "baseline.classes_imported",
      entityType: "baseline",
      entityId: p.baselineId,
      detail: p.detail,
    });
    return { version, classCount: list.length };
  });
}

/** One class's validated bins, in ascending length order. */
export interface ClassBinsInput {
  /** Index into `classNames`. */
  classIndex: number;
  lengthsM: Float64Array;
  counts: Float64Array;
}

/**
 * Store imported histograms: one `class_histograms` row per class in the file (encoded and checked
 * before the transaction starts, so the transaction only deletes and inserts a few rows).
 * replace: every class's histogram is replaced by the file's (classes absent from the file end with
 * none); merge: only the classes in the file get new histograms.
 */
export async function importHistograms(
  conn: Knex,
  p: {
    baselineId: string;
    teamId: string;
    userId: string;
    mode: ImportMode;
    classNames: readonly string[];
    histograms: readonly ClassBinsInput[];
    summary: string;
    detail: unknown;
    /** Warnings the import answers; stored on the baseline until dismissed (they supersede earlier histogram warnings of the same classes). */
    warnings?: readonly ImportWarningInput[];
    /** The baseline version the client loaded: StaleVersionError when it moved on (absent only for scripts). */
    version?: number;
  },
): Promise<{ version: number; inserted: number }> {
  const encoded = p.histograms.map((h) => ({ classIndex: h.classIndex, columns: encodeHistogram(h.lengthsM, h.counts) }));
  const bytes = encoded.reduce((n, e) => n + e.columns.lengths_m.byteLength + e.columns.counts.byteLength, 0);
  return bytes < LARGE_WRITE_BYTES ? writeHistograms(conn, p, encoded) : withDeferredCheckpoint(conn, () => writeHistograms(conn, p, encoded));
}

/** Above this many bytes of blobs, the WAL checkpoint runs after the answer rather than inside the commit. */
const LARGE_WRITE_BYTES = 1 << 20;

/**
 * Run a large write with SQLite's automatic WAL checkpoint suspended, then checkpoint right after.
 * A commit in WAL mode is complete once its frames are in the WAL (with synchronous=NORMAL, as set in
 * db/connect.ts, that is the durability the app has for every write); the automatic checkpoint that
 * a big commit triggers copies the pages into the main file and syncs both files to disk — for a
 * 1,000,000-bin import (16 MB of blobs) that is the larger part of the storing time on a slow disk.
 * It is the same work either way; here it is done just after the request is answered (PASSIVE:
 * never waits for readers; through the pool, so never inside another transaction).
 */
/** Large writes in flight per database, and the auto-checkpoint setting to restore after the last. */
const suspended = new WeakMap<Knex, { inFlight: number; every: number }>();

async function withDeferredCheckpoint<T>(db: Knex, write: () => Promise<T>): Promise<T> {
  // concurrent large imports share one suspension: the first reads the setting, the last restores it
  let s = suspended.get(db);
  const first = !s;
  if (!s) suspended.set(db, (s = { inFlight: 0, every: 1000 }));
  s.inFlight += 1;
  try {
    if (first) {
      const rows = (await db.raw("pragma wal_autocheckpoint")) as { wal_autocheckpoint: number }[];
      const every = Number(rows[0]?.wal_autocheckpoint);
      if (Number.isSafeInteger(every) && every > 0) s.every = every;
      await db.raw("pragma wal_autocheckpoint = 0");
    }
    return await write();
  } finally {
    s.inFlight -= 1;
    if (s.inFlight === 0) {
      suspended.delete(db);
      await db.raw(`pragma wal_autocheckpoint = ${s.every}`);
      setTimeout(() => void db.raw("pragma wal_checkpoint(PASSIVE)").catch(() => undefined), 20).unref();
    }
  }
}

async function writeHistograms(
  conn: Knex,
  p: {
    baselineId: string;
    teamId: string;
    userId: string;
    mode: ImportMode;
    classNames: readonly string[];
    summary: string;
    detail: unknown;
    warnings?: readonly ImportWarningInput[];
    version?: number;
  },
  encoded: { classIndex: number; columns: HistogramColumns }[],
): Promise<{ version: number; inserted: number }> {
  return conn.transaction(async (trx) => {
    // the version first: a stale import fails before it deletes or writes a single bin
    const version = await bumpVersion(trx, p.baselineId, p.teamId, p.userId, p.version);
    const current: { id: string; name: string }[] = await trx("wire_classes").where({ baseline_id: p.baselineId }).select("id", "name");
    const idByName = new Map(current.map((c) => [c.name, c.id]));
    const ids = p.classNames.map((n) => idByName.get(n));
    const missing = encoded.filter((e) => !ids[e.classIndex]).map((e) => p.classNames[e.classIndex]);
    if (missing.length) throw new ImportConflictError(`Classes ${missing.join(", ")} were removed from the baseline during the upload; upload again.`);
    if (p.mode === "replace") {
      await trx("class_histograms")
        .whereIn("class_id", trx("wire_classes").where({ baseline_id: p.baselineId }).select("id"))
        .delete();
    } else {
      const touched = encoded.map((e) => ids[e.classIndex]!);
      for (let i = 0; i < touched.length; i += 500)
        await trx("class_histograms")
          .whereIn("class_id", touched.slice(i, i + 500))
          .delete();
    }
    let inserted = 0;
    for (const e of encoded) {
      await trx("class_histograms").insert({ class_id: ids[e.classIndex]!, ...e.columns });
      inserted += e.columns.bin_count;
    }
    await writeRevision(trx, p.baselineId, version, p.userId, p.summary);
    // the file's histograms supersede the earlier histogram warnings of the classes they replace
    const now = Date.now();
    const superseded = trx("baseline_warnings").where({ baseline_id: p.baselineId, source: HISTOGRAM_WARNING_SOURCE }).whereNull("dismissed_at");
    if (p.mode === "merge") superseded.whereIn("class_name", [...new Set(encoded.map((e) => p.classNames[e.classIndex]!))]);
    await superseded.update({ dismissed_at: now, dismissed_by: p.userId });
    for (const w of p.warnings ?? []) {
      await trx("baseline_warnings").insert({
        id: randomUUID(),
        baseline_id: p.baselineId,
        source: HISTOGRAM_WARNING_SOURCE,
        class_name: w.className,
        message: w.message,
        created_at: now,
        created_by: p.userId,
      });
    }
    await writeAudit(trx, {
      teamId: p.teamId,
      userId: p.userId,
      action: "baseline.histograms_imported",
      entityType: "baseline",
      entityId: p.baselineId,
      detail: p.warnings?.length ? { ...(p.detail as object), warnings: p.warnings.length } : p.detail,
    });
    return { version, inserted };
  });
}

/** `baseline_warnings.source` of the warnings a histogram import answers. */
export const HISTOGRAM_WARNING_SOURCE = "histogram-import";

/** One warning an import answered, as stored on the baseline (`className` null: about the whole baseline). */
export interface ImportWarningInput {
  className: string | null;
  message: string;
}

/**
 * Dismiss one open warning of a baseline (editor or owner; the route checks the role). A warning that is not
 * the baseline's, or already dismissed, is NotFoundError (404), so a second click changes nothing.
 */
export async function dismissBaselineWarning(conn: Knex, p: { baselineId: string; teamId: string; userId: string; warningId: string }): Promise<void> {
  await conn.transaction(async (trx) => {
    const n = await trx("baseline_warnings")
      .where({ id: p.warningId, baseline_id: p.baselineId })
      .whereNull("dismissed_at")
      .update({ dismissed_at: Date.now(), dismissed_by: p.userId });
    if (n === 0) throw new NotFoundError("Warning", "This warning is not open on this baseline (already dismissed?).");
    await writeAudit(trx, {
      teamId: p.teamId,
      userId: p.userId,
      action: "baseline.warning_dismissed",
      entityType: "baseline",
      entityId: p.baselineId,
      detail: { warningId: p.warningId },
    });
  });
}

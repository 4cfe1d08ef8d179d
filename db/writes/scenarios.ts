import "server-only";
import { randomUUID } from "node:crypto";
import type { Knex } from "knex";
import type { ScenarioSettings } from "@/lib/scaling";
import { writeAudit } from "@/db/audit";
import { InvalidInputError, NotFoundError, StaleVersionError, fieldError } from "@/db/errors";
import { freeScenarioName, getScenario, getScenarioRevision, scenarioNameTaken, type Scenario } from "@/db/queries/scenarios";

/**
 * Every write of the scenario aggregate: the scenario row, its revisions and its audit rows. Each
 * function is one transaction that checks what depends on stored data (override names, a free name,
 * the version), bumps the version, writes the revision and the audit row; on any error nothing is stored.
 * Settings arrive complete (normalised by the caller from validated input).
 */

type Conn = Knex | Knex.Transaction;

const NAME_TAKEN = "A scenario with this name already exists on this baseline.";

/** Override keys that name no class of the baseline, as field errors (undefined when all are known). */
export function unknownOverrideFields(settings: { overrides: Record<string, unknown> }, classNames: readonly string[]): Record<string, string[]> | undefined {
  const known = new Set(classNames);
  const bad = Object.keys(settings.overrides).filter((n) => !known.has(n));
  if (bad.length === 0) return undefined;
  return Object.fromEntries(bad.map((n) => [`settings.overrides.${n}`, [`No class named "${n}" in this baseline.`]]));
}

/** The 400 for overrides of classes the baseline does not have. */
export function unknownOverridesError(fields: Record<string, string[]>): InvalidInputError {
  return new InvalidInputError(`Per-class settings name classes that are not in the baseline: ${Object.values(fields).flat().join(" ")}`, fields);
}

const LABELS: Record<string, string> = {
  s: "S",
  sL: "S_L",
  level: "model level",
  barrierScales: "barrier scaling",
  miller: "Miller factor",
  deviceRFactor: "device R factor",
  deviceCFactor: "device C factor",
  supplyV: "supply",
  k: "k",
  metal: "metal",
  aspectRatio: "aspect ratio",
  airGap: "air gap",
  lengthRule: "length rule",
  temperatureC: "temperature °C",
  barrierM: "barrier",
};

function show(v: unknown): string {
  if (v === null || v === undefined) return "—";
  if (typeof v === "boolean") return v ? "scales" : "fixed";
  if (typeof v === "number") return String(Number(v.toPrecision(6)));
  if (typeof v === "object" && "kind" in v) {
    const r = v as { kind: string; sL?: number; exponent?: number };
    return r.kind === "factor" ? `S_L = ${show(r.sL)}` : r.kind === "power" ? `S_L = S^${show(r.exponent)}` : r.kind === "fixed" ? "S_L = 1" : "S_L = S";
  }
  if (typeof v === "object" && "kGap" in v && "gapFraction" in v) return `k ${show(v.kGap)} over ${show(Number(v.gapFraction) * 100)}% of T`;
  return String(v);
}

/** Settings values compare by content (an air gap is an object). */
const same = (x: unknown, y: unknown) => x === y || JSON.stringify(x ?? null) === JSON.stringify(y ?? null);

/** Human summary of what changed between two settings (revision summaries): ["S 1 → 0.7", "M2: k 2.7 → 1.9"]. */
export function describeSettingsChange(a: ScenarioSettings, b: ScenarioSettings): string[] {
  const out: string[] = [];
  for (const key of Object.keys(LABELS) as (keyof ScenarioSettings)[]) {
    if (key === "overrides" || !(key in b || key in a)) continue;
    if (!same(a[key], b[key])) out.push(`${LABELS[key]} ${show(a[key])} → ${show(b[key])}`);
  }
  const names = new Set([...Object.keys(a.overrides ?? {}), ...Object.keys(b.overrides ?? {})]);
  for (const n of names) {
    const oa = (a.overrides?.[n] ?? {}) as Record<string, unknown>;
    const ob = (b.overrides?.[n] ?? {}) as Record<string, unknown>;
    const keys = new Set([...Object.keys(oa), ...Object.keys(ob)]);
    const parts: string[] = [];
    for (const k of keys) if (!same(oa[k], ob[k])) parts.push(`${LABELS[k] ?? k} ${show(oa[k])} → ${show(ob[k])}`);
    if (parts.length) out.push(`${n}: ${parts.join(", ")}`);
  }
  return out;
}

// ---------------------------------------------------------------------------------------------
// Shared steps (inside the caller's transaction)

async function checkOverrides(trx: Knex.Transaction, baselineId: string, settings: ScenarioSettings): Promise<void> {
  const rows: { name: string }[] = await trx("wire_classes").where({ baseline_id: baselineId }).select("name");
  const unknown = unknownOverrideFields(
    settings,
    rows.map((r) => r.name),
  );
  if (unknown) throw unknownOverridesError(unknown);
}

async function writeRevision(
  trx: Knex.Transaction,
  p: { scenarioId: string; version: number; userId: string; summary: string; name: string; notes: string; settings: ScenarioSettings },
): Promise<void> {
  await trx("scenario_revisions").insert({
    scenario_id: p.scenarioId,
    version: p.version,
    user_id: p.userId,
    at: Date.now(),
    summary: p.summary.slice(0, 500),
    name: p.name,
    notes: p.notes,
    settings: JSON.stringify(p.settings),
  });
}

/** The scenario as stored, in the team; StaleVersionError (version 0) when it is gone. */
async function current(trx: Knex.Transaction, id: string, teamId: string, version: number): Promise<Scenario> {
  const before = await getScenario(trx, id);
  if (!before) throw new StaleVersionError("This scenario", 0, version);
  if (before.teamId !== teamId) throw new NotFoundError("Scenario");
  return before;
}

/** The versioned update and its revision; returns the scenario as saved. */
async function save(
  trx: Knex.Transaction,
  before: Scenario,
  p: { userId: string; version: number; next: { name: string; notes: string; settings: ScenarioSettings }; summary?: string },
): Promise<Scenario> {
  const now = Date.now();
  const version = p.version + 1;
  const n = await trx("scenarios")
    .where({ id: before.id, version: p.version })
    .update({
      name: p.next.name,
      notes: p.next.notes,
      settings: JSON.stringify(p.next.settings),
      version,
      updated_by: p.userId,
      updated_at: now,
    });
  if (n === 0) throw new StaleVersionError("This scenario", before.version, p.version);
  let summary = p.summary;
  if (summary === undefined) {
    const changes: string[] = [];
    if (p.next.name !== before.name) changes.push(`renamed to "${p.next.name}"`);
    if (p.next.notes !== before.notes) changes.push("notes");
    changes.push(...describeSettingsChange(before.settings, p.next.settings));
    summary = changes.length ? `Changed ${changes.join("; ")}` : "Saved without changes";
  }
  await writeRevision(trx, { scenarioId: before.id, version, userId: p.userId, summary, ...p.next });
  return { ...before, ...p.next, version, updatedBy: p.userId, updatedAt: now };
}

// ---------------------------------------------------------------------------------------------

/** A new scenario on a baseline of the team, with its first revision and a "scenario.create" audit row. Returns its id. */
export async function createScenario(
  conn: Conn,
  p: {
    teamId: string;
    baselineId: string;
    userId: string;
    name: string;
    notes: string;
    settings: ScenarioSettings;
    isDemo?: boolean;
    summary?: string;
  },
): Promise<string> {
  const id = randomUUID();
  const now = Date.now();
  await conn.transaction(async (trx) => {
    // Another team's baseline answers exactly like a missing one.
    if (!(await trx("baselines").where({ id: p.baselineId, team_id: p.teamId }).first("id"))) throw new NotFoundError("Baseline");
    await checkOverrides(trx, p.baselineId, p.settings);
    if (await scenarioNameTaken(trx, p.baselineId, p.name)) throw new InvalidInputError(NAME_TAKEN, fieldError("name", NAME_TAKEN));
    await trx("scenarios").insert({
      id,
      team_id: p.teamId,
      baseline_id: p.baselineId,
      name: p.name,
      notes: p.notes,
      settings: JSON.stringify(p.settings),
      version: 1,
      is_demo: p.isDemo ? 1 : 0,
      created_by: p.userId,
      created_at: now,
      updated_by: p.userId,
      updated_at: now,
    });
    await writeRevision(trx, {
      scenarioId: id,
      version: 1,
      userId: p.userId,
      summary: p.summary ?? "Created",
      name: p.name,
      notes: p.notes,
      settings: p.settings,
    });
    await writeAudit(trx, {
      teamId: p.teamId,
      userId: p.userId,
      action: "scenario.create",
      entityType: "scenario",
      entityId: id,
      detail: { name: p.name, baselineId: p.baselineId },
    });
  });
  return id;
}

/**
 * Versioned save of name, notes and/or settings: `version` is the version the client loaded; a newer
 * stored version throws StaleVersionError. Returns the scenario as saved.
 */
export async function updateScenario(
  conn: Conn,
  p: { id: string; teamId: string; userId: string; version: number; name?: string; notes?: string; settings?: ScenarioSettings },
): Promise<Scenario> {
  return conn.transaction(async (trx) => {
    const before = await current(trx, p.id, p.teamId, p.version);
    if (p.settings) await checkOverrides(trx, before.baselineId, p.settings);
    if (p.name !== undefined && (await scenarioNameTaken(trx, before.baselineId, p.name, p.id)))
      throw new InvalidInputError(NAME_TAKEN, fieldError("name", NAME_TAKEN));
    const next = { name: p.name ?? before.name, notes: p.notes ?? before.notes, settings: p.settings ?? before.settings };
    const saved = await save(trx, before, { userId: p.userId, version: p.version, next });
    const fields = (["name", "notes", "settings"] as const).filter((k) => p[k] !== undefined);
    await writeAudit(trx, {
      teamId: p.teamId,
      userId: p.userId,
      action: "scenario.update",
      entityType: "scenario",
      entityId: p.id,
      detail: { version: saved.version, fields },
    });
    return saved;
  });
}

/**
 * Restore an old revision's name, notes and settings as a new revision (history is never rewritten).
 * The current name is kept when the old one now belongs to another scenario of the baseline.
 */
export async function restoreScenario(conn: Conn, p: { id: string; teamId: string; userId: string; version: number; revisionId: number }): Promise<Scenario> {
  return conn.transaction(async (trx) => {
    const rev = await getScenarioRevision(trx, p.id, p.revisionId);
    if (!rev) throw new NotFoundError("Revision");
    const before = await current(trx, p.id, p.teamId, p.version);
    const name = (await scenarioNameTaken(trx, before.baselineId, rev.name, p.id)) ? before.name : rev.name;
    const saved = await save(trx, before, {
      userId: p.userId,
      version: p.version,
      next: { name, notes: rev.notes, settings: rev.settings },
      summary: `Restored version ${rev.version}`,
    });
    await writeAudit(trx, {
      teamId: p.teamId,
      userId: p.userId,
      action: "scenario.update",
      entityType: "scenario",
      entityId: p.id,
      detail: { version: saved.version, restoredVersion: rev.version },
    });
    return saved;
  });
}

/**
 * Copy a scenario (settings and notes) onto the same baseline, with its first revision and a "scenario.create" audit
 * row naming the source; without a name, a free "X (copy)", "X (copy 2)", …; a given name that is taken is a 400 on
 * `name`. Returns the new id.
 */
export async function duplicateScenario(conn: Conn, p: { id: string; teamId: string; userId: string; name?: string }): Promise<string> {
  const id = randomUUID();
  const now = Date.now();
  await conn.transaction(async (trx) => {
    const src = await getScenario(trx, p.id);
    if (!src || src.teamId !== p.teamId) throw new NotFoundError("Scenario");
    const name = p.name ?? (await freeScenarioName(trx, src.baselineId, src.name));
    if (await scenarioNameTaken(trx, src.baselineId, name)) throw new InvalidInputError(NAME_TAKEN, fieldError("name", NAME_TAKEN));
    await trx("scenarios").insert({
      id,
      team_id: src.teamId,
      baseline_id: src.baselineId,
      name,
      notes: src.notes,
      settings: JSON.stringify(src.settings),
      version: 1,
      is_demo: 0,
      created_by: p.userId,
      created_at: now,
      updated_by: p.userId,
      updated_at: now,
    });
    await writeRevision(trx, {
      scenarioId: id,
      version: 1,
      userId: p.userId,
      summary: `Duplicated from "${src.name}"`,
      name,
      notes: src.notes,
      settings: src.settings,
    });
    await writeAudit(trx, {
      teamId: src.teamId,
      userId: p.userId,
      action: "scenario.create",
      entityType: "scenario",
      entityId: id,
      detail: { name, baselineId: src.baselineId, duplicatedFrom: src.id },
    });
  });
  return id;
}

/** Delete a scenario (its revisions cascade). */
export async function deleteScenario(conn: Conn, p: { id: string; teamId: string; userId: string }): Promise<void> {
  await conn.transaction(async (trx) => {
    const row = await trx("scenarios").where({ id: p.id, team_id: p.teamId }).first("name");
    if (!row) throw new NotFoundError("Scenario");
    await trx("scenarios").where({ id: p.id }).delete();
    await writeAudit(trx, {
      teamId: p.teamId,
      userId: p.userId,
      action: "scenario.delete",
      entityType: "scenario",
      entityId: p.id,
      detail: { name: row.name },
    });
  });
}

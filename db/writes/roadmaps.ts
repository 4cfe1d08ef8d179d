import "server-only";
import { randomUUID } from "node:crypto";
import type { Knex } from "knex";
import type { RoadmapStep, Technology, WireClass } from "@/lib/scaling";
import { writeAudit } from "@/db/audit";
import { InvalidInputError, NotFoundError, StaleVersionError, fieldError } from "@/db/errors";
import { getBaseline } from "@/db/queries/baselines";
import { getRoadmap, roadmapNameTaken, type Roadmap } from "@/db/queries/roadmaps";
import { getScenario } from "@/db/queries/scenarios";
import { listClassesWithHistograms } from "@/db/queries/wire-classes";

/**
 * Every write of the roadmap aggregate (issue 14): the roadmap row, its revisions and its audit rows. Each function is
 * one transaction that resolves what depends on stored data (steps made from a scenario, a free name, the version),
 * hands the resolved chain and the baseline's stored classes and technology to the caller's `compose` (the engine's
 * composeRoadmap: db/ does not import the engine; it throws RoadmapInputError for a class not in the baseline, a
 * target pitch that leaves no metal, …, a 400 through lib/api.ts), bumps the version, writes the revision and the
 * audit row; on any error nothing is stored.
 * Steps arrive validated (lib/validation/roadmap.ts) with undefined fields dropped.
 */

type Conn = Knex | Knex.Transaction;

/** The engine's check of a chain against its baseline (callers pass lib/scaling composeRoadmap); throws on bad steps. */
export type ComposeCheck = (p: { classes: WireClass[]; technology: Technology; steps: RoadmapStep[] }) => unknown;

const NAME_TAKEN = "A roadmap with this name already exists on this baseline.";

const isEmpty = (o: object | undefined) => !o || Object.keys(o).length === 0;

/**
 * Steps as stored: a step with `fromScenarioId` and no settings of its own (absent or {}) takes that scenario's
 * settings (it must be of the same team and the same baseline, else a 400 on `steps.N.fromScenarioId`); with settings
 * of its own, those are kept and `fromScenarioId` stays as where the step came from (checked the same way, unless the
 * stored roadmap already named that source).
 */
async function resolveSteps(
  trx: Knex.Transaction,
  teamId: string,
  baselineId: string,
  steps: readonly RoadmapStep[],
  stored: readonly RoadmapStep[] = [],
): Promise<RoadmapStep[]> {
  // On a save, a step that keeps its own settings and a source the roadmap already had needs no lookup: the source
  // scenario may have been deleted since, and the roadmap must stay savable.
  const known = new Set(stored.flatMap((st) => (st.fromScenarioId ? [st.fromScenarioId] : [])));
  const out: RoadmapStep[] = [];
  for (const [i, step] of steps.entries()) {
    if (step.fromScenarioId === undefined) {
      out.push({ name: step.name, settings: step.settings ?? {} });
      continue;
    }
    if (!isEmpty(step.settings) && known.has(step.fromScenarioId)) {
      out.push({ name: step.name, settings: step.settings, fromScenarioId: step.fromScenarioId });
      continue;
    }
    const field = `steps.${i}.fromScenarioId`;
    const sc = await getScenario(trx, step.fromScenarioId);
    if (!sc || sc.teamId !== teamId) {
      const m = `Step ${i + 1} ("${step.name}"): no scenario with this id in the team.`;
      throw new InvalidInputError(m, fieldError(field, m));
    }
    if (sc.baselineId !== baselineId) {
      const m = `Step ${i + 1} ("${step.name}"): scenario "${sc.name}" is on another baseline than the roadmap.`;
      throw new InvalidInputError(m, fieldError(field, m));
    }
    out.push({ name: step.name, settings: isEmpty(step.settings) ? structuredClone(sc.settings) : step.settings, fromScenarioId: sc.id });
  }
  return out;
}

/** The chain composed against the stored baseline by the caller's engine check (throws RoadmapInputError on bad steps). */
async function checkComposes(trx: Knex.Transaction, baselineId: string, steps: RoadmapStep[], compose: ComposeCheck): Promise<void> {
  const baseline = await getBaseline(trx, baselineId);
  if (!baseline) throw new NotFoundError("Baseline");
  const stored = await listClassesWithHistograms(trx, baselineId);
  const classes: WireClass[] = stored.map(({ id: _i, position: _p, histogramBins: _h, ...c }) => c);
  compose({ classes, technology: baseline.technology, steps });
}

async function writeRevision(
  trx: Knex.Transaction,
  p: { roadmapId: string; version: number; userId: string; summary: string; name: string; steps: RoadmapStep[] },
) {
  await trx("roadmap_revisions").insert({
    roadmap_id: p.roadmapId,
    version: p.version,
    user_id: p.userId,
    at: Date.now(),
    summary: p.summary.slice(0, 500),
    name: p.name,
    steps: JSON.stringify(p.steps),
  });
}

/** Human summary of what changed between two chains (revision summaries): ["N2 (step 2) changed", "added N3 (step 3)"]. */
export function describeStepsChange(a: readonly RoadmapStep[], b: readonly RoadmapStep[]): string[] {
  const out: string[] = [];
  for (let i = 0; i < Math.max(a.length, b.length); i++) {
    const x = a[i];
    const y = b[i];
    if (x && !y) out.push(`removed ${x.name} (step ${i + 1})`);
    else if (!x && y) out.push(`added ${y.name} (step ${i + 1})`);
    else if (x && y && JSON.stringify(x) !== JSON.stringify(y))
      out.push(x.name === y.name ? `${y.name} (step ${i + 1}) changed` : `step ${i + 1} ${x.name} → ${y.name}`);
  }
  return out;
}

/** A new roadmap on a baseline of the team, with its first revision and a "roadmap.create" audit row. Returns its id. */
export async function createRoadmap(
  conn: Conn,
  p: {
    teamId: string;
    baselineId: string;
    userId: string;
    name: string;
    steps: readonly RoadmapStep[];
    compose: ComposeCheck;
    isDemo?: boolean;
    summary?: string;
  },
): Promise<string> {
  const id = randomUUID();
  const now = Date.now();
  await conn.transaction(async (trx) => {
    // Another team's baseline answers exactly like a missing one.
    if (!(await trx("baselines").where({ id: p.baselineId, team_id: p.teamId }).first("id"))) throw new NotFoundError("Baseline");
    if (await roadmapNameTaken(trx, p.baselineId, p.name)) throw new InvalidInputError(NAME_TAKEN, fieldError("name", NAME_TAKEN));
    const steps = await resolveSteps(trx, p.teamId, p.baselineId, p.steps);
    await checkComposes(trx, p.baselineId, steps, p.compose);
    await trx("roadmaps").insert({
      id,
      team_id: p.teamId,
      baseline_id: p.baselineId,
      name: p.name,
      steps: JSON.stringify(steps),
      version: 1,
      is_demo: p.isDemo ? 1 : 0,
      created_by: p.userId,
      created_at: now,
      updated_by: p.userId,
      updated_at: now,
    });
    await writeRevision(trx, { roadmapId: id, version: 1, userId: p.userId, summary: p.summary ?? "Created", name: p.name, steps });
    await writeAudit(trx, {
      teamId: p.teamId,
      userId: p.userId,
      action: "roadmap.create",
      entityType: "roadmap",
      entityId: id,
      detail: { name: p.name, baselineId: p.baselineId, steps: steps.length },
    });
  });
  return id;
}

/**
 * Versioned save of the name and/or the steps: `version` is the version the client loaded; a newer stored version
 * throws StaleVersionError (version 0 when the roadmap is gone). Returns the roadmap as saved.
 */
export async function updateRoadmap(
  conn: Conn,
  p: { id: string; teamId: string; userId: string; version: number; name?: string; steps?: readonly RoadmapStep[]; compose: ComposeCheck },
): Promise<Roadmap> {
  return conn.transaction(async (trx) => {
    const before = await getRoadmap(trx, p.id);
    if (!before) throw new StaleVersionError("This roadmap", 0, p.version);
    if (before.teamId !== p.teamId) throw new NotFoundError("Roadmap");
    if (before.version !== p.version) throw new StaleVersionError("This roadmap", before.version, p.version);
    if (p.name !== undefined && (await roadmapNameTaken(trx, before.baselineId, p.name, p.id)))
      throw new InvalidInputError(NAME_TAKEN, fieldError("name", NAME_TAKEN));
    const steps = p.steps ? await resolveSteps(trx, p.teamId, before.baselineId, p.steps, before.steps) : before.steps;
    if (p.steps) await checkComposes(trx, before.baselineId, steps, p.compose);
    const name = p.name ?? before.name;
    const now = Date.now();
    const version = p.version + 1;
    const n = await trx("roadmaps")
      .where({ id: p.id, version: p.version })
      .update({ name, steps: JSON.stringify(steps), version, updated_by: p.userId, updated_at: now });
    if (n === 0) throw new StaleVersionError("This roadmap", before.version, p.version);
    const changes: string[] = [];
    if (name !== before.name) changes.push(`renamed to "${name}"`);
    changes.push(...describeStepsChange(before.steps, steps));
    await writeRevision(trx, {
      roadmapId: p.id,
      version,
      userId: p.userId,
      summary: changes.length ? `Changed ${changes.join("; ")}` : "Saved without changes",
      name,
      steps,
    });
    const fields = (["name", "steps"] as const).filter((k) => p[k] !== undefined);
    await writeAudit(trx, {
      teamId: p.teamId,
      userId: p.userId,
      action: "roadmap.update",
      entityType: "roadmap",
      entityId: p.id,
      detail: { version, fields },
    });
    return { ...before, name, steps, version, updatedBy: p.userId, updatedAt: now };
  });
}

/** Delete a roadmap (its revisions cascade; reports that froze it keep their frozen copy). */
export async function deleteRoadmap(conn: Conn, p: { id: string; teamId: string; userId: string }): Promise<void> {
  await conn.transaction(async (trx) => {
    const row = await trx("roadmaps").where({ id: p.id, team_id: p.teamId }).first("name");
    if (!row) throw new NotFoundError("Roadmap");
    await trx("roadmaps").where({ id: p.id }).delete();
    await writeAudit(trx, {
      teamId: p.teamId,
      userId: p.userId,
      action: "roadmap.delete",
      entityType: "roadmap",
      entityId: p.id,
      detail: { name: row.name },
    });
  });
}

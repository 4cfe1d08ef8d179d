import { afterAll, beforeAll, describe, expect, it } from "vitest";
import type { Knex } from "knex";
import { InvalidInputError, NotFoundError, StaleVersionError } from "@/db/errors";
import { getScenario, listScenarioRevisions } from "@/db/queries/scenarios";
import { createBaseline } from "@/db/writes/baselines";
import { createScenario, deleteScenario, describeSettingsChange, restoreScenario, updateScenario } from "@/db/writes/scenarios";
import { DEFAULT_TECHNOLOGY, type ScenarioSettings } from "@/lib/scaling";
import { defaultScenarioSettings } from "@/lib/workspace/settings";
import { auditRows, counts, ownerWithTeam, refuseInsert, tempDb, wireClass } from "../helpers/temp-db";

let db: Knex;
let close: () => Promise<void>;
beforeAll(async () => ({ db, close } = await tempDb("writes-scenarios")));
afterAll(async () => close());

const TABLES = ["scenarios", "scenario_revisions", "audit_log"] as const;
const base: ScenarioSettings = defaultScenarioSettings(DEFAULT_TECHNOLOGY);

async function setup() {
  const o = await ownerWithTeam(db);
  const baselineId = await createBaseline(db, {
    teamId: o.teamId,
    userId: o.userId,
    baseline: { name: "B", technology: DEFAULT_TECHNOLOGY, classes: [wireClass("M1"), wireClass("M2")] },
  });
  const id = await createScenario(db, { teamId: o.teamId, baselineId, userId: o.userId, name: "Shrink", notes: "", settings: base });
  return { ...o, baselineId, id };
}

describe("db/writes/scenarios", () => {
  it("create: the scenario, revision 1 and scenario.create commit together", async () => {
    const s = await setup();
    expect(await getScenario(db, s.id)).toMatchObject({ name: "Shrink", version: 1, teamId: s.teamId, baselineId: s.baselineId });
    expect((await listScenarioRevisions(db, s.id)).map((r) => [r.version, r.summary])).toEqual([[1, "Created"]]);
    expect(await auditRows(db, { entity_id: s.id })).toEqual([
      {
        action: "scenario.create",
        entity_type: "scenario",
        entity_id: s.id,
        user_id: s.userId,
        team_id: s.teamId,
        detail: { name: "Shrink", baselineId: s.baselineId },
      },
    ]);
  });

  it("create refuses overrides of unknown classes, a taken name and another team's baseline, storing nothing", async () => {
    const s = await setup();
    const other = await ownerWithTeam(db);
    const before = await counts(db, TABLES);
    const p = { teamId: s.teamId, baselineId: s.baselineId, userId: s.userId, notes: "" };
    const unknown = await createScenario(db, { ...p, name: "Other", settings: { ...base, overrides: { M9: { k: 2 } } } }).catch((e: unknown) => e);
    expect(unknown).toBeInstanceOf(InvalidInputError);
    expect((unknown as InvalidInputError).fields).toEqual({ "settings.overrides.M9": ['No class named "M9" in this baseline.'] });
    await expect(createScenario(db, { ...p, name: "SHRINK", settings: base })).rejects.toThrow("A scenario with this name already exists on this baseline.");
    await expect(createScenario(db, { ...p, teamId: other.teamId, name: "Theirs", settings: base })).rejects.toBeInstanceOf(NotFoundError);
    expect(await counts(db, TABLES)).toEqual(before);
  });

  it("update: bumps the version, describes the change in revision 2, audits the fields", async () => {
    const s = await setup();
    const saved = await updateScenario(db, {
      id: s.id,
      teamId: s.teamId,
      userId: s.userId,
      version: 1,
      notes: "why",
      settings: { ...base, s: 0.7, overrides: { M2: { k: 1.9 } } },
    });
    expect(saved).toMatchObject({ version: 2, notes: "why", updatedBy: s.userId });
    expect(await getScenario(db, s.id)).toMatchObject({ version: 2, notes: "why", settings: { s: 0.7 } });
    expect((await listScenarioRevisions(db, s.id))[0]).toMatchObject({ version: 2, summary: "Changed notes; S 1 → 0.7; M2: k — → 1.9" });
    expect((await auditRows(db, { entity_id: s.id, action: "scenario.update" })).map((r) => r.detail)).toEqual([{ version: 2, fields: ["notes", "settings"] }]);
  });

  it("update with a stale version: StaleVersionError with the current version, nothing written", async () => {
    const s = await setup();
    await updateScenario(db, { id: s.id, teamId: s.teamId, userId: s.userId, version: 1, notes: "first" });
    const before = await counts(db, TABLES);
    const err = await updateScenario(db, { id: s.id, teamId: s.teamId, userId: s.userId, version: 1, notes: "late" }).catch((e: unknown) => e);
    expect(err).toBeInstanceOf(StaleVersionError);
    expect(err).toMatchObject({ what: "This scenario", currentVersion: 2, yourVersion: 1 });
    expect(await counts(db, TABLES)).toEqual(before);
    expect((await getScenario(db, s.id))!.notes).toBe("first");
  });

  it("update of a deleted scenario is stale (version 0); bad overrides and taken names are checked inside the write", async () => {
    const s = await setup();
    await createScenario(db, { teamId: s.teamId, baselineId: s.baselineId, userId: s.userId, name: "Taken", notes: "", settings: base });
    const before = await counts(db, TABLES);
    await expect(updateScenario(db, { id: s.id, teamId: s.teamId, userId: s.userId, version: 1, name: "taken" })).rejects.toBeInstanceOf(InvalidInputError);
    await expect(
      updateScenario(db, {
        id: s.id,
        teamId: s.teamId,
        userId: s.userId,
        version: 1,
        settings: { ...base, overrides: { nope: { s: 0.5 } } },
      }),
    ).rejects.toBeInstanceOf(InvalidInputError);
    await expect(updateScenario(db, { id: "gone", teamId: s.teamId, userId: s.userId, version: 3 })).rejects.toMatchObject({
      currentVersion: 0,
      yourVersion: 3,
    });
    expect(await counts(db, TABLES)).toEqual(before);
  });

  it("update: the audit insert refused at the end rolls back the bump and the revision", async () => {
    const s = await setup();
    const before = await counts(db, TABLES);
    const undo = await refuseInsert(db, "audit_log", "new.action = 'scenario.update'");
    try {
      await expect(updateScenario(db, { id: s.id, teamId: s.teamId, userId: s.userId, version: 1, notes: "lost" })).rejects.toThrow(/refused by the test/);
    } finally {
      await undo();
    }
    expect(await counts(db, TABLES)).toEqual(before);
    expect(await getScenario(db, s.id)).toMatchObject({ version: 1, notes: "" });
  });

  it("restore: an old revision becomes a new one (history kept), audited with the restored version", async () => {
    const s = await setup();
    await updateScenario(db, { id: s.id, teamId: s.teamId, userId: s.userId, version: 1, name: "Renamed", settings: { ...base, s: 0.5 } });
    const first = (await listScenarioRevisions(db, s.id)).find((r) => r.version === 1)!;
    // the old name now belongs to another scenario: the current name is kept
    await createScenario(db, { teamId: s.teamId, baselineId: s.baselineId, userId: s.userId, name: "Shrink", notes: "", settings: base });
    await expect(restoreScenario(db, { id: s.id, teamId: s.teamId, userId: s.userId, version: 1, revisionId: first.id })).rejects.toBeInstanceOf(
      StaleVersionError,
    );
    await expect(restoreScenario(db, { id: s.id, teamId: s.teamId, userId: s.userId, version: 2, revisionId: 999_999 })).rejects.toThrow("Revision not found.");
    const restored = await restoreScenario(db, { id: s.id, teamId: s.teamId, userId: s.userId, version: 2, revisionId: first.id });
    expect(restored).toMatchObject({ version: 3, name: "Renamed", settings: { s: 1 } });
    expect((await listScenarioRevisions(db, s.id)).map((r) => [r.version, r.summary.split(";")[0]])).toEqual([
      [3, "Restored version 1"],
      [2, 'Changed renamed to "Renamed"'],
      [1, "Created"],
    ]);
    expect((await auditRows(db, { entity_id: s.id, action: "scenario.update" })).map((r) => r.detail)).toEqual([
      { version: 2, fields: ["name", "settings"] },
      { version: 3, restoredVersion: 1 },
    ]);
  });

  it("delete: removes the scenario and its revisions with a scenario.delete row; another team's id is a NotFoundError", async () => {
    const s = await setup();
    const other = await ownerWithTeam(db);
    await expect(deleteScenario(db, { id: s.id, teamId: other.teamId, userId: other.userId })).rejects.toBeInstanceOf(NotFoundError);
    await deleteScenario(db, { id: s.id, teamId: s.teamId, userId: s.userId });
    expect(await getScenario(db, s.id)).toBeUndefined();
    expect(await listScenarioRevisions(db, s.id)).toEqual([]);
    expect((await auditRows(db, { entity_id: s.id, action: "scenario.delete" })).map((r) => r.detail)).toEqual([{ name: "Shrink" }]);
  });

  it("describeSettingsChange names each changed setting and override", () => {
    expect(describeSettingsChange(base, { ...base, level: "fringe", barrierScales: true, k: 2.2 })).toEqual([
      "model level full → fringe",
      "barrier scaling fixed → scales",
      "k — → 2.2",
    ]);
    expect(describeSettingsChange(base, base)).toEqual([]);
    // issue 14: length rules (global and per class) and the scenario's temperature
    expect(
      describeSettingsChange(base, {
        ...base,
        lengthRule: { kind: "power", exponent: 0.5 },
        temperatureC: 105,
        overrides: { M2: { lengthRule: { kind: "factor", sL: 1.2 } } },
      }),
    ).toEqual(["length rule — → S_L = S^0.5", "temperature °C — → 105", "M2: length rule — → S_L = 1.2"]);
  });
});

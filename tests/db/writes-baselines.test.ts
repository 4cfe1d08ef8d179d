import { afterAll, beforeAll, describe, expect, it } from "vitest";
import type { Knex } from "knex";
import { ImportConflictError, InvalidInputError, NotFoundError, StaleVersionError } from "@/db/errors";
import { getBaseline, listBaselineRevisions } from "@/db/queries/baselines";
import { listClasses, listClassesWithHistograms } from "@/db/queries/wire-classes";
import {
  createBaseline,
  createBaselineFromImport,
  deleteBaseline,
  duplicateBaseline,
  importHistograms,
  importWireClasses,
  replaceBaselineClasses,
  updateBaseline,
} from "@/db/writes/baselines";
import { DEFAULT_TECHNOLOGY } from "@/lib/scaling";
import { auditRows, counts, ownerWithTeam, refuseInsert, tempDb, wireClass } from "../helpers/temp-db";

let db: Knex;
let close: () => Promise<void>;
beforeAll(async () => ({ db, close } = await tempDb("writes-baselines")));
afterAll(async () => close());

const TABLES = ["baselines", "wire_classes", "class_histograms", "baseline_revisions", "audit_log"] as const;

async function newBaseline(name = "Skua") {
  const o = await ownerWithTeam(db);
  const id = await createBaseline(db, {
    teamId: o.teamId,
    userId: o.userId,
    baseline: {
      name,
      technology: DEFAULT_TECHNOLOGY,
      classes: [wireClass("local"), wireClass("global", { tier: "global", widthM: 4e-7 })],
    },
  });
  return { ...o, id };
}

const version = async (id: string) => (await getBaseline(db, id))?.version;

describe("db/writes/baselines: create", () => {
  it("stores the baseline, its classes, revision 1 and a baseline.create audit row together", async () => {
    const b = await newBaseline();
    expect(await version(b.id)).toBe(1);
    expect((await listClasses(db, b.id)).map((c) => c.name)).toEqual(["local", "global"]);
    expect((await listBaselineRevisions(db, b.id)).map((r) => [r.version, r.summary])).toEqual([[1, "Created with 2 classes"]]);
    expect(await auditRows(db, { entity_id: b.id })).toEqual([
      {
        action: "baseline.create",
        entity_type: "baseline",
        entity_id: b.id,
        user_id: b.userId,
        team_id: b.teamId,
        detail: { name: "Skua", classes: 2 },
      },
    ]);
  });

  it("stores seed histograms by class name in the same transaction", async () => {
    const o = await ownerWithTeam(db);
    const id = await createBaseline(db, {
      teamId: o.teamId,
      userId: o.userId,
      baseline: {
        name: "Seeded",
        technology: DEFAULT_TECHNOLOGY,
        classes: [wireClass("local"), wireClass("global")],
        histograms: {
          global: [
            { lengthM: 2e-6, count: 3 },
            { lengthM: 1e-6, count: 5 },
          ],
        },
      },
    });
    const classes = await listClassesWithHistograms(db, id);
    expect(classes.map((c) => c.histogram ?? null)).toEqual([
      null,
      [
        { lengthM: 1e-6, count: 5 },
        { lengthM: 2e-6, count: 3 },
      ],
    ]);
  });

  it("a taken name (any case) is an InvalidInputError on `name` and stores nothing", async () => {
    const b = await newBaseline("Taken");
    const before = await counts(db, TABLES);
    const err = await createBaseline(db, {
      teamId: b.teamId,
      userId: b.userId,
      baseline: { name: "TAKEN", technology: DEFAULT_TECHNOLOGY },
    }).catch((e: unknown) => e);
    expect(err).toBeInstanceOf(InvalidInputError);
    expect((err as InvalidInputError).fields).toEqual({ name: ["A baseline with this name already exists in the team."] });
    expect(await counts(db, TABLES)).toEqual(before);
  });

  it("a failure in the middle (the revision insert refused) rolls back the baseline and its classes", async () => {
    const o = await ownerWithTeam(db);
    const before = await counts(db, TABLES);
    const undo = await refuseInsert(db, "baseline_revisions", "1");
    try {
      await expect(
        createBaseline(db, {
          teamId: o.teamId,
          userId: o.userId,
          baseline: { name: "Doomed", technology: DEFAULT_TECHNOLOGY, classes: [wireClass("local")] },
        }),
      ).rejects.toThrow(/refused by the test/);
    } finally {
      await undo();
    }
    expect(await counts(db, TABLES)).toEqual(before);
  });
});

describe("db/writes/baselines: versioned edits", () => {
  it("update: the loaded version bumps it, writes revision 2 and a baseline.update audit row", async () => {
    const b = await newBaseline();
    expect(
      await updateBaseline(db, {
        id: b.id,
        teamId: b.teamId,
        userId: b.userId,
        version: 1,
        description: "edited",
        technology: { ...DEFAULT_TECHNOLOGY, supplyV: 0.7 },
      }),
    ).toBe(2);
    const stored = (await getBaseline(db, b.id))!;
    expect([stored.version, stored.description, stored.technology.supplyV]).toEqual([2, "edited", 0.7]);
    expect((await listBaselineRevisions(db, b.id))[0]).toMatchObject({ version: 2, summary: "Changed description; technology: supply" });
    const audit = await auditRows(db, { entity_id: b.id, action: "baseline.update" });
    expect(audit.map((r) => r.detail)).toEqual([{ version: 2, fields: ["description", "technology"] }]);
  });

  it("update with a stale version throws StaleVersionError (current version) and writes nothing", async () => {
    const b = await newBaseline();
    await updateBaseline(db, { id: b.id, teamId: b.teamId, userId: b.userId, version: 1, description: "first" });
    const before = await counts(db, TABLES);
    const err = await updateBaseline(db, { id: b.id, teamId: b.teamId, userId: b.userId, version: 1, description: "late" }).catch((e: unknown) => e);
    expect(err).toBeInstanceOf(StaleVersionError);
    expect(err).toMatchObject({ currentVersion: 2, yourVersion: 1 });
    expect(await counts(db, TABLES)).toEqual(before);
    expect((await getBaseline(db, b.id))!.description).toBe("first");
  });

  it("update: a name taken by another baseline is an InvalidInputError; the baseline's own name is fine", async () => {
    const b = await newBaseline("One");
    await createBaseline(db, { teamId: b.teamId, userId: b.userId, baseline: { name: "Two", technology: DEFAULT_TECHNOLOGY } });
    await expect(updateBaseline(db, { id: b.id, teamId: b.teamId, userId: b.userId, version: 1, name: "two" })).rejects.toBeInstanceOf(InvalidInputError);
    expect(await version(b.id)).toBe(1);
    expect(await updateBaseline(db, { id: b.id, teamId: b.teamId, userId: b.userId, version: 1, name: "ONE" })).toBe(2);
  });

  it("update: the audit insert refused at the end rolls back the version bump and the revision", async () => {
    const b = await newBaseline();
    const before = await counts(db, TABLES);
    const undo = await refuseInsert(db, "audit_log", "new.action = 'baseline.update'");
    try {
      await expect(updateBaseline(db, { id: b.id, teamId: b.teamId, userId: b.userId, version: 1, description: "lost" })).rejects.toThrow(
        /refused by the test/,
      );
    } finally {
      await undo();
    }
    expect(await counts(db, TABLES)).toEqual(before);
    expect(await getBaseline(db, b.id)).toMatchObject({ version: 1, description: "" });
  });

  it("class table: keeps ids (and histograms) of kept classes, bumps the version, writes the revision and baseline.classes_update", async () => {
    const b = await newBaseline();
    const [local] = await listClasses(db, b.id);
    await importHistograms(db, {
      baselineId: b.id,
      teamId: b.teamId,
      userId: b.userId,
      mode: "replace",
      classNames: ["local", "global"],
      histograms: [{ classIndex: 0, lengthsM: Float64Array.from([1e-6]), counts: Float64Array.from([4]) }],
      summary: "h",
      detail: {},
    });
    const v = (await version(b.id))!;
    expect(
      await replaceBaselineClasses(db, {
        id: b.id,
        teamId: b.teamId,
        userId: b.userId,
        version: v,
        classes: [{ ...wireClass("local2"), id: local!.id }, wireClass("fresh")],
      }),
    ).toBe(v + 1);
    const after = await listClasses(db, b.id);
    expect(after.map((c) => [c.name, c.histogramBins])).toEqual([
      ["local2", 1],
      ["fresh", 0],
    ]);
    expect(after[0]!.id).toBe(local!.id);
    expect((await listBaselineRevisions(db, b.id))[0]!.summary).toBe("Edited class table (2 classes; added local2, fresh; removed local, global)");
    expect((await auditRows(db, { entity_id: b.id, action: "baseline.classes_update" })).map((r) => r.detail)).toEqual([{ version: v + 1, classes: 2 }]);
  });

  it("class table with a stale version: StaleVersionError, classes untouched", async () => {
    const b = await newBaseline();
    const classesBefore = await listClasses(db, b.id);
    const before = await counts(db, TABLES);
    await expect(replaceBaselineClasses(db, { id: b.id, teamId: b.teamId, userId: b.userId, version: 5, classes: [wireClass("x")] })).rejects.toMatchObject({
      currentVersion: 1,
      yourVersion: 5,
    });
    expect(await counts(db, TABLES)).toEqual(before);
    expect(await listClasses(db, b.id)).toEqual(classesBefore);
  });
});

describe("db/writes/baselines: duplicate and delete", () => {
  it("duplicate copies classes under a free name, revision 1 and a baseline.create row naming the source", async () => {
    const b = await newBaseline("Src");
    const copy = await duplicateBaseline(db, { id: b.id, teamId: b.teamId, userId: b.userId });
    expect((await getBaseline(db, copy))!.name).toBe("Src (copy)");
    const again = await duplicateBaseline(db, { id: b.id, teamId: b.teamId, userId: b.userId });
    expect((await getBaseline(db, again))!.name).toBe("Src (copy 2)");
    expect((await listClasses(db, copy)).map((c) => c.name)).toEqual(["local", "global"]);
    expect((await listBaselineRevisions(db, copy)).map((r) => r.summary)).toEqual(['Duplicated from "Src"']);
    expect((await auditRows(db, { entity_id: copy })).map((r) => [r.action, r.detail])).toEqual([
      ["baseline.create", { name: "Src (copy)", duplicatedFrom: b.id }],
    ]);
  });

  it("duplicate into another team is a NotFoundError; a taken name an InvalidInputError; neither stores anything", async () => {
    const b = await newBaseline("Mine");
    const other = await ownerWithTeam(db);
    const before = await counts(db, TABLES);
    await expect(duplicateBaseline(db, { id: b.id, teamId: other.teamId, userId: other.userId })).rejects.toBeInstanceOf(NotFoundError);
    await expect(duplicateBaseline(db, { id: b.id, teamId: b.teamId, userId: b.userId, name: "mine" })).rejects.toBeInstanceOf(InvalidInputError);
    expect(await counts(db, TABLES)).toEqual(before);
  });

  it("delete removes the baseline with its classes and writes baseline.delete; another team's id is a NotFoundError", async () => {
    const b = await newBaseline("Gone");
    const other = await ownerWithTeam(db);
    await expect(deleteBaseline(db, { id: b.id, teamId: other.teamId, userId: other.userId })).rejects.toBeInstanceOf(NotFoundError);
    expect(await getBaseline(db, b.id)).toBeDefined();
    await deleteBaseline(db, { id: b.id, teamId: b.teamId, userId: b.userId });
    expect(await getBaseline(db, b.id)).toBeUndefined();
    expect(await listClasses(db, b.id)).toEqual([]);
    expect((await auditRows(db, { entity_id: b.id, action: "baseline.delete" })).map((r) => r.detail)).toEqual([{ name: "Gone" }]);
  });
});

describe("db/writes/baselines: CSV imports", () => {
  it("a new baseline from an import: revision 1 and baseline.created_from_import; a taken name is an ImportConflictError", async () => {
    const o = await ownerWithTeam(db);
    const p = {
      teamId: o.teamId,
      userId: o.userId,
      name: "From CSV",
      technology: DEFAULT_TECHNOLOGY,
      classes: [wireClass("m1")],
      summary: "Created from a CSV import with 1 classes",
      detail: { rows: 1 },
    };
    const id = await createBaselineFromImport(db, p);
    expect(await getBaseline(db, id)).toMatchObject({ name: "From CSV", version: 1, technology: DEFAULT_TECHNOLOGY });
    expect((await auditRows(db, { entity_id: id })).map((r) => [r.action, r.detail])).toEqual([["baseline.created_from_import", { rows: 1 }]]);
    const before = await counts(db, TABLES);
    await expect(createBaselineFromImport(db, { ...p, name: "from csv" })).rejects.toBeInstanceOf(ImportConflictError);
    expect(await counts(db, TABLES)).toEqual(before);
  });

  it("classes import: merge updates and appends, bumps the version with a revision and baseline.classes_imported", async () => {
    const b = await newBaseline();
    const r = await importWireClasses(db, {
      baselineId: b.id,
      teamId: b.teamId,
      userId: b.userId,
      mode: "merge",
      classes: [wireClass("GLOBAL", { k: 2.2 }), wireClass("new")],
      summary: "merged",
      detail: { mode: "merge" },
      maxClasses: 200,
    });
    expect(r).toEqual({ version: 2, classCount: 3 });
    expect((await listClasses(db, b.id)).map((c) => [c.name, c.k])).toEqual([
      ["local", 2.7],
      ["GLOBAL", 2.2],
      ["new", 2.7],
    ]);
    expect((await listBaselineRevisions(db, b.id))[0]).toMatchObject({ version: 2, summary: "merged" });
    expect((await auditRows(db, { entity_id: b.id, action: "baseline.classes_imported" })).map((r) => r.detail)).toEqual([{ mode: "merge" }]);
  });

  it("classes import over the class limit, or into a deleted baseline, is an ImportConflictError that stores nothing", async () => {
    const b = await newBaseline();
    const before = await counts(db, TABLES);
    await expect(
      importWireClasses(db, {
        baselineId: b.id,
        teamId: b.teamId,
        userId: b.userId,
        mode: "merge",
        classes: [wireClass("a"), wireClass("b")],
        summary: "s",
        detail: {},
        maxClasses: 3,
      }),
    ).rejects.toThrow("A baseline holds at most 3 classes; this import would make 4.");
    await expect(
      importWireClasses(db, {
        baselineId: "no-such-baseline",
        teamId: b.teamId,
        userId: b.userId,
        mode: "replace",
        classes: [wireClass("a")],
        summary: "s",
        detail: {},
        maxClasses: 200,
      }),
    ).rejects.toThrow("The baseline was deleted during the upload.");
    expect(await counts(db, TABLES)).toEqual(before);
  });

  it("histogram import: the audit insert refused rolls back the histograms, the bump and the revision", async () => {
    const b = await newBaseline();
    const before = await counts(db, TABLES);
    const undo = await refuseInsert(db, "audit_log", "new.action = 'baseline.histograms_imported'");
    try {
      await expect(
        importHistograms(db, {
          baselineId: b.id,
          teamId: b.teamId,
          userId: b.userId,
          mode: "replace",
          classNames: ["local", "global"],
          histograms: [{ classIndex: 1, lengthsM: Float64Array.from([1e-6, 2e-6]), counts: Float64Array.from([1, 2]) }],
          summary: "h",
          detail: {},
        }),
      ).rejects.toThrow(/refused by the test/);
    } finally {
      await undo();
    }
    expect(await counts(db, TABLES)).toEqual(before);
    expect(await version(b.id)).toBe(1);
  });
});

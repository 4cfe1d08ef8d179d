import { afterAll, beforeAll, describe, expect, it } from "vitest";
import type { Knex } from "knex";
import { NotFoundError } from "@/db/errors";
import { getReport, listReportVersions } from "@/db/queries/reports";
import { listShareLinks, resolveShareToken } from "@/db/queries/share-links";
import { createBaseline } from "@/db/writes/baselines";
import { deleteReport } from "@/db/writes/reports";
import { createScenario } from "@/db/writes/scenarios";
import { createShareLink, revokeShareLink } from "@/db/writes/share-links";
import { DEFAULT_TECHNOLOGY } from "@/lib/scaling";
import { composeReport, findReport, refreshReport } from "@/lib/reports/service";
import { defaultScenarioSettings } from "@/lib/workspace/settings";
import { auditRows, counts, ownerWithTeam, refuseInsert, tempDb, wireClass } from "../helpers/temp-db";

let db: Knex;
let close: () => Promise<void>;
beforeAll(async () => ({ db, close } = await tempDb("writes-reports")));
afterAll(async () => close());

const TABLES = ["reports", "share_links", "audit_log"] as const;

async function setup() {
  const o = await ownerWithTeam(db);
  const baselineId = await createBaseline(db, {
    teamId: o.teamId,
    userId: o.userId,
    baseline: { name: "B", technology: DEFAULT_TECHNOLOGY, classes: [wireClass("M1"), wireClass("M2", { widthM: 8e-8 })] },
  });
  const settings = defaultScenarioSettings(DEFAULT_TECHNOLOGY);
  const a = await createScenario(db, { teamId: o.teamId, baselineId, userId: o.userId, name: "A", notes: "", settings });
  const b = await createScenario(db, {
    teamId: o.teamId,
    baselineId,
    userId: o.userId,
    name: "B",
    notes: "",
    settings: { ...settings, s: 0.7 },
  });
  const input = { baselineId, scenarioIds: [a, b], title: "Options", audienceNote: "" };
  return { ...o, baselineId, scenarioIds: [a, b], input };
}

describe("db/writes/reports (through lib/reports/service)", () => {
  it("compose stores version 1 with report.create; refresh stores version 2 of the series with report.refresh", async () => {
    const s = await setup();
    const v1 = await composeReport(db, { teamId: s.teamId, userId: s.userId, input: s.input });
    expect(v1.version).toBe(1);
    const stored = (await findReport(db, v1.id))!;
    expect(stored.frozen.options.map((o) => o.name)).toEqual(["A", "B"]);
    const v2 = await refreshReport(db, stored, s.userId);
    expect(v2).toMatchObject({ seriesId: v1.seriesId, version: 2 });
    expect((await listReportVersions(db, s.teamId, v1.seriesId)).map((v) => v.version)).toEqual([2, 1]);
    const audit = await auditRows(db, { team_id: s.teamId, entity_type: "report" });
    expect(audit.map((r) => [r.action, r.entity_id, r.detail])).toEqual([
      ["report.create", v1.id, { title: "Options", seriesId: v1.seriesId, version: 1, options: ["A", "B"] }],
      ["report.refresh", v2.id, { title: "Options", seriesId: v1.seriesId, version: 2, options: ["A", "B"] }],
    ]);
  });

  it("inputs of another team, or a scenario of another baseline, are domain errors and store nothing", async () => {
    const s = await setup();
    const other = await ownerWithTeam(db);
    const b2 = await createBaseline(db, {
      teamId: s.teamId,
      userId: s.userId,
      baseline: { name: "B2", technology: DEFAULT_TECHNOLOGY, classes: [wireClass("M1")] },
    });
    const before = await counts(db, TABLES);
    await expect(composeReport(db, { teamId: other.teamId, userId: other.userId, input: s.input })).rejects.toMatchObject({
      constructor: NotFoundError,
      field: "baselineId",
    });
    await expect(composeReport(db, { teamId: s.teamId, userId: s.userId, input: { ...s.input, baselineId: b2 } })).rejects.toThrow(
      /belongs to another baseline/,
    );
    await expect(composeReport(db, { teamId: s.teamId, userId: s.userId, input: { ...s.input, classNames: ["M7"] } })).rejects.toMatchObject({
      fields: { classNames: ["Unknown class: M7."] },
    });
    expect(await counts(db, TABLES)).toEqual(before);
  });

  it("a refused audit insert rolls back the stored report", async () => {
    const s = await setup();
    const before = await counts(db, TABLES);
    const undo = await refuseInsert(db, "audit_log", "new.action = 'report.create'");
    try {
      await expect(composeReport(db, { teamId: s.teamId, userId: s.userId, input: s.input })).rejects.toThrow(/refused by the test/);
    } finally {
      await undo();
    }
    expect(await counts(db, TABLES)).toEqual(before);
  });

  it("delete removes one version with report.delete; a missing or foreign id is a NotFoundError", async () => {
    const s = await setup();
    const other = await ownerWithTeam(db);
    const r = await composeReport(db, { teamId: s.teamId, userId: s.userId, input: s.input });
    await expect(deleteReport(db, { id: r.id, teamId: other.teamId, userId: other.userId })).rejects.toBeInstanceOf(NotFoundError);
    await deleteReport(db, { id: r.id, teamId: s.teamId, userId: s.userId });
    expect(await getReport(db, r.id)).toBeUndefined();
    await expect(deleteReport(db, { id: r.id, teamId: s.teamId, userId: s.userId })).rejects.toThrow("Report not found.");
    expect((await auditRows(db, { entity_id: r.id, action: "report.delete" })).map((x) => x.detail)).toEqual([
      { title: "Options", seriesId: r.seriesId, version: 1 },
    ]);
  });

  it("findReport refuses a stored document that no longer matches the schema", async () => {
    const s = await setup();
    const r = await composeReport(db, { teamId: s.teamId, userId: s.userId, input: s.input });
    await db("reports")
      .where({ id: r.id })
      .update({ frozen: JSON.stringify({ schemaVersion: 1, options: "broken" }) });
    await expect(findReport(db, r.id)).rejects.toThrow(/does not match the schema/);
  });
});

describe("db/writes/share-links", () => {
  it("create stores only the token's hash with share_link.create; revoke once writes share_link.revoke, twice is harmless", async () => {
    const s = await setup();
    const r = await composeReport(db, { teamId: s.teamId, userId: s.userId, input: s.input });
    const { link, token } = await createShareLink(db, {
      reportId: r.id,
      teamId: s.teamId,
      userId: s.userId,
      expiresInDays: 3,
      reason: "test",
    });
    expect(link).toMatchObject({ reportId: r.id, status: "active", createdByName: expect.any(String) });
    expect(await db("share_links").where({ id: link.id }).first("token_hash")).not.toMatchObject({ token_hash: token });
    expect(await resolveShareToken(db, token)).toMatchObject({ status: "ok", reportId: r.id });
    await revokeShareLink(db, { reportId: r.id, linkId: link.id, teamId: s.teamId, userId: s.userId });
    await revokeShareLink(db, { reportId: r.id, linkId: link.id, teamId: s.teamId, userId: s.userId });
    expect((await listShareLinks(db, r.id)).map((l) => l.status)).toEqual(["revoked"]);
    expect(await resolveShareToken(db, token)).toEqual({ status: "missing" });
    expect((await auditRows(db, { entity_id: link.id })).map((x) => [x.action, x.detail])).toEqual([
      ["share_link.create", { reportId: r.id, expiresAt: link.expiresAt, reason: "test" }],
      ["share_link.revoke", { reportId: r.id }],
    ]);
  });

  it("a link of another report, or a report of another team, is a NotFoundError; a refused audit insert leaves no link", async () => {
    const s = await setup();
    const other = await ownerWithTeam(db);
    const r = await composeReport(db, { teamId: s.teamId, userId: s.userId, input: s.input });
    await expect(revokeShareLink(db, { reportId: r.id, linkId: "nope", teamId: s.teamId, userId: s.userId })).rejects.toThrow("Share link not found.");
    await expect(createShareLink(db, { reportId: r.id, teamId: other.teamId, userId: other.userId, expiresInDays: 1 })).rejects.toBeInstanceOf(NotFoundError);
    const before = await counts(db, TABLES);
    const undo = await refuseInsert(db, "audit_log", "new.action = 'share_link.create'");
    try {
      await expect(createShareLink(db, { reportId: r.id, teamId: s.teamId, userId: s.userId, expiresInDays: 1 })).rejects.toThrow(/refused by the test/);
    } finally {
      await undo();
    }
    expect(await counts(db, TABLES)).toEqual(before);
  });
});

import { describe, expect, it } from "vitest";
import { evaluateScenario, type WireClass } from "@/lib/scaling";
import { decodeHistogram, histogramRow, toLengthBins } from "@/db/histogram-blob";
import { Client } from "../helpers/http";
import { TECH, createBaseline, rawDb, sampleClasses, snapshot, teamWithRoles } from "./workspace-helpers";

describe("baselines: CRUD, versions and revisions", () => {
  it("creates a baseline from values with units, stored exactly in SI, and lists it", async () => {
    const { owner, teamId } = await teamWithRoles();
    const b = await createBaseline(owner.client, teamId, "Tile A");
    expect(b.version).toBe(1);
    const got = await owner.client.get(`/api/baselines/${b.id}`);
    expect(got.status).toBe(200);
    const m1 = got.json.baseline.classes[0];
    expect(m1).toMatchObject({
      name: "M1",
      widthM: 2e-8,
      thicknessM: 4e-8,
      spacingM: 2e-8,
      meanLengthM: 5e-6,
      driverOhm: 8000,
      loadF: 4e-16,
    });
    expect(got.json.baseline.classes[1].ildAboveM).toBeNull();
    expect(got.json.baseline.technology).toEqual(TECH);
    const list = await owner.client.get(`/api/teams/${teamId}/baselines`);
    expect(list.json.baselines.map((x: { name: string }) => x.name)).toContain("Tile A");
    expect(list.json.baselines.find((x: { id: string }) => x.id === b.id).classCount).toBe(2);
  });

  it("PATCH with the loaded version bumps it and writes a revision; a stale version answers 409 with the current version", async () => {
    const { owner, editor, teamId } = await teamWithRoles();
    const b = await createBaseline(owner.client, teamId);
    const r = await editor.client.patch(`/api/baselines/${b.id}`, {
      version: 1,
      description: "edited",
      technology: { ...TECH, supplyV: "700 mV" },
    });
    expect(r.status).toBe(200);
    expect(r.json.baseline.version).toBe(2);
    expect(r.json.baseline.technology.supplyV).toBe(0.7);
    const before = snapshot();
    const stale = await owner.client.patch(`/api/baselines/${b.id}`, { version: 1, description: "mine" });
    expect(stale.status).toBe(409);
    expect(stale.json.error.code).toBe("stale_version");
    expect(stale.json.error.currentVersion).toBe(2);
    expect(stale.json.error.message).toMatch(/saved by someone else/);
    expect(snapshot()).toEqual(before);
    const revs = await owner.client.get(`/api/baselines/${b.id}/revisions`);
    expect(revs.json.revisions.map((x: { version: number }) => x.version)).toEqual([2, 1]);
    expect(revs.json.revisions[0].summary).toMatch(/description; technology: supply/);
    expect(revs.json.revisions[0].userName).toBe("Eve Editor");
  });

  it("stores the engine 2 technology settings and the classes' vias, and evaluates with them", async () => {
    const { owner, teamId } = await teamWithRoles();
    const b = await createBaseline(owner.client, teamId);
    const tech = {
      ...TECH,
      temperatureC: 85,
      delayModel: "sakurai",
      capacitanceModel: "published",
      minRepeaterGain: 0.05,
      repeaterOutputCRatio: 0.6,
      repeaterAreaM2: 2e-13,
      repeaterLeakageW: "2 nW",
    };
    const p = await owner.client.patch(`/api/baselines/${b.id}`, { version: 1, technology: tech });
    expect(p.status).toBe(200);
    expect(p.json.baseline.technology).toEqual({ ...tech, repeaterLeakageW: 2e-9 });
    const revs = await owner.client.get(`/api/baselines/${b.id}/revisions`);
    expect(revs.json.revisions[0].summary).toMatch(/technology: delay model, capacitance model, temperature, minimum repeater gain/);
    const classes = sampleClasses();
    const put = await owner.client.put(`/api/baselines/${b.id}/classes`, {
      version: 2,
      classes: [
        { ...classes[0], id: b.classes[0]!.id, viasPerNet: 4, viaOhm: "12 ohm" },
        { ...classes[1], viasPerNet: 0, viaWidthM: "30 nm", viaHeightM: "45 nm" },
      ],
    });
    expect(put.status).toBe(200);
    const got = put.json.baseline.classes;
    expect(got[0]).toMatchObject({ viasPerNet: 4, viaOhm: 12 });
    expect(got[0]).not.toHaveProperty("viaWidthM");
    expect(got[1]).toMatchObject({ viasPerNet: 0, viaWidthM: 3e-8, viaHeightM: 4.5e-8 });
    const db = rawDb();
    expect(db.prepare("select vias_per_net, via_ohm, via_width_m, via_height_m from wire_classes where id = ?").get(got[0].id)).toEqual({
      vias_per_net: 4,
      via_ohm: 12,
      via_width_m: null,
      via_height_m: null,
    });
    db.close();
    // the server evaluates with what was stored: the same figures as the engine on the same inputs
    const s = (await owner.client.post(`/api/teams/${teamId}/scenarios`, { baselineId: b.id, name: "Hot" })).json.scenario;
    const ev = await owner.client.post(`/api/scenarios/${s.id}/evaluate`);
    expect(ev.status).toBe(200);
    const stored: WireClass[] = got.map(
      ({ id: _i, position: _p, histogramBins: _h, ...c }: WireClass & { id: string; position: number; histogramBins: number }) => c,
    );
    const local = evaluateScenario({ classes: stored, technology: p.json.baseline.technology, settings: s.settings });
    const first = ev.json.evaluation.classes[0].scenario;
    expect(first.temperatureC).toBe(85);
    expect(first.delayModel).toBe("sakurai");
    // the published forms chosen: an ungapped class takes Sakurai–Tamaru / Cohn, not the tables
    expect(first.capacitance.model).toBe("coupled");
    expect(first.cFPerM).toBe(local.classes[0]!.scenario.cFPerM);
    expect(first.viaOhm).toBeGreaterThan(0);
    expect(first.viaOhm).toBe(local.classes[0]!.scenario.viaOhm);
    expect(first.delayS).toBe(local.classes[0]!.scenario.delayS);
  });

  it("stores the classes' air gaps (issue 11) in their columns, returns only the fields given, and copies them on duplicate", async () => {
    const { owner, teamId } = await teamWithRoles();
    const b = await createBaseline(owner.client, teamId);
    const classes = sampleClasses();
    const put = await owner.client.put(`/api/baselines/${b.id}/classes`, {
      version: 1,
      classes: [
        { ...classes[0], id: b.classes[0]!.id, kGap: "1", gapFraction: 0.6 },
        { ...classes[1], id: b.classes[1]!.id, kGap: 2.7 },
      ],
    });
    expect(put.status, put.text).toBe(200);
    const got = put.json.baseline.classes;
    expect(got[0]).toMatchObject({ name: "M1", kGap: 1, gapFraction: 0.6 });
    expect(got[1]).toMatchObject({ name: "M2", kGap: 2.7 });
    expect(got[1]).not.toHaveProperty("gapFraction");
    const db = rawDb();
    const row = (id: string) => db.prepare("select k_gap, gap_fraction from wire_classes where id = ?").get(id);
    expect(row(got[0].id)).toEqual({ k_gap: 1, gap_fraction: 0.6 });
    expect(row(got[1].id)).toEqual({ k_gap: 2.7, gap_fraction: null });
    // the class table round-trips through the API unchanged (what the baseline editor sends back)
    const again = await owner.client.put(`/api/baselines/${b.id}/classes`, {
      version: 2,
      classes: got.map(({ position: _p, histogramBins: _h, ...c }: Record<string, unknown>) => c),
    });
    expect(again.status, again.text).toBe(200);
    expect(again.json.baseline.classes).toEqual(got);
    const dup = await owner.client.post(`/api/baselines/${b.id}/duplicate`, {});
    expect(dup.status, dup.text).toBe(201);
    const copied = dup.json.baseline.classes;
    expect(copied.map((c: Record<string, unknown>) => [c.name, c.kGap, c.gapFraction])).toEqual([
      ["M1", 1, 0.6],
      ["M2", 2.7, undefined],
    ]);
    expect(row(copied[0].id)).toEqual({ k_gap: 1, gap_fraction: 0.6 });
    db.close();
    // removing the gap clears the columns (a class without the fields has none)
    const cleared = await owner.client.put(`/api/baselines/${b.id}/classes`, { version: 3, classes: [{ ...classes[0], id: got[0].id }, classes[1]] });
    expect(cleared.status, cleared.text).toBe(200);
    expect(cleared.json.baseline.classes[0]).not.toHaveProperty("kGap");
    expect(cleared.json.baseline.classes[0]).not.toHaveProperty("gapFraction");
  });

  it("PUT classes replaces them in one go; a class keeping its id keeps its histogram, a removed class loses it", async () => {
    const { owner, teamId } = await teamWithRoles();
    const b = await createBaseline(owner.client, teamId);
    const [m1, m2] = b.classes;
    const db = rawDb();
    const ins = db.prepare(
      "insert into class_histograms (class_id, bin_count, net_count, lengths_m, counts) values (@class_id, @bin_count, @net_count, @lengths_m, @counts)",
    );
    for (const c of [m1!, m2!])
      ins.run(
        histogramRow(
          c.id,
          [1, 2, 3, 4, 5].map((i) => i * 1e-6),
          [10, 20, 30, 40, 50],
        ),
      );
    db.close();
    const classes = sampleClasses();
    const put = await owner.client.put(`/api/baselines/${b.id}/classes`, {
      version: 1,
      classes: [
        { ...classes[1], name: "M2" }, // reordered, no id: matched by name
        { ...classes[0], id: m1!.id, name: "M1 renamed", widthM: "22 nm" },
        { ...classes[0], name: "M3" },
      ],
    });
    expect(put.status).toBe(200);
    expect(put.json.baseline.version).toBe(2);
    const got = put.json.baseline.classes as { id: string; name: string; widthM: number; histogramBins: number }[];
    expect(got.map((c) => c.name)).toEqual(["M2", "M1 renamed", "M3"]);
    expect(got[1]).toMatchObject({ id: m1!.id, widthM: 2.2e-8, histogramBins: 5 });
    expect(got[0]).toMatchObject({ id: m2!.id, histogramBins: 5 });
    expect(got[2]!.histogramBins).toBe(0);
    const drop = await owner.client.put(`/api/baselines/${b.id}/classes`, {
      version: 2,
      classes: [{ ...classes[0], id: m1!.id, name: "M1 renamed" }],
    });
    expect(drop.status).toBe(200);
    const db2 = rawDb();
    expect(db2.prepare("select * from class_histograms where class_id = ?").get(m2!.id)).toBeUndefined();
    const kept = db2.prepare("select * from class_histograms where class_id = ?").get(m1!.id) as Parameters<typeof decodeHistogram>[0];
    expect(kept.bin_count).toBe(5);
    expect([...decodeHistogram(kept).counts]).toEqual([10, 20, 30, 40, 50]);
    db2.close();
  });

  it("duplicates a baseline with its classes and histograms under a free name", async () => {
    const { owner, editor, teamId } = await teamWithRoles();
    const b = await createBaseline(owner.client, teamId, "Original");
    const db = rawDb();
    db.prepare(
      "insert into class_histograms (class_id, bin_count, net_count, lengths_m, counts) values (@class_id, @bin_count, @net_count, @lengths_m, @counts)",
    ).run(histogramRow(b.classes[0]!.id, [1e-6], [7]));
    db.close();
    const d = await editor.client.post(`/api/baselines/${b.id}/duplicate`, {});
    expect(d.status).toBe(201);
    expect(d.json.baseline.name).toBe("Original (copy)");
    expect(d.json.baseline.classes.map((c: { name: string }) => c.name)).toEqual(["M1", "M2"]);
    expect(d.json.baseline.classes[0].histogramBins).toBe(1);
    expect(d.json.baseline.classes[0].id).not.toBe(b.classes[0]!.id);
    const db3 = rawDb();
    const copied = db3.prepare("select * from class_histograms where class_id = ?").get(d.json.baseline.classes[0].id) as Parameters<typeof decodeHistogram>[0];
    db3.close();
    expect(toLengthBins(decodeHistogram(copied))).toEqual([{ lengthM: 1e-6, count: 7 }]);
    const d2 = await editor.client.post(`/api/baselines/${b.id}/duplicate`, {});
    expect(d2.json.baseline.name).toBe("Original (copy 2)");
  });
});

describe("roles and team boundaries", () => {
  it("viewer reads but cannot write (403); another team gets 404; signed out 401", async () => {
    const { owner, viewer, outsider, teamId } = await teamWithRoles();
    const b = await createBaseline(owner.client, teamId);
    expect((await viewer.client.get(`/api/baselines/${b.id}`)).status).toBe(200);
    expect((await viewer.client.get(`/api/teams/${teamId}/baselines`)).status).toBe(200);
    const before = snapshot();
    for (const r of [
      await viewer.client.post(`/api/teams/${teamId}/baselines`, { name: "nope" }),
      await viewer.client.patch(`/api/baselines/${b.id}`, { version: 1, name: "nope" }),
      await viewer.client.put(`/api/baselines/${b.id}/classes`, { version: 1, classes: [] }),
      await viewer.client.post(`/api/baselines/${b.id}/duplicate`, {}),
      await viewer.client.del(`/api/baselines/${b.id}`),
      await viewer.client.post(`/api/teams/${teamId}/scenarios`, { baselineId: b.id, name: "nope" }),
    ]) {
      expect(r.status).toBe(403);
      expect(r.json.error.code).toBe("forbidden");
    }
    for (const path of [`/api/baselines/${b.id}`, `/api/baselines/${b.id}/classes`, `/api/teams/${teamId}/baselines`, `/api/teams/${teamId}/scenarios`]) {
      const r = await outsider.client.get(path);
      expect(r.status).toBe(404);
      expect(r.json.error.code).toBe("not_found");
    }
    expect((await outsider.client.patch(`/api/baselines/${b.id}`, { version: 1, name: "x" })).status).toBe(404);
    expect((await new Client().get(`/api/baselines/${b.id}`)).status).toBe(401);
    expect((await new Client().get(`/api/baselines/does-not-exist`)).status).toBe(401);
    expect((await owner.client.get(`/api/baselines/does-not-exist`)).status).toBe(404);
    expect(snapshot()).toEqual(before);
  });

  it("delete is owner-or-author: an editor cannot delete the owner's baseline, the owner can; the author editor can delete theirs", async () => {
    const { owner, editor, teamId } = await teamWithRoles();
    const b = await createBaseline(owner.client, teamId);
    const before = snapshot();
    const r = await editor.client.del(`/api/baselines/${b.id}`);
    expect(r.status).toBe(403);
    expect(r.json.error.message).toMatch(/owner or the baseline's author/);
    expect(snapshot()).toEqual(before);
    const mine = await createBaseline(editor.client, teamId);
    expect((await editor.client.del(`/api/baselines/${mine.id}`)).status).toBe(204);
    expect((await owner.client.del(`/api/baselines/${b.id}`)).status).toBe(204);
    expect((await owner.client.get(`/api/baselines/${b.id}`)).status).toBe(404);
  });
});

describe("scenarios: create, save with versions, history, restore, evaluate", () => {
  it("creates with defaults, saves, answers 409 on a stale save, lists revisions and restores an old one as a new revision", async () => {
    const { owner, editor, viewer, teamId } = await teamWithRoles();
    const b = await createBaseline(owner.client, teamId);
    const c = await editor.client.post(`/api/teams/${teamId}/scenarios`, { baselineId: b.id, name: "Shrink", notes: "first" });
    expect(c.status).toBe(201);
    const s = c.json.scenario;
    expect(s).toMatchObject({ version: 1, settings: { s: 1, sL: 1, level: "full", miller: 1, supplyV: 0.75, overrides: {} } });
    const p = await editor.client.patch(`/api/scenarios/${s.id}`, {
      version: 1,
      settings: { ...s.settings, s: 1.4, overrides: { M2: { k: 1.9 } } },
    });
    expect(p.status).toBe(200);
    expect(p.json.scenario.version).toBe(2);
    const before = snapshot();
    const stale = await owner.client.patch(`/api/scenarios/${s.id}`, { version: 1, settings: { ...s.settings, s: 3 } });
    expect(stale.status).toBe(409);
    expect(stale.json.error).toMatchObject({ code: "stale_version", currentVersion: 2 });
    expect(snapshot()).toEqual(before);
    const revs = await viewer.client.get(`/api/scenarios/${s.id}/revisions`);
    expect(revs.status).toBe(200);
    expect(revs.json.revisions.map((r: { version: number }) => r.version)).toEqual([2, 1]);
    expect(revs.json.revisions[0].summary).toMatch(/S 1 → 1\.4/);
    expect(revs.json.revisions[0].summary).toMatch(/M2: k — → 1\.9/);
    const first = revs.json.revisions[1];
    expect((await viewer.client.post(`/api/scenarios/${s.id}/restore`, { revisionId: first.id, version: 2 })).status).toBe(403);
    const staleRestore = await editor.client.post(`/api/scenarios/${s.id}/restore`, { revisionId: first.id, version: 1 });
    expect(staleRestore.status).toBe(409);
    const rest = await editor.client.post(`/api/scenarios/${s.id}/restore`, { revisionId: first.id, version: 2 });
    expect(rest.status).toBe(200);
    expect(rest.json.scenario.version).toBe(3);
    expect(rest.json.scenario.settings.s).toBe(1);
    expect(rest.json.scenario.settings.overrides).toEqual({});
    const after = await viewer.client.get(`/api/scenarios/${s.id}/revisions`);
    expect(after.json.revisions[0]).toMatchObject({ version: 3, summary: "Restored version 1" });
    expect(after.json.revisions).toHaveLength(3);
  });

  it("evaluate returns the engine's evaluation of the stored baseline and settings (or unsaved ones), equal to evaluating locally", async () => {
    const { owner, viewer, teamId } = await teamWithRoles();
    const b = await createBaseline(owner.client, teamId);
    const settings = {
      s: 1.43,
      sL: 1.1,
      level: "full",
      barrierScales: false,
      miller: 1.5,
      deviceRFactor: 0.9,
      deviceCFactor: 1,
      supplyV: 0.7,
      k: null,
      metal: null,
      overrides: { M1: { metal: "Ru", barrierM: 0 } },
    };
    const c = await owner.client.post(`/api/teams/${teamId}/scenarios`, { baselineId: b.id, name: "E", settings });
    expect(c.status).toBe(201);
    const r = await viewer.client.post(`/api/scenarios/${c.json.scenario.id}/evaluate`);
    expect(r.status).toBe(200);
    const classes = (await viewer.client.get(`/api/baselines/${b.id}`)).json.baseline.classes.map(
      ({ id: _i, position: _p, histogramBins: _h, ...wc }: WireClass & { id: string; position: number; histogramBins: number }) => wc,
    );
    const local = evaluateScenario({ classes, technology: TECH, settings: c.json.scenario.settings });
    expect(r.json.evaluation).toEqual(JSON.parse(JSON.stringify(local)));
    expect(r.json.evaluation.classes[0].scenario.metal).toBe("Ru");
    const unsaved = await viewer.client.post(`/api/scenarios/${c.json.scenario.id}/evaluate`, { settings: { ...settings, s: 2 } });
    expect(unsaved.status).toBe(200);
    expect(unsaved.json.settings.s).toBe(2);
    expect(unsaved.json.evaluation.classes[0].scenario.widthM).toBeCloseTo(1e-8, 20);
  });

  it("stores a global air gap and per-class ones (null = none for that class), evaluates, and freezes them in a report", async () => {
    const { owner, teamId } = await teamWithRoles();
    const b = await createBaseline(owner.client, teamId);
    const withGap = await owner.client.put(`/api/baselines/${b.id}/classes`, {
      version: 1,
      classes: [
        { ...sampleClasses()[0], id: b.classes[0]!.id, kGap: 1, gapFraction: 0.5 },
        { ...sampleClasses()[1], id: b.classes[1]!.id },
      ],
    });
    expect(withGap.status, withGap.text).toBe(200);
    const s = (await owner.client.post(`/api/teams/${teamId}/scenarios`, { baselineId: b.id, name: "Air" })).json.scenario;
    expect(s.settings).not.toHaveProperty("airGap");
    const settings = {
      ...s.settings,
      airGap: { kGap: "1.0", gapFraction: 0.5 },
      overrides: { M1: { airGap: null }, M2: { s: 1.2, airGap: { kGap: 1.5, gapFraction: 1 } } },
    };
    const p = await owner.client.patch(`/api/scenarios/${s.id}`, { version: 1, settings });
    expect(p.status, p.text).toBe(200);
    expect(p.json.scenario.settings.airGap).toEqual({ kGap: 1, gapFraction: 0.5 });
    expect(p.json.scenario.settings.overrides).toEqual({ M1: { airGap: null }, M2: { s: 1.2, airGap: { kGap: 1.5, gapFraction: 1 } } });
    const db = rawDb();
    const stored = JSON.parse((db.prepare("select settings from scenarios where id = ?").get(s.id) as { settings: string }).settings);
    db.close();
    expect(stored.airGap).toEqual({ kGap: 1, gapFraction: 0.5 });
    expect(stored.overrides.M1).toEqual({ airGap: null });
    expect((await owner.client.get(`/api/scenarios/${s.id}`)).json.scenario.settings).toEqual(p.json.scenario.settings);
    expect((await owner.client.post(`/api/scenarios/${s.id}/evaluate`)).status).toBe(200);
    // a report freezes the settings with their air gaps
    const other = (await owner.client.post(`/api/teams/${teamId}/scenarios`, { baselineId: b.id, name: "Plain", settings: { s: 1.4 } })).json.scenario;
    const rep = await owner.client.post(`/api/teams/${teamId}/reports`, { baselineId: b.id, scenarioIds: [s.id, other.id], title: "Air gaps" });
    expect(rep.status, rep.text).toBe(201);
    const frozen = (await owner.client.get(`/api/reports/${rep.json.report.id}`)).json.report.frozen;
    expect(frozen.options[0].settings.airGap).toEqual({ kGap: 1, gapFraction: 0.5 });
    expect(frozen.options[0].settings.overrides.M1).toEqual({ airGap: null });
    expect(frozen.options[1].settings).not.toHaveProperty("airGap");
    expect(frozen.baseline.classes[0]).toMatchObject({ name: "M1", kGap: 1, gapFraction: 0.5 });
    expect(frozen.baseline.classes[1]).not.toHaveProperty("kGap");
    // switching the global gap off (null) stores none
    const off = await owner.client.patch(`/api/scenarios/${s.id}`, { version: 2, settings: { ...p.json.scenario.settings, airGap: null } });
    expect(off.status, off.text).toBe(200);
    expect(off.json.scenario.settings).not.toHaveProperty("airGap");
    expect(off.json.scenario.settings.overrides.M1).toEqual({ airGap: null });
  });

  it("scenario delete is owner-or-author", async () => {
    const { owner, editor, teamId } = await teamWithRoles();
    const b = await createBaseline(owner.client, teamId);
    const mine = (await owner.client.post(`/api/teams/${teamId}/scenarios`, { baselineId: b.id, name: "Owner's" })).json.scenario;
    const theirs = (await editor.client.post(`/api/teams/${teamId}/scenarios`, { baselineId: b.id, name: "Editor's" })).json.scenario;
    expect((await editor.client.del(`/api/scenarios/${mine.id}`)).status).toBe(403);
    expect((await editor.client.del(`/api/scenarios/${theirs.id}`)).status).toBe(204);
    expect((await owner.client.del(`/api/scenarios/${mine.id}`)).status).toBe(204);
    expect((await owner.client.get(`/api/scenarios/${mine.id}`)).status).toBe(404);
  });
});

describe("bad input: status, field message, nothing stored changes", () => {
  type Case = { what: string; send: (ctx: Ctx) => Promise<{ status: number; json: any }>; status: number; field?: string; message: RegExp };
  type Ctx = Awaited<ReturnType<typeof setup>>;
  async function setup() {
    const roles = await teamWithRoles();
    const b = await createBaseline(roles.owner.client, roles.teamId);
    const s = (await roles.owner.client.post(`/api/teams/${roles.teamId}/scenarios`, { baselineId: b.id, name: "S" })).json.scenario;
    const otherBaseline = await createBaseline(roles.outsider.client, roles.outsider.teamId);
    return { ...roles, b, s, otherBaseline };
  }
  const withClass = (patch: Record<string, unknown>) => {
    const [a, b] = sampleClasses();
    return [{ ...a, ...patch }, b];
  };
  const putClasses = (ctx: Ctx, classes: unknown[]) => ctx.owner.client.put(`/api/baselines/${ctx.b.id}/classes`, { version: 1, classes });
  const patchSettings = (ctx: Ctx, patch: Record<string, unknown>) =>
    ctx.owner.client.patch(`/api/scenarios/${ctx.s.id}`, { version: 1, settings: { ...ctx.s.settings, ...patch } });

  const cases: Case[] = [
    {
      what: "a non-numeric width",
      send: (c) => putClasses(c, withClass({ widthM: "wide" })),
      status: 400,
      field: "classes.0.widthM",
      message: /"wide" is not a number with a known unit/,
    },
    {
      what: "a negative width",
      send: (c) => putClasses(c, withClass({ widthM: -2e-8 })),
      status: 400,
      field: "classes.0.widthM",
      message: /Width must be greater than 0/,
    },
    {
      what: "a negative spacing typed with a unit",
      send: (c) => putClasses(c, withClass({ spacingM: "-20 nm" })),
      status: 400,
      field: "classes.0.spacingM",
      message: /Spacing must be greater than 0/,
    },
    {
      what: "a fractional via count",
      send: (c) => putClasses(c, withClass({ viasPerNet: 1.5 })),
      status: 400,
      field: "classes.0.viasPerNet",
      message: /Vias per net must be a whole number/,
    },
    {
      what: "a negative via resistance",
      send: (c) => putClasses(c, withClass({ viaOhm: "-3 ohm" })),
      status: 400,
      field: "classes.0.viaOhm",
      message: /Via resistance must not be negative/,
    },
    {
      what: "a temperature below absolute zero",
      send: (c) => c.owner.client.patch(`/api/baselines/${c.b.id}`, { version: 1, technology: { ...TECH, temperatureC: -300 } }),
      status: 400,
      field: "technology.temperatureC",
      message: /above −273.15 °C/,
    },
    {
      what: "an unknown delay model",
      send: (c) => c.owner.client.patch(`/api/baselines/${c.b.id}`, { version: 1, technology: { ...TECH, delayModel: "elmore" } }),
      status: 400,
      field: "technology.delayModel",
      message: /Delay model must be one of exact, sakurai/,
    },
    {
      what: "an unknown capacitance model",
      send: (c) => c.owner.client.patch(`/api/baselines/${c.b.id}`, { version: 1, technology: { ...TECH, capacitanceModel: "closed" } }),
      status: 400,
      field: "technology.capacitanceModel",
      message: /Capacitance model must be one of accurate, published/,
    },
    {
      what: "a materials override out of the engine's range",
      send: (c) => c.owner.client.patch(`/api/baselines/${c.b.id}`, { version: 1, technology: { ...TECH, materials: { Cu: { specularity: 1.2 } } } }),
      status: 400,
      field: "technology.materials.Cu.specularity",
      message: /Specularity must be from 0 to less than 1/,
    },
    {
      what: "a negative net count",
      send: (c) => putClasses(c, withClass({ netCount: -5 })),
      status: 400,
      field: "classes.0.netCount",
      message: /Net count must not be negative/,
    },
    {
      what: "an unknown unit",
      send: (c) => putClasses(c, withClass({ thicknessM: "40 furlongs" })),
      status: 400,
      field: "classes.0.thicknessM",
      message: /not a number with a known unit/,
    },
    {
      what: "a width without a unit in metres that is far too large",
      send: (c) => putClasses(c, withClass({ widthM: 20 })),
      status: 400,
      field: "classes.0.widthM",
      message: /did you forget a unit/,
    },
    {
      what: "k below 1",
      send: (c) => putClasses(c, withClass({ k: 0.8 })),
      status: 400,
      field: "classes.0.k",
      message: /k must be at least 1/,
    },
    {
      what: "a class name used twice",
      send: (c) => putClasses(c, [sampleClasses()[0], { ...sampleClasses()[1], name: "m1" }]),
      status: 400,
      field: "classes.1.name",
      message: /used twice/,
    },
    { what: "S = 0", send: (c) => patchSettings(c, { s: 0 }), status: 400, field: "settings.s", message: /S must be greater than 0/ },
    { what: "S < 0", send: (c) => patchSettings(c, { s: -1 }), status: 400, field: "settings.s", message: /S must be greater than 0/ },
    { what: "S_L = 0", send: (c) => patchSettings(c, { sL: 0 }), status: 400, field: "settings.sL", message: /S_L must be greater than 0/ },
    {
      what: "a per-class S ≤ 0",
      send: (c) => patchSettings(c, { overrides: { M1: { s: -0.5 } } }),
      status: 400,
      field: "settings.overrides.M1.s",
      message: /S must be greater than 0/,
    },
    {
      what: "a scenario k below 1",
      send: (c) => patchSettings(c, { k: 0.9 }),
      status: 400,
      field: "settings.k",
      message: /k must be at least 1/,
    },
    {
      what: "Miller factor above 2",
      send: (c) => patchSettings(c, { miller: 2.5 }),
      status: 400,
      field: "settings.miller",
      message: /between 0 and 2/,
    },
    {
      what: "an air-gap k above the class's k",
      send: (c) => putClasses(c, withClass({ kGap: 2.8 })),
      status: 400,
      field: "classes.0.kGap",
      message: /Air-gap k must not exceed the class's k \(2\.7\)/,
    },
    {
      what: "a gap fraction above 1",
      send: (c) => putClasses(c, withClass({ kGap: 1, gapFraction: 1.2 })),
      status: 400,
      field: "classes.0.gapFraction",
      message: /Gap fraction must be between 0 and 1/,
    },
    {
      what: "a global air gap with k below 1",
      send: (c) => patchSettings(c, { airGap: { kGap: 0.5 } }),
      status: 400,
      field: "settings.airGap.kGap",
      message: /Air-gap k must be at least 1/,
    },
    {
      what: "a per-class air gap with a fraction above 1",
      send: (c) => patchSettings(c, { overrides: { M1: { airGap: { kGap: 1, gapFraction: 1.5 } } } }),
      status: 400,
      field: "settings.overrides.M1.airGap.gapFraction",
      message: /Gap fraction must be between 0 and 1/,
    },
    {
      what: "Miller factor below 0",
      send: (c) => patchSettings(c, { miller: -0.1 }),
      status: 400,
      field: "settings.miller",
      message: /between 0 and 2/,
    },
    {
      what: "an override for a class the baseline lacks",
      send: (c) => patchSettings(c, { overrides: { M9: { k: 2 } } }),
      status: 400,
      field: "settings.overrides.M9",
      message: /No class named "M9"/,
    },
    {
      what: "a scenario on another team's baseline",
      send: (c) => c.owner.client.post(`/api/teams/${c.teamId}/scenarios`, { baselineId: c.otherBaseline.id, name: "Sneaky" }),
      status: 404,
      message: /Baseline not found/,
    },
    {
      what: "a stale version on save",
      send: (c) => c.owner.client.patch(`/api/scenarios/${c.s.id}`, { version: 7, name: "late" }),
      status: 409,
      message: /saved by someone else/,
    },
    {
      what: "a stale version on the class table",
      send: (c) => c.owner.client.put(`/api/baselines/${c.b.id}/classes`, { version: 9, classes: sampleClasses() }),
      status: 409,
      message: /saved by someone else/,
    },
    {
      what: "an oversize class payload",
      send: (c) =>
        putClasses(
          c,
          Array.from({ length: 1500 }, (_, i) => ({ ...sampleClasses()[0], name: `C${i}`, padding: "x".repeat(100) })),
        ),
      status: 413,
      message: /larger than the limit/,
    },
    {
      what: "an oversize scenario payload",
      send: (c) => c.owner.client.patch(`/api/scenarios/${c.s.id}`, { version: 1, notes: "n".repeat(70 * 1024) }),
      status: 413,
      message: /larger than the limit/,
    },
    {
      what: "a duplicate baseline name",
      send: (c) => c.owner.client.post(`/api/teams/${c.teamId}/baselines`, { name: (c.b as unknown as { name: string }).name ?? "x" }),
      status: 400,
      field: "name",
      message: /already exists/,
    },
  ];
  for (const k of cases) {
    it(`rejects ${k.what}`, async () => {
      const ctx = await setup();
      const before = snapshot();
      const r = await k.send(ctx);
      expect(r.status).toBe(k.status);
      expect(r.json.error.message).toMatch(k.message);
      if (k.field) expect((r.json.error.fields?.[k.field] ?? []).join(" ")).toMatch(k.message);
      expect(snapshot()).toEqual(before);
    });
  }
});

describe("audit log: creates and edits of baselines, classes and scenarios", () => {
  const auditOf = (teamId: string) => {
    const db = rawDb();
    try {
      return db.prepare("select action, entity_type, entity_id, user_id, detail from audit_log where team_id = ? order by id").all(teamId) as {
        action: string;
        entity_type: string;
        entity_id: string;
        user_id: string;
        detail: string;
      }[];
    } finally {
      db.close();
    }
  };

  it("writes one row per create, edit, duplicate, restore and delete, by the acting user; a stale save writes none", async () => {
    const { owner, editor, teamId } = await teamWithRoles();
    const b = await createBaseline(owner.client, teamId, "Audited");
    expect((await editor.client.patch(`/api/baselines/${b.id}`, { version: 1, description: "edited" })).status).toBe(200);
    const classes = (await owner.client.get(`/api/baselines/${b.id}`)).json.baseline.classes;
    expect((await editor.client.put(`/api/baselines/${b.id}/classes`, { version: 2, classes: classes.slice(0, 1) })).status).toBe(200);
    const dup = await editor.client.post(`/api/baselines/${b.id}/duplicate`, {});
    expect(dup.status).toBe(201);
    const sc = (await editor.client.post(`/api/teams/${teamId}/scenarios`, { baselineId: b.id, name: "Audited shrink" })).json.scenario;
    const saved = await editor.client.patch(`/api/scenarios/${sc.id}`, { version: 1, settings: { ...sc.settings, s: 1.4 } });
    expect(saved.status).toBe(200);
    const rowsBeforeStale = auditOf(teamId).length;
    expect((await owner.client.patch(`/api/scenarios/${sc.id}`, { version: 1, notes: "late" })).status).toBe(409);
    expect((await owner.client.put(`/api/baselines/${b.id}/classes`, { version: 1, classes })).status).toBe(409);
    expect(auditOf(teamId)).toHaveLength(rowsBeforeStale);
    const rev1 = (await editor.client.get(`/api/scenarios/${sc.id}/revisions`)).json.revisions.find((r: { version: number }) => r.version === 1);
    expect((await editor.client.post(`/api/scenarios/${sc.id}/restore`, { revisionId: rev1.id, version: 2 })).status).toBe(200);
    expect((await owner.client.del(`/api/scenarios/${sc.id}`)).status).toBe(204);

    const rows = auditOf(teamId).filter((r) => r.action.startsWith("baseline.") || r.action.startsWith("scenario."));
    expect(rows.map((r) => [r.action, r.entity_id])).toEqual([
      ["baseline.create", b.id],
      ["baseline.update", b.id],
      ["baseline.classes_update", b.id],
      ["baseline.create", dup.json.baseline.id],
      ["scenario.create", sc.id],
      ["scenario.update", sc.id],
      ["scenario.update", sc.id],
      ["scenario.delete", sc.id],
    ]);
    expect(rows.map((r) => r.user_id)).toEqual([
      owner.userId,
      editor.userId,
      editor.userId,
      editor.userId,
      editor.userId,
      editor.userId,
      editor.userId,
      owner.userId,
    ]);
    expect(JSON.parse(rows[2]!.detail)).toEqual({ version: 3, classes: 1 });
    expect(JSON.parse(rows[3]!.detail)).toMatchObject({ duplicatedFrom: b.id });
    expect(JSON.parse(rows[5]!.detail)).toEqual({ version: 2, fields: ["settings"] });
    expect(JSON.parse(rows[6]!.detail)).toEqual({ version: 3, restoredVersion: 1 });
  });
});

import { createHash } from "node:crypto";
import { describe, expect, it } from "vitest";
import { evaluateRoadmap, type RoadmapStep, type WireClass } from "@/lib/scaling";
import { Client } from "../helpers/http";
import { TECH, createBaseline, rawDb, teamWithRoles } from "./workspace-helpers";

// Issue 14: roadmaps (storage, routes, roles, 409, evaluate) and POST /api/scenarios/[id]/duplicate, over real HTTP.

const TABLES = ["roadmaps", "roadmap_revisions", "scenarios", "scenario_revisions", "audit_log"] as const;

/** Row counts and a SHA-256 of every row of the tables these routes write, read from the server's SQLite file. */
function stored(): Record<string, { rows: number; sha: string }> {
  const db = rawDb();
  try {
    const out: Record<string, { rows: number; sha: string }> = {};
    for (const t of TABLES) {
      const rows = db.prepare(`select * from ${t} order by rowid`).all();
      out[t] = { rows: rows.length, sha: createHash("sha256").update(JSON.stringify(rows)).digest("hex") };
    }
    return out;
  } finally {
    db.close();
  }
}

function auditOf(teamId: string, prefix: string) {
  const db = rawDb();
  try {
    return (
      db.prepare("select action, entity_id, user_id, detail from audit_log where team_id = ? order by id").all(teamId) as {
        action: string;
        entity_id: string;
        user_id: string;
        detail: string;
      }[]
    ).filter((r) => r.action.startsWith(prefix));
  } finally {
    db.close();
  }
}

/** The baseline's classes as the engine takes them, read through the API (what the server evaluates). */
async function engineClasses(c: Client, baselineId: string): Promise<WireClass[]> {
  const r = await c.get(`/api/baselines/${baselineId}`);
  return r.json.baseline.classes.map(
    ({ id: _i, position: _p, histogramBins: _h, ...wc }: WireClass & { id: string; position: number; histogramBins: number }) => wc,
  );
}

const THREE_STEPS: RoadmapStep[] = [
  { name: "N1", settings: { s: 1.25 } },
  { name: "N2", settings: { s: 1.2, overrides: { M2: { k: 2.2 } } } },
  { name: "N3", settings: { s: 1.1, overrides: { M1: { metal: "Ru", barrierM: 0 } } } },
];

describe("roadmaps: create, list, get, save with versions, delete", () => {
  it("creates a three-step roadmap (201), lists and reads it, saves with the loaded version, answers 409 on a stale save, deletes", async () => {
    const { owner, editor, viewer, teamId } = await teamWithRoles();
    const b = await createBaseline(owner.client, teamId);
    const c = await editor.client.post(`/api/teams/${teamId}/roadmaps`, { name: "Copper path", baselineId: b.id, steps: THREE_STEPS });
    expect(c.status, c.text).toBe(201);
    const r = c.json.roadmap;
    expect(r).toMatchObject({ version: 1, baselineId: b.id, name: "Copper path" });
    expect(r.steps.map((s: RoadmapStep) => s.name)).toEqual(["N1", "N2", "N3"]);
    expect(r.steps[1].settings).toEqual({ s: 1.2, overrides: { M2: { k: 2.2 } } });

    const list = await viewer.client.get(`/api/teams/${teamId}/roadmaps`);
    expect(list.status).toBe(200);
    expect(list.json.roadmaps.map((x: { id: string }) => x.id)).toEqual([r.id]);
    const one = await viewer.client.get(`/api/roadmaps/${r.id}`);
    expect(one.status).toBe(200);
    expect(one.json.roadmap).toEqual(r);
    expect(one.json.role).toBe("viewer");

    const p = await editor.client.patch(`/api/roadmaps/${r.id}`, {
      version: 1,
      name: "Copper path v2",
      steps: [...THREE_STEPS, { name: "N4", settings: { s: 1.1 } }],
    });
    expect(p.status, p.text).toBe(200);
    expect(p.json.roadmap).toMatchObject({ version: 2, name: "Copper path v2" });
    expect(p.json.roadmap.steps).toHaveLength(4);

    const before = stored();
    const stale = await owner.client.patch(`/api/roadmaps/${r.id}`, { version: 1, name: "mine" });
    expect(stale.status).toBe(409);
    expect(stale.json.error).toMatchObject({ code: "stale_version", currentVersion: 2 });
    expect(stored()).toEqual(before);

    const revs = await viewer.client.get(`/api/roadmaps/${r.id}/revisions`);
    expect(revs.status).toBe(200);
    expect(revs.json.revisions.map((x: { version: number }) => x.version)).toEqual([2, 1]);
    expect(revs.json.revisions[0].summary).toMatch(/renamed to "Copper path v2"; added N4 \(step 4\)/);
    expect(revs.json.revisions[0].userName).toBe("Eve Editor");
    expect(revs.json.revisions[1].steps).toEqual(r.steps);

    // delete: owner or author, as for scenarios
    const del = await owner.client.del(`/api/roadmaps/${r.id}`);
    expect(del.status).toBe(204);
    expect((await viewer.client.get(`/api/roadmaps/${r.id}`)).status).toBe(404);
    const gone = await editor.client.patch(`/api/roadmaps/${r.id}`, { version: 2, name: "late" });
    expect(gone.status).toBe(404);

    const rows = auditOf(teamId, "roadmap.");
    expect(rows.map((x) => [x.action, x.entity_id, x.user_id])).toEqual([
      ["roadmap.create", r.id, editor.userId],
      ["roadmap.update", r.id, editor.userId],
      ["roadmap.delete", r.id, owner.userId],
    ]);
    expect(JSON.parse(rows[1]!.detail)).toEqual({ version: 2, fields: ["name", "steps"] });
  });

  it("roles: viewer reads and evaluates (writes 403), another team 404, signed out 401; an editor deletes only their own", async () => {
    const { owner, editor, viewer, outsider, teamId } = await teamWithRoles();
    const b = await createBaseline(owner.client, teamId);
    const r = (await owner.client.post(`/api/teams/${teamId}/roadmaps`, { name: "R", baselineId: b.id, steps: THREE_STEPS })).json.roadmap;
    expect((await viewer.client.post(`/api/roadmaps/${r.id}/evaluate`)).status).toBe(200);
    const before = stored();
    for (const res of [
      await viewer.client.post(`/api/teams/${teamId}/roadmaps`, { name: "nope", baselineId: b.id, steps: THREE_STEPS }),
      await viewer.client.patch(`/api/roadmaps/${r.id}`, { version: 1, name: "nope" }),
      await viewer.client.del(`/api/roadmaps/${r.id}`),
    ]) {
      expect(res.status).toBe(403);
      expect(res.json.error.code).toBe("forbidden");
    }
    // an editor who did not create it
    expect((await editor.client.del(`/api/roadmaps/${r.id}`)).status).toBe(403);
    for (const res of [
      await outsider.client.get(`/api/roadmaps/${r.id}`),
      await outsider.client.get(`/api/roadmaps/${r.id}/revisions`),
      await outsider.client.get(`/api/teams/${teamId}/roadmaps`),
      await outsider.client.post(`/api/roadmaps/${r.id}/evaluate`),
      await outsider.client.patch(`/api/roadmaps/${r.id}`, { version: 1, name: "x" }),
      await outsider.client.del(`/api/roadmaps/${r.id}`),
      // the outsider's own team, with our baseline: like a missing baseline
      await outsider.client.post(`/api/teams/${outsider.teamId}/roadmaps`, { name: "x", baselineId: b.id, steps: THREE_STEPS }),
    ]) {
      expect(res.status).toBe(404);
      expect(res.json.error.code).toBe("not_found");
    }
    const anon = new Client();
    expect((await anon.get(`/api/roadmaps/${r.id}`)).status).toBe(401);
    expect((await anon.get(`/api/teams/${teamId}/roadmaps`)).status).toBe(401);
    expect((await anon.post(`/api/roadmaps/${r.id}/evaluate`)).status).toBe(401);
    expect((await anon.post(`/api/teams/${teamId}/roadmaps`, { name: "x", baselineId: b.id, steps: THREE_STEPS })).status).toBe(401);
    expect(stored()).toEqual(before);
  });
});

describe("roadmaps: evaluate", () => {
  it("answers each step's evaluation against N0, equal to the engine's evaluateRoadmap on the stored classes", async () => {
    const { owner, viewer, teamId } = await teamWithRoles();
    const b = await createBaseline(owner.client, teamId);
    const r = (await owner.client.post(`/api/teams/${teamId}/roadmaps`, { name: "R", baselineId: b.id, steps: THREE_STEPS })).json.roadmap;
    const ev = await viewer.client.post(`/api/roadmaps/${r.id}/evaluate`);
    expect(ev.status, ev.text).toBe(200);
    expect(ev.json.steps.map((s: { name: string }) => s.name)).toEqual(["N1", "N2", "N3"]);
    const local = evaluateRoadmap({ classes: await engineClasses(viewer.client, b.id), technology: TECH, steps: r.steps });
    expect(ev.json.steps).toEqual(JSON.parse(JSON.stringify(local.steps)));
    expect(ev.json).toMatchObject({ baselineVersion: 1, roadmapVersion: 1 });
    // Issue 14: "step n's S is the product of the steps' S up to n" — M1 (20 nm wide at N0) at N2 is 20 nm / (1.25 × 1.2).
    const m1AtN2 = ev.json.steps[1].evaluation.classes.find((c: { name: string }) => c.name === "M1");
    expect(m1AtN2.scenario.widthM).toBeCloseTo(2e-8 / (1.25 * 1.2), 20);
    // the per-class override of step 2 leaves M1 alone and carries to N3 for M2 (issue 14: options carry forward)
    expect(ev.json.steps[2].settings.overrides.M2.k).toBe(2.2);
    expect(ev.json.steps[2].settings.overrides.M1?.k).toBeUndefined();
  });

  it("a stored chain that no longer fits its baseline (a class removed) answers 400 naming the step, not a 500", async () => {
    const { owner, teamId } = await teamWithRoles();
    const b = await createBaseline(owner.client, teamId);
    const r = (await owner.client.post(`/api/teams/${teamId}/roadmaps`, { name: "R", baselineId: b.id, steps: THREE_STEPS })).json.roadmap;
    const classes = (await owner.client.get(`/api/baselines/${b.id}`)).json.baseline.classes;
    expect((await owner.client.put(`/api/baselines/${b.id}/classes`, { version: 1, classes: classes.slice(0, 1) })).status).toBe(200);
    const ev = await owner.client.post(`/api/roadmaps/${r.id}/evaluate`);
    expect(ev.status).toBe(400);
    expect(Object.keys(ev.json.error.fields)).toEqual(["steps.1.settings.overrides.M2"]);
  });
});

describe("roadmaps: steps from a scenario", () => {
  it("a step with fromScenarioId copies the scenario's settings and keeps the id; another baseline's or team's scenario is a 400 on steps.N.fromScenarioId", async () => {
    const { owner, outsider, teamId } = await teamWithRoles();
    const b = await createBaseline(owner.client, teamId);
    const b2 = await createBaseline(owner.client, teamId);
    const settings = { s: 1.3, sL: 1.1, miller: 1.5, overrides: { M1: { metal: "Ru", barrierM: 0 } } };
    const sc = (await owner.client.post(`/api/teams/${teamId}/scenarios`, { baselineId: b.id, name: "Ru local", settings })).json.scenario;
    const c = await owner.client.post(`/api/teams/${teamId}/roadmaps`, {
      name: "From a scenario",
      baselineId: b.id,
      steps: [
        { name: "N1", settings: { s: 1.2 } },
        { name: "N2", settings: {}, fromScenarioId: sc.id },
      ],
    });
    expect(c.status, c.text).toBe(201);
    expect(c.json.roadmap.steps[1]).toEqual({ name: "N2", settings: sc.settings, fromScenarioId: sc.id });

    // the source scenario deleted later: the roadmap still saves with the step as stored
    const made = c.json.roadmap;
    expect((await owner.client.del(`/api/scenarios/${sc.id}`)).status).toBe(204);
    const resaved = await owner.client.patch(`/api/roadmaps/${made.id}`, { version: 1, steps: made.steps });
    expect(resaved.status, resaved.text).toBe(200);
    expect(resaved.json.roadmap.steps[1]).toEqual(made.steps[1]);

    const elsewhere = (await owner.client.post(`/api/teams/${teamId}/scenarios`, { baselineId: b2.id, name: "Other baseline" })).json.scenario;
    const ob = await createBaseline(outsider.client, outsider.teamId);
    const foreign = (await outsider.client.post(`/api/teams/${outsider.teamId}/scenarios`, { baselineId: ob.id, name: "Theirs" })).json.scenario;
    const before = stored();
    for (const [id, msg] of [
      [elsewhere.id, /another baseline/],
      [foreign.id, /no scenario with this id/],
      ["no-such-scenario", /no scenario with this id/],
    ] as const) {
      const bad = await owner.client.post(`/api/teams/${teamId}/roadmaps`, {
        name: "Bad",
        baselineId: b.id,
        steps: [
          { name: "N1", settings: { s: 1.2 } },
          { name: "N2", settings: {}, fromScenarioId: id },
        ],
      });
      expect(bad.status).toBe(400);
      expect(Object.keys(bad.json.error.fields)).toEqual(["steps.1.fromScenarioId"]);
      expect(bad.json.error.fields["steps.1.fromScenarioId"][0]).toMatch(msg);
    }
    expect(stored()).toEqual(before);
  });
});

describe("roadmaps: bad input answers 400 naming the step and field; nothing stored", () => {
  const nine = Array.from({ length: 9 }, (_, i) => ({ name: `N${i + 1}`, settings: { s: 1.1 } }));
  const cases: { what: string; steps: unknown; field: (k: string) => boolean; message: RegExp }[] = [
    { what: "more than 8 steps", steps: nine, field: (k) => k === "steps", message: /8/ },
    { what: "no steps", steps: [], field: (k) => k === "steps", message: /step/i },
    {
      what: "a class not in the baseline",
      steps: [
        { name: "N1", settings: { s: 1.2 } },
        { name: "N2", settings: { overrides: { M9: { s: 1.3 } } } },
      ],
      field: (k) => k === "steps.1.settings.overrides.M9",
      message: /M9/,
    },
    {
      what: "a target pitch smaller than twice the barrier (M1: 2 nm barrier, kept)",
      steps: [{ name: "N1", settings: { overrides: { M1: { targetPitchM: 3e-9 } } } }],
      field: (k) => k.startsWith("steps.0.settings.overrides.M1"),
      message: /barrier/i,
    },
    {
      what: "a length rule exponent outside 0–2",
      steps: [{ name: "N1", settings: { s: 1.2, lengthRule: { kind: "power", exponent: 2.5 } } }],
      field: (k) => k.startsWith("steps.0.settings.lengthRule"),
      message: /2/,
    },
    {
      what: "a per-class length rule exponent below 0",
      steps: [{ name: "N1", settings: { overrides: { M2: { lengthRule: { kind: "power", exponent: -0.5 } } } } }],
      field: (k) => k.startsWith("steps.0.settings.overrides.M2.lengthRule"),
      message: /0/,
    },
  ];
  for (const k of cases) {
    it(`rejects ${k.what}, on create and on save`, async () => {
      const { owner, teamId } = await teamWithRoles();
      const b = await createBaseline(owner.client, teamId);
      const r = (await owner.client.post(`/api/teams/${teamId}/roadmaps`, { name: "Good", baselineId: b.id, steps: THREE_STEPS })).json.roadmap;
      const before = stored();
      for (const res of [
        await owner.client.post(`/api/teams/${teamId}/roadmaps`, { name: "Bad", baselineId: b.id, steps: k.steps }),
        await owner.client.patch(`/api/roadmaps/${r.id}`, { version: 1, steps: k.steps }),
      ]) {
        expect(res.status, res.text).toBe(400);
        expect(res.json.error.code).toBe("invalid_input");
        const keys = Object.keys(res.json.error.fields ?? {});
        expect(keys.some(k.field), keys.join(", ")).toBe(true);
        expect(res.json.error.message).toMatch(k.message);
      }
      expect(stored()).toEqual(before);
    });
  }

  it("a taken name is a 400 on name; a missing baseline is a 404", async () => {
    const { owner, teamId } = await teamWithRoles();
    const b = await createBaseline(owner.client, teamId);
    expect((await owner.client.post(`/api/teams/${teamId}/roadmaps`, { name: "Same", baselineId: b.id, steps: THREE_STEPS })).status).toBe(201);
    const before = stored();
    const dup = await owner.client.post(`/api/teams/${teamId}/roadmaps`, { name: "same", baselineId: b.id, steps: THREE_STEPS });
    expect(dup.status).toBe(400);
    expect(Object.keys(dup.json.error.fields)).toEqual(["name"]);
    const none = await owner.client.post(`/api/teams/${teamId}/roadmaps`, { name: "X", baselineId: "nope", steps: THREE_STEPS });
    expect(none.status).toBe(404);
    expect(stored()).toEqual(before);
  });
});

describe("POST /api/scenarios/[id]/duplicate", () => {
  it("copies settings and notes under a free name (201, the create route's shape), with a revision and an audit row; roles as for writes", async () => {
    const { owner, editor, viewer, outsider, teamId } = await teamWithRoles();
    const b = await createBaseline(owner.client, teamId);
    const settings = { s: 1.4, sL: 1.2, miller: 1.5, k: 2.2, overrides: { M2: { metal: "Ru", barrierM: 0, airGap: { kGap: 1, gapFraction: 0.5 } } } };
    const src = (await owner.client.post(`/api/teams/${teamId}/scenarios`, { baselineId: b.id, name: "Shrink", notes: "why", settings })).json.scenario;

    const d1 = await editor.client.post(`/api/scenarios/${src.id}/duplicate`);
    expect(d1.status, d1.text).toBe(201);
    const copy = d1.json.scenario;
    expect(Object.keys(copy).sort()).toEqual(Object.keys(src).sort());
    expect(copy).toMatchObject({ name: "Shrink (copy)", notes: "why", baselineId: b.id, teamId, version: 1, createdBy: editor.userId });
    expect(copy.settings).toEqual(src.settings);
    expect(copy.id).not.toBe(src.id);
    const d2 = await editor.client.post(`/api/scenarios/${src.id}/duplicate`, {});
    expect(d2.json.scenario.name).toBe("Shrink (copy 2)");
    const named = await editor.client.post(`/api/scenarios/${src.id}/duplicate`, { name: "Shrink, air gap" });
    expect(named.status).toBe(201);
    expect(named.json.scenario.name).toBe("Shrink, air gap");

    const revs = await viewer.client.get(`/api/scenarios/${copy.id}/revisions`);
    expect(revs.json.revisions).toHaveLength(1);
    expect(revs.json.revisions[0]).toMatchObject({ version: 1, summary: 'Duplicated from "Shrink"', userName: "Eve Editor" });
    const audit = auditOf(teamId, "scenario.create").filter((r) => r.entity_id === copy.id);
    expect(audit).toHaveLength(1);
    expect(JSON.parse(audit[0]!.detail)).toEqual({ name: "Shrink (copy)", baselineId: b.id, duplicatedFrom: src.id });
    // the copy evaluates exactly like the original
    const e1 = await viewer.client.post(`/api/scenarios/${src.id}/evaluate`);
    const e2 = await viewer.client.post(`/api/scenarios/${copy.id}/evaluate`);
    expect(e2.json.evaluation).toEqual(e1.json.evaluation);

    const before = stored();
    const taken = await editor.client.post(`/api/scenarios/${src.id}/duplicate`, { name: "shrink" });
    expect(taken.status).toBe(400);
    expect(Object.keys(taken.json.error.fields)).toEqual(["name"]);
    const blank = await editor.client.post(`/api/scenarios/${src.id}/duplicate`, { name: "  " });
    expect(blank.status).toBe(400);
    expect(Object.keys(blank.json.error.fields)).toEqual(["name"]);
    expect((await viewer.client.post(`/api/scenarios/${src.id}/duplicate`)).status).toBe(403);
    expect((await outsider.client.post(`/api/scenarios/${src.id}/duplicate`)).status).toBe(404);
    expect((await editor.client.post(`/api/scenarios/no-such-id/duplicate`)).status).toBe(404);
    expect((await new Client().post(`/api/scenarios/${src.id}/duplicate`)).status).toBe(401);
    expect(stored()).toEqual(before);
  });
});

describe("reports with roadmaps", () => {
  it("freezes the chosen roadmaps' steps and evaluations; the frozen JSON stays byte-identical after the roadmap is saved again; the CSV has a row per step", async () => {
    const { owner, viewer, outsider, teamId } = await teamWithRoles();
    const b = await createBaseline(owner.client, teamId);
    const s1 = (await owner.client.post(`/api/teams/${teamId}/scenarios`, { baselineId: b.id, name: "Shrink", settings: { s: 1.4 } })).json.scenario;
    const s2 = (
      await owner.client.post(`/api/teams/${teamId}/scenarios`, {
        baselineId: b.id,
        name: "Shrink Ru",
        settings: { s: 1.4, overrides: { M1: { metal: "Ru", barrierM: 0 } } },
      })
    ).json.scenario;
    const cu = (await owner.client.post(`/api/teams/${teamId}/roadmaps`, { name: "Cu", baselineId: b.id, steps: THREE_STEPS })).json.roadmap;
    const ruSteps: RoadmapStep[] = [
      { name: "N1", settings: { s: 1.25, overrides: { M1: { metal: "Ru", barrierM: 0 } } } },
      { name: "N2", settings: { s: 1.2, overrides: { M2: { airGap: { kGap: 1, gapFraction: 1 } } } } },
    ];
    const ru = (await owner.client.post(`/api/teams/${teamId}/roadmaps`, { name: "Ru", baselineId: b.id, steps: ruSteps })).json.roadmap;

    const made = await owner.client.post(`/api/teams/${teamId}/reports`, {
      baselineId: b.id,
      scenarioIds: [s1.id, s2.id],
      roadmapIds: [cu.id, ru.id],
      title: "Branches",
    });
    expect(made.status, made.text).toBe(201);
    const frozen = made.json.report.frozen;
    expect(frozen.roadmaps.map((r: { key: string; name: string; roadmapId: string; version: number }) => [r.key, r.name, r.roadmapId, r.version])).toEqual([
      ["R1", "Cu", cu.id, 1],
      ["R2", "Ru", ru.id, 1],
    ]);
    expect(frozen.roadmaps[1].steps.map((st: { name: string }) => st.name)).toEqual(["N1", "N2"]);
    expect(frozen.roadmaps[1].steps[0].settings).toEqual(ruSteps[0]!.settings);
    // every step's numbers are the engine's evaluateRoadmap on the stored classes
    const classes = await engineClasses(owner.client, b.id);
    for (const [i, steps] of [THREE_STEPS, ruSteps].entries()) {
      const local = evaluateRoadmap({ classes, technology: TECH, steps }).steps;
      frozen.roadmaps[i].steps.forEach((st: { evaluation: { classes: { name: string; scenario: { delayS: number } }[] }; composed: unknown }, j: number) => {
        expect(st.evaluation.classes.map((c) => c.scenario.delayS)).toEqual(local[j]!.evaluation.classes.map((c) => c.scenario.delayS));
        expect(st.composed).toEqual(JSON.parse(JSON.stringify(local[j]!.settings)));
      });
    }

    const frozenText = () => {
      const db = rawDb();
      try {
        return (db.prepare("select frozen from reports where id = ?").get(made.json.report.id) as { frozen: string }).frozen;
      } finally {
        db.close();
      }
    };
    const storedBefore = frozenText();
    const readBefore = (await viewer.client.get(`/api/reports/${made.json.report.id}`)).text;
    const p = await owner.client.patch(`/api/roadmaps/${cu.id}`, { version: 1, name: "Cu, renamed", steps: [{ name: "N1", settings: { s: 2 } }] });
    expect(p.status, p.text).toBe(200);
    expect(frozenText()).toBe(storedBefore);
    const readAfter = await viewer.client.get(`/api/reports/${made.json.report.id}`);
    expect(JSON.stringify(readAfter.json.report?.frozen ?? readAfter.json.frozen)).toBe(
      JSON.stringify(JSON.parse(readBefore).report?.frozen ?? JSON.parse(readBefore).frozen),
    );
    expect(JSON.stringify(readAfter.json.report?.frozen ?? readAfter.json.frozen)).toContain('"name":"Cu"');

    // refresh freezes the roadmaps as they are now, as the next version; the old version keeps its copy
    const refreshed = await owner.client.post(`/api/reports/${made.json.report.id}/refresh`);
    expect(refreshed.status, refreshed.text).toBe(201);
    const v2 = (await viewer.client.get(`/api/reports/${refreshed.json.report.id}`)).json.report.frozen;
    expect(v2.roadmaps.map((r: { name: string; version: number; steps: unknown[] }) => [r.name, r.version, r.steps.length])).toEqual([
      ["Cu, renamed", 2, 1],
      ["Ru", 1, 2],
    ]);
    expect(frozenText()).toBe(storedBefore);

    const csv = await viewer.client.get(`/api/reports/${made.json.report.id}/export.csv`);
    expect(csv.status).toBe(200);
    const [table, totals] = csv.text.split("\r\n\r\n");
    const stepRows = table!.split("\r\n").filter((l) => l.startsWith("Roadmap "));
    // 2 classes × (3 + 2) steps
    expect(stepRows).toHaveLength(10);
    expect(stepRows.filter((l) => l.startsWith("Roadmap R2 N2,Ru,"))).toHaveLength(2);
    expect(totals!.split("\r\n").filter((l) => l.startsWith("Roadmap "))).toHaveLength(5);

    // the share view leaves the source ids out
    const share = await owner.client.post(`/api/reports/${made.json.report.id}/share-links`, {});
    expect(share.status, share.text).toBe(201);
    const shown = await new Client().get(`/api/share/${(share.json.url as string).split("/r/")[1]}`);
    expect(shown.status).toBe(200);
    expect(shown.json.report.frozen.roadmaps.map((r: { name: string }) => r.name)).toEqual(["Cu", "Ru"]);
    for (const secret of [cu.id, ru.id, s1.id, s2.id, b.id, teamId]) expect(shown.text).not.toContain(secret);

    // another baseline's roadmap: 400 on roadmapIds; another team's (or none): 404 on roadmapIds; nothing stored
    const b2 = await createBaseline(owner.client, teamId);
    const elsewhere = (await owner.client.post(`/api/teams/${teamId}/roadmaps`, { name: "Elsewhere", baselineId: b2.id, steps: THREE_STEPS })).json.roadmap;
    const ob = await createBaseline(outsider.client, outsider.teamId);
    const theirs = (await outsider.client.post(`/api/teams/${outsider.teamId}/roadmaps`, { name: "Theirs", baselineId: ob.id, steps: THREE_STEPS })).json
      .roadmap;
    const before = stored();
    const countReports = () => {
      const db = rawDb();
      try {
        return (db.prepare("select count(*) as n from reports").get() as { n: number }).n;
      } finally {
        db.close();
      }
    };
    const reportsBefore = countReports();
    const wrongBaseline = await owner.client.post(`/api/teams/${teamId}/reports`, {
      baselineId: b.id,
      scenarioIds: [s1.id, s2.id],
      roadmapIds: [elsewhere.id],
      title: "x",
    });
    expect(wrongBaseline.status).toBe(400);
    expect(Object.keys(wrongBaseline.json.error.fields)).toEqual(["roadmapIds"]);
    for (const id of [theirs.id, "no-such-roadmap"]) {
      const r = await owner.client.post(`/api/teams/${teamId}/reports`, { baselineId: b.id, scenarioIds: [s1.id, s2.id], roadmapIds: [id], title: "x" });
      expect(r.status).toBe(404);
      expect(Object.keys(r.json.error.fields)).toEqual(["roadmapIds"]);
    }
    expect(countReports()).toBe(reportsBefore);
    expect(stored()).toEqual(before);
  });
});

import { describe, expect, it } from "vitest";
import { evaluateScenario, type WireClass } from "@/lib/scaling";
import { createBaseline, rawDb, snapshot, teamWithRoles } from "./workspace-helpers";

// Issue 14: length rules (global and per class) and a scenario temperature through the scenario routes and reports.

describe("scenarios with length rules and a temperature", () => {
  it("stores the rules and temperature as given, evaluates with them like the engine, and freezes them in a report", async () => {
    const { owner, teamId } = await teamWithRoles();
    const b = await createBaseline(owner.client, teamId);
    const settings = {
      s: 1.5,
      lengthRule: { kind: "power", exponent: "0.5" },
      temperatureC: 105,
      overrides: { M2: { lengthRule: { kind: "fixed" } } },
    };
    const c = await owner.client.post(`/api/teams/${teamId}/scenarios`, { baselineId: b.id, name: "Rules", settings });
    expect(c.status, c.text).toBe(201);
    const s = c.json.scenario;
    expect(s.settings.lengthRule).toEqual({ kind: "power", exponent: 0.5 });
    expect(s.settings.temperatureC).toBe(105);
    expect(s.settings.overrides).toEqual({ M2: { lengthRule: { kind: "fixed" } } });
    // a scenario without them stores neither field (settings stored before keep their shape)
    const plain = (await owner.client.post(`/api/teams/${teamId}/scenarios`, { baselineId: b.id, name: "Plain", settings: { s: 1.5 } })).json.scenario;
    expect(plain.settings).not.toHaveProperty("lengthRule");
    expect(plain.settings).not.toHaveProperty("temperatureC");
    // the route's evaluation is the engine's with the stored settings: M1 at S_L = √1.5, M2 kept
    const ev = await owner.client.post(`/api/scenarios/${s.id}/evaluate`);
    expect(ev.status, ev.text).toBe(200);
    const baseline = (await owner.client.get(`/api/baselines/${b.id}`)).json.baseline;
    const classes = baseline.classes.map(({ id: _id, ...wc }: WireClass & { id: string }) => wc);
    const local = evaluateScenario({ classes, technology: baseline.technology, settings: s.settings });
    expect(ev.json.evaluation.classes.map((x: { ratio: unknown }) => x.ratio)).toEqual(JSON.parse(JSON.stringify(local.classes.map((x) => x.ratio))));
    const [m1, m2] = ev.json.evaluation.classes;
    expect(m1.scenario.lengthM).toBeCloseTo(m1.baseline.lengthM / Math.sqrt(1.5), 18);
    expect(m2.scenario.lengthM).toBe(m2.baseline.lengthM);
    expect(m1.scenario.temperatureC).toBe(105);
    expect(m1.baseline.temperatureC).toBe(baseline.technology.temperatureC ?? 25);
    // a report freezes them
    const rep = await owner.client.post(`/api/teams/${teamId}/reports`, { baselineId: b.id, scenarioIds: [s.id, plain.id], title: "Rules" });
    expect(rep.status, rep.text).toBe(201);
    const frozen = (await owner.client.get(`/api/reports/${rep.json.report.id}`)).json.report.frozen;
    expect(frozen.options[0].settings.lengthRule).toEqual({ kind: "power", exponent: 0.5 });
    expect(frozen.options[0].settings.overrides.M2).toEqual({ lengthRule: { kind: "fixed" } });
    expect(frozen.options[1].settings).not.toHaveProperty("lengthRule");
  });

  it("an exponent outside 0–2 (global or per class) or a factor ≤ 0 answers 400 naming the field; nothing stored", async () => {
    const { owner, teamId } = await teamWithRoles();
    const b = await createBaseline(owner.client, teamId);
    const s = (await owner.client.post(`/api/teams/${teamId}/scenarios`, { baselineId: b.id, name: "S" })).json.scenario;
    const cases: [Record<string, unknown>, string][] = [
      [{ lengthRule: { kind: "power", exponent: 2.5 } }, "settings.lengthRule.exponent"],
      [{ overrides: { M1: { lengthRule: { kind: "power", exponent: -1 } } } }, "settings.overrides.M1.lengthRule.exponent"],
      [{ lengthRule: { kind: "factor", sL: 0 } }, "settings.lengthRule.sL"],
      [{ temperatureC: 500 }, "settings.temperatureC"],
    ];
    for (const [bad, field] of cases) {
      const before = snapshot();
      const r = await owner.client.patch(`/api/scenarios/${s.id}`, { version: 1, settings: { ...s.settings, ...bad } });
      expect(r.status, r.text).toBe(400);
      expect(Object.keys(r.json.error.fields ?? {})).toContain(field);
      const created = await owner.client.post(`/api/teams/${teamId}/scenarios`, { baselineId: b.id, name: "Bad", settings: bad });
      expect(created.status).toBe(400);
      expect(Object.keys(created.json.error.fields ?? {})).toContain(field);
      expect(snapshot()).toEqual(before);
    }
    const db = rawDb();
    const n = (db.prepare("select count(*) as n from scenarios where baseline_id = ?").get(b.id) as { n: number }).n;
    db.close();
    expect(n).toBe(1);
  });
});

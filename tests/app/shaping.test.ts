import { beforeAll, describe, expect, inject, it } from "vitest";
import { openDatabase } from "@/db/connect";
import { seedDemoWorkspace } from "@/lib/demo/seed-workspace";
import { type Client, userWithTeam } from "../helpers/http";
import { addMember } from "../helpers/members";

// Issue 15 items 2 and 3 over HTTP: "apply to scenario" is the existing versioned scenario save (PATCH) with the
// class's override gaining lineFraction and aspectRatio; the shaping page's access; a report with the shaping section.

let owner: { client: Client; teamId: string; userId: string };
let viewer: { client: Client };
let baselineId: string;
let scenarioIds: string[];

beforeAll(async () => {
  owner = await userWithTeam("Shaping (http)");
  const knex = openDatabase(inject("dbPath"));
  try {
    ({ baselineId, scenarioIds } = await seedDemoWorkspace(knex, { teamId: owner.teamId, ownerId: owner.userId, editorId: owner.userId }));
  } finally {
    await knex.destroy();
  }
  viewer = await addMember(owner.client, owner.teamId, "viewer");
});

describe("apply to scenario (PATCH /api/scenarios/[id])", () => {
  it("stores { lineFraction, aspectRatio } beside the class's other override entries; a stale version is 409; a viewer 403", async () => {
    const id = scenarioIds[1]!; // the air-gap scenario: intermediate already has an override
    const { scenario } = (await owner.client.get(`/api/scenarios/${id}`)).json;
    const settings = {
      ...scenario.settings,
      overrides: { ...scenario.settings.overrides, intermediate: { ...scenario.settings.overrides.intermediate, lineFraction: 0.47, aspectRatio: 2.5 } },
    };
    const ok = await owner.client.patch(`/api/scenarios/${id}`, { version: scenario.version, settings });
    expect(ok.status, ok.text).toBe(200);
    expect(ok.json.scenario.version).toBe(scenario.version + 1);
    expect(ok.json.scenario.settings.overrides.intermediate).toEqual({ airGap: { kGap: 1, gapFraction: 1 }, lineFraction: 0.47, aspectRatio: 2.5 });

    const stale = await owner.client.patch(`/api/scenarios/${id}`, { version: scenario.version, settings });
    expect(stale.status).toBe(409);
    expect(stale.json.error).toMatchObject({ code: "stale_version", currentVersion: scenario.version + 1 });

    const denied = await viewer.client.patch(`/api/scenarios/${id}`, { version: scenario.version + 1, settings });
    expect(denied.status).toBe(403);
    const bad = await owner.client.patch(`/api/scenarios/${id}`, {
      version: scenario.version + 1,
      settings: { ...settings, overrides: { intermediate: { lineFraction: 1.2 } } },
    });
    expect(bad.status).toBe(400);
    expect(JSON.stringify(bad.json.error)).toMatch(/lineFraction|Line fraction/);
    // nothing changed by the refused writes
    expect((await owner.client.get(`/api/scenarios/${id}`)).json.scenario.version).toBe(scenario.version + 1);
  });
});

describe("the Layer shaping page", () => {
  it("renders for a viewer and an owner; another team's scenario is a 404", async () => {
    const url = `/teams/${owner.teamId}/scenarios/${scenarioIds[0]}/shaping`;
    for (const c of [owner.client, viewer.client]) {
      const r = await c.get(url);
      expect(r.status).toBe(200);
      expect(r.text).toContain("Layer shaping");
    }
    const other = await userWithTeam("Other (shaping)");
    expect((await other.client.get(url)).status).toBe(404);
  });
});

describe("a report with the Layer shaping section", () => {
  it("freezes, per option and chosen class, the optimum, the delay parts and the top-5 tornado; the report page shows it", async () => {
    const r = await owner.client.post(`/api/teams/${owner.teamId}/reports`, {
      baselineId,
      scenarioIds: scenarioIds.slice(0, 2),
      title: "Shaping report",
      classNames: ["local", "intermediate"],
      shaping: { objective: "repeated" },
    });
    expect(r.status, r.text).toBe(201);
    const sh = r.json.report.frozen.shaping;
    expect(sh.objective).toBe("repeated");
    expect(sh.options.map((o: { key: string }) => o.key)).toEqual(["A", "B"]);
    for (const o of sh.options) {
      expect(o.classes.map((c: { className: string }) => c.className)).toEqual(["local", "intermediate"]);
      for (const c of o.classes) {
        expect(c.optimum.objectiveValue).toBeLessThanOrEqual(c.current.objectiveValue * (1 + 1e-9));
        expect(c.tornado.top).toHaveLength(5);
        const p = c.parts;
        expect(p.driverWireS + p.driverLoadS + p.wireWireS + p.wireLoadS + p.repeatersS).toBeCloseTo(p.totalS, 18);
      }
    }
    const page = await owner.client.get(`/teams/${owner.teamId}/reports/${r.json.report.id}`);
    expect(page.status).toBe(200);
    expect(page.text).toContain("Layer shaping: line fraction and aspect ratio");
    const bad = await owner.client.post(`/api/teams/${owner.teamId}/reports`, {
      baselineId,
      scenarioIds: scenarioIds.slice(0, 2),
      title: "Bad shaping",
      shaping: { objective: "speed" },
    });
    expect(bad.status).toBe(400);
    expect(JSON.stringify(bad.json.error)).toContain("shaping.objective must be delay, repeated, energy or edp.");
    // without the choice the document has no section (older reports and reports without it are unchanged)
    const plain = await owner.client.post(`/api/teams/${owner.teamId}/reports`, { baselineId, scenarioIds: scenarioIds.slice(0, 2), title: "Plain" });
    expect(plain.status).toBe(201);
    expect(plain.json.report.frozen.shaping).toBeUndefined();
  });
});

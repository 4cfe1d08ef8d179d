import { describe, expect, it } from "vitest";
import { evaluateScenario, fitSizeEffect, type WireClass } from "@/lib/scaling";
import { TECH, createBaseline, snapshot, teamWithRoles } from "./workspace-helpers";

type StoredClass = WireClass & { id: string; position: number; histogramBins: number };
const engineClasses = (cs: StoredClass[]): WireClass[] => cs.map(({ id: _i, position: _p, histogramBins: _h, ...c }) => c);

// Invented measurements of the two sample classes (M1: 20 × 40 nm, barrier 2 nm; M2: 40 × 80 nm, barrier 2.5 nm), made
// from p = 0.3, R = 0.35 at 25 °C and rounded to 5 digits, so one (p, R) pair fits both.
// Their bulk floors at 25 °C, ρ0(20 °C)·(1 + α·5 K)/A with the catalogue's Cu (1.678 µΩ·cm, α = 0.00405/K; CRC
// Handbook, docs/models.md): M1 16 × 38 nm → 28.2 Ω/µm, M2 35 × 77.5 nm → 6.31 Ω/µm.
const MEASURED = [
  { class: "M1", rOhmPerUm: 109.73 },
  { class: "M2", rOhmPerUm: 14.832, temperatureC: 25 },
];

describe("POST /api/baselines/[id]/fit: calibration to measured lines", () => {
  it("returns the engine's fit on the stored classes (viewer may run it), stores nothing; the fit applies through PATCH technology.materials", async () => {
    const { owner, viewer, outsider, teamId } = await teamWithRoles();
    const b = await createBaseline(owner.client, teamId);
    const before = snapshot();
    const r = await viewer.client.post(`/api/baselines/${b.id}/fit`, { measured: MEASURED });
    expect(r.status, r.text).toBe(200);
    expect(snapshot()).toEqual(before);
    const stored = (await owner.client.get(`/api/baselines/${b.id}`)).json.baseline;
    const local = fitSizeEffect({
      classes: engineClasses(stored.classes),
      technology: stored.technology,
      measured: MEASURED.map((m) => ({ className: m.class, rOhmPerM: m.rOhmPerUm * 1e6, temperatureC: m.temperatureC })),
    });
    expect(r.json).toEqual(JSON.parse(JSON.stringify(local)));
    expect(Object.keys(r.json.metals)).toEqual(["Cu"]);
    expect(r.json.points.map((p: { class: string }) => p.class)).toEqual(["M1", "M2"]);
    // two lines of one metal and two unknowns: the fit goes through both
    for (const p of r.json.points) expect(Math.abs(p.residual)).toBeLessThan(1e-3);

    // the editor's unsaved technology is the starting point when sent (here: hotter wiring → lower fitted scattering)
    const hot = await viewer.client.post(`/api/baselines/${b.id}/fit`, {
      measured: [{ class: "M1", rOhmPerUm: 45.2 }],
      technology: { ...TECH, temperatureC: 85 },
    });
    const cold = await viewer.client.post(`/api/baselines/${b.id}/fit`, { measured: [{ class: "M1", rOhmPerUm: 45.2 }] });
    expect(hot.status).toBe(200);
    expect(hot.json.metals.Cu.resistivityOhmM).toBeLessThan(cold.json.metals.Cu.resistivityOhmM);

    expect((await outsider.client.post(`/api/baselines/${b.id}/fit`, { measured: MEASURED })).status).toBe(404);

    // apply: the fitted block and its source go into the baseline's technology; evaluations use it
    const patch = await owner.client.patch(`/api/baselines/${b.id}`, {
      version: 1,
      technology: { ...TECH, materials: r.json.metals, materialsSource: "Fitted to 2 measured lines (M1, M2), 2026-12-02" },
    });
    expect(patch.status, patch.text).toBe(200);
    expect(patch.json.baseline.technology.materials).toEqual(r.json.metals);
    expect(patch.json.baseline.technology.materialsSource).toBe("Fitted to 2 measured lines (M1, M2), 2026-12-02");
    const revs = await owner.client.get(`/api/baselines/${b.id}/revisions`);
    expect(revs.json.revisions[0].summary).toMatch(/materials, materials source/);
    const s = (await owner.client.post(`/api/teams/${teamId}/scenarios`, { baselineId: b.id, name: "Calibrated" })).json.scenario;
    const ev = await owner.client.post(`/api/scenarios/${s.id}/evaluate`);
    const mine = evaluateScenario({ classes: engineClasses(patch.json.baseline.classes), technology: patch.json.baseline.technology, settings: s.settings });
    expect(ev.json.evaluation.classes[0].baseline.rOhmPerM).toBe(mine.classes[0]!.baseline.rOhmPerM);
    // at the baseline geometry, the calibrated full model gives the measured line back (× Ω/m per Ω/µm)
    expect(Math.abs(ev.json.evaluation.classes[0].baseline.rOhmPerM / 1e6 / 109.73 - 1)).toBeLessThan(1e-3);
    // a guard against a hang, not a speed check: four members signing up (scrypt) and confirming their addresses
    // through mailed links take seconds on a busy machine
  }, 90_000);

  it.each([
    [{ measured: [{ class: "M1", rOhmPerUm: 0 }] }, "measured.0.rOhmPerUm", /greater than 0/],
    [{ measured: [{ class: "M1", rOhmPerUm: -3 }] }, "measured.0.rOhmPerUm", /greater than 0/],
    [{ measured: [{ class: "M1", rOhmPerUm: "NaN" }] }, "measured.0.rOhmPerUm", /must be a number/],
    [{ measured: [{ class: "M1", rOhmPerUm: 1e12 }] }, "measured.0.rOhmPerUm", /below 1e9/],
    // below the bulk floor of M1 (28.2 Ω/µm at 25 °C): impossible, size effects only add resistance
    [
      { measured: [MEASURED[0], { class: "M1", rOhmPerUm: 20 }] },
      "measured.1.rOhmPerUm",
      /Row 2 \(class M1\): 20 Ω\/µm is below the bulk resistance.*28\.\d+ Ω\/µm at 25 °C/,
    ],
    [{ measured: [{ class: "M9", rOhmPerUm: 40 }] }, "measured.0.class", /Row 1 \(class M9\): no class of this baseline is named "M9"/],
    [{ measured: [{ class: "M1", rOhmPerUm: 40, temperatureC: -300 }] }, "measured.0.temperatureC", /above −273.15 °C/],
    [{ measured: [{ class: "M1", rOhmPerUm: 40, temperatureC: 401 }] }, "measured.0.temperatureC", /at most 400 °C/],
    [{ measured: [] }, "measured", /at least one/],
    [{ measured: [{ class: "M1", rOhmPerUm: 40, extra: 1 }] }, "measured.0", /extra/],
  ])("a bad measured line answers 400 naming row and field, nothing stored: %j", async (body, field, message) => {
    const { owner, teamId } = await teamWithRoles();
    const b = await createBaseline(owner.client, teamId);
    const before = snapshot();
    const r = await owner.client.post(`/api/baselines/${b.id}/fit`, body);
    expect(r.status, r.text).toBe(400);
    expect(Object.keys(r.json.error.fields)).toContain(field);
    expect(r.json.error.fields[field].join(" ")).toMatch(message);
    expect(snapshot()).toEqual(before);
  });
});

describe("engine 2 inputs: out-of-range temperature, via counts and materials answer 400 naming the field, nothing stored", () => {
  it.each([
    ["technology.temperatureC", { temperatureC: -274 }],
    ["technology.temperatureC", { temperatureC: 401 }],
    ["technology.materials.Cu.specularity", { materials: { Cu: { specularity: 1.2 } } }],
    ["technology.materials.Cu.resistivityOhmM", { materials: { Cu: { resistivityOhmM: -1e-8 } } }],
    ["technology.materials.Cu.meanFreePathM", { materials: { Cu: { meanFreePathM: 0 } } }],
    ["technology.materials.Cu.tempCoeffPerK", { materials: { Cu: { tempCoeffPerK: 0.5 } } }],
    ["technology.materials.Xx", { materials: { Xx: { specularity: 0.1 } } }],
    ["technology.materials.Cu", { materials: { Cu: { colour: 1 } } }],
  ])("PATCH technology: %s", async (field, extra) => {
    const { owner, teamId } = await teamWithRoles();
    const b = await createBaseline(owner.client, teamId);
    const before = snapshot();
    const r = await owner.client.patch(`/api/baselines/${b.id}`, { version: 1, technology: { ...TECH, ...extra } });
    expect(r.status, r.text).toBe(400);
    expect(Object.keys(r.json.error.fields).some((k) => k.startsWith(field))).toBe(true);
    expect(snapshot()).toEqual(before);
  });

  it.each([
    [-1, /negative|at least/],
    [1.5, /whole number|integer/],
  ])("PUT classes with viasPerNet %s: 400 naming classes.0.viasPerNet", async (vias, message) => {
    const { owner, teamId } = await teamWithRoles();
    const b = await createBaseline(owner.client, teamId);
    const stored = (await owner.client.get(`/api/baselines/${b.id}`)).json.baseline;
    const before = snapshot();
    const classes = engineClasses(stored.classes).map((c, i) => (i === 0 ? { ...c, viasPerNet: vias } : c));
    const r = await owner.client.put(`/api/baselines/${b.id}/classes`, { version: 1, classes });
    expect(r.status, r.text).toBe(400);
    expect(r.json.error.fields["classes.0.viasPerNet"].join(" ")).toMatch(message);
    expect(snapshot()).toEqual(before);
  });
});

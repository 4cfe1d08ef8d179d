import { afterAll, beforeAll, describe, expect, it } from "vitest";
import type { Knex } from "knex";
import { tempDb } from "../helpers/temp-db";
import { DEMO_TEAM_NAME, DEMO_USERS, seedDemo } from "@/lib/demo/seed";
import { verifyPassword } from "@/lib/password";
import { listClassesWithHistograms } from "@/db/queries/wire-classes";
import { composeRoadmap } from "@/lib/scaling";

let db: Knex;
let close: () => Promise<void>;
beforeAll(async () => {
  ({ db, close } = await tempDb("demo"));
});
afterAll(() => close());

const TABLES = [
  "users",
  "teams",
  "memberships",
  "baselines",
  "wire_classes",
  "class_histograms",
  "scenarios",
  "roadmaps",
  "roadmap_revisions",
  "reports",
  "audit_log",
];
async function counts(): Promise<Record<string, number>> {
  const out: Record<string, number> = {};
  for (const t of TABLES) out[t] = Number(((await db(t).count({ n: "*" }).first()) as { n: number }).n);
  // one class_histograms row per class: count the bins they hold too
  out["histogram bins"] = Number(((await db("class_histograms").sum({ n: "bin_count" }).first()) as { n: number | null }).n ?? 0);
  return out;
}

describe("seedDemo", () => {
  it("creates the invented team with an owner, an editor and a viewer whose printed passwords work", async () => {
    const r = await seedDemo(db);
    const team = await db("teams").where({ id: r.teamId }).first();
    expect(team).toMatchObject({ name: DEMO_TEAM_NAME, is_demo: 1 });
    const roles = await db("memberships as m")
      .join("users as u", "u.id", "m.user_id")
      .where("m.team_id", r.teamId)
      .select("u.email", "m.role", "u.password_hash", "u.email_verified_at");
    expect(roles.map((x: { email: string; role: string }) => [x.email, x.role]).sort()).toEqual(DEMO_USERS.map((u) => [u.email, u.role]).sort());
    for (const u of DEMO_USERS) {
      const row = roles.find((x: { email: string }) => x.email === u.email)!;
      expect(await verifyPassword(u.password, row.password_hash)).toBe(true);
      // Verified from the start (issue 12, finding 6): the demo owner can send invites and report e-mails at once.
      expect(row.email_verified_at).toBeGreaterThan(0);
    }
    expect(r.baselineId).toBeTruthy();
    expect(r.scenarioIds?.length).toBe(3);
    expect(r.reportId).toBeTruthy();
  });

  it("gives the demo baseline two three-step roadmaps (issue 14) that compose against its classes", async () => {
    const team = await db("teams").where({ is_demo: 1 }).first("id");
    const rows: { name: string; steps: string; baseline_id: string; is_demo: number }[] = await db("roadmaps").where({ team_id: team.id }).orderBy("name");
    expect(rows.map((x) => x.name)).toEqual(["Barrier-free local, air-gapped intermediate", "Copper, fixed barrier"]);
    const baseline = await db("baselines").where({ team_id: team.id }).first("id", "technology");
    const classes = (await listClassesWithHistograms(db, baseline.id)).map(({ id: _i, position: _p, histogramBins: _h, ...c }) => c);
    const technology = JSON.parse(baseline.technology);
    for (const row of rows) {
      expect(row).toMatchObject({ baseline_id: baseline.id, is_demo: 1 });
      expect(JSON.parse(row.steps).map((s: { name: string }) => s.name)).toEqual(["N1", "N2", "N3"]);
    }
    const ru = composeRoadmap({ classes, technology, steps: JSON.parse(rows[0]!.steps) });
    const cu = composeRoadmap({ classes, technology, steps: JSON.parse(rows[1]!.steps) });
    // Issue 14 composition: a class's S is the product over the steps (invented S 1.25, 1.25, 1.2 in the copper branch);
    // the Ru branch sets local's N3 pitch to a 24 nm target, so local's S at N3 is 48 nm / 24 nm (skua-baseline.csv pitch).
    expect(cu[2]!.overrides.local!.s).toBeCloseTo(1.25 * 1.25 * 1.2, 12);
    expect(ru[2]!.overrides.local!.s).toBeCloseTo(48 / 24, 12);
    // carried forward: Ru without barrier on local from N1, the air gap on intermediate from N2; copper keeps its metal
    expect(ru[2]!.overrides.local).toMatchObject({ metal: "Ru", barrierM: 0 });
    expect(ru[0]!.overrides.intermediate?.airGap).toBeUndefined();
    expect(ru[2]!.overrides.intermediate!.airGap).toEqual({ kGap: 1, gapFraction: 1 });
    expect(cu[2]!.overrides.local!.metal).toBeUndefined();
    expect(cu[2]!.overrides.intermediate!.airGap).toBeUndefined();
  });

  it("is idempotent: a second run changes nothing and keeps later edits", async () => {
    const first = await counts();
    expect(first).toMatchObject({ class_histograms: 4, "histogram bins": 192, roadmaps: 2, roadmap_revisions: 2 });
    const team = await db("teams").where({ is_demo: 1 }).first("id");
    // A user's later change (a role change by the owner) must survive a re-run.
    const viewer = await db("users").where({ email: "viewer@harrowbay.example" }).first("id");
    await db("memberships").where({ team_id: team.id, user_id: viewer.id }).update({ role: "editor" });
    const r = await seedDemo(db);
    expect(r.teamId).toBe(team.id);
    expect(r.users.every((u) => !u.created)).toBe(true);
    expect(await counts()).toEqual(first);
    expect((await db("memberships").where({ team_id: team.id, user_id: viewer.id }).first("role")).role).toBe("editor");
  });
});

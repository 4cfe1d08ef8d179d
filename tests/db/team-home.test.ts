import { afterAll, beforeAll, describe, expect, it } from "vitest";
import type { Knex } from "knex";
import { classRow } from "@/db/writes/baselines";
import { tempDb, wireClass } from "../helpers/temp-db";
import { getTeamHome } from "@/db/queries/home";

// getTeamHome answers the team home in one statement (counts + three "recent" lists as JSON); these rows are
// written directly so every ordering and filter of that statement is pinned down.

let db: Knex;
let close: () => Promise<void>;
beforeAll(async () => {
  ({ db, close } = await tempDb("home"));
  await db("users").insert([
    { id: "u1", email: "u1@example.test", name: "U1", password_hash: "x", created_at: 1 },
    { id: "u2", email: "u2@example.test", name: "U2", password_hash: "x", created_at: 1 },
  ]);
  await db("teams").insert([
    { id: "t", name: "T", created_at: 1 },
    { id: "other", name: "Other", created_at: 1 },
    { id: "empty", name: "Empty", created_at: 1 },
  ]);
  await db("memberships").insert([
    { team_id: "t", user_id: "u1", role: "owner", created_at: 1 },
    { team_id: "t", user_id: "u2", role: "viewer", created_at: 1 },
    { team_id: "other", user_id: "u1", role: "owner", created_at: 1 },
    { team_id: "empty", user_id: "u2", role: "owner", created_at: 1 },
  ]);
  const baseline = (team: string, i: number) => ({
    id: `${team}-b${i}`,
    team_id: team,
    name: `${team} baseline ${i}`,
    technology: "{}",
    is_demo: i % 2,
    created_at: 1,
    updated_at: 100 + ((i * 7) % 10), // a shuffled order, all distinct
  });
  await db("baselines").insert([...Array.from({ length: 10 }, (_, i) => baseline("t", i)), baseline("other", 0)]);
  // classes: baseline i of team t has i classes
  for (let i = 0; i < 10; i++) {
    for (let c = 0; c < i; c++) {
      await db("wire_classes").insert({ id: `t-b${i}-c${c}`, ...classRow(`t-b${i}`, c, wireClass(`c${c}`, { netCount: 10 })) });
    }
  }
  const scenario = (team: string, i: number, baselineId: string) => ({
    id: `${team}-s${i}`,
    team_id: team,
    baseline_id: baselineId,
    name: `${team} scenario ${i}`,
    settings: "{}",
    is_demo: i === 3 ? 1 : 0,
    created_at: 1,
    updated_at: 200 + ((i * 2) % 9),
  });
  await db("scenarios").insert([...Array.from({ length: 9 }, (_, i) => scenario("t", i, `t-b${i % 3}`)), scenario("other", 0, "other-b0")]);
  const report = (team: string, series: string, version: number, createdAt: number) => ({
    id: `${team}-${series}-v${version}`,
    team_id: team,
    series_id: `${team}-${series}`,
    version,
    title: `${series} v${version}`,
    frozen: "{}",
    engine_version: "test",
    is_demo: 0,
    created_at: createdAt,
  });
  await db("reports").insert([
    // ten series; r0, r1 and r9 have later versions, whose creation time decides the series' place
    ...Array.from({ length: 10 }, (_, i) => report("t", `r${i}`, 1, 300 + i)),
    report("t", "r0", 2, 400),
    report("t", "r1", 2, 290),
    report("t", "r1", 3, 401),
    report("t", "r9", 2, 200), // the latest version of r9 is older than its first: r9 drops out of the top 8
    report("other", "r0", 1, 999),
  ]);
});
afterAll(() => close());

describe("getTeamHome", () => {
  it("counts the team's own rows only (report series, not versions)", async () => {
    const home = await getTeamHome(db, "t");
    expect(home.counts).toEqual({ baselines: 10, scenarios: 9, reports: 10, members: 2 });
  });

  it("lists the 8 most recently changed baselines, newest first, with their class counts", async () => {
    const home = await getTeamHome(db, "t");
    const expected = Array.from({ length: 10 }, (_, i) => i)
      .sort((a, b) => ((b * 7) % 10) - ((a * 7) % 10))
      .slice(0, 8)
      .map((i) => ({ id: `t-b${i}`, name: `t baseline ${i}`, classCount: i, isDemo: i % 2 === 1, updatedAt: 100 + ((i * 7) % 10) }));
    expect(home.baselines).toEqual(expected);
  });

  it("lists the 8 most recently changed scenarios with their baseline's name", async () => {
    const home = await getTeamHome(db, "t");
    const expected = Array.from({ length: 9 }, (_, i) => i)
      .sort((a, b) => ((b * 2) % 9) - ((a * 2) % 9))
      .slice(0, 8)
      .map((i) => ({
        id: `t-s${i}`,
        name: `t scenario ${i}`,
        baselineName: `t baseline ${i % 3}`,
        isDemo: i === 3,
        updatedAt: 200 + ((i * 2) % 9),
      }));
    expect(home.scenarios).toEqual(expected);
  });

  it("lists the latest version of the 8 newest report series", async () => {
    const home = await getTeamHome(db, "t");
    expect(home.reports.map((r) => [r.id, r.version, r.createdAt])).toEqual([
      ["t-r1-v3", 3, 401],
      ["t-r0-v2", 2, 400],
      ["t-r8-v1", 1, 308],
      ["t-r7-v1", 1, 307],
      ["t-r6-v1", 1, 306],
      ["t-r5-v1", 1, 305],
      ["t-r4-v1", 1, 304],
      ["t-r3-v1", 1, 303],
    ]);
    expect(home.reports[0]).toEqual({ id: "t-r1-v3", title: "r1 v3", version: 3, isDemo: false, createdAt: 401 });
  });

  it("answers zeros and empty lists for a team without rows, and for no such team", async () => {
    const empty = { counts: { baselines: 0, scenarios: 0, reports: 0, members: 1 }, baselines: [], scenarios: [], reports: [] };
    expect(await getTeamHome(db, "empty")).toEqual(empty);
    expect(await getTeamHome(db, "no-such-team")).toEqual({ ...empty, counts: { ...empty.counts, members: 0 } });
  });
});

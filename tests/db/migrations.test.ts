import { afterAll, beforeAll, describe, expect, it } from "vitest";
import type { Knex } from "knex";
import fs from "node:fs";
import path from "node:path";
import { migrateLatest } from "@/db/migrate";
import { tempDb } from "../helpers/temp-db";

let db: Knex;
let close: () => Promise<void>;
beforeAll(async () => {
  ({ db, close } = await tempDb("db"));
});
afterAll(() => close());

describe("migrations", () => {
  it("creates every table the product needs", async () => {
    const rows = await db.raw<{ name: string }[]>("select name from sqlite_master where type = 'table'");
    const names = rows.map((r) => r.name);
    for (const t of [
      "users",
      "sessions",
      "teams",
      "memberships",
      "invites",
      "audit_log",
      "outbox",
      "baselines",
      "wire_classes",
      "class_histograms",
      "scenarios",
      "scenario_revisions",
      "roadmaps",
      "roadmap_revisions",
      "reports",
      "share_links",
      "known_devices",
      "password_resets",
    ]) {
      expect(names).toContain(t);
    }
  });

  it("stores a histogram as one class_histograms row per class, deleted with its class", async () => {
    const cols = await db.raw<{ name: string; type: string; notnull: number; pk: number }[]>("pragma table_info(class_histograms)");
    expect(cols.map((c) => [c.name, c.type.toLowerCase(), c.notnull || c.pk])).toEqual([
      ["class_id", "text", 1],
      ["bin_count", "integer", 1],
      ["net_count", "integer", 1],
      ["lengths_m", "blob", 1],
      ["counts", "blob", 1],
    ]);
    const fks = await db.raw<{ table: string; from: string; to: string; on_delete: string }[]>("pragma foreign_key_list(class_histograms)");
    expect(fks.map((f) => [f.table, f.from, f.to, f.on_delete])).toEqual([["wire_classes", "class_id", "id", "CASCADE"]]);
    const names = (await db.raw<{ name: string }[]>("select name from sqlite_master where type = 'table'")).map((r) => r.name);
    expect(names).not.toContain("histogram_bins");
  });

  it("turns foreign keys and WAL on", async () => {
    const fk = await db.raw<{ foreign_keys: number }[]>("pragma foreign_keys");
    expect(fk[0]?.foreign_keys).toBe(1);
    const jm = await db.raw<{ journal_mode: string }[]>("pragma journal_mode");
    expect(jm[0]?.journal_mode).toBe("wal");
  });

  it("is idempotent: a second run changes nothing", async () => {
    await migrateLatest(db);
    const [{ n }] = (await db("knex_migrations").count({ n: "*" })) as [{ n: number }];
    // one row per migration file
    expect(Number(n)).toBe(fs.readdirSync(path.resolve("migrations")).filter((f) => f.endsWith(".ts")).length);
  });

  it("gives wire_classes the engine 2 via columns, nullable (classes stored before have none)", async () => {
    const cols = await db.raw<{ name: string; type: string; notnull: number }[]>("pragma table_info(wire_classes)");
    const via = cols.filter((c) => c.name.startsWith("via"));
    expect(via.map((c) => [c.name, c.type.toLowerCase(), c.notnull])).toEqual([
      ["vias_per_net", "integer", 0],
      ["via_ohm", "float", 0],
      ["via_width_m", "float", 0],
      ["via_height_m", "float", 0],
    ]);
  });

  it("gives wire_classes the air-gap columns, nullable (classes stored before have no gap); down drops them", async () => {
    const cols = await db.raw<{ name: string; type: string; notnull: number }[]>("pragma table_info(wire_classes)");
    const gap = cols.filter((c) => c.name === "k_gap" || c.name === "gap_fraction");
    expect(gap.map((c) => [c.name, c.type.toLowerCase(), c.notnull])).toEqual([
      ["k_gap", "float", 0],
      ["gap_fraction", "float", 0],
    ]);
    const m5 = await import("@/migrations/20261202000005_air_gaps");
    await db.transaction(async (trx) => {
      await m5.down(trx);
      const after = (await trx.raw<{ name: string }[]>("pragma table_info(wire_classes)")).map((c) => c.name);
      expect(after).not.toContain("k_gap");
      expect(after).not.toContain("gap_fraction");
      expect(after).toContain("via_height_m");
      await m5.up(trx);
    });
    const again = (await db.raw<{ name: string }[]>("pragma table_info(wire_classes)")).map((c) => c.name);
    expect(again).toEqual(expect.arrayContaining(["k_gap", "gap_fraction"]));
  });

  it("auth hardening: sessions get created_at (existing ones count from the migration), reset tokens and devices go with their user", async () => {
    const cols = (await db.raw<{ name: string }[]>("pragma table_info(sessions)")).map((c) => c.name);
    expect(cols).toContain("created_at");
    const fks = await db.raw<{ table: string; on_delete: string }[]>("pragma foreign_key_list(password_resets)");
    expect(fks.map((f) => [f.table, f.on_delete])).toEqual([["users", "CASCADE"]]);
    const m10 = await import("@/migrations/20261202000010_auth_hardening");
    await db("users").insert({ id: "u-m10", email: "m10@example.com", name: "M", password_hash: "x", created_at: 1 });
    await db.transaction(async (trx) => {
      await m10.down(trx);
      await trx("sessions").insert({ id: "s-m10", user_id: "u-m10", expires_at: 2_000_000_000 });
      const before = Date.now();
      await m10.up(trx);
      const row = await trx("sessions").where({ id: "s-m10" }).first();
      expect(row.created_at).toBeGreaterThanOrEqual(before);
      await trx("sessions").where({ id: "s-m10" }).delete();
    });
    await db("users").where({ id: "u-m10" }).delete();
  });

  it("roadmaps (issue 14): one name per baseline, gone with their baseline or team, revisions gone with their roadmap; down drops both tables", async () => {
    const fks = await db.raw<{ table: string; from: string; on_delete: string }[]>("pragma foreign_key_list(roadmaps)");
    expect(fks.map((f) => [f.table, f.from, f.on_delete]).sort()).toEqual(
      [
        ["baselines", "baseline_id", "CASCADE"],
        ["teams", "team_id", "CASCADE"],
        ["users", "created_by", "SET NULL"],
        ["users", "updated_by", "SET NULL"],
      ].sort(),
    );
    const revFks = await db.raw<{ table: string; from: string; on_delete: string }[]>("pragma foreign_key_list(roadmap_revisions)");
    expect(revFks.map((f) => [f.table, f.from, f.on_delete]).sort()).toEqual(
      [
        ["roadmaps", "roadmap_id", "CASCADE"],
        ["users", "user_id", "SET NULL"],
      ].sort(),
    );
    const idx = await db.raw<{ name: string; unique: number }[]>("pragma index_list(roadmaps)");
    const uniqueCols = await Promise.all(
      idx
        .filter((i) => i.unique && !i.name.startsWith("sqlite_autoindex_roadmaps_1"))
        .map(async (i) => (await db.raw<{ name: string }[]>(`pragma index_info("${i.name}")`)).map((c) => c.name)),
    );
    expect(uniqueCols).toContainEqual(["baseline_id", "name"]);
    const m50 = await import("@/migrations/20261202000050_roadmaps");
    await db.transaction(async (trx) => {
      await m50.down(trx);
      const names = (await trx.raw<{ name: string }[]>("select name from sqlite_master where type = 'table'")).map((r) => r.name);
      expect(names).not.toContain("roadmaps");
      expect(names).not.toContain("roadmap_revisions");
      await m50.up(trx);
    });
  });

  it("shares one migrations table with the knex CLI (file names match)", () => {
    const files = fs
      .readdirSync(path.resolve("migrations"))
      .filter((f) => f.endsWith(".ts"))
      .sort();
    return db("knex_migrations")
      .pluck("name")
      .then((names: string[]) => expect(names.sort()).toEqual(files));
  });
});

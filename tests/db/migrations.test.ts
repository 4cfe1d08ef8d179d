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
      "reports",
      "share_links",
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
    expect(Number(n)).toBe(6);
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

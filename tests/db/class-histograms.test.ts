import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { randomUUID } from "node:crypto";
import fs from "node:fs";
import os from "node:os";
import path from "node:path";
import type { Knex } from "knex";
import { openDatabase } from "@/db/connect";
import { migrateLatest } from "@/db/migrate";
import { decodeHistogram } from "@/db/histogram-blob";
import { ImportConflictError } from "@/db/errors";
import { classHistogram, histogramsByClass } from "@/db/queries/import";
import { listClasses, listClassesWithHistograms } from "@/db/queries/wire-classes";
import { classRow, duplicateBaseline, importHistograms } from "@/db/writes/baselines";
import { wireClass } from "../helpers/temp-db";

let dir: string;
let db: Knex;
const NAMES = ["local", "intermediate", "global"];

beforeAll(async () => {
  dir = fs.mkdtempSync(path.join(os.tmpdir(), "plateau-hist-"));
  db = openDatabase(path.join(dir, "h.sqlite"));
  await migrateLatest(db);
  const now = Date.now();
  await db("users").insert({ id: "u", email: "u@example.test", name: "U", password_hash: "x", created_at: now });
  await db("teams").insert({ id: "t", name: "T", created_at: now });
});
afterAll(async () => {
  await db.destroy();
  fs.rmSync(dir, { recursive: true, force: true });
});

async function baseline(): Promise<{ id: string; classIds: string[] }> {
  const id = randomUUID();
  const now = Date.now();
  await db("baselines").insert({ id, team_id: "t", name: id, technology: "{}", created_at: now, updated_at: now });
  const classIds: string[] = [];
  for (const [position, name] of NAMES.entries()) {
    const cid = randomUUID();
    classIds.push(cid);
    await db("wire_classes").insert({ id: cid, ...classRow(id, position, wireClass(name, { netCount: 10 })) });
  }
  return { id, classIds };
}

const bins = (classIndex: number, lengths: number[], counts: number[]) => ({
  classIndex,
  lengthsM: Float64Array.from(lengths),
  counts: Float64Array.from(counts),
});
const store = (baselineId: string, mode: "replace" | "merge", histograms: ReturnType<typeof bins>[]) =>
  importHistograms(db, { baselineId, teamId: "t", userId: "u", mode, classNames: NAMES, histograms, summary: "test", detail: {} });
const binCounts = async (baselineId: string) => Object.fromEntries((await listClasses(db, baselineId)).map((c) => [c.name, c.histogramBins]));

describe("class_histograms: storing and reading histograms", () => {
  it("stores one row per class; replace clears the classes absent from the file, merge keeps them", async () => {
    const b = await baseline();
    const r = await store(b.id, "replace", [bins(0, [1e-6, 2e-6, 3e-6], [5, 6, 7]), bins(2, [1e-4], [9])]);
    expect(r).toEqual({ version: 2, inserted: 4 });
    expect(await db("class_histograms").whereIn("class_id", b.classIds).count({ n: "*" })).toEqual([{ n: 2 }]);
    expect(await binCounts(b.id)).toEqual({ local: 3, intermediate: 0, global: 1 });
    const local = await db("class_histograms").where({ class_id: b.classIds[0] }).first();
    expect(local).toMatchObject({ bin_count: 3, net_count: 18 });
    expect([...decodeHistogram(local).lengthsM]).toEqual([1e-6, 2e-6, 3e-6]);

    await store(b.id, "merge", [bins(1, [5e-6, 6e-6], [1, 1]), bins(2, [2e-4], [3])]);
    expect(await binCounts(b.id)).toEqual({ local: 3, intermediate: 2, global: 1 });
    expect([...(await classHistogram(db, b.classIds[2]!))!.lengthsM]).toEqual([2e-4]);
    // what the engine and the JSON API read
    const withH = await listClassesWithHistograms(db, b.id);
    expect(withH.map((c) => c.histogram?.length ?? 0)).toEqual([3, 2, 1]);
    expect(withH[0]!.histogram).toEqual([
      { lengthM: 1e-6, count: 5 },
      { lengthM: 2e-6, count: 6 },
      { lengthM: 3e-6, count: 7 },
    ]);
    expect((await histogramsByClass(db, b.id)).map((c) => [c.name, c.netCount, c.bins.length])).toEqual([
      ["local", 18, 3],
      ["intermediate", 2, 2],
      ["global", 3, 1],
    ]);

    await store(b.id, "replace", [bins(1, [7e-6], [4])]);
    expect(await binCounts(b.id)).toEqual({ local: 0, intermediate: 1, global: 0 });
    expect(await classHistogram(db, b.classIds[0]!)).toBeNull();
  });

  it("copies histograms with a duplicated baseline and deletes them with their class", async () => {
    const b = await baseline();
    await store(b.id, "replace", [bins(0, [1e-6, 2e-6], [1, 2])]);
    const copy = await duplicateBaseline(db, { id: b.id, teamId: "t", userId: "u", name: `${b.id} copy` });
    const copied = await listClassesWithHistograms(db, copy);
    expect(copied[0]!.histogram).toEqual([
      { lengthM: 1e-6, count: 1 },
      { lengthM: 2e-6, count: 2 },
    ]);
    expect(copied[0]!.id).not.toBe(b.classIds[0]);
    await db("wire_classes").where({ id: b.classIds[0] }).delete();
    expect(await db("class_histograms").where({ class_id: b.classIds[0] }).first()).toBeUndefined();
    expect(await classHistogram(db, copied[0]!.id)).not.toBeNull();
  });

  it("changes nothing when a class vanished during the upload or a histogram is malformed", async () => {
    const b = await baseline();
    await store(b.id, "replace", [bins(0, [1e-6], [1])]);
    const before = await db("class_histograms").whereIn("class_id", b.classIds).select();
    const version = (await db("baselines").where({ id: b.id }).first("version")).version;
    await db("wire_classes").where({ id: b.classIds[2] }).delete();
    await expect(store(b.id, "replace", [bins(0, [5e-6], [1]), bins(2, [1e-6], [1])])).rejects.toThrow(ImportConflictError);
    await expect(store(b.id, "replace", [bins(0, [2e-6, 1e-6], [1, 1])])).rejects.toThrow(/does not ascend/);
    expect(await db("class_histograms").whereIn("class_id", b.classIds).select()).toEqual(before);
    expect((await db("baselines").where({ id: b.id }).first("version")).version).toBe(version);
  });

  it("large imports (concurrent too) defer the WAL checkpoint and restore the automatic one", async () => {
    const big = (ci: number, n: number) =>
      bins(
        ci,
        Array.from({ length: n }, (_, i) => (i + 1) * 1e-7),
        Array.from({ length: n }, (_, i) => i % 7),
      );
    const [b1, b2] = [await baseline(), await baseline()];
    const [r1, r2] = await Promise.all([store(b1.id, "replace", [big(0, 50_000), big(1, 30_000)]), store(b2.id, "replace", [big(2, 70_000)])]);
    expect(r1.inserted).toBe(80_000);
    expect(r2.inserted).toBe(70_000);
    expect(await db.raw("pragma wal_autocheckpoint")).toEqual([{ wal_autocheckpoint: 1000 }]);
    expect(await binCounts(b2.id)).toEqual({ local: 0, intermediate: 0, global: 70_000 });
    const h = (await classHistogram(db, b1.classIds[1]!))!;
    expect([h.lengthsM.length, h.lengthsM[29_999], h.counts[29_999]]).toEqual([30_000, 30_000 * 1e-7, 29_999 % 7]);
  });
});

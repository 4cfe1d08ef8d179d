// Child process of tests/bench/import-bench.ts: one histogram import through lib/import against a fresh
// SQLite file, exactly as the route runs it (stream → parse → validate → per-class typed arrays → one
// transaction writing one class_histograms row per class).
// Run with `tsx --conditions=react-server` (server-only modules). Prints one JSON line.
import { randomUUID } from "node:crypto";
import fs from "node:fs";
import { openDatabase } from "@/db/connect";
import { migrateLatest } from "@/db/migrate";
import { storeHistograms } from "@/db/queries/import";
import { HistogramAccumulator } from "@/lib/import/histogram-accumulator";
import { parseHistogramCsv } from "@/lib/import/histograms";
import { MAX_IMPORT_BYTES } from "@/lib/import/limits";
import { nodeUtf8Decoder } from "@/lib/import/node-utf8";

const [csvPath, dbPath, classList] = process.argv.slice(2) as [string, string, string];
const names = classList.split(",");
const db = openDatabase(dbPath);
await migrateLatest(db);
const now = Date.now();
await db("users").insert({ id: "bench-user", email: "bench@example.test", name: "Bench", password_hash: "x", created_at: now });
await db("teams").insert({ id: "bench-team", name: "Bench", created_at: now });
await db("baselines").insert({ id: "bench-baseline", team_id: "bench-team", name: "Bench", technology: "{}", created_at: now, updated_at: now });
let position = 0;
for (const name of names) {
  await db("wire_classes").insert({
    id: randomUUID(), baseline_id: "bench-baseline", position: position++, name, tier: "local", width_m: 2.4e-8, thickness_m: 4.8e-8, spacing_m: 2.4e-8,
    ild_below_m: 3e-8, ild_above_m: 3e-8, barrier_m: 2e-9, metal: "Cu", k: 2.7, net_count: 1000, mean_length_m: 4e-6, driver_ohm: 8000, load_f: 4e-16, activity: 0.15,
  });
}
const t0 = performance.now();
const acc = new HistogramAccumulator(names.length);
const parsed = await parseHistogramCsv(fs.createReadStream(csvPath, { highWaterMark: 64 * 1024 }), names, { maxBytes: MAX_IMPORT_BYTES, utf8: nodeUtf8Decoder, sink: acc });
const t1 = performance.now();
if (!parsed.ok) throw new Error(`bench file invalid: ${JSON.stringify(parsed.errors.slice(0, 3))}`);
await storeHistograms(db, {
  baselineId: "bench-baseline", teamId: "bench-team", userId: "bench-user", mode: "replace", classNames: names,
  histograms: acc.classIndices().map((classIndex) => ({ classIndex, ...acc.sorted(classIndex) })), summary: "bench", detail: {},
});
const t2 = performance.now();
acc.release();
// the WAL checkpoint a large import defers until after its answer: timed apart, for the record
await db.raw("pragma wal_checkpoint(TRUNCATE)");
const checkpointMs = performance.now() - t2;
const stored = (await db("class_histograms").sum({ n: "bin_count" }))[0]?.n;
await db.destroy();
const hwm = /VmHWM:\s+(\d+) kB/.exec(fs.readFileSync("/proc/self/status", "utf8"))?.[1];
console.log(JSON.stringify({ parseMs: t1 - t0, storeMs: t2 - t1, totalMs: t2 - t0, checkpointMs, rows: parsed.rows, stored: Number(stored), peakRssMiB: Number(hwm) / 1024 }));

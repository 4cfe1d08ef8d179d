// Child process of tests/bench/import-bench.ts: one histogram import through lib/import against a fresh
// SQLite file, exactly as the route runs it (stream → parse → validate → per-class typed arrays → one
// transaction writing one class_histograms row per class).
// Run with `tsx --conditions=react-server` (server-only modules). Prints one JSON line.
import fs from "node:fs";
import { openDatabase } from "@/db/connect";
import { migrateLatest } from "@/db/migrate";
import { createBaseline, importHistograms } from "@/db/writes/baselines";
import { createTeam } from "@/db/writes/teams";
import { signUpUser } from "@/db/writes/users";
import { DEFAULT_TECHNOLOGY } from "@/lib/scaling";
import { HistogramAccumulator } from "@/lib/import/histogram-accumulator";
import { parseHistogramCsv } from "@/lib/import/histograms";
import { MAX_IMPORT_BYTES } from "@/lib/import/limits";
import { nodeUtf8Decoder } from "@/lib/import/node-utf8";
import { wireClass } from "../helpers/temp-db";

const [csvPath, dbPath, classList] = process.argv.slice(2) as [string, string, string];
const names = classList.split(",");
const db = openDatabase(dbPath);
await migrateLatest(db);
// The same write modules as the app: a user, a team and a baseline with the classes the file names.
const user = await signUpUser(db, { email: "bench@example.test", name: "Bench", passwordHash: "x" });
const team = await createTeam(db, { name: "Bench", ownerId: user.id });
const baselineId = await createBaseline(db, {
  teamId: team.id,
  userId: user.id,
  baseline: {
    name: "Bench",
    technology: { ...DEFAULT_TECHNOLOGY },
    classes: names.map((name) => wireClass(name)),
  },
});
const t0 = performance.now();
const acc = new HistogramAccumulator(names.length);
const parsed = await parseHistogramCsv(fs.createReadStream(csvPath, { highWaterMark: 64 * 1024 }), names, {
  maxBytes: MAX_IMPORT_BYTES,
  utf8: nodeUtf8Decoder,
  sink: acc,
});
const t1 = performance.now();
if (!parsed.ok) throw new Error(`bench file invalid: ${JSON.stringify(parsed.errors.slice(0, 3))}`);
await importHistograms(db, {
  baselineId,
  teamId: team.id,
  userId: user.id,
  mode: "replace",
  classNames: names,
  histograms: acc.classIndices().map((classIndex) => ({ classIndex, ...acc.sorted(classIndex) })),
  summary: "bench",
  detail: {},
});
const t2 = performance.now();
acc.release();
// the WAL checkpoint a large import defers until after its answer: timed apart, for the record
await db.raw("pragma wal_checkpoint(TRUNCATE)");
const checkpointMs = performance.now() - t2;
const stored = (await db("class_histograms").sum({ n: "bin_count" }))[0]?.n;
await db.destroy();
const hwm = /VmHWM:\s+(\d+) kB/.exec(fs.readFileSync("/proc/self/status", "utf8"))?.[1];
console.log(
  JSON.stringify({
    parseMs: t1 - t0,
    storeMs: t2 - t1,
    totalMs: t2 - t0,
    checkpointMs,
    rows: parsed.rows,
    stored: Number(stored),
    peakRssMiB: Number(hwm) / 1024,
  }),
);

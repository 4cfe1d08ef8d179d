import { db } from "@/db/client";
import { probeWritable } from "@/db/queries/health";
import { apiRoute, databaseUnavailable, DATABASE_RETRY_AFTER_S } from "@/lib/api";

export const dynamic = "force-dynamic";

/** One write probe per second at most, shared by the health checks that arrive meanwhile (a probe takes the write lock). */
const PROBE_MS = 1000;
const g = globalThis as unknown as { __plateauHealthProbe?: { at: number; result: Promise<void> } };
function probe(): Promise<void> {
  const last = g.__plateauHealthProbe;
  if (last && Date.now() - last.at < PROBE_MS) return last.result;
  const result = probeWritable(db);
  result.catch(() => undefined); // reported to each caller; never an unhandled rejection
  g.__plateauHealthProbe = { at: Date.now(), result };
  return result;
}

/**
 * Health and readiness: 200 `{ ok: true, database: { migrated: true, writable: true } }` when the database is
 * migrated and can be written now; otherwise 503 with Retry-After and `{ ok: false, database: { migrated, writable,
 * problem } }` (a read-only or missing file, a disk error, a lock held by another process). apiRoute has already
 * waited for the migrations: when they cannot run, it answers 503 database_unavailable itself.
 */
export const GET = apiRoute(async () => {
  try {
    await probe();
  } catch (e) {
    const unavailable = databaseUnavailable(e);
    if (!unavailable) throw e;
    return Response.json(
      { ok: false, database: { migrated: true, writable: false, problem: unavailable.message } },
      { status: 503, headers: { "retry-after": String(DATABASE_RETRY_AFTER_S), "cache-control": "no-store" } },
    );
  }
  return Response.json({ ok: true, database: { migrated: true, writable: true } }, { headers: { "cache-control": "no-store" } });
});

import { db } from "@/db/client";
import { probeWritable } from "@/db/queries/health";
import { apiRoute, databaseUnavailable, DATABASE_RETRY_AFTER_S } from "@/lib/api";

export const dynamic = "force-dynamic";

/**
 * Health and readiness: 200 `{ ok: true, database: { migrated: true, writable: true } }` when the database is
 * migrated and can be written now; otherwise 503 with Retry-After and `{ ok: false, database: { migrated, writable,
 * problem } }` (a read-only or missing file, a disk error, a lock held by another process). apiRoute has already
 * waited for the migrations: when they cannot run, it answers 503 database_unavailable itself.
 */
export const GET = apiRoute(async () => {
  try {
    await probeWritable(db);
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

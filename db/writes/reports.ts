// Server code only (no `import "server-only"`: the demo seeder, a plain tsx script, stores its report here too).
import { randomUUID } from "node:crypto";
import type { Knex } from "knex";
import type { FrozenReport } from "@/lib/validation/report";
import { writeAudit } from "@/db/audit";
import { NotFoundError } from "@/db/errors";
import { newId } from "@/db/ids";

/**
 * Every write of the report aggregate (a series of frozen versions). Each function is one transaction
 * with its audit row. Share links have their own module (db/writes/share-links.ts).
 */

type Conn = Knex | Knex.Transaction;

/**
 * Store a frozen report as a new series (no seriesId: "report.create") or as the next version of a
 * series ("report.refresh"). `frozen` must already be validated: lib/reports/freeze.ts `freezeReport`
 * returns a document parsed by the frozen-report schema, and that is exactly what every read accepts.
 */
export async function storeReport(
  conn: Conn,
  p: {
    teamId: string;
    userId: string | null;
    seriesId?: string;
    baselineId: string | null;
    title: string;
    audienceNote: string;
    frozen: FrozenReport;
    isDemo?: boolean;
  },
): Promise<{ id: string; seriesId: string; version: number }> {
  return conn.transaction(async (trx) => {
    const seriesId = p.seriesId ?? randomUUID();
    const max = await trx("reports").where({ series_id: seriesId }).max({ v: "version" }).first();
    const version = (Number(max?.v) || 0) + 1;
    const id = newId();
    await trx("reports").insert({
      id,
      team_id: p.teamId,
      series_id: seriesId,
      version,
      baseline_id: p.baselineId,
      title: p.title,
      audience_note: p.audienceNote,
      frozen: JSON.stringify(p.frozen),
      engine_version: p.frozen.engineVersion,
      is_demo: p.isDemo ? 1 : 0,
      created_by: p.userId,
      created_at: p.frozen.createdAt,
    });
    await writeAudit(trx, {
      teamId: p.teamId,
      userId: p.userId,
      action: version === 1 ? "report.create" : "report.refresh",
      entityType: "report",
      entityId: id,
      detail: { title: p.title, seriesId, version, options: p.frozen.options.map((o) => o.name) },
    });
    return { id, seriesId, version };
  });
}

/** Delete one version of a report (its share links go with it); NotFoundError when the team has no such report. */
export async function deleteReport(conn: Conn, p: { id: string; teamId: string; userId: string }): Promise<void> {
  await conn.transaction(async (trx) => {
    const row = await trx("reports").where({ id: p.id, team_id: p.teamId }).first("title", "series_id", "version");
    if (!row) throw new NotFoundError("Report");
    await trx("reports").where({ id: p.id }).delete();
    await writeAudit(trx, {
      teamId: p.teamId,
      userId: p.userId,
      action: "report.delete",
      entityType: "report",
      entityId: p.id,
      detail: { title: row.title, seriesId: row.series_id, version: row.version },
    });
  });
}

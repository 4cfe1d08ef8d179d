import "server-only";
import type { Knex } from "knex";
import { db } from "@/db/client";
import { baselineTeamId } from "@/db/queries/baselines";
import { requireResourceRole } from "@/lib/access";
import { apiRoute, parseOrThrow } from "@/lib/api";
import { importModeSchema, importQuerySchema, searchParamsObject } from "@/lib/validation/import";
import { csvUploadSource } from "@/lib/import/request-body";
import type { BaselineImportRequest } from "@/lib/import/types";

/**
 * The POST handler of a CSV import into a baseline (classes or histograms): editor or owner; body = the CSV
 * (text/csv) or a multipart form with a `file` field, at most 64 MiB (413 above); `?mode=replace|merge` is
 * required, `&version=N` (the baseline version the client loaded) too unless `&dryRun=1`, which validates and
 * answers the summary without storing. A stale version → 409 stale_version. Answers `run`'s result as JSON.
 */
export function baselineImportRoute(run: (db: Knex, p: BaselineImportRequest) => Promise<unknown>) {
  return apiRoute<{ id: string }>(async (req, { id }) => {
    const a = await requireResourceRole(() => baselineTeamId(db, id), "editor", "Baseline");
    const query = searchParamsObject(req.url);
    const modeOk = importModeSchema.safeParse(query.mode).success;
    const q = parseOrThrow(
      importQuerySchema,
      query,
      modeOk ? "Give the baseline version you loaded (?version=N)." : "Choose mode=replace or mode=merge explicitly.",
    );
    const result = await run(db, {
      baselineId: id,
      teamId: a.teamId,
      userId: a.user.id,
      mode: q.mode,
      dryRun: q.dryRun,
      version: q.version,
      source: csvUploadSource(req),
    });
    return Response.json(result);
  });
}

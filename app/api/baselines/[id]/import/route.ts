import { db } from "@/db/client";
import { baselineTeamId } from "@/db/queries/baselines";
import { requireResourceRole } from "@/lib/access";
import { apiRoute, parseOrThrow } from "@/lib/api";
import { csvUploadSource } from "@/lib/import/request-body";
import { runWireClassImport } from "@/lib/import/run-classes";
import { importQuerySchema, searchParamsObject } from "@/lib/validation/import";

export const dynamic = "force-dynamic";

/**
 * Import wire classes (CSV, format on /help/csv): body = the CSV (text/csv) or a multipart form
 * with a `file` field, at most 64 MiB (413 above). `?mode=replace|merge` is required;
 * `&dryRun=1` validates and answers the summary without storing. Editor or owner.
 */
export const POST = apiRoute<{ id: string }>(async (req, { id }) => {
  const a = await requireResourceRole(() => baselineTeamId(db, id), "editor", "Baseline");
  const q = parseOrThrow(importQuerySchema, searchParamsObject(req.url), "Choose mode=replace or mode=merge explicitly.");
  const result = await runWireClassImport(db, {
    baselineId: id,
    teamId: a.teamId,
    userId: a.user.id,
    mode: q.mode,
    dryRun: q.dryRun,
    source: csvUploadSource(req),
  });
  return Response.json(result);
});

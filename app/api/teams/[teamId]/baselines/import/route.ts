import { db } from "@/db/client";
import { requireTeamRole } from "@/lib/access";
import { apiRoute, parseOrThrow } from "@/lib/api";
import { csvUploadSource } from "@/lib/import/request-body";
import { runNewBaselineImport } from "@/lib/import/run-classes";
import { DEFAULT_TECHNOLOGY } from "@/lib/scaling/client";
import { newBaselineImportQuerySchema, searchParamsObject } from "@/lib/validation/import";

export const dynamic = "force-dynamic";

/** New baseline from a wire-class CSV: `?name=…` (required), `&dryRun=1` validates only. Editor or owner. 201 `{ baseline }`. */
export const POST = apiRoute<{ teamId: string }>(async (req, { teamId }) => {
  const a = await requireTeamRole(teamId, "editor");
  const q = parseOrThrow(newBaselineImportQuerySchema, searchParamsObject(req.url));
  const result = await runNewBaselineImport(db, {
    teamId,
    userId: a.user.id,
    name: q.name,
    technology: DEFAULT_TECHNOLOGY,
    dryRun: q.dryRun,
    source: csvUploadSource(req),
  });
  return Response.json(result, { status: result.stored ? 201 : 200 });
});

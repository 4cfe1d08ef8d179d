import { db } from "@/db/client";
import { baselineTeamId, getBaseline } from "@/db/queries/baselines";
import { listClasses } from "@/db/queries/wire-classes";
import { requireResourceRole } from "@/lib/access";
import { apiRoute, notFound } from "@/lib/api";
import { csvHeaders } from "@/lib/csv-safe";
import { classesCsv } from "@/lib/import/export";

export const dynamic = "force-dynamic";

/** The baseline's wire classes as CSV in the import format (re-importable unchanged). Viewer or better. */
export const GET = apiRoute<{ id: string }>(async (_req, { id }) => {
  await requireResourceRole(() => baselineTeamId(db, id), "viewer", "Baseline");
  const b = await getBaseline(db, id);
  if (!b) throw notFound("Baseline");
  return new Response(classesCsv(await listClasses(db, id)), { headers: csvHeaders(`${b.name}-wire-classes.csv`) });
});

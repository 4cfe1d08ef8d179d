import { db } from "@/db/client";
import { baselineTeamId, getBaseline } from "@/db/queries/baselines";
import { requireResourceRole } from "@/lib/access";
import { apiRoute, notFound } from "@/lib/api";
import { csvHeaders } from "@/lib/csv-safe";
import { histogramCsvStream } from "@/lib/import/export";

export const dynamic = "force-dynamic";

/** The baseline's length histograms as CSV (`class, length_um, count`), streamed. Viewer or better. */
export const GET = apiRoute<{ id: string }>(async (_req, { id }) => {
  await requireResourceRole(() => baselineTeamId(db, id), "viewer", "Baseline");
  const b = await getBaseline(db, id);
  if (!b) throw notFound("Baseline");
  return new Response(histogramCsvStream(db, id), { headers: csvHeaders(`${b.name}-length-histograms.csv`) });
});

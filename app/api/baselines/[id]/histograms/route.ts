import { db } from "@/db/client";
import { baselineTeamId } from "@/db/queries/baselines";
import { histogramsByClass } from "@/db/queries/import";
import { requireResourceRole } from "@/lib/access";
import { apiRoute, parseOrThrow } from "@/lib/api";
import { formatScaled } from "@/lib/import/numbers";
import { csvUploadSource } from "@/lib/import/request-body";
import { runHistogramImport } from "@/lib/import/run-histograms";
import { importQuerySchema, searchParamsObject } from "@/lib/validation/import";

export const dynamic = "force-dynamic";

/** Length histograms of every class: `{ classes: [{ name, totalNets, bins: [{ lengthUm, count }] }] }`. */
export const GET = apiRoute<{ id: string }>(async (_req, { id }) => {
  await requireResourceRole(() => baselineTeamId(db, id), "viewer", "Baseline");
  const classes = await histogramsByClass(db, id);
  return Response.json({
    classes: classes.map((c) => ({
      name: c.name,
      totalNets: c.bins.reduce((s, b) => s + b.count, 0),
      bins: c.bins.map((b) => ({ lengthUm: Number(formatScaled(b.lengthM, -6)), count: b.count })),
    })),
  });
});

/**
 * Import length histograms (CSV `class, length_um, count`): body = the CSV (text/csv) or a
 * multipart form with a `file` field, at most 64 MiB. `?mode=replace|merge` (required),
 * `&dryRun=1` validates without storing. Editor or owner.
 */
export const POST = apiRoute<{ id: string }>(async (req, { id }) => {
  const a = await requireResourceRole(() => baselineTeamId(db, id), "editor", "Baseline");
  const q = parseOrThrow(importQuerySchema, searchParamsObject(req.url), "Choose mode=replace or mode=merge explicitly.");
  const result = await runHistogramImport(db, {
    baselineId: id,
    teamId: a.teamId,
    userId: a.user.id,
    mode: q.mode,
    dryRun: q.dryRun,
    source: csvUploadSource(req),
  });
  return Response.json(result);
});

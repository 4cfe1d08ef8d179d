import { db } from "@/db/client";
import { baselineTeamId } from "@/db/queries/baselines";
import { histogramsByClass } from "@/db/queries/import";
import { requireResourceRole } from "@/lib/access";
import { apiRoute } from "@/lib/api";
import { baselineImportRoute } from "@/lib/baseline-import-route";
import { formatScaled } from "@/lib/scaling/client";
import { runHistogramImport } from "@/lib/import/run-histograms";

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

/** Import length histograms (CSV `class, length_um, count`); mode, dry run, body and limits as in lib/baseline-import-route.ts. */
export const POST = baselineImportRoute(runHistogramImport);

import { db } from "@/db/client";
import { getScenario, scenarioTeamId } from "@/db/queries/scenarios";
import { requireResourceRole } from "@/lib/access";
import { apiRoute, notFound } from "@/lib/api";
import { csvHeaders } from "@/lib/csv-safe";
import { resultsCsv } from "@/lib/import/export";
import { evaluateOrThrow, loadEngineInputs } from "@/lib/workspace/evaluate-server";
import { CAUTION_TEXT } from "@/components/caution";

export const dynamic = "force-dynamic";

/** Per-class results of a scenario against its baseline, evaluated now on the stored data; units in the headers. Viewer or better. */
export const GET = apiRoute<{ id: string }>(async (_req, { id }) => {
  await requireResourceRole(() => scenarioTeamId(db, id), "viewer", "Scenario");
  const s = await getScenario(db, id);
  if (!s) throw notFound("Scenario");
  const inputs = await loadEngineInputs(db, s.baselineId);
  const ev = evaluateOrThrow({ ...inputs, settings: s.settings });
  return new Response(resultsCsv(ev), {
    headers: { ...csvHeaders(`${s.name}-results.csv`), "x-plateau-engine-version": ev.engineVersion, "x-plateau-caution": CAUTION_TEXT.replace(/[^\x20-\x7e]/g, "-") },
  });
});

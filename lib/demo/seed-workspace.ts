import fs from "node:fs";
import path from "node:path";
import type { Knex } from "knex";
import { parseHistogramCsv, parseWireClassCsv } from "@/scaling/csv";
import type { ScenarioSettings, Technology } from "@/lib/scaling";
import { createBaseline } from "@/db/queries/baselines";
import { histogramRow, sortedHistogram } from "@/db/histogram-blob";
import { createScenario } from "@/db/queries/scenarios";
import { scenarioSettingsSchema } from "@/lib/validation/scenario";
import { technologySchema } from "@/lib/validation/baseline";
import { wireClassListSchema } from "@/lib/validation/wire-class";
import { normalizeSettings } from "@/lib/workspace/settings";

export const DEMO_BASELINE_NAME = "Skua tile — today's wiring";
const DEMO_BASELINE_DESCRIPTION =
  "Invented demo data: the fictional team Harrow Bay Silicon's made-up accelerator tile \"Skua\", four wire classes with length histograms. No value describes a real process.";

function examplesDir(): string {
  const candidates = [path.resolve(process.cwd(), "scaling/examples"), path.resolve(path.dirname(new URL(import.meta.url).pathname), "../../scaling/examples")];
  const dir = candidates.find((d) => fs.existsSync(path.join(d, "skua-baseline.csv")));
  if (!dir) throw new Error("demo data not found: scaling/examples/skua-baseline.csv");
  return dir;
}

/**
 * The demo workspace of a team: the Skua baseline (classes, technology, histograms) owned by the owner and
 * its three scenarios authored by the editor, all read from scaling/examples/ (the single source of demo data).
 * Idempotent: rows found by name are kept and reused.
 */
export async function seedDemoWorkspace(db: Knex, p: { teamId: string; ownerId: string; editorId: string }): Promise<{ baselineId: string; scenarioIds: string[] }> {
  const dir = examplesDir();
  const read = (f: string) => fs.readFileSync(path.join(dir, f), "utf8");
  const technology = technologySchema.parse(JSON.parse(read("skua-technology.json"))) as Technology;

  let baseline = await db("baselines").where({ team_id: p.teamId, name: DEMO_BASELINE_NAME }).first("id");
  if (!baseline) {
    const csv = parseWireClassCsv(read("skua-baseline.csv"));
    if (csv.errors.length) throw new Error(`demo baseline CSV: ${csv.errors.map((e) => `line ${e.line} ${e.column}: ${e.message}`).join("; ")}`);
    const classes = wireClassListSchema.parse(csv.classes.map(({ histogram: _h, ...c }) => c));
    const id = await createBaseline(db, {
      teamId: p.teamId,
      userId: p.ownerId,
      input: { name: DEMO_BASELINE_NAME, description: DEMO_BASELINE_DESCRIPTION, technology, classes },
      isDemo: true,
      summary: "Seeded the invented demo baseline",
    });
    const hist = parseHistogramCsv(read("skua-histograms.csv"));
    if (hist.errors.length) throw new Error(`demo histogram CSV: ${hist.errors[0]?.message}`);
    await db.transaction(async (trx) => {
      const rows: { id: string; name: string }[] = await trx("wire_classes").where({ baseline_id: id }).select("id", "name");
      for (const r of rows) {
        const bins = hist.bins[r.name] ?? [];
        if (bins.length === 0) continue;
        const h = sortedHistogram(bins);
        await trx("class_histograms").insert(histogramRow(r.id, h.lengthsM, h.counts));
      }
    });
    baseline = { id };
  }
  const baselineId = baseline.id as string;

  const scenarios = JSON.parse(read("skua-scenarios.json")) as { name: string; notes: string; settings: ScenarioSettings }[];
  const scenarioIds: string[] = [];
  for (const s of scenarios) {
    const found = await db("scenarios").where({ baseline_id: baselineId, name: s.name }).first("id");
    if (found) {
      scenarioIds.push(found.id as string);
      continue;
    }
    const settings = normalizeSettings(scenarioSettingsSchema.parse(s.settings), technology);
    scenarioIds.push(
      await createScenario(db, { teamId: p.teamId, baselineId, userId: p.editorId, name: s.name, notes: s.notes, settings, isDemo: true, summary: "Seeded the invented demo scenario" }),
    );
  }
  return { baselineId, scenarioIds };
}

import fs from "node:fs";
import path from "node:path";
import type { Knex } from "knex";
import { findBaselineIdByName, findRoadmapIdByName, findScenarioIdByName } from "@/db/queries/demo";
import { parseHistogramBins } from "@/lib/import/histograms";
import { parseWireClassCsv } from "@/lib/import/wire-classes";
import { DEFAULT_TECHNOLOGY, type ScenarioSettings, type Technology } from "@/lib/scaling/client";
import { composeRoadmap } from "@/lib/scaling";
import { createBaseline } from "@/db/writes/baselines";
import { createRoadmap } from "@/db/writes/roadmaps";
import { createScenario } from "@/db/writes/scenarios";
import { roadmapStepsSchema } from "@/lib/validation/roadmap";
import { scenarioSettingsSchema } from "@/lib/validation/scenario";
import { wireClassListSchema } from "@/lib/validation/wire-class";
import { normalizeSettings } from "@/lib/workspace/settings";

export const DEMO_BASELINE_NAME = "Skua tile — today's wiring";
const DEMO_BASELINE_DESCRIPTION =
  'Invented demo data: the fictional team Harrow Bay Silicon\'s made-up accelerator tile "Skua", four wire classes with length histograms. No value describes a real process.';

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
/** The demo's roadmaps (issue 14): two branches from the Skua baseline over N1–N3, by name, with their steps' file. */
export const DEMO_ROADMAPS = [
  { name: "Copper, fixed barrier", file: "skua-roadmap-copper.json" },
  { name: "Barrier-free local, air-gapped intermediate", file: "skua-roadmap-ru-airgap.json" },
] as const;

/** Operating temperature of the demo's wiring, °C. */
export const DEMO_TEMPERATURE_C = 85;

export async function seedDemoWorkspace(
  db: Knex,
  p: { teamId: string; ownerId: string; editorId: string },
): Promise<{ baselineId: string; scenarioIds: string[]; roadmapIds: string[] }> {
  const dir = examplesDir();
  const read = (f: string) => fs.readFileSync(path.join(dir, f), "utf8");
  // The one default technology, with the wiring at 85 °C: a product's hot corner, as planners use it (new baselines
  // keep the engine's default of 25 °C).
  const technology: Technology = { ...DEFAULT_TECHNOLOGY, temperatureC: DEMO_TEMPERATURE_C };

  let baselineId = await findBaselineIdByName(db, p.teamId, DEMO_BASELINE_NAME);
  if (!baselineId) {
    const csv = parseWireClassCsv(read("skua-baseline.csv"));
    if (!csv.ok) throw new Error(`demo baseline CSV: ${csv.errors.map((e) => `line ${e.line} ${e.column}: ${e.message}`).join("; ")}`);
    const classes = wireClassListSchema.parse(csv.classes);
    const hist = parseHistogramBins(
      read("skua-histograms.csv"),
      classes.map((c) => c.name),
    );
    if (!hist.ok) throw new Error(`demo histogram CSV: ${hist.errors[0]?.message}`);
    // The baseline, its classes and histograms, its first revision and its audit row: one transaction.
    baselineId = await createBaseline(db, {
      teamId: p.teamId,
      userId: p.ownerId,
      baseline: { name: DEMO_BASELINE_NAME, description: DEMO_BASELINE_DESCRIPTION, technology, classes, histograms: hist.bins },
      isDemo: true,
      summary: "Seeded the invented demo baseline",
    });
  }

  const scenarios = JSON.parse(read("skua-scenarios.json")) as { name: string; notes: string; settings: ScenarioSettings }[];
  const scenarioIds: string[] = [];
  for (const s of scenarios) {
    const found = await findScenarioIdByName(db, baselineId, s.name);
    if (found) {
      scenarioIds.push(found);
      continue;
    }
    const settings = normalizeSettings(scenarioSettingsSchema.parse(s.settings), technology);
    scenarioIds.push(
      await createScenario(db, {
        teamId: p.teamId,
        baselineId,
        userId: p.editorId,
        name: s.name,
        notes: s.notes,
        settings,
        isDemo: true,
        summary: "Seeded the invented demo scenario",
      }),
    );
  }

  // The two roadmap branches (issue 14), steps from scaling/examples (the engine's CLI examples): validated like the
  // API's input, composed against the baseline by the write.
  const roadmapIds: string[] = [];
  for (const r of DEMO_ROADMAPS) {
    const found = await findRoadmapIdByName(db, baselineId, r.name);
    if (found) {
      roadmapIds.push(found);
      continue;
    }
    const file = JSON.parse(read(r.file)) as { steps: unknown };
    roadmapIds.push(
      await createRoadmap(db, {
        teamId: p.teamId,
        baselineId,
        userId: p.editorId,
        name: r.name,
        steps: roadmapStepsSchema.parse(file.steps),
        compose: composeRoadmap,
        isDemo: true,
        summary: "Seeded the invented demo roadmap",
      }),
    );
  }
  return { baselineId, scenarioIds, roadmapIds };
}

import type { Knex } from "knex";
import { findDemoReportId } from "@/db/queries/demo";
import { composeReport } from "@/lib/reports/service";

export const DEMO_REPORT_TITLE = "Skua tile: three wiring options for the next node";
const DEMO_AUDIENCE_NOTE =
  "For the Skua program review (invented demo data). Which option keeps the intermediate and global wires fast enough after a 0.7× pitch shrink, and what each costs in repeaters and switching energy.";

/**
 * The demo's one report: the demo baseline against its three scenarios (plain shrink, air gap on the
 * intermediate tier, barrier-free ruthenium on local wires) and its two roadmap branches. Idempotent: a team that already has a demo
 * report keeps it, and its id is returned.
 */
export async function seedDemoReports(
  db: Knex,
  p: { teamId: string; ownerId: string; baselineId: string; scenarioIds: string[]; roadmapIds?: string[] },
): Promise<{ reportId: string }> {
  const existing = await findDemoReportId(db, p.teamId);
  if (existing) return { reportId: existing };
  // The same path as the compose route: load and check the inputs, freeze, store with its audit row.
  const { id } = await composeReport(db, {
    teamId: p.teamId,
    userId: p.ownerId,
    input: {
      baselineId: p.baselineId,
      scenarioIds: p.scenarioIds.slice(0, 4),
      title: DEMO_REPORT_TITLE,
      audienceNote: DEMO_AUDIENCE_NOTE,
      metrics: ["delay", "rc", "capacitance", "repeaters", "energy", "overBudget"],
      // the two roadmap branches (issue 14) frozen beside the scenarios
      ...(p.roadmapIds?.length ? { roadmapIds: p.roadmapIds.slice(0, 3) } : {}),
    },
    isDemo: true,
  });
  return { reportId: id };
}

import type { Knex } from "knex";
import { insertReport, loadReportInputs } from "@/db/queries/reports";
import { freezeReport } from "@/lib/reports/freeze";

export const DEMO_REPORT_TITLE = "Skua tile: three wiring options for the next node";
const DEMO_AUDIENCE_NOTE =
  "For the Skua program review (invented demo data). Which option keeps the intermediate and global wires fast enough after a 0.7× pitch shrink, and what each costs in repeaters and switching energy.";

/**
 * The demo's one report: the demo baseline against its three scenarios (plain shrink, air gap on the
 * intermediate tier, barrier-free ruthenium on local wires). Idempotent: a team that already has a demo
 * report keeps it, and its id is returned.
 */
export async function seedDemoReports(
  db: Knex,
  p: { teamId: string; ownerId: string; baselineId: string; scenarioIds: string[] },
): Promise<{ reportId: string }> {
  const existing = await db("reports").where({ team_id: p.teamId, is_demo: 1 }).orderBy("created_at").first("id");
  if (existing) return { reportId: existing.id as string };
  const inputs = await loadReportInputs(db, { teamId: p.teamId, baselineId: p.baselineId, scenarioIds: p.scenarioIds.slice(0, 4) });
  const frozen = freezeReport({ ...inputs, metrics: ["delay", "rc", "capacitance", "repeaters", "energy", "overBudget"] });
  const { id } = await insertReport(db, {
    teamId: p.teamId,
    userId: p.ownerId,
    baselineId: p.baselineId,
    title: DEMO_REPORT_TITLE,
    audienceNote: DEMO_AUDIENCE_NOTE,
    frozen,
    isDemo: true,
  });
  return { reportId: id };
}

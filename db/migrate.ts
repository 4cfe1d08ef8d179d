import type { Knex } from "knex";
import * as m1 from "../migrations/20261201000001_platform";
import * as m2 from "../migrations/20261201000002_workspace";
import * as m3 from "../migrations/20261201000003_reports";
import * as m4 from "../migrations/20261201000004_vias";
import * as m5 from "../migrations/20261202000005_air_gaps";
import * as m10 from "../migrations/20261202000010_auth_hardening";
import * as m20 from "../migrations/20261202000020_email_verification";
import * as m40 from "../migrations/20261202000040_baseline_warnings";
import * as m50 from "../migrations/20261202000050_roadmaps";

// Static index of the migrations so the bundled server can run them; keyed by file name
// (with .ts) so the knex CLI and the app share one knex_migrations table.
const MIGRATIONS: Record<string, Knex.Migration> = {
  "20261201000001_platform.ts": m1,
  "20261201000002_workspace.ts": m2,
  "20261201000003_reports.ts": m3,
  "20261201000004_vias.ts": m4,
  "20261202000005_air_gaps.ts": m5,
  "20261202000010_auth_hardening.ts": m10,
  "20261202000020_email_verification.ts": m20,
  "20261202000040_baseline_warnings.ts": m40,
  "20261202000050_roadmaps.ts": m50,
};

const source: Knex.MigrationSource<string> = {
  getMigrations: async () => Object.keys(MIGRATIONS).sort(),
  getMigrationName: (name) => name,
  getMigration: async (name) => {
    const m = MIGRATIONS[name];
    if (!m) throw new Error(`unknown migration ${name}`);
    return m;
  },
};

export async function migrateLatest(db: Knex): Promise<void> {
  await db.migrate.latest({ migrationSource: source });
}

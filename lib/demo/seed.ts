import type { Knex } from "knex";
import { getUserByEmail, insertUser } from "@/db/queries/users";
import { insertMembership, insertTeamWithOwner } from "@/db/queries/teams";
import { hashPassword } from "@/lib/password";
import type { Role } from "@/lib/access";
import { seedDemoWorkspace } from "./seed-workspace";
import { seedDemoReports } from "./seed-reports";

export const DEMO_TEAM_NAME = "Harrow Bay Silicon";

/**
 * The invented demo users. DEMO-ONLY passwords: they are printed by `npm run demo` and published in
 * the README, so never use the demo team for real work on a shared server.
 */
export const DEMO_USERS: readonly { role: Role; email: string; name: string; password: string }[] = [
  { role: "owner", email: "owner@harrowbay.example", name: "Morgan Ashdown", password: "harrowbay-owner-demo" },
  { role: "editor", email: "editor@harrowbay.example", name: "Priya Calloway", password: "harrowbay-editor-demo" },
  { role: "viewer", email: "viewer@harrowbay.example", name: "Dana Whitlock", password: "harrowbay-viewer-demo" },
];

export interface DemoSeedResult {
  teamId: string;
  users: { role: Role; email: string; password: string; userId: string; created: boolean }[];
  baselineId?: string;
  scenarioIds?: string[];
  reportId?: string;
}

/**
 * Seed the demo team idempotently: users, the team (is_demo = 1) and memberships are created only when
 * missing; nothing existing is changed or deleted (a re-run keeps passwords, roles and edits).
 */
export async function seedDemo(db: Knex): Promise<DemoSeedResult> {
  // Hash outside the transaction (slow on purpose), only for users that don't exist yet.
  const hashes = new Map<string, string>();
  for (const u of DEMO_USERS) if (!(await getUserByEmail(db, u.email))) hashes.set(u.email, await hashPassword(u.password));

  const core = await db.transaction(async (trx) => {
    const users: DemoSeedResult["users"] = [];
    for (const u of DEMO_USERS) {
      const found = await getUserByEmail(trx, u.email);
      const hash = hashes.get(u.email);
      const rec = found ?? (hash ? await insertUser(trx, { email: u.email, name: u.name, passwordHash: hash }) : undefined);
      if (!rec) throw new Error(`demo user ${u.email} vanished during seeding; run the demo again`);
      users.push({ role: u.role, email: u.email, password: u.password, userId: rec.id, created: !found });
    }
    const owner = users[0]!;
    let team = (await trx("teams").where({ name: DEMO_TEAM_NAME, is_demo: 1 }).orderBy("created_at").first("id")) as { id: string } | undefined;
    if (!team) {
      team = await insertTeamWithOwner(trx, { name: DEMO_TEAM_NAME, ownerId: owner.userId, isDemo: true });
      await trx("audit_log").insert({ team_id: team.id, user_id: owner.userId, action: "team.create", entity_type: "team", entity_id: team.id, detail: JSON.stringify({ name: DEMO_TEAM_NAME, demo: true }), at: Date.now() });
    }
    for (const u of users) {
      const member = await trx("memberships").where({ team_id: team.id, user_id: u.userId }).first("role");
      if (!member) await insertMembership(trx, { teamId: team.id, userId: u.userId, role: u.role });
    }
    return { teamId: team.id, users };
  });

  const ownerId = core.users.find((u) => u.role === "owner")!.userId;
  const editorId = core.users.find((u) => u.role === "editor")!.userId;
  const { baselineId, scenarioIds } = await seedDemoWorkspace(db, { teamId: core.teamId, ownerId, editorId });
  const { reportId } = await seedDemoReports(db, { teamId: core.teamId, ownerId, baselineId, scenarioIds });
  return { ...core, baselineId, scenarioIds, reportId };
}

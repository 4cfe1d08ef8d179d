import type { Knex } from "knex";
import { getMembershipRole } from "@/db/queries/access";
import { findDemoTeamId } from "@/db/queries/demo";
import { getUserByEmail } from "@/db/queries/users";
import { addMember, createTeam } from "@/db/writes/teams";
import { signUpUser } from "@/db/writes/users";
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
  roadmapIds?: string[];
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

  // Each step is one write-module transaction; a run cut short is completed by the next (every step looks first).
  const core = await (async () => {
    const users: DemoSeedResult["users"] = [];
    for (const u of DEMO_USERS) {
      const found = await getUserByEmail(db, u.email);
      const hash = hashes.get(u.email);
      const rec =
        found ?? (hash ? await signUpUser(db, { email: u.email, name: u.name, passwordHash: hash, detail: { demo: true }, emailVerified: true }) : undefined);
      if (!rec) throw new Error(`demo user ${u.email} vanished during seeding; run the demo again`);
      users.push({ role: u.role, email: u.email, password: u.password, userId: rec.id, created: !found });
    }
    const owner = users[0]!;
    const teamId =
      (await findDemoTeamId(db, DEMO_TEAM_NAME)) ??
      (await createTeam(db, { name: DEMO_TEAM_NAME, ownerId: owner.userId, isDemo: true, detail: { demo: true } })).id;
    for (const u of users) {
      const role = await getMembershipRole(db, teamId, u.userId);
      if (!role) await addMember(db, { teamId, userId: u.userId, role: u.role, actorId: owner.userId, detail: { demo: true } });
    }
    return { teamId, users };
  })();

  const ownerId = core.users.find((u) => u.role === "owner")!.userId;
  const editorId = core.users.find((u) => u.role === "editor")!.userId;
  const { baselineId, scenarioIds, roadmapIds } = await seedDemoWorkspace(db, { teamId: core.teamId, ownerId, editorId });
  const { reportId } = await seedDemoReports(db, { teamId: core.teamId, ownerId, baselineId, scenarioIds, roadmapIds });
  return { ...core, baselineId, scenarioIds, roadmapIds, reportId };
}

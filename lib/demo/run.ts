// `npm run demo`: migrate, seed the invented demo team, build, and serve on PORT (default 3000).
import "./server-only-hook";
import { spawn, spawnSync } from "node:child_process";
import path from "node:path";
import { fileURLToPath } from "node:url";

const root = path.resolve(path.dirname(fileURLToPath(import.meta.url)), "../..");
process.chdir(root);
const nextBin = path.join(root, "node_modules", "next", "dist", "bin", "next");
const port = process.env.PORT || "3000";
// Nothing is sent anywhere: Next.js telemetry stays off.
process.env.NEXT_TELEMETRY_DISABLED = "1";

async function seed() {
  // Imported after the hook is registered (static imports would be resolved before it).
  const { databasePath } = await import("@/db/path");
  const { openDatabase } = await import("@/db/connect");
  const { migrateLatest } = await import("@/db/migrate");
  const { seedDemo, DEMO_TEAM_NAME } = await import("./seed");
  const file = databasePath();
  const db = openDatabase(file);
  try {
    await migrateLatest(db);
    const r = await seedDemo(db);
    return { file, teamName: DEMO_TEAM_NAME, ...r };
  } finally {
    await db.destroy();
  }
}

function printDetails(s: Awaited<ReturnType<typeof seed>>) {
  const url = `http://localhost:${port}`;
  const lines = [
    "",
    'Plateau demo — invented team "' + s.teamName + '" (all demo data is invented)',
    `  database: ${s.file}`,
    `  open:     ${url}/sign-in`,
    "  sign in as (DEMO-ONLY passwords, printed on purpose — never reuse them):",
    ...s.users.map((u) => `    ${u.role.padEnd(6)}  ${u.email.padEnd(26)}  ${u.password}`),
    `  team home: ${url}/teams/${s.teamId}`,
    "",
  ];
  console.log(lines.join("\n"));
}

function run(): void {
  seed()
    .then((s) => {
      const created = s.users.filter((u) => u.created).length;
      console.log(created ? `Seeded ${created} demo user(s) and the demo team.` : "Demo data already present: nothing changed.");
      printDetails(s);
      console.log("Building the app (next build)…");
      const build = spawnSync(process.execPath, [nextBin, "build"], { stdio: "inherit", env: { ...process.env, NODE_ENV: "production" } });
      if (build.status !== 0) {
        console.error(`next build failed (exit ${build.status ?? build.signal}).`);
        process.exit(build.status ?? 1);
      }
      printDetails(s);
      // PLATEAU_DEMO=1: the Outbox page shows each owner their team's captured mail (a plain `next start` has none).
      const server = spawn(process.execPath, [nextBin, "start", "-p", port], {
        stdio: "inherit",
        env: { ...process.env, NODE_ENV: "production", PLATEAU_DEMO: "1" },
      });
      for (const sig of ["SIGINT", "SIGTERM", "SIGHUP"] as const) {
        process.on(sig, () => {
          if (server.exitCode === null) server.kill(sig);
        });
      }
      server.on("exit", (code, signal) => process.exit(code ?? (signal ? 0 : 1)));
    })
    .catch((e: unknown) => {
      console.error("Demo setup failed:", e);
      process.exit(1);
    });
}

run();

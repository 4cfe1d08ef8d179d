import { createHash } from "node:crypto";
import Database from "better-sqlite3";
import { inject } from "vitest";
import { type Client, userWithTeam, signedUpClient } from "../helpers/http";

export const WORKSPACE_TABLES = ["baselines", "wire_classes", "class_histograms", "baseline_revisions", "scenarios", "scenario_revisions"] as const;

/** Row counts and a SHA-256 of every row of the workspace tables, read from the server's SQLite file read-only. */
export function snapshot(): Record<string, { rows: number; sha: string }> {
  const db = new Database(inject("dbPath"), { readonly: true, fileMustExist: true });
  try {
    const out: Record<string, { rows: number; sha: string }> = {};
    for (const t of WORKSPACE_TABLES) {
      const rows = db.prepare(`select * from ${t} order by rowid`).all();
      out[t] = { rows: rows.length, sha: createHash("sha256").update(JSON.stringify(rows)).digest("hex") };
    }
    return out;
  } finally {
    db.close();
  }
}

/** Give a user a role in a team directly in the database file (invites are the platform's and tested there). */
export function addMember(teamId: string, userId: string, role: "owner" | "editor" | "viewer"): void {
  const db = new Database(inject("dbPath"));
  db.pragma("busy_timeout = 5000");
  try {
    db.prepare("insert into memberships (team_id, user_id, role, created_at) values (?, ?, ?, ?)").run(teamId, userId, role, Date.now());
  } finally {
    db.close();
  }
}

export function rawDb(): Database.Database {
  const db = new Database(inject("dbPath"));
  db.pragma("busy_timeout = 5000");
  return db;
}

/** An owner with a team, plus an editor and a viewer in it and an outsider with their own team. */
export async function teamWithRoles() {
  const owner = await userWithTeam("Workspace Team");
  const editor = await signedUpClient("Eve Editor");
  const viewer = await signedUpClient("Vic Viewer");
  addMember(owner.teamId, editor.userId, "editor");
  addMember(owner.teamId, viewer.userId, "viewer");
  const outsider = await userWithTeam("Other Team");
  return { owner, editor, viewer, outsider, teamId: owner.teamId };
}

/** Two classes typed the way a person would: strings with units. */
export function sampleClasses() {
  return [
    {
      name: "M1",
      tier: "local",
      widthM: "20 nm",
      thicknessM: "40nm",
      spacingM: "0.02 µm",
      ildBelowM: "30 nm",
      ildAboveM: "30 nm",
      barrierM: "2 nm",
      metal: "Cu",
      k: 2.7,
      netCount: 100000,
      meanLengthM: "5 µm",
      driverOhm: "8 kohm",
      loadF: "0.4 fF",
      activity: 0.15,
    },
    {
      name: "M2",
      tier: "intermediate",
      widthM: 4e-8,
      thicknessM: 8e-8,
      spacingM: 4e-8,
      ildBelowM: 5e-8,
      ildAboveM: null,
      barrierM: 2.5e-9,
      metal: "Cu",
      k: 2.7,
      netCount: 30000,
      meanLengthM: 2.5e-5,
      driverOhm: 3000,
      loadF: 1e-15,
      activity: 0.12,
    },
  ];
}

export const TECH = { supplyV: 0.75, clockHz: 1.5e9, repeaterR0Ohm: 6000, repeaterC0F: 2.5e-16, delayBudgetS: 1e-10 };

export async function createBaseline(c: Client, teamId: string, name = `Baseline ${Math.random().toString(36).slice(2, 8)}`) {
  const r = await c.post(`/api/teams/${teamId}/baselines`, { name, technology: TECH, classes: sampleClasses() });
  if (r.status !== 201) throw new Error(`baseline create failed ${r.status} ${r.text}`);
  return r.json.baseline as { id: string; version: number; classes: { id: string; name: string }[] };
}

import { expect } from "vitest";
import { Client, GOOD_PASSWORD, uniqueEmail } from "./http";
import { openTestDb } from "./db-file";

/** The invite link (and its token) in the plain-text body of an outbox row. */
export function inviteLinkFromOutbox(outboxId: number): { link: string; token: string } {
  const db = openTestDb();
  try {
    const row = db.prepare("select text_body from outbox where id = ?").get(outboxId) as { text_body: string } | undefined;
    const m = row?.text_body.match(/(https?:\/\/\S+\/invite\/([A-Za-z0-9_-]+))/);
    if (!m) throw new Error(`no invite link in outbox row ${outboxId}`);
    return { link: m[1]!, token: m[2]! };
  } finally {
    db.close();
  }
}

/** Invite `email` to the team as `role` (owner's client) and return the token from the e-mail. */
export async function inviteToken(owner: Client, teamId: string, email: string, role: "owner" | "editor" | "viewer"): Promise<string> {
  const r = await owner.post(`/api/teams/${teamId}/invites`, { email, role });
  expect(r.status, r.text).toBe(201);
  return inviteLinkFromOutbox(r.json.mail.outboxId).token;
}

/** A new user who joined the team with `role` through a real invite. */
export async function addMember(owner: Client, teamId: string, role: "owner" | "editor" | "viewer", name = `A ${role}`) {
  const email = uniqueEmail(role);
  const token = await inviteToken(owner, teamId, email, role);
  const client = new Client();
  const s = await client.post("/api/auth/sign-up", { email, password: GOOD_PASSWORD, name });
  expect(s.status, s.text).toBe(201);
  const a = await client.post("/api/invites/accept", { token });
  expect(a.status, a.text).toBe(200);
  return { client, email, userId: s.json.user.id as string };
}

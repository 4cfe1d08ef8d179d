import fs from "node:fs";
import os from "node:os";
import path from "node:path";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import type { Knex } from "knex";
import { openDatabase } from "@/db/connect";
import { getUserById } from "@/db/queries/users";
import { acceptInvite, createInvite } from "@/db/writes/teams";
import { createEmailVerification, signUpUser, verifyEmail } from "@/db/writes/users";
import * as m1 from "@/migrations/20261201000001_platform";
import * as m2 from "@/migrations/20261201000002_workspace";
import * as m3 from "@/migrations/20261201000003_reports";
import * as m4 from "@/migrations/20261201000004_vias";
import * as m5 from "@/migrations/20261202000005_air_gaps";
import * as m20 from "@/migrations/20261202000020_email_verification";
import { auditRows, counts, newUser, ownerWithTeam, tempDb } from "../helpers/temp-db";

// Issue 12, finding 6: the stored side of e-mail verification (migration 20261202000020, db/writes/users.ts).

describe("migration 20261202000020_email_verification", () => {
  it("counts accounts that existed before it as verified (at their creation); accounts made afterwards start unverified", async () => {
    const dir = fs.mkdtempSync(path.join(os.tmpdir(), "plateau-verify-mig-"));
    const db = openDatabase(path.join(dir, "t.sqlite"));
    try {
      for (const m of [m1, m2, m3, m4, m5]) await m.up(db);
      await db("users").insert({ id: "old-user", email: "old@example.test", name: "Old", password_hash: "x", created_at: 1234 });
      await m20.up(db);
      expect(await db("users").where({ id: "old-user" }).first("email_verified_at")).toEqual({ email_verified_at: 1234 });
      const fresh = await signUpUser(db, { email: "new@example.test", name: "New", passwordHash: "x" });
      expect(fresh.emailVerifiedAt).toBe(null);
      const seeded = await signUpUser(db, { email: "demo@example.test", name: "Demo", passwordHash: "x", emailVerified: true });
      expect(seeded.emailVerifiedAt).toBe(seeded.createdAt);
      const cols = (await db.raw<{ name: string }[]>("pragma table_info(outbox)")).map((c) => c.name);
      expect(cols).toContain("user_id");
    } finally {
      await db.destroy();
      fs.rmSync(dir, { recursive: true, force: true });
    }
  });
});

let db: Knex;
let close: () => Promise<void>;
beforeAll(async () => {
  ({ db, close } = await tempDb("verify"));
});
afterAll(() => close());

async function link(userId: string, email: string, tokenHash: string, expiresAt = Date.now() + 60_000) {
  await createEmailVerification(db, { userId, email, tokenHash, expiresAt, now: Date.now() });
}

describe("verifyEmail", () => {
  it("confirms once: the link is marked used, the account verified, one audit row; a second use changes nothing", async () => {
    const u = await newUser(db, "Verifier");
    await link(u.userId, u.email, "hash-once");
    const r = await verifyEmail(db, { tokenHash: "hash-once", now: Date.now() });
    expect(r).toEqual({ status: "verified", userId: u.userId, email: u.email });
    expect((await getUserById(db, u.userId))!.emailVerifiedAt).toBeGreaterThan(0);
    const before = await counts(db, ["audit_log", "email_verifications"]);
    expect(await verifyEmail(db, { tokenHash: "hash-once", now: Date.now() })).toMatchObject({ status: "used" });
    expect(await counts(db, ["audit_log", "email_verifications"])).toEqual(before);
    expect((await auditRows(db, { user_id: u.userId })).map((a) => a.action)).toEqual(["user.sign_up", "user.verification_send", "user.verify_email"]);
  });

  it("an expired link, an unknown one, or one made for an address the account no longer has verifies nothing", async () => {
    const u = await newUser(db, "Late");
    await link(u.userId, u.email, "hash-late", Date.now() - 1);
    await link(u.userId, "previous@example.test", "hash-moved");
    const audit = (await counts(db, ["audit_log"])).audit_log;
    expect(await verifyEmail(db, { tokenHash: "hash-late", now: Date.now() })).toEqual({ status: "expired", userId: u.userId });
    expect(await verifyEmail(db, { tokenHash: "hash-none", now: Date.now() })).toEqual({ status: "invalid" });
    expect(await verifyEmail(db, { tokenHash: "hash-moved", now: Date.now() })).toEqual({ status: "invalid" });
    expect((await getUserById(db, u.userId))!.emailVerifiedAt).toBe(null);
    expect(await db("email_verifications").where({ user_id: u.userId }).whereNotNull("used_at").count({ n: "*" })).toEqual([{ n: 0 }]);
    expect((await counts(db, ["audit_log"])).audit_log).toBe(audit);
  });
});

describe("acceptInvite", () => {
  it("confirms the address the invite was sent to, in the same transaction", async () => {
    const o = await ownerWithTeam(db, "Verify by invite");
    const u = await newUser(db, "Invitee");
    const { invite } = await createInvite(db, {
      teamId: o.teamId,
      invitedBy: o.userId,
      email: u.email,
      role: "viewer",
      tokenHash: "invite-hash-1",
      expiresAt: Date.now() + 60_000,
    });
    await acceptInvite(db, { inviteId: invite.id, userId: u.userId });
    expect((await getUserById(db, u.userId))!.emailVerifiedAt).toBeGreaterThan(0);
    const accept = (await auditRows(db, { user_id: u.userId, action: "invite.accept" }))[0]!;
    expect(accept.detail).toEqual({ role: "viewer", emailVerified: true });
  });
});

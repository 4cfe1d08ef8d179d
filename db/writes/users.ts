import "server-only";
import type { Knex } from "knex";
import { writeAudit } from "@/db/audit";
import { ConflictError, fieldError } from "@/db/errors";
import { newId } from "@/db/ids";
import { getEmailVerificationByTokenHash, toUser, type UserRecord } from "@/db/queries/users";

/** Writes of user accounts. */

type Conn = Knex | Knex.Transaction;

export const EMAIL_TAKEN = "An account with this e-mail address already exists. Sign in instead.";

function isUniqueViolation(e: unknown): boolean {
  return typeof e === "object" && e !== null && "code" in e && String((e as { code: unknown }).code).startsWith("SQLITE_CONSTRAINT_UNIQUE");
}

/**
 * A new account ("user.sign_up"). The caller has normalised the e-mail (lower case) and hashed the
 * password. A taken address (also two sign-ups racing for it: the unique index decides) is a ConflictError on `email`.
 */
export async function signUpUser(
  conn: Conn,
  u: { email: string; name: string; passwordHash: string; detail?: Record<string, unknown>; emailVerified?: boolean },
): Promise<UserRecord> {
  try {
    return await conn.transaction(async (trx) => {
      const now = Date.now();
      // Only the demo seeder passes emailVerified (its invented addresses can receive nothing); sign-up never does.
      const row = {
        id: newId(),
        email: u.email,
        name: u.name,
        password_hash: u.passwordHash,
        created_at: now,
        email_verified_at: u.emailVerified ? now : null,
      };
      await trx("users").insert(row);
      await writeAudit(trx, {
        teamId: null,
        userId: row.id,
        action: "user.sign_up",
        entityType: "user",
        entityId: row.id,
        detail: u.detail,
        at: row.created_at,
      });
      return toUser(row);
    });
  } catch (e) {
    if (isUniqueViolation(e)) throw new ConflictError(EMAIL_TAKEN, fieldError("email", EMAIL_TAKEN));
    throw e;
  }
}

/**
 * Store a new e-mail verification link for the user's current address ("user.verification_send"): only the
 * token's hash. Earlier links stay valid until they expire (each proves the same address).
 */
export async function createEmailVerification(
  conn: Conn,
  p: { userId: string; email: string; tokenHash: string; expiresAt: number; now: number },
): Promise<void> {
  await conn.transaction(async (trx) => {
    const id = newId();
    await trx("email_verifications").insert({
      id,
      user_id: p.userId,
      email: p.email,
      token_hash: p.tokenHash,
      created_at: p.now,
      expires_at: p.expiresAt,
      used_at: null,
    });
    await writeAudit(trx, { teamId: null, userId: p.userId, action: "user.verification_send", entityType: "user", entityId: p.userId, at: p.now });
  });
}

export type VerifyEmailResult =
  | { status: "verified"; userId: string; email: string }
  | { status: "used"; userId: string; email: string }
  | { status: "expired"; userId: string }
  | { status: "invalid" };

/**
 * Use a verification link ("user.verify_email"): marks it used and the account's address verified, in one
 * transaction. A link used before, expired, unknown, or made for an address the account no longer has changes nothing.
 */
export async function verifyEmail(conn: Conn, p: { tokenHash: string; now: number }): Promise<VerifyEmailResult> {
  return conn.transaction(async (trx) => {
    const v = await getEmailVerificationByTokenHash(trx, p.tokenHash);
    if (!v) return { status: "invalid" };
    const user: { email: string } | undefined = await trx("users").where({ id: v.userId }).first("email");
    if (!user || user.email !== v.email) return { status: "invalid" };
    if (v.usedAt !== null) return { status: "used", userId: v.userId, email: v.email };
    if (v.expiresAt <= p.now) return { status: "expired", userId: v.userId };
    const n = await trx("email_verifications").where({ id: v.id }).whereNull("used_at").update({ used_at: p.now });
    if (n !== 1) return { status: "used", userId: v.userId, email: v.email };
    await trx("users").where({ id: v.userId }).whereNull("email_verified_at").update({ email_verified_at: p.now });
    await writeAudit(trx, { teamId: null, userId: v.userId, action: "user.verify_email", entityType: "user", entityId: v.userId, at: p.now });
    return { status: "verified", userId: v.userId, email: v.email };
  });
}

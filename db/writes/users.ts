import "server-only";
import type { Knex } from "knex";
import { writeAudit } from "@/db/audit";
import { ConflictError, InvalidInputError, NotFoundError, fieldError } from "@/db/errors";
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

/** Remember a device (a `plateau_device` cookie) after a successful sign-in, or refresh its last use. Keeps a user's 20 latest. */
export async function rememberDevice(conn: Knex, d: { userId: string; tokenHash: string; now?: number }): Promise<void> {
  const now = d.now ?? Date.now();
  await conn.transaction(async (trx) => {
    await trx("known_devices")
      .insert({ token_hash: d.tokenHash, user_id: d.userId, created_at: now, last_used_at: now })
      .onConflict("token_hash")
      .merge(["last_used_at"]);
    const keep = trx("known_devices").where({ user_id: d.userId }).orderBy("last_used_at", "desc").limit(20).select("token_hash");
    await trx("known_devices").where({ user_id: d.userId }).whereNotIn("token_hash", keep).delete();
  });
}

/**
 * A new password for a user who proved the current one ("user.password_change"): stores the hash and ends
 * every other session of the user (`keepSessionId` stays), in one transaction.
 */
export async function changePassword(
  conn: Knex,
  p: { userId: string; passwordHash: string; keepSessionId: string | null },
): Promise<{ endedSessions: number }> {
  return conn.transaction(async (trx) => {
    const updated = await trx("users").where({ id: p.userId }).update({ password_hash: p.passwordHash });
    if (updated !== 1) throw new NotFoundError("User");
    const others = trx("sessions").where({ user_id: p.userId });
    if (p.keepSessionId) others.whereNot({ id: p.keepSessionId });
    const endedSessions = await others.delete();
    await writeAudit(trx, {
      teamId: null,
      userId: p.userId,
      action: "user.password_change",
      entityType: "user",
      entityId: p.userId,
      detail: { endedSessions },
    });
    return { endedSessions };
  });
}

/** A password-reset link was made ("user.password_reset_request"): only the token's SHA-256 is stored. */
export async function createPasswordReset(
  conn: Knex,
  r: { userId: string; tokenHash: string; ttlMs: number; now?: number },
): Promise<{ id: string; expiresAt: number }> {
  const now = r.now ?? Date.now();
  return conn.transaction(async (trx) => {
    const row = { id: newId(), user_id: r.userId, token_hash: r.tokenHash, created_at: now, expires_at: now + r.ttlMs, used_at: null };
    await trx("password_resets").insert(row);
    await writeAudit(trx, { teamId: null, userId: r.userId, action: "user.password_reset_request", entityType: "user", entityId: r.userId, at: now });
    return { id: row.id, expiresAt: row.expires_at };
  });
}

export const RESET_INVALID = "This reset link is not valid, was already used or has expired (links last 1 hour). Ask for a new one.";

/**
 * Use a reset link ("user.password_reset"): in one transaction the token must be unused and unexpired; the
 * password is replaced, this and every other open link of the user are spent, and all the user's sessions
 * and known devices end. A bad, used or expired token is an InvalidInputError on `token` (nothing changes).
 */
export async function resetPassword(conn: Knex, p: { tokenHash: string; passwordHash: string; now?: number }): Promise<{ userId: string }> {
  const now = p.now ?? Date.now();
  return conn.transaction(async (trx) => {
    const r = await trx("password_resets").where({ token_hash: p.tokenHash }).first();
    if (!r || r.used_at !== null || r.expires_at <= now) throw new InvalidInputError(RESET_INVALID, fieldError("token", RESET_INVALID));
    const spent = await trx("password_resets").where({ id: r.id }).whereNull("used_at").update({ used_at: now });
    if (spent !== 1) throw new InvalidInputError(RESET_INVALID, fieldError("token", RESET_INVALID));
    await trx("password_resets").where({ user_id: r.user_id }).whereNull("used_at").update({ used_at: now });
    await trx("users").where({ id: r.user_id }).update({ password_hash: p.passwordHash });
    const endedSessions = await trx("sessions").where({ user_id: r.user_id }).delete();
    await trx("known_devices").where({ user_id: r.user_id }).delete();
    await writeAudit(trx, {
      teamId: null,
      userId: r.user_id,
      action: "user.password_reset",
      entityType: "user",
      entityId: r.user_id,
      detail: { endedSessions },
      at: now,
    });
    return { userId: r.user_id as string };
  });
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

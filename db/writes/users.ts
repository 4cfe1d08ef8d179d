import "server-only";
import type { Knex } from "knex";
import { writeAudit } from "@/db/audit";
import { ConflictError, fieldError } from "@/db/errors";
import { newId } from "@/db/ids";
import { toUser, type UserRecord } from "@/db/queries/users";

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
export async function signUpUser(conn: Conn, u: { email: string; name: string; passwordHash: string; detail?: Record<string, unknown> }): Promise<UserRecord> {
  try {
    return await conn.transaction(async (trx) => {
      const row = { id: newId(), email: u.email, name: u.name, password_hash: u.passwordHash, created_at: Date.now() };
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

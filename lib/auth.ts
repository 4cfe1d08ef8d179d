import "server-only";
// Every lucia import lives in this file: lucia v3 is deprecated upstream, so a later swap touches one module.
import { Lucia, type Session, type User } from "lucia";
import { BetterSqlite3Adapter } from "@lucia-auth/adapter-sqlite";
import Database from "better-sqlite3";
import { cookies } from "next/headers";
import { cache } from "react";
import { databasePath } from "@/db/path";
import { ready } from "@/db/client";

type UserAttributes = { email: string; name: string; emailVerified: boolean };
const g = globalThis as unknown as { __plateauLucia?: Lucia<Record<never, never>, UserAttributes> };

function createLucia() {
  const raw = new Database(databasePath());
  raw.pragma("journal_mode = WAL");
  raw.pragma("foreign_keys = ON");
  raw.pragma("busy_timeout = 5000");
  const adapter = new BetterSqlite3Adapter(raw, { user: "users", session: "sessions" });
  return new Lucia(adapter, {
    sessionCookie: {
      name: "plateau_session",
      expires: false,
      attributes: {
        // Secure in production; PLATEAU_INSECURE_COOKIES=1 opts out for plain-http hosts other than localhost.
        secure: process.env.NODE_ENV === "production" && process.env.PLATEAU_INSECURE_COOKIES !== "1",
        sameSite: "lax",
      },
    },
    getUserAttributes: (attributes): UserAttributes => ({
      email: attributes.email,
      name: attributes.name,
      emailVerified: attributes.email_verified_at !== null && attributes.email_verified_at !== undefined,
    }),
  });
}

export function lucia() {
  return (g.__plateauLucia ??= createLucia());
}

declare module "lucia" {
  interface Register {
    Lucia: ReturnType<typeof createLucia>;
    DatabaseUserAttributes: { email: string; name: string; email_verified_at: number | null };
  }
}

export type AuthUser = User;
export type AuthSession = Session;

/** Create a session for a user and set its cookie (route handlers and server actions only). */
export async function startSession(userId: string): Promise<void> {
  await ready();
  const session = await lucia().createSession(userId, {});
  const cookie = lucia().createSessionCookie(session.id);
  (await cookies()).set(cookie.name, cookie.value, cookie.attributes);
}

/** Invalidate the current session and blank its cookie. */
export async function endSession(): Promise<void> {
  const { session } = await validateRequest();
  if (session) await lucia().invalidateSession(session.id);
  const blank = lucia().createBlankSessionCookie();
  (await cookies()).set(blank.name, blank.value, blank.attributes);
}

/** End every session of a user (e.g. after a password change). */
export async function endAllSessions(userId: string): Promise<void> {
  await lucia().invalidateUserSessions(userId);
}

/**
 * The signed-in user and session, or nulls. Cached per request (lucia's App Router guide).
 * Refreshes the cookie when lucia extends the session.
 */
export const validateRequest = cache(async (): Promise<{ user: User; session: Session } | { user: null; session: null }> => {
  await ready();
  const jar = await cookies();
  const sessionId = jar.get(lucia().sessionCookieName)?.value ?? null;
  if (!sessionId) return { user: null, session: null };
  const result = await lucia().validateSession(sessionId);
  try {
    if (result.session?.fresh) {
      const c = lucia().createSessionCookie(result.session.id);
      jar.set(c.name, c.value, c.attributes);
    }
    if (!result.session) {
      const c = lucia().createBlankSessionCookie();
      jar.set(c.name, c.value, c.attributes);
    }
  } catch {
    // Next throws when setting cookies during a Server Component render; the next action or handler will do it.
  }
  return result;
});

export const SESSION_COOKIE = "plateau_session";

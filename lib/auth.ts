import "server-only";
// Every lucia import lives in this file: lucia v3 is deprecated upstream, so a later swap touches one module.
import { Lucia, TimeSpan, type Session, type User } from "lucia";
import { BetterSqlite3Adapter } from "@lucia-auth/adapter-sqlite";
import Database from "better-sqlite3";
import { cookies } from "next/headers";
import { cache } from "react";
import { databasePath } from "@/db/path";
import { ready } from "@/db/client";
import { AbsoluteLifetimeAdapter } from "@/db/session-adapter";

/**
 * Session lifetimes (OWASP ASVS 4.0.3 3.3.1, 3.3.2): a session ends after 7 days without use (sliding: lucia
 * extends it when half of that has passed) and 30 days after sign-in whatever the activity (absolute). The
 * cookie lives exactly as long as the session (Max-Age = the session's remaining time).
 */
export const SESSION_IDLE_MS = 7 * 24 * 60 * 60 * 1000;
export const SESSION_ABSOLUTE_MS = 30 * 24 * 60 * 60 * 1000;

type UserAttributes = { email: string; name: string; emailVerified: boolean };
const g = globalThis as unknown as { __plateauLucia?: Lucia<{ createdAt: number }, UserAttributes> };

function createLucia() {
  const raw = new Database(databasePath());
  raw.pragma("journal_mode = WAL");
  raw.pragma("foreign_keys = ON");
  raw.pragma("busy_timeout = 5000");
  const adapter = new AbsoluteLifetimeAdapter(new BetterSqlite3Adapter(raw, { user: "users", session: "sessions" }), raw, SESSION_ABSOLUTE_MS);
  return new Lucia(adapter, {
    sessionExpiresIn: new TimeSpan(SESSION_IDLE_MS / 1000, "s"),
    sessionCookie: {
      name: "plateau_session",
      expires: true,
      attributes: {
        secure: secureCookies(),
        sameSite: "lax",
      },
    },
    getSessionAttributes: (attributes) => ({ createdAt: attributes.created_at }),
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
    DatabaseSessionAttributes: { created_at: number };
  }
}

export type AuthUser = User;
export type AuthSession = Session;

/** Secure cookies in production; PLATEAU_INSECURE_COOKIES=1 opts out for plain-http hosts other than localhost. */
export function secureCookies(): boolean {
  return process.env.NODE_ENV === "production" && process.env.PLATEAU_INSECURE_COOKIES !== "1";
}

/** When a session ends: its sliding expiry, but never past the absolute lifetime. */
export function sessionEnd(session: Pick<Session, "expiresAt" | "createdAt">): number {
  return Math.min(session.expiresAt.getTime(), session.createdAt + SESSION_ABSOLUTE_MS);
}

/** The session cookie, living exactly as long as the session. */
function sessionCookie(session: Session) {
  const c = lucia().createSessionCookie(session.id);
  const maxAge = Math.max(0, Math.floor((sessionEnd(session) - Date.now()) / 1000));
  return { name: c.name, value: c.value, attributes: { ...c.attributes, maxAge } };
}

/** Create a session for a user and set its cookie (route handlers and server actions only). */
export async function startSession(userId: string): Promise<AuthSession> {
  await ready();
  const session = await lucia().createSession(userId, { created_at: Date.now() });
  const cookie = sessionCookie(session);
  (await cookies()).set(cookie.name, cookie.value, cookie.attributes);
  return session;
}

/** Blank the session cookie (after the session was ended server-side). */
export async function clearSessionCookie(): Promise<void> {
  const blank = lucia().createBlankSessionCookie();
  (await cookies()).set(blank.name, blank.value, blank.attributes);
}

/** Invalidate the current session and blank its cookie. */
export async function endSession(): Promise<void> {
  const { session } = await validateRequest();
  if (session) await lucia().invalidateSession(session.id);
  await clearSessionCookie();
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
      const c = sessionCookie(result.session);
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

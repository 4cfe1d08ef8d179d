import type { Adapter, DatabaseSession, DatabaseUser } from "lucia";
import type Database from "better-sqlite3";

/**
 * lucia's SQLite adapter with an absolute session lifetime (OWASP ASVS 4.0.3 3.3.1/3.3.2): a session ends
 * `absoluteMs` after `sessions.created_at` (ms) whatever its activity. Reads report the earlier of the
 * sliding expiry and that end, so lucia ends the session on time; extensions never pass that end.
 */
export class AbsoluteLifetimeAdapter implements Adapter {
  constructor(
    private readonly base: Adapter,
    private readonly raw: Database.Database,
    private readonly absoluteMs: number,
  ) {}

  /** When a stored session ends at the latest (ms). */
  absoluteEnd(attributes: Record<string, unknown>): number {
    const created = Number(attributes.created_at);
    return (Number.isFinite(created) ? created : 0) + this.absoluteMs;
  }

  private clamp(s: DatabaseSession): DatabaseSession {
    const end = this.absoluteEnd(s.attributes);
    return end < s.expiresAt.getTime() ? { ...s, expiresAt: new Date(end) } : s;
  }

  async getSessionAndUser(sessionId: string): Promise<[session: DatabaseSession | null, user: DatabaseUser | null]> {
    const [s, u] = await this.base.getSessionAndUser(sessionId);
    return [s ? this.clamp(s) : null, u];
  }

  async getUserSessions(userId: string): Promise<DatabaseSession[]> {
    return (await this.base.getUserSessions(userId)).map((s) => this.clamp(s));
  }

  setSession(session: DatabaseSession): Promise<void> {
    return this.base.setSession(session);
  }

  async updateSessionExpiration(sessionId: string, expiresAt: Date): Promise<void> {
    // expires_at is in seconds (lucia's format), created_at in ms.
    this.raw
      .prepare("update sessions set expires_at = cast(min(?, (created_at + ?) / 1000) as integer) where id = ?")
      .run(Math.floor(expiresAt.getTime() / 1000), this.absoluteMs, sessionId);
  }

  deleteSession(sessionId: string): Promise<void> {
    return this.base.deleteSession(sessionId);
  }

  deleteUserSessions(userId: string): Promise<void> {
    return this.base.deleteUserSessions(userId);
  }

  deleteExpiredSessions(): Promise<void> {
    return this.base.deleteExpiredSessions();
  }
}

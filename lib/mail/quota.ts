import "server-only";
import { db, ready } from "@/db/client";
import { mailSendTimes } from "@/db/queries/mail";
import { tooManyRequests } from "@/lib/api";
import { LIMITED_KINDS, MAIL_WINDOW_MS, mailLimits, secondsUntilRoom } from "./rules";

/**
 * Sending limits for the mail users address to others (invites and report e-mails), so an account cannot use
 * Plateau as a spam relay: per user and per team, over a sliding hour, counted in messages (one per recipient) from
 * the outbox (rules and settings: lib/mail/rules.ts). A request that would go over a limit is refused whole (429
 * with Retry-After), before anything is stored.
 */

function wait(seconds: number): string {
  const minutes = Math.ceil(seconds / 60);
  return minutes <= 1 ? "a minute" : `${minutes} minutes`;
}

// One process serves the app (SQLite), so a promise chain makes "count, then queue" atomic: concurrent requests
// cannot all pass the check before any of them has queued its messages. Kept on globalThis for dev reloads.
const g = globalThis as unknown as { __plateauMailLock?: Promise<void> };

/** Run `fn` while no other mail-limit check runs. */
export async function withMailLock<T>(fn: () => Promise<T>): Promise<T> {
  const previous = g.__plateauMailLock ?? Promise.resolve();
  let release!: () => void;
  const mine = new Promise<void>((r) => (release = r));
  g.__plateauMailLock = previous.then(() => mine);
  await previous;
  try {
    return await fn();
  } finally {
    release();
  }
}

/**
 * Check the limits for `messages` more messages by `userId` from `teamId`, then run `fn`, which must queue them
 * (queueMail) before it returns; delivery happens after, outside the lock. Over a limit: 429 `mail_rate_limited`.
 */
export async function withMailQuota<T>(p: { userId: string; teamId: string; messages: number }, fn: () => Promise<T>): Promise<T> {
  await ready();
  return withMailLock(async () => {
    const now = Date.now();
    const since = now - MAIL_WINDOW_MS;
    const limits = mailLimits(process.env);
    const userWait = secondsUntilRoom(await mailSendTimes(db, { userId: p.userId }, LIMITED_KINDS, since), p.messages, limits.perUser, now);
    if (userWait > 0) {
      throw tooManyRequests(
        "mail_rate_limited",
        `You can send at most ${limits.perUser} invites and report e-mails per hour (one per recipient), and this would go over it. Try again in ${wait(userWait)}.`,
        userWait,
      );
    }
    const teamWait = secondsUntilRoom(await mailSendTimes(db, { teamId: p.teamId }, LIMITED_KINDS, since), p.messages, limits.perTeam, now);
    if (teamWait > 0) {
      throw tooManyRequests(
        "mail_rate_limited",
        `This team can send at most ${limits.perTeam} invites and report e-mails per hour (one per recipient), and this would go over it. Try again in ${wait(teamWait)}.`,
        teamWait,
      );
    }
    return fn();
  });
}

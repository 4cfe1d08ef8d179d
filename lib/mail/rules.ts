// The pure rules of Plateau's mail (no I/O, unit-tested in tests/lib/mail-rules.test.ts): the sending limits, the
// pacing of confirmation links, and where the Outbox page exists.

/** The sending limits count messages (one per recipient) of these kinds over a sliding hour. */
export const MAIL_WINDOW_MS = 60 * 60 * 1000;
export const LIMITED_KINDS = ["invite", "report"] as const;
export const DEFAULT_MAIL_LIMITS = { perUser: 40, perTeam: 100 } as const;

function positiveInt(value: string | undefined, fallback: number): number {
  const text = value?.trim();
  const n = Number(text);
  return text && Number.isInteger(n) && n > 0 ? n : fallback;
}

/** Messages per hour per user and per team: PLATEAU_MAIL_LIMIT_USER and PLATEAU_MAIL_LIMIT_TEAM, else 40 and 100. */
export function mailLimits(env: Record<string, string | undefined>): { perUser: number; perTeam: number } {
  return {
    perUser: positiveInt(env.PLATEAU_MAIL_LIMIT_USER, DEFAULT_MAIL_LIMITS.perUser),
    perTeam: positiveInt(env.PLATEAU_MAIL_LIMIT_TEAM, DEFAULT_MAIL_LIMITS.perTeam),
  };
}

/**
 * Seconds until `messages` more fit under `limit`, given the send times in the window (oldest first); 0 when they
 * fit now. A request larger than the limit itself waits a whole window.
 */
export function secondsUntilRoom(times: readonly number[], messages: number, limit: number, now: number, windowMs = MAIL_WINDOW_MS): number {
  const excess = times.length + messages - limit;
  if (excess <= 0) return 0;
  const freeing = times[excess - 1];
  if (freeing === undefined) return Math.ceil(windowMs / 1000);
  return Math.max(1, Math.ceil((freeing + windowMs - now) / 1000));
}

/** A confirmation link works once, for 24 hours. */
export const VERIFY_TTL_MS = 24 * 60 * 60 * 1000;
/** "Send the link again": at most one a minute and five a day per account (the first, at sign-up, counts). */
export const RESEND_GAP_MS = 60 * 1000;
export const MAX_LINKS_PER_DAY = 5;
export const DAY_MS = 24 * 60 * 60 * 1000;

/** Seconds until the account may be sent another confirmation link (0 = now), from its sends of the last day, newest first. */
export function secondsUntilNextLink(sendTimesNewestFirst: readonly number[], now: number): number {
  const last = sendTimesNewestFirst[0];
  let wait = last !== undefined ? last + RESEND_GAP_MS - now : 0;
  const fifth = sendTimesNewestFirst[MAX_LINKS_PER_DAY - 1];
  if (fifth !== undefined) wait = Math.max(wait, fifth + DAY_MS - now);
  return wait > 0 ? Math.ceil(wait / 1000) : 0;
}

/**
 * Whether this server has an Outbox page: in development (`next dev`) and in the demo (`npm run demo` starts the
 * server with PLATEAU_DEMO=1), where mail goes to the local catcher and the page is the only way to read it. A
 * production server (`next start` without PLATEAU_DEMO=1) has no such page: it answers 404.
 */
export function outboxEnabled(env: { NODE_ENV?: string; PLATEAU_DEMO?: string }): boolean {
  return env.NODE_ENV !== "production" || env.PLATEAU_DEMO === "1";
}

/** The longest team or person name an invite e-mail quotes; longer names are cut with "…". */
export const MAIL_NAME_MAX = 60;

/**
 * A user-chosen name made safe to quote in a mail's subject or text: control and format characters (newlines, bidi
 * overrides, zero-width marks), lone surrogates and line separators become spaces, runs of spaces one, double quotes single ones (the
 * name sits inside quotes), at most MAIL_NAME_MAX characters.
 */
export function mailSafeName(name: string, max = MAIL_NAME_MAX): string {
  const clean = name
    .replace(/[\p{Cc}\p{Cf}\p{Cs}\p{Zl}\p{Zp}]/gu, " ")
    .replace(/"/g, "'")
    .replace(/\s+/g, " ")
    .trim();
  const chars = Array.from(clean);
  return chars.length <= max
    ? clean
    : `${chars
        .slice(0, max - 1)
        .join("")
        .trimEnd()}…`;
}

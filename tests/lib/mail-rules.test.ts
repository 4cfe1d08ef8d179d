import { describe, expect, it } from "vitest";
import { DAY_MS, mailLimits, mailSafeName, outboxEnabled, secondsUntilNextLink, secondsUntilRoom } from "@/lib/mail/rules";

// The pure mail rules behind issue 12, finding 6 (sending limits, link pacing, invite subject) and issue 13, item 13
// (where the Outbox page exists). The HTTP side: tests/app/mail-relay.test.ts and tests/app/outbox.test.ts.

const HOUR = 3600_000;

describe("secondsUntilRoom (sliding-hour limits)", () => {
  it("is 0 while the messages fit, and otherwise waits for just enough old sends to leave the window", () => {
    const now = 10 * HOUR;
    const times = [now - 50 * 60_000, now - 40 * 60_000, now - 30 * 60_000]; // oldest first
    expect(secondsUntilRoom(times, 2, 5, now)).toBe(0);
    // one too many: the oldest (50 minutes ago) must leave, in 10 minutes
    expect(secondsUntilRoom(times, 3, 5, now)).toBe(600);
    // two too many: the second oldest, in 20 minutes
    expect(secondsUntilRoom(times, 4, 5, now)).toBe(1200);
    // more than the limit itself can never fit: a whole window
    expect(secondsUntilRoom([], 6, 5, now)).toBe(3600);
    // never less than a second
    expect(secondsUntilRoom([now - HOUR + 1], 1, 1, now)).toBe(1);
  });
});

describe("mailLimits", () => {
  it("defaults to 40 per user and 100 per team an hour; the settings take positive integers only", () => {
    expect(mailLimits({})).toEqual({ perUser: 40, perTeam: 100 });
    expect(mailLimits({ PLATEAU_MAIL_LIMIT_USER: " 5 ", PLATEAU_MAIL_LIMIT_TEAM: "12" })).toEqual({ perUser: 5, perTeam: 12 });
    for (const bad of ["", "0", "-3", "2.5", "many"]) {
      expect(mailLimits({ PLATEAU_MAIL_LIMIT_USER: bad, PLATEAU_MAIL_LIMIT_TEAM: bad })).toEqual({ perUser: 40, perTeam: 100 });
    }
  });
});

describe("secondsUntilNextLink (confirmation links: one a minute, five a day)", () => {
  it("waits out the minute after the last link, and the day after the fifth-newest", () => {
    const now = 100 * DAY_MS;
    expect(secondsUntilNextLink([], now)).toBe(0);
    expect(secondsUntilNextLink([now - 20_000], now)).toBe(40);
    expect(secondsUntilNextLink([now - 61_000], now)).toBe(0);
    const four = [1, 2, 3, 4].map((h) => now - h * HOUR);
    expect(secondsUntilNextLink(four, now)).toBe(0);
    const five = [...four, now - 5 * HOUR];
    expect(secondsUntilNextLink(five, now)).toBe(19 * 3600);
  });
});

describe("mailSafeName (names quoted in invite mails)", () => {
  it("turns control, format and separator characters into single spaces, double quotes into single ones, and caps at 60", () => {
    expect(mailSafeName("  Harbour\tWiring  ")).toBe("Harbour Wiring");
    expect(mailSafeName("A\r\nBcc: x@y.example")).toBe("A Bcc: x@y.example");
    expect(mailSafeName('Evil\u202Egnp.exe "team"\u200B\u2028end\u0000')).toBe("Evil gnp.exe 'team' end");
    expect(mailSafeName(`lone \uD800 surrogate`)).toBe("lone surrogate");
    const long = mailSafeName("y".repeat(100));
    expect(Array.from(long)).toHaveLength(60);
    expect(long.endsWith("…")).toBe(true);
    // astral characters count as one and are never split
    expect(Array.from(mailSafeName("🙂".repeat(70)))).toHaveLength(60);
    expect(mailSafeName("🙂".repeat(70)).startsWith("🙂".repeat(59))).toBe(true);
  });
});

describe("outboxEnabled (issue 13, item 13)", () => {
  it("is on in development and in the demo, off in a plain production server", () => {
    expect(outboxEnabled({ NODE_ENV: "development" })).toBe(true);
    expect(outboxEnabled({ NODE_ENV: "test" })).toBe(true);
    expect(outboxEnabled({ NODE_ENV: "production", PLATEAU_DEMO: "1" })).toBe(true);
    expect(outboxEnabled({ NODE_ENV: "production" })).toBe(false);
    expect(outboxEnabled({ NODE_ENV: "production", PLATEAU_DEMO: "true" })).toBe(false);
  });
});

import { afterAll, beforeAll, describe, expect, it } from "vitest";
import type { Knex } from "knex";
import { tempDb } from "../helpers/temp-db";
import { getThrottleRows } from "@/db/queries/throttle";
import {
  ACCOUNT_MAX_DELAY_MS,
  ACCOUNT_WINDOW_MS,
  LOCK_MS,
  WINDOW_MS,
  accountDelayMs,
  lockedUntil,
  recordFailure,
  recordSuccess,
  throttleKeys,
} from "@/lib/throttle";

let db: Knex;
let close: () => Promise<void>;
beforeAll(async () => {
  ({ db, close } = await tempDb("throttle"));
});
afterAll(() => close());

const T0 = 1_800_000_000_000;

// OWASP ASVS 4.0.3 2.2.1: soft lockouts, rate limits and ever increasing delays instead of a hard account
// lock; "no more than 100 failed attempts per hour is possible on a single account".
describe("sign-in throttle", () => {
  it("5 failures of one account from one client lock that pair for 15 minutes; the account stays open to other clients (only a short delay)", async () => {
    const keys = throttleKeys("a@example.com", "203.0.113.1");
    for (let i = 0; i < 4; i++) expect(await recordFailure(db, keys, T0 + i * 1000)).toBeNull();
    expect(await lockedUntil(db, keys, T0 + 4000)).toBeNull();
    expect(await recordFailure(db, keys, T0 + 5000)).toBe(T0 + 5000 + LOCK_MS);
    expect(await lockedUntil(db, keys, T0 + 6000)).toBe(T0 + 5000 + LOCK_MS);
    // Another client: only the account's growing delay (1 s after the 5th failure), never the 15-minute lock.
    const elsewhere = throttleKeys("a@example.com", "203.0.113.99");
    expect(await lockedUntil(db, elsewhere, T0 + 5500)).toBe(T0 + 6000);
    expect(await lockedUntil(db, elsewhere, T0 + 6000)).toBeNull();
    expect(await lockedUntil(db, keys, T0 + 5000 + LOCK_MS)).toBeNull();
  });

  it("the account's delay grows 1 s, 2 s, 4 s … and stops at 60 s, so at most ~65 failures an hour reach the password check", async () => {
    expect([4, 5, 6, 7, 8, 10, 11, 12, 50].map(accountDelayMs)).toEqual([0, 1000, 2000, 4000, 8000, 32000, 60000, 60000, 60000]);
    // An attacker rotating clients, trying each time the delay allows, for one hour:
    let t = T0 + 10 * ACCOUNT_WINDOW_MS;
    const end = t + ACCOUNT_WINDOW_MS;
    let attempts = 0;
    let client = 0;
    while (t < end) {
      const keys = throttleKeys("target@example.com", `198.51.100.${(client++ % 250) + 1}`);
      const until = await lockedUntil(db, keys, t);
      if (until) {
        t = until;
        continue;
      }
      attempts += 1;
      await recordFailure(db, keys, t);
      t += 10;
    }
    expect(attempts).toBeLessThanOrEqual(100);
    expect(attempts).toBeGreaterThan(50);
    expect(ACCOUNT_MAX_DELAY_MS).toBe(60_000);
  });

  it("a known device of the account is throttled on its own key: the attacker's failures elsewhere never block it", async () => {
    const email = "owner@example.com";
    let t = T0 + 20 * ACCOUNT_WINDOW_MS;
    for (let i = 0; i < 30; i++) {
      const keys = throttleKeys(email, `192.0.2.${i + 1}`);
      const until = await lockedUntil(db, keys, t);
      if (until) t = until;
      await recordFailure(db, keys, t);
    }
    const attacker = throttleKeys(email, "192.0.2.200");
    expect(await lockedUntil(db, attacker, t + 1)).not.toBeNull();
    const device = throttleKeys(email, "192.0.2.200", "device-of-owner");
    expect(device).toEqual([{ kind: "device", key: "device:device-of-owner" }]);
    expect(await lockedUntil(db, device, t + 1)).toBeNull();
    // Its own limit: 5 failures from that device lock the device for 15 minutes.
    for (let i = 0; i < 4; i++) expect(await recordFailure(db, device, t + i)).toBeNull();
    expect(await recordFailure(db, device, t + 4)).toBe(t + 4 + LOCK_MS);
  });

  it("failures spread wider than the window never lock the pair", async () => {
    const keys = throttleKeys("slow@example.com", "203.0.113.2").filter((k) => k.kind !== "account");
    for (let i = 0; i < 10; i++) expect(await recordFailure(db, keys, T0 + i * (WINDOW_MS / 3))).toBeNull();
    expect(await lockedUntil(db, keys, T0 + 10 * (WINDOW_MS / 3))).toBeNull();
  });

  it("locks a client address after 20 failures over many accounts; other addresses stay open", async () => {
    let locked: number | null = null;
    for (let i = 0; i < 20; i++) locked = await recordFailure(db, throttleKeys(`spray${i}@example.com`, "203.0.113.3"), T0 + i);
    expect(locked).toBe(T0 + 19 + LOCK_MS);
    expect(await lockedUntil(db, throttleKeys("fresh@example.com", "203.0.113.3"), T0 + 100)).toBe(T0 + 19 + LOCK_MS);
    expect(await lockedUntil(db, throttleKeys("fresh@example.com", "203.0.113.4"), T0 + 100)).toBeNull();
  });

  it("IPv6 clients are counted by their /64, so rotating addresses inside one network does not help", () => {
    const a = throttleKeys("v6@example.com", "2001:db8:1:2::1");
    const b = throttleKeys("v6@example.com", "2001:db8:1:2:ffff:1:2:3");
    expect(a.find((k) => k.kind === "client")?.key).toBe("client:2001:db8:1:2::/64");
    expect(b.find((k) => k.kind === "client")?.key).toBe("client:2001:db8:1:2::/64");
  });

  it("recordSuccess clears the account's and the pair's counts but not the client's", async () => {
    const keys = throttleKeys("b@example.com", "203.0.113.5");
    for (let i = 0; i < 4; i++) await recordFailure(db, keys, T0 + i);
    await recordSuccess(db, keys);
    const rows = await getThrottleRows(db, ["account:b@example.com", "pair:b@example.com|203.0.113.5", "client:203.0.113.5"]);
    expect(rows.map((r) => ({ key: r.key, failures: r.failures }))).toEqual([{ key: "client:203.0.113.5", failures: 4 }]);
    for (let i = 0; i < 4; i++) expect(await recordFailure(db, keys, T0 + 10 + i)).toBeNull();
  });

  it("counts failures that arrive at the same time without losing one (read and write in one transaction)", async () => {
    const keys = throttleKeys("burst@example.com", "203.0.113.6");
    const results = await Promise.all(Array.from({ length: 5 }, (_, i) => recordFailure(db, keys, T0 + i)));
    expect(results.filter((r) => r !== null).length).toBeGreaterThanOrEqual(1);
    const rows = await getThrottleRows(db, ["account:burst@example.com"]);
    expect(rows[0]?.failures).toBe(5);
    expect(await lockedUntil(db, keys, T0 + 10)).toBe(T0 + 4 + LOCK_MS);
  });

  it("without a client address only the account key applies", () => {
    expect(throttleKeys("c@example.com", null)).toEqual([{ kind: "account", key: "account:c@example.com" }]);
  });
});

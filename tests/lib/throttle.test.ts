import { afterAll, beforeAll, describe, expect, it } from "vitest";
import type { Knex } from "knex";
import { tempDb } from "../helpers/temp-db";
import { getThrottleRows } from "@/db/queries/throttle";
import { LOCK_MS, WINDOW_MS, clientAddress, lockedUntil, recordFailure, recordSuccess, throttleKeys } from "@/lib/throttle";

let db: Knex;
let close: () => Promise<void>;
beforeAll(async () => {
  ({ db, close } = await tempDb("throttle"));
});
afterAll(() => close());

const T0 = 1_800_000_000_000;

describe("sign-in throttle", () => {
  it("recordFailure locks the account key on the 5th failure within 15 minutes, for 15 minutes", async () => {
    const keys = throttleKeys("a@example.com", "203.0.113.1");
    for (let i = 0; i < 4; i++) expect(await recordFailure(db, keys, T0 + i * 1000)).toBeNull();
    expect(await lockedUntil(db, keys, T0 + 4000)).toBeNull();
    expect(await recordFailure(db, keys, T0 + 5000)).toBe(T0 + 5000 + LOCK_MS);
    expect(await lockedUntil(db, keys, T0 + 6000)).toBe(T0 + 5000 + LOCK_MS);
    // The same account from another address is locked too; the lock ends on time.
    const elsewhere = throttleKeys("a@example.com", "203.0.113.99");
    expect(await lockedUntil(db, elsewhere, T0 + 6000)).toBe(T0 + 5000 + LOCK_MS);
    expect(await lockedUntil(db, elsewhere, T0 + 5000 + LOCK_MS)).toBeNull();
  });

  it("failures spread wider than the window never lock", async () => {
    const keys = throttleKeys("slow@example.com", "203.0.113.2");
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

  it("recordSuccess clears the account count but not the client's", async () => {
    const keys = throttleKeys("b@example.com", "203.0.113.5");
    for (let i = 0; i < 4; i++) await recordFailure(db, keys, T0 + i);
    await recordSuccess(db, keys);
    const rows = await getThrottleRows(db, ["account:b@example.com", "client:203.0.113.5"]);
    expect(rows.map((r) => ({ key: r.key, failures: r.failures }))).toEqual([{ key: "client:203.0.113.5", failures: 4 }]);
    for (let i = 0; i < 4; i++) expect(await recordFailure(db, keys, T0 + 10 + i)).toBeNull();
  });

  it("counts failures that arrive at the same time without losing one (read and write in one transaction)", async () => {
    const keys = throttleKeys("burst@example.com", "203.0.113.6");
    const results = await Promise.all(Array.from({ length: 5 }, (_, i) => recordFailure(db, keys, T0 + i)));
    expect(results.filter((r) => r !== null)).toHaveLength(1);
    expect(await lockedUntil(db, keys, T0 + 10)).not.toBeNull();
  });

  it("clientAddress takes the first x-forwarded-for hop, then x-real-ip, else null", () => {
    expect(clientAddress(new Headers({ "x-forwarded-for": " 192.0.2.7 , 10.0.0.1" }))).toBe("192.0.2.7");
    expect(clientAddress(new Headers({ "x-real-ip": "192.0.2.8" }))).toBe("192.0.2.8");
    expect(clientAddress(new Headers())).toBeNull();
  });
});

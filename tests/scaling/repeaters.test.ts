import { describe, expect, it } from "vitest";
import { REPEATER_A, REPEATER_B } from "@/lib/scaling/constants";
import { lineDelay } from "@/lib/scaling/delay";
import { criticalLengthM, optimalRepeaters, repeatedDelayS } from "@/lib/scaling/repeaters";
import { expectClose } from "./close";

// Bakoglu & Meindl, "Optimal interconnection circuits for VLSI", IEEE TED ED-32(5), 1985 [memory]: stage model and optimum.
describe("optimalRepeaters({ rOhm, cF, lengthM, r0Ohm, c0F })", () => {
  const line = { rOhm: 20e3, cF: 400e-15, lengthM: 2e-3, r0Ohm: 6000, c0F: 0.25e-15 };
  it("matches a brute-force search over whole k and a fine grid of h", () => {
    const r = optimalRepeaters(line);
    let best = Infinity;
    let bestK = 0;
    for (let k = 1; k <= 200; k++) {
      for (let h = 1; h <= 2000; h += 0.5) {
        const t = repeatedDelayS({ ...line, count: k, size: h });
        if (t < best) { best = t; bestK = k; }
      }
    }
    expect(r.count).toBe(bestK);
    expect(r.delayS).toBeLessThanOrEqual(best * (1 + 1e-12));
    expectClose(r.delayS, best, 1e-4); // the h grid step limits the brute force
  });
  it("T* = 2(a + sqrt(ab))·sqrt(R0·C0·R·C) (Bakoglu–Meindl 1985) and delay per metre", () => {
    const r = optimalRepeaters(line);
    const tOpt = 2 * (REPEATER_A + Math.sqrt(REPEATER_A * REPEATER_B)) * Math.sqrt(6000 * 0.25e-15 * 20e3 * 400e-15);
    expectClose(r.delayPerMS, tOpt / 2e-3, 1e-12);
    expect(r.delayS).toBeGreaterThanOrEqual(tOpt * (1 - 1e-12)); // whole k can only be slower than the continuous optimum
  });
  it("k = h = 1 reproduces the Sakurai delay of a minimum driver and load (a = ln2, b = 0.377)", () => {
    expectClose(repeatedDelayS({ ...line, count: 1, size: 1 }), lineDelay({ rOhm: 20e3, cF: 400e-15, driverOhm: 6000, loadF: 0.25e-15 }).t50S, 1e-12);
  });
  it("short lines get one stage; the critical length is where two stages start to pay (brute force over length)", () => {
    const per = { rOhmPerM: 1e7, cFPerM: 2e-10, r0Ohm: 6000, c0F: 0.25e-15 };
    const lc = criticalLengthM(per);
    const at = (L: number) => optimalRepeaters({ rOhm: per.rOhmPerM * L, cF: per.cFPerM * L, lengthM: L, r0Ohm: 6000, c0F: 0.25e-15 });
    expect(at(lc * 0.99).count).toBe(1);
    expect(at(lc * 1.01).count).toBe(2);
    expectClose(at(lc).criticalLengthM, lc, 1e-12);
  });
  it("rejects non-positive input", () => {
    expect(() => optimalRepeaters({ ...line, r0Ohm: 0 })).toThrow("r0Ohm must be > 0 (got 0)");
  });
});

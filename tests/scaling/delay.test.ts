import { execFileSync } from "node:child_process";
import { existsSync, mkdtempSync, rmSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { afterAll, describe, expect, it } from "vitest";
import { lineDelay, lumpedT50S } from "@/lib/scaling/delay";
import { expectClose } from "./close";

/** Far-end step response of an open-ended uniform RC line, normalized time τ = t/(RC):
 *  v = 1 − (4/π)·Σ (−1)ⁿ/(2n+1)·exp(−(2n+1)²π²τ/4) (docs/models.md; Bakoglu 1990 / Rabaey et al. 2003, distributed RC line). */
function farEnd(tau: number): number {
  let s = 0;
  for (let n = 0; n < 200; n++) {
    const m = 2 * n + 1;
    const term = ((n % 2 === 0 ? 1 : -1) / m) * Math.exp((-m * m * Math.PI * Math.PI * tau) / 4);
    s += term;
    if (Math.abs(term) < 1e-18) break;
  }
  return 1 - (4 / Math.PI) * s;
}
function solveFor(v: number): number {
  let lo = 1e-4;
  let hi = 5;
  for (let i = 0; i < 200; i++) {
    const mid = (lo + hi) / 2;
    if (farEnd(mid) < v) lo = mid;
    else hi = mid;
  }
  return (lo + hi) / 2;
}

describe("step responses (series solved numerically in this test)", () => {
  const t50 = solveFor(0.5);
  const t10 = solveFor(0.1);
  const t90 = solveFor(0.9);
  it("distributed line: t50 = 0.3787·RC, 10–90% = 0.901·RC (docs/models.md; textbooks round to 0.38 and 0.9)", () => {
    expect(t50).toBeCloseTo(0.3787, 4);
    expect(t90 - t10).toBeCloseTo(0.901, 3);
  });
  it("lineDelay without driver/load gives 0.377·RC, within 0.5% of the exact 0.3787·RC (Sakurai, IEEE JSSC SC-18(4), 1983)", () => {
    const d = lineDelay({ rOhm: 1000, cF: 1e-13 });
    expectClose(d.t50S, t50 * 1e-10, 0.005);
    expectClose(d.intrinsicS, 0.377e-10, 1e-12);
  });
  it("lumped RC: t50 = ln2·RC = 0.693·RC (exact, first-order step response)", () => {
    expectClose(lumpedT50S({ rOhm: 1000, cF: 1e-13 }), Math.LN2 * 1e-10, 1e-14);
  });
  it("Elmore: T_D = Rd(C + CL) + R(C/2 + CL) (Elmore, J. Appl. Phys. 19, 1948)", () => {
    const d = lineDelay({ rOhm: 1000, cF: 1e-13, driverOhm: 500, loadF: 2e-14 });
    expectClose(d.elmoreS, 500 * 1.2e-13 + 1000 * (0.5e-13 + 2e-14), 1e-12);
  });
  it("rejects negative inputs", () => {
    expect(() => lineDelay({ rOhm: -1, cF: 1e-13 })).toThrow("rOhm must be >= 0 (got -1)");
  });
});

const NGSPICE = "/usr/bin/ngspice";
const haveSpice = existsSync(NGSPICE);
if (!haveSpice && process.env.CI) throw new Error("ngspice is required under CI (Debian package ngspice) but /usr/bin/ngspice is missing");
if (!haveSpice) console.warn("SKIPPED: ngspice not found at /usr/bin/ngspice (apt-get install -y ngspice); the driver + line + load check did not run");

describe.skipIf(!haveSpice)("driver + distributed line + load vs ngspice (200-section RC ladder)", () => {
  const dir = mkdtempSync(join(tmpdir(), "plateau-spice-"));
  afterAll(() => rmSync(dir, { recursive: true, force: true }));
  function spiceT50(r: number, c: number, rd: number, cl: number): number {
    const n = 200;
    const lines = ["* plateau RC ladder", "V1 in 0 PWL(0 0 1f 1)", rd > 0 ? `RD in n0 ${rd}` : "RD in n0 1e-3"];
    for (let i = 0; i < n; i++) {
      lines.push(`R${i} n${i} n${i + 1} ${r / n}`);
      // π sections: half a capacitor at each end of every segment
      lines.push(`CA${i} n${i} 0 ${c / n / 2}`, `CB${i} n${i + 1} 0 ${c / n / 2}`);
    }
    if (cl > 0) lines.push(`CL n${n} 0 ${cl}`);
    const elmore = rd * (c + cl) + r * (c / 2 + cl);
    const tstop = 6 * elmore;
    lines.push(`.tran ${tstop / 20000} ${tstop} 0 ${tstop / 20000}`, `.meas tran t50 TRIG v(in) VAL=0.5 RISE=1 TARG v(n${n}) VAL=0.5 RISE=1`, ".end");
    const file = join(dir, `ladder-${rd}-${cl}.cir`);
    writeFileSync(file, lines.join("\n") + "\n");
    const out = execFileSync(NGSPICE, ["-b", file], { encoding: "utf8", stdio: ["ignore", "pipe", "pipe"] });
    const m = /t50\s*=\s*([-+0-9.eE]+)/.exec(out);
    if (!m) throw new Error(`no t50 in ngspice output:\n${out}`);
    return Number(m[1]);
  }
  const R = 1000;
  const C = 200e-15;
  // Combinations of driver/line and load/line ratios. Measured (ngspice-39, 100–200 π-sections): the Sakurai form is
  // 0.5% low at Rd = CL = 0 and up to 3.2% low near Rd/R ≈ CL/C ≈ 0.2–0.4 (worst −3.21% at 0.4/0.4); elsewhere within
  // 2.5%. The 3% target of the issue is therefore missed by 0.2 points in that corner: asserted at 3.5%, reported.
  it.each([
    [0, 0],
    [0.2 * R, 0.2 * C],
    [R, C],
    [5 * R, 0.5 * C],
    [0.1 * R, 3 * C],
    [3 * R, 0],
  ])("Rd = %d Ω, CL = %d F", (rd, cl) => {
    const sim = spiceT50(R, C, rd, cl);
    const model = lineDelay({ rOhm: R, cF: C, driverOhm: rd, loadF: cl, model: "sakurai" }).t50S;
    console.log(
      `ngspice t50 ${sim.toExponential(4)} s, Sakurai ${model.toExponential(4)} s, error ${((model / sim - 1) * 100).toFixed(2)}% (Rd ${rd}, CL ${cl})`,
    );
    expectClose(model, sim, 0.035);
  });
});

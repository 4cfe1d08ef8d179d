/**
 * ngspice helpers for the delay tests: RC ladders (π sections) as the reference for a distributed line — the ladder
 * network is the line's standard discretisation (common practice, no source) — run by Debian's ngspice in batch mode.
 */
import { execFileSync } from "node:child_process";
import { existsSync, mkdtempSync, rmSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";

export const NGSPICE = "/usr/bin/ngspice";
export const haveSpice = existsSync(NGSPICE);
if (!haveSpice && process.env.CI) throw new Error("ngspice is required under CI (Debian package ngspice) but /usr/bin/ngspice is missing");

let dir: string | null = null;
let seq = 0;
export function cleanupSpice(): void {
  if (dir) rmSync(dir, { recursive: true, force: true });
  dir = null;
}

/** Appends `sections` π sections of a line (r, c totals) from node a to node b (internal nodes prefixed by `tag`). */
export function ladder(lines: string[], tag: string, a: string, b: string, r: number, c: number, sections: number): void {
  for (let i = 0; i < sections; i++) {
    const from = i === 0 ? a : `${tag}_${i}`;
    const to = i === sections - 1 ? b : `${tag}_${i + 1}`;
    lines.push(`R${tag}_${i} ${from} ${to} ${r / sections}`, `CA${tag}_${i} ${from} 0 ${c / sections / 2}`, `CB${tag}_${i} ${to} 0 ${c / sections / 2}`);
  }
}

/** Runs a netlist body (elements) with a 1 fs step at node `in` and returns the 50%-to-50% delay from `in` to `out`. */
export function spiceDelay(body: string[], out: string, tstop: number): number {
  if (!dir) dir = mkdtempSync(join(tmpdir(), "plateau-spice-"));
  const lines = ["* plateau", "V1 in 0 PWL(0 0 1f 1)", ...body];
  lines.push(`.tran ${tstop / 40000} ${tstop} 0 ${tstop / 40000}`, `.meas tran t50 TRIG v(in) VAL=0.5 RISE=1 TARG v(${out}) VAL=0.5 RISE=1`, ".end");
  const file = join(dir, `c${seq++}.cir`);
  writeFileSync(file, lines.join("\n") + "\n");
  const text = execFileSync(NGSPICE, ["-b", file], { encoding: "utf8", stdio: ["ignore", "pipe", "pipe"] });
  const m = /t50\s*=\s*([-+0-9.eE]+)/.exec(text);
  if (!m) throw new Error(`no t50 in ngspice output:\n${text}`);
  return Number(m[1]);
}

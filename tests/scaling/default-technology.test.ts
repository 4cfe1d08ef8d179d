import fs from "node:fs";
import os from "node:os";
import path from "node:path";
import { describe, expect, it } from "vitest";
import { DEFAULT_TECHNOLOGY, evaluateScenario, baselineSettings } from "@/lib/scaling";
import { parseWireClassCsv } from "@/lib/import/wire-classes";
import { cliTechnology, run } from "@/scaling/cli";

const BASE = "scaling/examples/skua-baseline.csv";

/** Every .ts/.tsx file under `dir` (no node_modules, no build output). */
function sources(dir: string): string[] {
  const out: string[] = [];
  for (const e of fs.readdirSync(dir, { withFileTypes: true })) {
    if (e.name === "node_modules" || e.name.startsWith(".next")) continue;
    const p = path.join(dir, e.name);
    if (e.isDirectory()) out.push(...sources(p));
    else if (/\.tsx?$/.test(e.name)) out.push(p);
  }
  return out;
}

describe("one default technology", () => {
  it("DEFAULT_TECHNOLOGY is the demo's invented figures (scaling/examples/README.md) and cannot be changed", () => {
    expect(DEFAULT_TECHNOLOGY).toEqual({ supplyV: 0.75, clockHz: 1.5e9, repeaterR0Ohm: 6000, repeaterC0F: 2.5e-16, delayBudgetS: 1e-10 });
    expect(Object.isFrozen(DEFAULT_TECHNOLOGY)).toBe(true);
  });

  it("the command line uses it without --technology, and lays a --technology file over it", () => {
    expect(cliTechnology()).toEqual(DEFAULT_TECHNOLOGY);
    const dir = fs.mkdtempSync(path.join(os.tmpdir(), "plateau-tech-"));
    try {
      const f = path.join(dir, "t.json");
      fs.writeFileSync(f, JSON.stringify({ clockHz: 3e9 }));
      expect(cliTechnology(f)).toEqual({ ...DEFAULT_TECHNOLOGY, clockHz: 3e9 });
    } finally {
      fs.rmSync(dir, { recursive: true, force: true });
    }
    // end to end: the CLI's totals are the engine's at DEFAULT_TECHNOLOGY, to the bit
    const out = JSON.parse(run(["evaluate", "--baseline", BASE, "--s", "1.4", "--json"]).stdout);
    const { classes } = parseWireClassCsv(fs.readFileSync(BASE));
    const ev = evaluateScenario({ classes, technology: DEFAULT_TECHNOLOGY, settings: { ...baselineSettings("full", DEFAULT_TECHNOLOGY), s: 1.4 } });
    expect(out.totals).toEqual(ev.totals);
  });

  it("no other technology literal and no technology file in the app, the engine, the database code or the command line", () => {
    const offenders: string[] = [];
    for (const dir of ["app", "components", "lib", "db", "scaling", "migrations"]) {
      for (const f of sources(dir)) {
        if (f === path.join("lib", "scaling", "technology.ts")) continue;
        const text = fs.readFileSync(f, "utf8");
        if (/(repeaterR0Ohm|repeaterC0F|clockHz|delayBudgetS)\s*:\s*[\d.]/.test(text) || text.includes("skua-technology")) offenders.push(f);
      }
    }
    expect(offenders).toEqual([]);
    expect(fs.existsSync("scaling/examples/skua-technology.json")).toBe(false);
  });
});

import { execFileSync, spawnSync } from "node:child_process";
import { mkdtempSync, readFileSync, rmSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { describe, expect, it } from "vitest";
import { run } from "@/scaling/cli";
import { lineCapacitance } from "@/lib/scaling/capacitance";

const BASE = "scaling/examples/skua-baseline.csv";

describe("run(argv)", () => {
  it("--help and no command print usage", () => {
    expect(run(["--help"]).stdout).toMatch(/capacitance/);
    expect(run(["--help"]).stdout).toMatch(/roadmap +--baseline classes\.csv --steps steps\.json/);
    expect(run(["--help"]).stdout).toMatch(/power:A \(S_L = S\^A, 0 ≤ A ≤ 2\)/);
    expect(run(["roadmap", "--help"]).stdout).toMatch(/Length rules/);
    expect(run([]).code).toBe(0);
  });
  it("plumbing: capacitance --json prints lineCapacitance's figures", () => {
    const r = run(["capacitance", "--width", "20nm", "--thickness", "40nm", "--height", "25 nm", "--spacing", "0.02um", "--k", "2.7", "--json"]);
    expect(r.code).toBe(0);
    const j = JSON.parse(r.stdout);
    const ref = lineCapacitance({
      widthM: 20e-9,
      thicknessM: 40e-9,
      spacingM: 20e-9,
      heightBelowM: 25e-9,
      heightAboveM: null,
      k: 2.7,
      miller: 1,
      model: "accurate",
    });
    expect(j.model).toBe("accurate");
    expect(j.totalFPerM).toBe(ref.totalFPerM);
    expect(j.couplingEachFPerM).toBe(ref.couplingEachFPerM);
    expect(j.couplingMillerFPerM).toBe(ref.couplingMillerFPerM);
    // one name, one meaning: the ambiguous names of engine 1 are gone
    expect(j).not.toHaveProperty("couplingFPerM");
    expect(j).not.toHaveProperty("millerCouplingFPerM");
    expect(j.groundFPerM).toBeCloseTo(ref.areaFPerM + ref.fringeFPerM, 20);
    expect(Array.isArray(j.validity)).toBe(true);
  });
  it("capacitance defaults to fringe without spacing; field model works", () => {
    expect(JSON.parse(run(["capacitance", "--width", "2e-8", "--thickness", "4e-8", "--height", "2.5e-8", "--json"]).stdout).model).toBe("fringe");
    expect(
      JSON.parse(run(["capacitance", "--width", "20nm", "--thickness", "40nm", "--height", "25nm", "--spacing", "20nm", "--model", "field", "--json"]).stdout)
        .couplingEachFPerM,
    ).toBeGreaterThan(0);
  });
  it("delay --json", () => {
    const j = JSON.parse(run(["delay", "--r-total", "1kohm", "--c-total", "100fF", "--driver", "500", "--load", "10f", "--json"]).stdout);
    // Sakurai's form (T. Sakurai, IEEE JSSC SC-18(4), 1983 [memory]) written out; the default model is the exact one,
    // which is never below it and at most 3.4% above (delay-table.test.ts).
    const sakurai = 0.377 * 1e-10 + Math.LN2 * (500 * 1e-13 + 500 * 1e-14 + 1000 * 1e-14);
    expect(j.sakuraiS).toBeCloseTo(sakurai, 22);
    expect(j.model).toBe("exact");
    expect(j.t50S).toBeGreaterThan(sakurai);
    expect(j.t50S).toBeLessThan(sakurai * 1.034);
    const s = JSON.parse(run(["delay", "--r-total", "1kohm", "--c-total", "100fF", "--driver", "500", "--load", "10f", "--model", "sakurai", "--json"]).stdout);
    expect(s.t50S).toBeCloseTo(sakurai, 22);
    expect(j.elmoreS).toBeGreaterThan(0);
  });
  it("evaluate --json has the documented shape", () => {
    const r = run(["evaluate", "--baseline", BASE, "--s", "1.4", "--json"]);
    expect(r.code).toBe(0);
    const j = JSON.parse(r.stdout);
    expect(j.classes).toHaveLength(4);
    for (const c of j.classes) {
      for (const side of [c.baseline, c.scenario])
        for (const k of ["lengthM", "rOhmPerM", "cFPerM", "rOhm", "cF", "rcS", "delayS", "repeaters", "energyJ"]) expect(Number.isFinite(side[k])).toBe(true);
      expect(c.ratio.rOhm).toBeGreaterThan(1.96);
    }
  });
  it("evaluate --model ideal follows the S² law for R", () => {
    const j = JSON.parse(run(["evaluate", "--baseline", BASE, "--s", "2", "--model", "ideal", "--json"]).stdout);
    for (const c of j.classes) expect(c.ratio.rOhm).toBeCloseTo(4, 10);
  });
  it("sweep --json gives curves per class and level", () => {
    const j = JSON.parse(run(["sweep", "--baseline", BASE, "--s-from", "1", "--s-to", "3", "--points", "5", "--json"]).stdout);
    expect(j.curves).toHaveLength(16);
    expect(j.curves[0].points).toHaveLength(5);
  });
  it("materials lists metals with sources", () => {
    expect(run(["materials"]).stdout).toMatch(/CRC Handbook/);
    expect(Object.keys(JSON.parse(run(["materials", "--json"]).stdout).metals)).toEqual(["Cu", "Al", "W", "Co", "Ru"]);
  });
  it.each([
    [["capacitance", "--width", "abc", "--thickness", "40nm", "--height", "25nm"], /--width: expected a length in metres/],
    [["capacitance", "--thickness", "40nm", "--height", "25nm"], /--width is required/],
    [["capacitance", "--width=-20nm", "--thickness", "40nm", "--height", "25nm"], /--width: expected a length in metres > 0/],
    [["capacitance", "--width", "20nm", "--thickness", "40nm", "--height", "25nm", "--k", "0.5"], /--k: expected a relative permittivity >= 1/],
    [
      ["capacitance", "--width", "20nm", "--thickness", "40nm", "--height", "25nm", "--model", "magic"],
      /--model: expected ideal, fringe, coupled, accurate or field/,
    ],
    [["capacitance", "--width", "20fF", "--thickness", "40nm", "--height", "25nm"], /--width: expected a length in metres/],
    [["delay", "--r-total", "1kF", "--c-total", "1fF"], /--r-total: expected a resistance in ohms/],
    [["delay", "--r-total", "1k"], /--c-total is required: a capacitance in farads/],
    [["evaluate", "--s", "1.4"], /--baseline is required/],
    [["evaluate", "--baseline", "nope.csv", "--s", "1.4"], /--baseline: cannot read file/],
    [["evaluate", "--baseline", BASE], /--s is required/],
    [["evaluate", "--baseline", BASE, "--s", "0"], /--s: expected a cross-section factor S > 0/],
    [["evaluate", "--baseline", BASE, "--s", "1.4", "--barrier", "maybe"], /--barrier: expected fixed or scales/],
    [["evaluate", "--baseline", BASE, "--s", "1.4", "--metal", "Au"], /--metal: expected one of/],
    [["evaluate", "--baseline", BASE, "--s", "1.4", "--bogus", "1"], /bogus/],
    [["sweep", "--baseline", BASE, "--s-from", "1", "--s-to", "3", "--points", "1.5"], /--points: expected a whole number/],
    [["sweep", "--baseline", BASE, "--s-from", "1", "--s-to", "3", "--points", "5", "--metric", "speed"], /--metric: expected delay, rc, r or c/],
    [["frobnicate"], /unknown command "frobnicate"/],
  ])("error: %j", (argv, message) => {
    const r = run(argv as string[]);
    expect(r.code).toBe(2);
    expect(r.stdout).toBe("");
    expect(r.stderr).toMatch(message);
    expect(r.stderr.trim().split("\n")).toHaveLength(1);
  });
});

describe("a bad CSV: one line naming file, line, column, value and reason (the app's reader and messages)", () => {
  it.each([
    [
      "a negative width",
      (t: string) => t.replace("\nglobal,global,400,", "\nglobal,global,-4,"),
      /^error: --baseline: \S+ line 5, column width_nm, value "-4": must be > 0\n$/,
    ],
    [
      "an extra column",
      (t: string) => t.replace("activity\n", "activity,colour\n"),
      /^error: --baseline: \S+ line 1: Unknown column "colour"\. Expected columns for wire classes: class, tier, /,
    ],
    [
      "two errors",
      (t: string) => t.replace(",Cu,", ",Mithril,").replace(",2.7,", ",0.5,"),
      /line 2, column metal, value "Mithril": must be one of Cu, Al, W, Co, Ru \(got "Mithril"\); see the metals catalogue .* \(and 1 more error\)\n$/,
    ],
  ])("%s", (_name, edit, message) => {
    const dir = mkdtempSync(join(tmpdir(), "plateau-cli-"));
    try {
      const f = join(dir, "classes.csv");
      writeFileSync(f, edit(readFileSync(BASE, "utf8")));
      const r = run(["evaluate", "--baseline", f, "--s", "1.4"]);
      expect(r.code).toBe(2);
      expect(r.stdout).toBe("");
      expect(r.stderr).toMatch(message);
    } finally {
      rmSync(dir, { recursive: true, force: true });
    }
  });
});

describe("real process (npx tsx scaling/cli.ts)", () => {
  it("evaluate --json prints only JSON on stdout", () => {
    const out = execFileSync("npx", ["tsx", "scaling/cli.ts", "evaluate", "--baseline", BASE, "--s", "1.4", "--json"], { encoding: "utf8" });
    expect(JSON.parse(out).classes[0].class).toBe("local");
  });
  it("a bad argument exits non-zero with one line on stderr", () => {
    const r = spawnSync("npx", ["tsx", "scaling/cli.ts", "delay", "--r-total", "x", "--c-total", "1fF"], { encoding: "utf8" });
    expect(r.status).toBe(2);
    expect(r.stderr.trim()).toMatch(/^error: --r-total: expected a resistance in ohms/);
  });
});

describe("engine 2 on the command line", () => {
  const withFiles = (files: Record<string, string>, fn: (dir: string) => void) => {
    const dir = mkdtempSync(join(tmpdir(), "plateau-cli2-"));
    try {
      for (const [name, text] of Object.entries(files)) writeFileSync(join(dir, name), text);
      fn(dir);
    } finally {
      rmSync(dir, { recursive: true, force: true });
    }
  };
  it("evaluate --json: the stable per-class repeater, via and temperature fields", () => {
    const j = JSON.parse(run(["evaluate", "--baseline", BASE, "--s", "1.43", "--json"]).stdout);
    expect(j.engineVersion).toBe("2.2.0");
    for (const c of j.classes) {
      for (const side of [c.baseline, c.scenario]) {
        for (const k of ["repeaterCount", "repeaterSize", "repeatedDelayS", "stageCount", "repeaterAreaM2", "repeaterEnergyJ", "viaOhm", "temperatureC"])
          expect(Number.isFinite(side[k])).toBe(true);
        expect(side.stageCount).toBe(side.repeaterCount + 1);
        if (side.repeaterCount === 0) expect(side.repeatedDelayS).toBe(side.delayS);
        else expect(side.repeatedDelayS).toBeLessThanOrEqual(0.9 * side.delayS);
        expect(side.temperatureC).toBe(25);
        expect(side.capacitance.couplingMillerFPerM).toBeCloseTo(2 * side.capacitance.couplingEachFPerM, 22);
        expect(side.capacitance).not.toHaveProperty("couplingFPerM");
      }
    }
    expect(j.classes.find((c: { class: string }) => c.class === "global").scenario.repeaterCount).toBeGreaterThan(0);
  });
  it("technology JSON: temperatureC, minRepeaterGain, repeater fields and materials reach the results; bad values exit 2 naming the field", () => {
    withFiles(
      {
        "t.json": JSON.stringify({
          temperatureC: 85,
          minRepeaterGain: 0.5,
          repeaterOutputCRatio: 0.7,
          repeaterAreaM2: 2e-13,
          repeaterLeakageW: 1e-9,
          materials: { Cu: { specularity: 0.3 } },
        }),
        "bad.json": JSON.stringify({ temperatureC: 500 }),
      },
      (dir) => {
        const j = JSON.parse(run(["evaluate", "--baseline", BASE, "--s", "1.43", "--technology", join(dir, "t.json"), "--json"]).stdout);
        for (const c of j.classes) expect(c.scenario.temperatureC).toBe(85);
        const bad = run(["evaluate", "--baseline", BASE, "--s", "1.43", "--technology", join(dir, "bad.json")]);
        expect(bad.code).toBe(2);
        expect(bad.stderr).toMatch(/^error: temperatureC must be between -273.15 and 400 \(got 500\)\n$/);
      },
    );
  });
  it("delay with a non-finite result exits 2 with one line", () => {
    const r = run(["delay", "--r-total", "1e200", "--c-total", "1e200"]);
    expect(r.code).toBe(2);
    expect(r.stdout).toBe("");
    expect(r.stderr.trim().split("\n")).toHaveLength(1);
  });
  it("capacitance --k-gap/--gap-fraction: the accurate model (default with --spacing) follows our field solve of the same air gap within 1%", () => {
    const geo = ["--width", "40nm", "--thickness", "80nm", "--height", "80nm", "--height-above", "80nm", "--spacing", "40nm", "--k", "2.7"];
    const json = (extra: string[]) => JSON.parse(run(["capacitance", ...geo, ...extra, "--json"]).stdout);
    const acc = json(["--k-gap", "1", "--gap-fraction", "0.5"]);
    const field = json(["--k-gap", "1", "--gap-fraction", "0.5", "--model", "field"]);
    const homogeneous = json([]);
    expect(acc.model).toBe("accurate");
    expect(homogeneous.model).toBe("accurate");
    for (const key of ["groundFPerM", "couplingEachFPerM", "totalFPerM"]) expect(Math.abs(acc[key] / field[key] - 1)).toBeLessThan(0.01);
    // the gap takes more off the coupling than off the ground (the ILD below and above keeps k)
    expect(acc.couplingEachFPerM / homogeneous.couplingEachFPerM).toBeLessThan(acc.groundFPerM / homogeneous.groundFPerM);
    expect(acc.totalFPerM).toBeCloseTo(acc.groundFPerM + 2 * acc.couplingEachFPerM, 22);
  });
  it.each([
    [["--k-gap", "0.5"], /^error: --k-gap: expected a relative permittivity from 1 to --k \(2\.7\), got 0\.5\n$/],
    [["--k-gap", "3"], /^error: --k-gap: expected a relative permittivity from 1 to --k \(2\.7\), got 3\n$/],
    [["--k-gap", "1", "--gap-fraction", "1.2"], /^error: --gap-fraction: expected a share of the line thickness from 0 to 1, got 1\.2\n$/],
    [["--gap-fraction", "0.5"], /^error: --gap-fraction needs --k-gap/],
    [
      ["--model", "field", "--height-above", "50nm", "--cap-thickness", "60nm"],
      /^error: --cap-thickness: the cap layer \(6e-8 m\) is thicker than the ILD above/,
    ],
    [["--model", "field", "--cap-thickness", "10nm"], /^error: --cap-thickness needs --height-above/],
    [["--height-above", "50nm", "--cap-thickness", "10nm"], /^error: --cap-thickness and --cap-k need --model field/],
    [
      ["--model", "field", "--height-above", "50nm", "--cap-thickness", "10nm", "--cap-k", "0.8"],
      /^error: --cap-k: expected a relative permittivity >= 1, got 0\.8/,
    ],
  ])("capacitance %j exits 2 naming the argument", (extra, message) => {
    const r = run(["capacitance", "--width", "40nm", "--thickness", "80nm", "--height", "80nm", "--spacing", "40nm", "--k", "2.7", ...extra]);
    expect(r.code).toBe(2);
    expect(r.stderr).toMatch(message);
  });
  it("capacitance --model field --cap-thickness/--cap-k: a cap of higher k on the lines raises the coupling and the total; a cap of k itself changes nothing", () => {
    const geo = ["--width", "40nm", "--thickness", "80nm", "--height", "80nm", "--height-above", "80nm", "--spacing", "40nm", "--k", "2.7", "--model", "field"];
    const json = (extra: string[]) => JSON.parse(run(["capacitance", ...geo, ...extra, "--json"]).stdout);
    const plain = json([]);
    const capped = json(["--cap-thickness", "10nm", "--cap-k", "4.5"]);
    const same = json(["--cap-thickness", "10nm", "--cap-k", "2.7"]);
    expect(capped.couplingEachFPerM).toBeGreaterThan(plain.couplingEachFPerM);
    expect(capped.totalFPerM).toBeGreaterThan(plain.totalFPerM);
    // capK = k: the homogeneous solve exactly (the layer is not even added to the grid; field-solve.ts)
    expect(same.totalFPerM).toBe(plain.totalFPerM);
  });
  it("capacitance --json: couplingEachFPerM (one neighbour) and couplingMillerFPerM (Miller × both)", () => {
    const j = JSON.parse(
      run(["capacitance", "--width", "20nm", "--thickness", "40nm", "--height", "25nm", "--spacing", "20nm", "--miller", "1.5", "--json"]).stdout,
    );
    expect(j.couplingMillerFPerM).toBeCloseTo(2 * 1.5 * j.couplingEachFPerM, 22);
  });
  it("sweep --length-rule follows-s|fixed|scenario, and every point has flags", () => {
    const pts = (rule: string) =>
      JSON.parse(
        run([
          "sweep",
          "--baseline",
          BASE,
          "--s-from",
          "1",
          "--s-to",
          "2",
          "--points",
          "3",
          "--metric",
          "r",
          "--levels",
          "ideal",
          "--class",
          "global",
          "--length-rule",
          rule,
          "--json",
        ]).stdout,
      ).curves[0].points;
    const follow = pts("follows-s");
    const fixed = pts("fixed");
    // ideal level, bulk: R ∝ S²/S_L (docs/models.md scaling laws): S_L = S gives ×S, S_L = 1 gives ×S²
    expect(follow[2].y / follow[0].y).toBeCloseTo(2, 9);
    expect(fixed[2].y / fixed[0].y).toBeCloseTo(4, 9);
    for (const p of [...follow, ...fixed]) expect(Array.isArray(p.flags)).toBe(true);
    expect(run(["sweep", "--baseline", BASE, "--s-from", "1", "--s-to", "2", "--points", "3", "--length-rule", "sideways"]).code).toBe(2);
  });
  it("vias from the optional CSV columns reach the results", () => {
    const text = readFileSync(BASE, "utf8")
      .replace("activity\n", "activity,vias_per_net,via_ohm\n")
      .replace(/\n(global,[^\n]*)/, "\n$1,4,10")
      .replace(/\n((?:local|intermediate|semi-global),[^\n]*)/g, "\n$1,,");
    withFiles({ "v.csv": text }, (dir) => {
      const r = run(["evaluate", "--baseline", join(dir, "v.csv"), "--s", "1.43", "--json"]);
      expect(r.stderr).toBe("");
      const j = JSON.parse(r.stdout);
      const g = j.classes.find((c: { class: string }) => c.class === "global");
      expect(g.baseline.viaOhm).toBeCloseTo(40, 9);
      expect(g.scenario.viaOhm).toBeCloseTo(40 * 1.43, 9);
      expect(j.classes.find((c: { class: string }) => c.class === "local").scenario.viaOhm).toBe(0);
    });
    withFiles(
      {
        "v.csv": readFileSync(BASE, "utf8")
          .replace("activity\n", "activity,vias_per_net\n")
          .replace(/\n([^\n]+)/g, "\n$1,1")
          .replace(/\n(global,[^\n]*),1/, "\n$1,-1"),
      },
      (dir) => {
        const r = run(["evaluate", "--baseline", join(dir, "v.csv"), "--s", "1.43"]);
        expect(r.code).toBe(2);
        expect(r.stderr).toMatch(/line 5, column vias_per_net, value "-1": must be ≥ 0/);
      },
    );
  });
  it("fit: measured CSV → { metals, points } usable as the technology's materials", () => {
    // measured = the engine's baseline resistance per length with p = 0.2, R = 0.3 set through materials (a round trip)
    withFiles({ "t.json": JSON.stringify({ materials: { Cu: { specularity: 0.2, grainReflection: 0.3 } } }) }, (dir) => {
      const ev = JSON.parse(run(["evaluate", "--baseline", BASE, "--s", "1", "--technology", join(dir, "t.json"), "--json"]).stdout);
      const rows = ev.classes.map((c: { class: string; baseline: { rOhmPerM: number } }) => `${c.class},${(c.baseline.rOhmPerM * 1e-6).toPrecision(12)},25`);
      writeFileSync(join(dir, "m.csv"), ["class,r_ohm_per_um,temperature_c", ...rows].join("\n") + "\n");
      const r = run(["fit", "--baseline", BASE, "--measured", join(dir, "m.csv"), "--json"]);
      expect(r.code).toBe(0);
      const j = JSON.parse(r.stdout);
      expect(j.metals.Cu.specularity).toBeCloseTo(0.2, 3);
      expect(j.metals.Cu.grainReflection).toBeCloseTo(0.3, 3);
      expect(j.points).toHaveLength(4);
      for (const p of j.points) expect(Object.keys(p)).toEqual(["class", "measuredOhmPerM", "fittedOhmPerM", "residual"]);
      writeFileSync(join(dir, "bad.csv"), "class,r_ohm_per_um\nlocal,0\n");
      const bad = run(["fit", "--baseline", BASE, "--measured", join(dir, "bad.csv")]);
      expect(bad.code).toBe(2);
      expect(bad.stderr).toMatch(/line 2, column r_ohm_per_um, value "0": must be > 0/);
    });
  });
});

describe("length rules and roadmaps on the command line (issue 14)", () => {
  const withFiles = (files: Record<string, string>, fn: (dir: string) => void) => {
    const dir = mkdtempSync(join(tmpdir(), "plateau-cli3-"));
    try {
      for (const [name, text] of Object.entries(files)) writeFileSync(join(dir, name), text);
      fn(dir);
    } finally {
      rmSync(dir, { recursive: true, force: true });
    }
  };
  const evaluate = (...args: string[]) => JSON.parse(run(["evaluate", "--baseline", BASE, "--json", ...args]).stdout);

  it("evaluate --length-rule power:0.5 at S = 1.5 equals --sl √1.5 = 1.2247… (S_L = S^a, the rule's definition)", () => {
    const rule = evaluate("--s", "1.5", "--length-rule", "power:0.5");
    const plain = evaluate("--s", "1.5", "--sl", String(Math.sqrt(1.5)));
    expect(rule.settings.lengthRule).toEqual({ kind: "power", exponent: 0.5 });
    expect(rule.classes).toEqual(plain.classes);
    expect(evaluate("--s", "1.5", "--length-rule", "factor:1.2").classes).toEqual(evaluate("--s", "1.5", "--sl", "1.2").classes);
    expect(evaluate("--s", "1.5", "--length-rule", "follows-s").classes).toEqual(evaluate("--s", "1.5", "--sl", "1.5").classes);
    expect(evaluate("--s", "1.5", "--length-rule", "fixed").classes).toEqual(evaluate("--s", "1.5").classes);
    expect(run(["evaluate", "--baseline", BASE, "--s", "1.5", "--length-rule", "power:0.5"]).stdout).toMatch(/S_L = S\^0\.5/);
  });
  it("bad --length-rule values exit 2 with one line", () => {
    for (const [rule, msg] of [
      ["power:2.5", /power:A needs an exponent A from 0 to 2, got 2.5/],
      ["power:-1", /from 0 to 2/],
      ["factor:0", /factor:X needs X > 0/],
      ["square", /expected follows-s, fixed, factor:X/],
      ["power:x", /expected follows-s, fixed, factor:X/],
    ] as const) {
      const r = run(["evaluate", "--baseline", BASE, "--s", "1.5", "--length-rule", rule]);
      expect(r.code).toBe(2);
      expect(r.stderr).toMatch(msg);
      expect(r.stderr.trim().split("\n")).toHaveLength(1);
    }
    expect(run(["evaluate", "--baseline", BASE, "--s", "1.5", "--sl", "2", "--length-rule", "fixed"]).code).toBe(2);
    expect(run(["sweep", "--baseline", BASE, "--variable", "k", "--from", "1", "--to", "3", "--points", "3", "--length-rule", "power:1"]).code).toBe(2);
  });
  it("sweep --length-rule power:A: R at level ideal ∝ S²/S_L = S^(2 − A) (bulk, barrier scaled: textbook scaling laws, docs/models.md)", () => {
    const pts = JSON.parse(
      run([
        "sweep",
        "--baseline",
        BASE,
        "--s-from",
        "1",
        "--s-to",
        "2",
        "--points",
        "3",
        "--metric",
        "r",
        "--levels",
        "ideal",
        "--class",
        "global",
        "--length-rule",
        "power:0.5",
        "--json",
      ]).stdout,
    ).curves[0].points as { x: number; y: number }[];
    for (const p of pts) expect(p.y / pts[0]!.y).toBeCloseTo(Math.pow(p.x, 1.5), 9);
  });

  it("roadmap --json: the API's { steps: [{ name, evaluation }] }; S over two steps multiplies (1.25 × 1.2 = 1.5 = evaluate --s 1.5)", () => {
    withFiles(
      {
        "steps.json": JSON.stringify([
          { name: "N1", settings: { s: 1.25 } },
          { name: "N2", settings: { s: 1.2 } },
        ]),
      },
      (dir) => {
        const r = run(["roadmap", "--baseline", BASE, "--steps", join(dir, "steps.json"), "--json"]);
        expect(r.code).toBe(0);
        const j = JSON.parse(r.stdout);
        expect(Object.keys(j)).toEqual(["steps"]);
        expect(j.steps.map((s: { name: string }) => s.name)).toEqual(["N1", "N2"]);
        for (const s of j.steps) expect(Object.keys(s)).toEqual(["name", "evaluation"]);
        const plain = evaluate("--s", "1.5");
        j.steps[1].evaluation.classes.forEach((c: { name: string; ratio: Record<string, number> }, i: number) => {
          expect(c.name).toBe(plain.classes[i].class);
          expect(c.ratio.delayS).toBeCloseTo(plain.classes[i].ratio.delayS, 9);
          expect(c.ratio.rOhm).toBeCloseTo(plain.classes[i].ratio.rOhm, 9);
        });
        // the table: one block per class, N0 and each step, ratios to N0
        const t = run(["roadmap", "--baseline", BASE, "--steps", join(dir, "steps.json")]);
        expect(t.code).toBe(0);
        for (const name of ["local", "intermediate", "semi-global", "global"]) expect(t.stdout).toContain(`\n${name} (`);
        expect(t.stdout).toMatch(/\nN0 +1 +1 .* 1\.000 +1\.000 +1\.000 +1\.000\n/);
        expect(t.stdout).toMatch(/\nN2 +1\.5 +1 /);
      },
    );
  });
  it("roadmap: a bad steps file exits 2 with one line naming the step and field", () => {
    const cases: [unknown, RegExp][] = [
      [
        [
          { name: "N1", settings: { s: 1.2 } },
          { name: "N2", settings: { lengthRule: { kind: "power", exponent: 3 } } },
        ],
        /step 2 "N2" settings\.lengthRule\.exponent: Length-rule exponent must be between 0 and 2/,
      ],
      [
        [{ name: "N1", settings: { overrides: { M9: { s: 1.1 } } } }],
        /step 1 "N1": class "M9" is not in the baseline \(at steps\.0\.settings\.overrides\.M9\)/,
      ],
      [
        [{ name: "N1", settings: { overrides: { local: { targetPitchM: 4e-9 } } } }],
        /step 1 "N1": target pitch 4 nm of class local is not more than twice its barrier 2 nm/,
      ],
      [[{ name: "N1", settings: { overrides: { local: { s: 1.1, targetPitchM: 40e-9 } } } }], /step 1 "N1" settings\.overrides\.local\.targetPitchM: /],
      [Array.from({ length: 9 }, (_, i) => ({ name: `N${i + 1}`, settings: {} })), /at most 8 steps/],
      [[], /at least one step/],
      [{ steps: [{ name: "N1", settings: { s: 0 } }] }, /step 1 "N1" settings\.s: S must be greater than 0/],
    ];
    for (const [steps, msg] of cases)
      withFiles({ "s.json": JSON.stringify(steps) }, (dir) => {
        const r = run(["roadmap", "--baseline", BASE, "--steps", join(dir, "s.json"), "--json"]);
        expect(r.code).toBe(2);
        expect(r.stdout).toBe("");
        expect(r.stderr).toMatch(msg);
        expect(r.stderr.trim().split("\n")).toHaveLength(1);
      });
    withFiles({ "s.json": "[{" }, (dir) => expect(run(["roadmap", "--baseline", BASE, "--steps", join(dir, "s.json")]).stderr).toMatch(/not valid JSON/));
    expect(run(["roadmap", "--baseline", BASE]).stderr).toMatch(/--steps is required/);
  });
  it("the demo roadmaps (scaling/examples, invented): three steps each; the air-gap branch lowers intermediate C from N2 on, the copper branch does not", () => {
    const chain = (file: string) => JSON.parse(run(["roadmap", "--baseline", BASE, "--steps", `scaling/examples/${file}`, "--json"]).stdout).steps;
    const cu = chain("skua-roadmap-copper.json");
    const ru = chain("skua-roadmap-ru-airgap.json");
    expect(cu.map((s: { name: string }) => s.name)).toEqual(["N1", "N2", "N3"]);
    expect(ru.map((s: { name: string }) => s.name)).toEqual(["N1", "N2", "N3"]);
    const cls = (
      steps: { evaluation: { classes: { name: string; ratio: { cF: number }; scenario: { pitchM: number; metal: string } }[] } }[],
      i: number,
      name: string,
    ) => steps[i]!.evaluation.classes.find((c) => c.name === name)!;
    // N1 identical for intermediate (no gap yet); from N2 the gap (air between the lines) lowers C
    expect(cls(ru, 0, "intermediate").ratio.cF).toBeCloseTo(cls(cu, 0, "intermediate").ratio.cF, 12);
    expect(cls(ru, 1, "intermediate").ratio.cF).toBeLessThan(0.9 * cls(cu, 1, "intermediate").ratio.cF);
    // local: Ru from N1; at N3 the local pitch is the 24 nm target (baseline 24 + 24 nm)
    expect(cls(ru, 0, "local").scenario.metal).toBe("Ru");
    expect(cls(ru, 2, "local").scenario.pitchM).toBeCloseTo(24e-9, 18);
    // global keeps its length (fixed rule): C does not move with S at a fixed k and a shape that scales as a whole
    expect(cls(cu, 2, "global").ratio.cF).toBeCloseTo(1, 9);
  });
});

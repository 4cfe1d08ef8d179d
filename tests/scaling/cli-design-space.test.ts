import { readFileSync } from "node:fs";
import { describe, expect, it } from "vitest";
import { run } from "@/scaling/cli";
import { baselineSettings } from "@/lib/scaling/evaluate";
import { DEFAULT_TECHNOLOGY } from "@/lib/scaling/technology";
import { optimizeClass, variation } from "@/lib/scaling/design-space";
import { parseWireClassCsv } from "@/lib/import/wire-classes";

const BASE = "scaling/examples/skua-baseline.csv";
const classes = () => parseWireClassCsv(readFileSync(BASE)).classes;
const settings = (s: number) => ({ ...baselineSettings("full", DEFAULT_TECHNOLOGY), s });

describe("optimize", () => {
  it("--json prints the contract's fields, the engine's figures (plumbing: optimizeClass on the same inputs)", () => {
    const r = run(["optimize", "--baseline", BASE, "--class", "intermediate", "--s", "1.2", "--objective", "edp", "--max-aspect", "2.5", "--json"]);
    expect(r.code).toBe(0);
    const j = JSON.parse(r.stdout);
    for (const k of ["widthM", "thicknessM", "spacingM", "objectiveValue", "lineFraction", "aspectRatio"]) expect(typeof j[k]).toBe("number");
    const ref = optimizeClass({
      wireClass: classes(),
      className: "intermediate",
      technology: DEFAULT_TECHNOLOGY,
      settings: settings(1.2),
      objective: "edp",
      maxAspect: 2.5,
    });
    expect(j.widthM).toBe(ref.widthM);
    expect(j.thicknessM).toBe(ref.thicknessM);
    expect(j.spacingM).toBe(ref.spacingM);
    expect(j.objectiveValue).toBe(ref.objectiveValue);
    expect(j.lineFraction).toBe(ref.lineFraction);
    expect(j.aspectRatio).toBe(ref.aspectRatio);
    expect(j.aspectRatio).toBeLessThanOrEqual(2.5);
  });
  it("without --json a readable summary; default objective delay, S = 1", () => {
    const r = run(["optimize", "--baseline", BASE, "--class", "local"]);
    expect(r.code).toBe(0);
    expect(r.stdout).toMatch(/Class local, objective delay, pitch 48 nm \(S = 1/);
    expect(r.stdout).toMatch(/line fraction W\/pitch +0\.\d{4}/);
  });
});

describe("variation", () => {
  const argv = [
    "variation",
    "--baseline",
    BASE,
    "--s",
    "1.2",
    "--sigma-width",
    "1nm",
    "--sigma-thickness",
    "2nm",
    "--sigma-k",
    "2%",
    "--samples",
    "400",
    "--seed",
    "1",
    "--json",
  ];
  it("--json prints per class { class, rOhmPerM, cFPerM, delayS } with mean/std/p5/p50/p95 (plumbing: variation on the same inputs)", () => {
    const r = run(argv);
    expect(r.code).toBe(0);
    const j = JSON.parse(r.stdout);
    expect(j.map((c: { class: string }) => c.class)).toEqual(["local", "intermediate", "semi-global", "global"]);
    for (const c of j) for (const q of ["rOhmPerM", "cFPerM", "delayS"]) expect(Object.keys(c[q]).sort()).toEqual(["mean", "p5", "p50", "p95", "std"]);
    const ref = variation({
      classes: classes(),
      technology: DEFAULT_TECHNOLOGY,
      settings: settings(1.2),
      sigma: { width: { absolute: 1e-9 }, thickness: { absolute: 2e-9 }, k: { relative: 0.02 } },
      samples: 400,
      seed: 1,
    });
    expect(j).toEqual(JSON.parse(JSON.stringify(ref)));
  });
  it("same seed → the same output; another seed → different", () => {
    expect(run(argv).stdout).toBe(run(argv).stdout);
    expect(run(argv.map((a, i) => (i === argv.indexOf("--seed") + 1 ? "2" : a))).stdout).not.toBe(run(argv).stdout);
  });
  it("without --json a table of bands", () => {
    const r = run(argv.slice(0, -1));
    expect(r.code).toBe(0);
    expect(r.stdout).toMatch(/^Monte Carlo, 400 samples per class, seed 1/);
    expect(r.stdout).toMatch(/\nintermediate +\S+ MΩ\/m \[/);
  });
});

describe("bad arguments: exit 2, one line naming the argument", () => {
  it.each([
    [["optimize", "--baseline", BASE], /--class is required/],
    [["optimize", "--baseline", BASE, "--class", "nope"], /--class: no class named "nope"/],
    [["optimize", "--baseline", BASE, "--class", "local", "--objective", "speed"], /--objective: expected delay, repeated, energy or edp/],
    [["optimize", "--baseline", BASE, "--class", "local", "--min-fraction", "1.2"], /--min-fraction: expected a share between 0 and 1/],
    [["optimize", "--baseline", BASE, "--class", "local", "--min-fraction", "0.6", "--max-fraction", "0.5"], /--min-fraction: .*no feasible line fraction/],
    [["optimize", "--baseline", BASE, "--class", "local", "--min-width", "40nm"], /--min-fraction: .*no feasible/],
    [["optimize", "--baseline", BASE, "--class", "local", "--max-aspect", "0"], /--max-aspect: expected an aspect ratio/],
    [["variation", "--baseline", BASE, "--seed", "1"], /--samples is required/],
    [["variation", "--baseline", BASE, "--samples", "100001", "--seed", "1"], /--samples: expected a whole number from 2 to 100000/],
    [["variation", "--baseline", BASE, "--samples", "10", "--seed", "1.5"], /--seed: expected a whole number/],
    [["variation", "--baseline", BASE, "--samples", "10", "--seed", "1", "--sigma-width", "-1nm"], /--sigma-width: expected .* >= 0/],
    [
      ["variation", "--baseline", BASE, "--samples", "10", "--seed", "1", "--sigma-width", "30nm"],
      /--sigma-width: sigma\.width must not be larger than the nominal value/,
    ],
    [["variation", "--baseline", BASE, "--samples", "10", "--seed", "1", "--sigma-k", "lots"], /--sigma-k: expected a σ of k/],
  ])("error: %j", (args, message) => {
    const r = run(args as string[]);
    expect(r.code).toBe(2);
    expect(r.stdout).toBe("");
    expect(r.stderr).toMatch(message);
    expect(r.stderr.trim().split("\n")).toHaveLength(1);
  });
});

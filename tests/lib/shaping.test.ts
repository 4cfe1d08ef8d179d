import fs from "node:fs";
import { describe, expect, it } from "vitest";
import { DEFAULT_TECHNOLOGY, DESIGN_OBJECTIVES, evaluateClass, objectiveOf, optimizeClass, type ScenarioSettings } from "@/lib/scaling";
import { parseWireClassCsv } from "@/lib/import/wire-classes";
import { shapeClass } from "@/lib/workspace/shaping";
import { applyShaping, checkShapingLimits, DEFAULT_SHAPING_LIMITS, explainShapingError, percentChange, SHAPING_OBJECTIVES } from "@/lib/workspace/shaping-view";

const classes = parseWireClassCsv(fs.readFileSync("scaling/examples/skua-baseline.csv", "utf8")).classes;
const scenarios = JSON.parse(fs.readFileSync("scaling/examples/skua-scenarios.json", "utf8")) as { id: string; settings: ScenarioSettings }[];
const airgap = scenarios.find((s) => s.id === "shrink-0p7-airgap")!.settings;
const tech = DEFAULT_TECHNOLOGY;

describe("shapeClass (the shaping screen's one computation)", () => {
  it("the optimum saved as the class's override evaluates to the optimiser's own value (same drawing through the ordinary path)", () => {
    // method: optimizeClass on the flattened class vs evaluateClass with overrides { lineFraction, aspectRatio } — common practice, no source
    for (const objective of DESIGN_OBJECTIVES) {
      const r = shapeClass({ classes, technology: tech, settings: airgap, className: "intermediate", objective, limits: DEFAULT_SHAPING_LIMITS, gridSize: 0 });
      const opt = optimizeClass({ wireClass: classes, className: "intermediate", technology: tech, settings: airgap, objective });
      expect(r.optimum.lineFraction).toBeCloseTo(opt.lineFraction, 9);
      expect(r.optimum.aspectRatio).toBeCloseTo(opt.aspectRatio, 9);
      expect(Math.abs(r.optimum.objectiveValue / opt.objectiveValue - 1)).toBeLessThan(1e-9);
      const saved = evaluateClass({ wireClass: classes.find((c) => c.name === "intermediate")!, technology: tech, settings: r.appliedSettings });
      expect(Math.abs(objectiveOf(saved, objective) / opt.objectiveValue - 1)).toBeLessThan(1e-9);
      // the optimum is no worse than the current drawing when the current one lies inside the limits
      if (r.current.lineFraction >= 0.3 && r.current.lineFraction <= 0.7 && r.current.aspectRatio >= 1 && r.current.aspectRatio <= 3)
        expect(r.optimum.objectiveValue).toBeLessThanOrEqual(r.current.objectiveValue * (1 + 1e-12));
      expect(r.grid).toBeNull();
    }
  });

  it("keeps the class's other override entries and the pitch; the heat map is 40 × 40 with the optimum near its best point", () => {
    // method: the optimiser must be within 0.5% of (and not above) the grid's best (issue 15) — common practice, no source
    const r = shapeClass({ classes, technology: tech, settings: airgap, className: "intermediate", objective: "delay", limits: DEFAULT_SHAPING_LIMITS });
    expect(r.appliedSettings.overrides.intermediate).toEqual({
      airGap: { kGap: 1, gapFraction: 1 },
      lineFraction: r.optimum.lineFraction,
      aspectRatio: r.optimum.aspectRatio,
    });
    expect(r.optimum.pitchM).toBeCloseTo(r.current.pitchM, 20);
    expect(r.grid!.values).toHaveLength(40);
    expect(r.grid!.values[0]).toHaveLength(40);
    expect(r.optimum.objectiveValue).toBeLessThanOrEqual(r.grid!.best.objectiveValue * (1 + 1e-12));
    expect(r.optimum.objectiveValue).toBeGreaterThan(r.grid!.best.objectiveValue * 0.995);
    // the parts sum to the repeated delay (Elmore split scaled to the engine's delay; design-space.ts delayParts)
    const p = r.parts;
    expect(p.driverWireS + p.driverLoadS + p.wireWireS + p.wireLoadS + p.repeatersS).toBeCloseTo(p.totalS, 20);
    // tornado signs (physics, common practice): a wider line has lower R per length and higher C per length
    const w = r.tornado.bars.find((b) => b.input === "width")!;
    expect(w.rHighOhmPerM).toBeLessThan(w.rLowOhmPerM);
    expect(w.cHighFPerM).toBeGreaterThan(w.cLowFPerM);
  });

  it("limits that leave no geometry throw the engine's RangeError, which explainShapingError words", () => {
    let message = "";
    try {
      shapeClass({
        classes,
        technology: tech,
        settings: airgap,
        className: "local",
        objective: "delay",
        limits: { ...DEFAULT_SHAPING_LIMITS, minWidthNm: 20, minSpaceNm: 20 },
        gridSize: 0,
      });
    } catch (e) {
      expect(e).toBeInstanceOf(RangeError);
      message = (e as Error).message;
    }
    expect(explainShapingError(message)).toMatch(/^No feasible geometry/);
    expect(explainShapingError("something else")).toBeNull();
    expect(() => shapeClass({ classes, technology: tech, settings: airgap, className: "nope", objective: "delay", limits: DEFAULT_SHAPING_LIMITS })).toThrow(
      /className/,
    );
  });
});

describe("shaping-view helpers", () => {
  it("lists the engine's objectives", () => {
    expect([...SHAPING_OBJECTIVES]).toEqual([...DESIGN_OBJECTIVES]);
  });

  it("checkShapingLimits names each bad field", () => {
    expect(checkShapingLimits(DEFAULT_SHAPING_LIMITS)).toEqual({});
    const bad = checkShapingLimits({ minWidthNm: -1, minSpaceNm: NaN, minFraction: 0, maxFraction: 1.2, maxAspect: 0.5 });
    expect(Object.keys(bad).sort()).toEqual(["maxAspect", "maxFraction", "minFraction", "minSpaceNm", "minWidthNm"]);
    expect(bad.minWidthNm).toMatch(/Minimum width/);
    expect(checkShapingLimits({ ...DEFAULT_SHAPING_LIMITS, minFraction: 0.6, maxFraction: 0.5 }).maxFraction).toMatch(/above the smallest/);
  });

  it("applyShaping adds to the class's override without touching others; percentChange", () => {
    const s = applyShaping(airgap, "local", 0.55, 2.2);
    expect(s.overrides.local).toEqual({ lineFraction: 0.55, aspectRatio: 2.2 });
    expect(s.overrides.intermediate).toEqual(airgap.overrides.intermediate);
    expect(airgap.overrides.local).toBeUndefined();
    expect(percentChange(200, 150)).toBeCloseTo(-25, 12);
    expect(percentChange(0, 1)).toBeNaN();
  });
});

describe("freezeReport with the Layer shaping section", () => {
  it("freezes per option and chosen class the optimum, parts and top-5 tornado, through the same computation as the screen", async () => {
    // method: the frozen figures against shapeClass called directly (same inputs) — common practice, no source
    const { freezeReport } = await import("@/lib/reports/freeze");
    const opts = scenarios.slice(0, 2).map((s, i) => ({ id: s.id, name: s.id, notes: "", version: 1 + i, settings: s.settings }));
    const frozen = freezeReport({
      baseline: { id: "b", name: "demo", description: "", version: 1, technology: tech, classes },
      scenarios: opts,
      classNames: ["intermediate", "local"],
      shaping: { objective: "edp" },
    });
    const sh = frozen.shaping!;
    expect(sh.objective).toBe("edp");
    expect(sh.omittedClasses).toEqual([]);
    expect(sh.options.map((o) => o.classes.map((c) => c.className))).toEqual([
      ["local", "intermediate"],
      ["local", "intermediate"],
    ]);
    const direct = shapeClass({
      classes,
      technology: tech,
      settings: opts[1]!.settings,
      className: "intermediate",
      objective: "edp",
      limits: DEFAULT_SHAPING_LIMITS,
      gridSize: 0,
    });
    const f = sh.options[1]!.classes[1]!;
    expect(f.optimum!.objectiveValue).toBe(direct.optimum.objectiveValue);
    expect(f.current!.lineFraction).toBe(direct.current.lineFraction);
    expect(f.tornado!.top.map((t) => t.input)).toEqual(direct.tornado.bars.slice(0, 5).map((b) => b.input));
    expect(f.parts!.totalS).toBe(direct.parts.totalS);
    // without the choice there is no section
    expect(
      freezeReport({ baseline: { id: "b", name: "demo", description: "", version: 1, technology: tech, classes }, scenarios: opts }).shaping,
    ).toBeUndefined();
  });
});

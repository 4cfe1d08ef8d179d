import { describe, expect, it } from "vitest";
import { baselineSettings, DEFAULT_TECHNOLOGY, type Technology } from "@/lib/scaling";
import { freezeReport } from "@/lib/reports/freeze";
import { modelsUsed, technologyWords } from "@/lib/reports/models";
import { testClass } from "../scaling/fixtures";

// Issue 11: a report names, per class, the capacitance model used (one plane or two, air gap or not) and the accuracy
// the engine measured for it (scaling/README.md "Accurate capacitance": held-out field solves).
function report(technology: Technology) {
  const classes = [
    testClass({ name: "one-plane" }),
    testClass({ name: "two-planes", ildAboveM: 50e-9 }),
    testClass({ name: "gapped", ildAboveM: 50e-9, kGap: 1, gapFraction: 1 }),
  ];
  return freezeReport({
    baseline: { id: "b", name: "B", description: "", version: 1, technology, classes },
    scenarios: [
      { id: "s1", name: "Full", notes: "", version: 1, settings: { ...baselineSettings("full", technology), s: 1.4 } },
      { id: "s2", name: "Fringe", notes: "", version: 1, settings: { ...baselineSettings("fringe", technology), s: 1.4 } },
    ],
  });
}

describe("modelsUsed: the capacitance model per class", () => {
  it("names the tables with their planes and gap, the fringe forms with theirs, and lists the classes per option", () => {
    const rows = modelsUsed(report(DEFAULT_TECHNOLOGY)).filter((r) => r.quantity === "Capacitance");
    const byModel = (re: RegExp) => rows.filter((r) => re.test(r.model));
    const onePlane = byModel(/^Accurate tables .*, one plane:/);
    const twoPlanes = byModel(/^Accurate tables .*, planes below and above:/);
    const gapped = byModel(/^Accurate tables .*, planes below and above, air gap between the lines as geometry/);
    expect(onePlane).toHaveLength(1);
    expect(twoPlanes).toHaveLength(1);
    expect(gapped).toHaveLength(1);
    expect(onePlane[0]!.classesByOption).toEqual({ "Option A": ["one-plane"] });
    expect(twoPlanes[0]!.classesByOption).toEqual({ "Option A": ["two-planes"] });
    expect(gapped[0]!.classesByOption).toEqual({ "Option A": ["gapped"] });
    // each row carries its own measured accuracy statement, not the others'
    expect(onePlane[0]!.accuracy).toHaveLength(1);
    expect(onePlane[0]!.accuracy[0]).toMatch(/^accurate tables, one plane: .*152 held-out geometries/);
    expect(gapped[0]!.accuracy[0]).toMatch(/air gap between the lines as geometry: .*448 held-out geometries/);
    // level fringe: Yuan–Trick over one plane, Cohn between two (the gap plays no part in a single-line form)
    expect(byModel(/^Yuan–Trick/)[0]!.classesByOption).toEqual({ "Option B": ["one-plane"] });
    expect(byModel(/^Cohn's thick strip/)[0]!.classesByOption).toEqual({ "Option B": ["two-planes", "gapped"] });
  });

  it("with the published forms chosen, ungapped classes name Sakurai–Tamaru or Cohn, the gapped one keeps the tables", () => {
    const f = report({ ...DEFAULT_TECHNOLOGY, capacitanceModel: "published" });
    const rows = modelsUsed(f).filter((r) => r.quantity === "Capacitance" && r.usedBy.includes("Option A"));
    expect(rows.map((r) => [r.model.split(":")[0], r.classesByOption["Option A"]])).toEqual([
      ["Published", ["one-plane"]],
      ["Published", ["two-planes"]],
      ["Accurate tables of our own 2D field solver, planes below and above, air gap between the lines as geometry", ["gapped"]],
    ]);
    expect(rows[0]!.model).toMatch(/Sakurai–Tamaru/);
    expect(rows[1]!.model).toMatch(/Cohn's thick strip between two planes with the fitted ground\/coupling split/);
    expect(technologyWords(f)).toMatch(/published closed forms/);
    expect(technologyWords(report(DEFAULT_TECHNOLOGY))).toMatch(/accurate field-solver tables/);
  });
});

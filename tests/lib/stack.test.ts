import { describe, expect, it } from "vitest";
import { moveItem, stackNotes } from "@/lib/workspace/stack";

// Plain bookkeeping of the stack view (common practice, no source): neighbouring layers share one dielectric, so the
// ILD above a layer should equal the ILD below the layer over it.
describe("stackNotes", () => {
  const layer = (name: string, below: number | null, above: number | null) => ({ name, ildBelowM: below, ildAboveM: above });

  it("names a mismatch of the ILD above one layer and below the next in nm", () => {
    const notes = stackNotes([layer("M1", 30e-9, 30e-9), layer("M2", 30e-9, 40e-9), layer("M3", 45e-9, null)]);
    expect(notes).toEqual([{ below: 1, text: "M2's ILD above (40 nm) differs from M3's ILD below (45 nm)." }]);
  });

  it("says when a layer under another has no plane above, and not for the top layer", () => {
    const notes = stackNotes([layer("M3", 50e-9, null), layer("M4", 50e-9, null)]);
    expect(notes).toHaveLength(1);
    expect(notes[0]!.text).toMatch(/^M3 has no plane above, although M4 lies over it/);
    expect(stackNotes([layer("M1", 30e-9, 30e-9), layer("M2", 30e-9, null)])).toEqual([]);
  });

  it("says when the upper layer has no plane below, or neither has", () => {
    expect(stackNotes([layer("A", 1e-8, 2e-8), layer("B", null, 1e-8)])[0]!.text).toMatch(/^B has no plane below/);
    expect(stackNotes([layer("A", 1e-8, null), layer("B", null, 1e-8)])[0]!.text).toMatch(/^A has no plane above and B no plane below/);
  });

  it("treats values equal to 0.1 nm as equal (nm typed, metres stored)", () => {
    expect(stackNotes([layer("A", 1e-8, 0.1 * 3e-7), layer("B", 3e-8, null)])).toEqual([]);
  });
});

describe("moveItem", () => {
  it("moves one item and keeps the rest in order", () => {
    expect(moveItem(["a", "b", "c", "d"], 0, 2)).toEqual(["b", "c", "a", "d"]);
    expect(moveItem(["a", "b", "c", "d"], 3, 1)).toEqual(["a", "d", "b", "c"]);
    expect(moveItem(["a", "b"], 0, 5)).toEqual(["a", "b"]);
  });
});

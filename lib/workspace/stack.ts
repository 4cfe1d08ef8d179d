import type { WireClass } from "@/lib/scaling/client";

/**
 * The metal stack of a baseline: its classes as layers from the bottom (table order = stored `position`), and the
 * consistency notes a planner reads before trusting the capacitances: where the ILD above one layer differs from the
 * ILD below the next, or a layer that has another layer over (under) it has no plane on that side.
 */

export interface StackNote {
  /** Index (from the bottom) of the lower layer of the interface the note is about. */
  below: number;
  text: string;
}

const nm = (m: number) => `${Number((m * 1e9).toPrecision(3))} nm`;

/** Notes on each interface between neighbouring layers, bottom first. Layers are `classes` in order from the bottom. */
export function stackNotes(classes: readonly Pick<WireClass, "name" | "ildBelowM" | "ildAboveM">[]): StackNote[] {
  const out: StackNote[] = [];
  for (let i = 0; i + 1 < classes.length; i++) {
    const lo = classes[i]!;
    const hi = classes[i + 1]!;
    const a = lo.ildAboveM;
    const b = hi.ildBelowM;
    if (a !== null && b !== null) {
      // equal to 0.1 nm: values typed in nm and stored in metres differ in the last bits only
      if (Math.abs(a - b) > 1e-10) out.push({ below: i, text: `${lo.name}'s ILD above (${nm(a)}) differs from ${hi.name}'s ILD below (${nm(b)}).` });
    } else if (a === null && b === null) {
      out.push({
        below: i,
        text: `${lo.name} has no plane above and ${hi.name} no plane below, although ${hi.name} lies over ${lo.name}: neither capacitance counts the other layer.`,
      });
    } else if (a === null) {
      out.push({
        below: i,
        text: `${lo.name} has no plane above, although ${hi.name} lies over it (${hi.name}'s ILD below is ${nm(b!)}): ${lo.name}'s capacitance leaves that layer out.`,
      });
    } else {
      out.push({
        below: i,
        text: `${hi.name} has no plane below, although it lies over ${lo.name} (${lo.name}'s ILD above is ${nm(a)}): ${hi.name}'s capacitance leaves that layer out.`,
      });
    }
  }
  return out;
}

/** `ids` with the item at `from` moved to `to` (both indices into `ids`). */
export function moveItem<T>(ids: readonly T[], from: number, to: number): T[] {
  if (from === to || from < 0 || to < 0 || from >= ids.length || to >= ids.length) return [...ids];
  const copy = [...ids];
  const [x] = copy.splice(from, 1);
  copy.splice(to, 0, x!);
  return copy;
}

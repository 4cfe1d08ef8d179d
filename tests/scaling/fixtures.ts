import type { WireClass } from "@/lib/scaling/types";

/** A plain test class (invented values). */
export function testClass(over: Partial<WireClass> = {}): WireClass {
  return {
    name: "m2",
    tier: "intermediate",
    widthM: 40e-9,
    thicknessM: 80e-9,
    spacingM: 40e-9,
    ildBelowM: 50e-9,
    ildAboveM: null,
    barrierM: 2.5e-9,
    metal: "Cu",
    k: 2.7,
    netCount: 1000,
    meanLengthM: 25e-6,
    driverOhm: 3000,
    loadF: 1e-15,
    activity: 0.1,
    ...over,
  };
}

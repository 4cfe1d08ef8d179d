import { describe, expect, it } from "vitest";
import { energyPerTransitionJ, switchingPowerW } from "@/lib/scaling/energy";
import { expectClose } from "./close";

// C·V² drawn from the supply per rising transition; ½·C·V² dissipated per transition (common practice, no source).
describe("energy", () => {
  it("energyPerTransitionJ = (C + CL)·V²", () => {
    expectClose(energyPerTransitionJ({ cF: 10e-15, loadF: 2e-15, supplyV: 0.75 }), 12e-15 * 0.5625, 1e-14);
  });
  it("switchingPowerW = ½·activity·f·nets·energy", () => {
    expectClose(switchingPowerW({ energyJ: 1e-15, activity: 0.2, clockHz: 2e9, netCount: 1000 }), 0.5 * 0.2 * 2e9 * 1000 * 1e-15, 1e-14);
    expect(() => switchingPowerW({ energyJ: 1e-15, activity: 1.5, clockHz: 2e9, netCount: 1 })).toThrow(/activity/);
  });
});

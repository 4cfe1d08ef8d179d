import { describe, expect, it } from "vitest";
import { DEFAULT_TECHNOLOGY } from "@/lib/scaling/technology";
import { baselineSettings, evaluateClass } from "@/lib/scaling/evaluate";
import { lineDelay } from "@/lib/scaling/delay";
import { validateWireClassRow } from "@/lib/scaling/formats";
import { expectClose } from "./close";
import { testClass } from "./fixtures";

const tech = { ...DEFAULT_TECHNOLOGY, temperatureC: 20 };
const at = (level: "coupled" | "full", s = 1) => ({ ...baselineSettings(level, tech), s });

describe("vias", () => {
  it("via geometry: hand calculation R = ρ·h/(w − 2t_b)² + ρ_barrier·t_b/w² (docs/models.md 'Via resistance'; ρ_barrier 200 µΩ·cm [memory])", () => {
    // Cu 1.678 µΩ·cm (CRC, 20 °C), w = 40 nm (the line's), h = 50 nm (the ILD below), t_b = 2.5 nm:
    // fill 1.678e-8·50e-9/(35e-9)² = 0.68490 Ω, bottom barrier 2e-6·2.5e-9/(40e-9)² = 3.1250 Ω; two vias per net.
    const r = evaluateClass({ wireClass: testClass({ viasPerNet: 2 }), technology: tech, settings: at("coupled") });
    expectClose(r.viaOhm, 2 * (0.6848979591836735 + 3.125), 1e-9);
    // lumped at the driver end: the net's delay is the line's with the driver + all vias
    expect(r.delayS).toBe(lineDelay({ rOhm: r.rOhm, cF: r.cF, driverOhm: r.driverOhm + r.viaOhm, loadF: r.loadF }).t50S);
    expect(r.driverOhm).toBe(3000);
  });
  it("scales ×S when width, height and barrier all shrink by S (R ∝ height/area)", () => {
    const wc = testClass({ viasPerNet: 3 });
    const st = { ...at("coupled", 2) };
    const a = evaluateClass({ wireClass: wc, technology: tech, settings: at("coupled") });
    const b = evaluateClass({ wireClass: wc, technology: tech, settings: st });
    expectClose(b.viaOhm / a.viaOhm, 2, 1e-12);
  });
  it("a measured viaOhm scales as a square via of the line's width and the ILD-below height (× S)", () => {
    const wc = testClass({ viasPerNet: 4, viaOhm: 12 });
    const a = evaluateClass({ wireClass: wc, technology: tech, settings: at("full") });
    const b = evaluateClass({ wireClass: wc, technology: tech, settings: at("full", 1.5) });
    expectClose(a.viaOhm, 48, 1e-12);
    expectClose(b.viaOhm, 48 * 1.5, 1e-12);
  });
  it("explicit via geometry and size effect at level full raise the via's resistance", () => {
    const wc = testClass({ viasPerNet: 1, viaWidthM: 30e-9, viaHeightM: 60e-9 });
    const bulk = evaluateClass({ wireClass: wc, technology: tech, settings: at("coupled") });
    expectClose(bulk.viaOhm, (1.678e-8 * 60e-9) / 25e-9 ** 2 + (2e-6 * 2.5e-9) / 30e-9 ** 2, 1e-9);
    const full = evaluateClass({ wireClass: wc, technology: tech, settings: at("full") });
    expect(full.viaOhm).toBeGreaterThan(bulk.viaOhm);
  });
  it("no vias: viaOhm 0 and the old delay; bad via counts are RangeErrors naming the field", () => {
    const r = evaluateClass({ wireClass: testClass(), technology: tech, settings: at("full") });
    expect(r.viaOhm).toBe(0);
    expect(() => evaluateClass({ wireClass: testClass({ viasPerNet: 1.5 }), technology: tech, settings: at("full") })).toThrow(
      /^m2\.viasPerNet must be a whole number/,
    );
    expect(() => evaluateClass({ wireClass: testClass({ viasPerNet: -1 }), technology: tech, settings: at("full") })).toThrow(RangeError);
  });
  it("CSV: optional via columns; negative or fractional counts rejected naming the row", () => {
    const base = {
      class: "m1",
      tier: "local",
      width_nm: "24",
      thickness_nm: "48",
      spacing_nm: "24",
      ild_below_nm: "30",
      ild_above_nm: "",
      barrier_nm: "2",
      metal: "Cu",
      k: "2.7",
      net_count: "10",
      mean_length_um: "4",
      driver_ohm: "8000",
      load_ff: "0.4",
      activity: "0.1",
    };
    expect(validateWireClassRow(base, 2).wireClass).not.toHaveProperty("viasPerNet");
    const ok = validateWireClassRow({ ...base, vias_per_net: "2", via_ohm: "15", via_width_nm: "20", via_height_nm: "35" }, 2).wireClass!;
    expect([ok.viasPerNet, ok.viaOhm]).toEqual([2, 15]);
    expectClose(ok.viaWidthM!, 20e-9, 1e-15);
    expectClose(ok.viaHeightM!, 35e-9, 1e-15);
    expect(validateWireClassRow({ ...base, vias_per_net: "1.5" }, 7).errors).toEqual([
      { line: 7, column: "vias_per_net", value: "1.5", message: "must be a whole number" },
    ]);
    expect(validateWireClassRow({ ...base, vias_per_net: "-2" }, 8).errors).toEqual([{ line: 8, column: "vias_per_net", value: "-2", message: "must be ≥ 0" }]);
  });
});

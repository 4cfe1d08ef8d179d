import "server-only";
import type { Knex } from "knex";
import { classHistogram, classIdsAndNames } from "@/db/queries/import";
import type { HistogramArrays } from "@/db/histogram-blob";
import type { StoredWireClass } from "@/db/queries/wire-classes";
import { formatScaled, type ClassComparison, type Evaluation } from "@/lib/scaling/client";
import { WIRE_CLASS_COLUMNS } from "@/lib/scaling/formats";
import { csvLine } from "@/lib/csv-safe";

/** Classes CSV in the import format (same columns and units), so an export re-imports unchanged. */
export function classesCsv(classes: StoredWireClass[]): string {
  const cols = WIRE_CLASS_COLUMNS.map((c) => c.name);
  let out = csvLine(cols);
  for (const c of classes) {
    const v: Record<string, string | number | null> = {
      class: c.name,
      tier: c.tier,
      width_nm: formatScaled(c.widthM, -9),
      thickness_nm: formatScaled(c.thicknessM, -9),
      spacing_nm: formatScaled(c.spacingM, -9),
      ild_below_nm: c.ildBelowM === null ? null : formatScaled(c.ildBelowM, -9),
      ild_above_nm: c.ildAboveM === null ? null : formatScaled(c.ildAboveM, -9),
      barrier_nm: formatScaled(c.barrierM, -9),
      metal: c.metal,
      k: formatScaled(c.k, 0),
      net_count: formatScaled(c.netCount, 0),
      mean_length_um: formatScaled(c.meanLengthM, -6),
      driver_ohm: formatScaled(c.driverOhm, 0),
      load_ff: formatScaled(c.loadF, -15),
      activity: formatScaled(c.activity, 0),
      vias_per_net: c.viasPerNet === undefined ? null : formatScaled(c.viasPerNet, 0),
      via_ohm: c.viaOhm === undefined ? null : formatScaled(c.viaOhm, 0),
      via_width_nm: c.viaWidthM === undefined ? null : formatScaled(c.viaWidthM, -9),
      via_height_nm: c.viaHeightM === undefined ? null : formatScaled(c.viaHeightM, -9),
      k_gap: c.kGap === undefined ? null : formatScaled(c.kGap, 0),
      gap_fraction: c.gapFraction === undefined ? null : formatScaled(c.gapFraction, 0),
    };
    out += csvLine(cols.map((k) => v[k] ?? null));
  }
  return out;
}

const PAGE = 20_000;

/**
 * Histogram CSV (`class, length_um, count`, lengths ascending) streamed page by page: one class's
 * stored histogram is decoded at a time (16 bytes per bin) and its text is produced 20,000 bins per chunk.
 */
export function histogramCsvStream(db: Knex, baselineId: string): ReadableStream<Uint8Array> {
  const enc = new TextEncoder();
  let classes: { id: string; name: string }[] | null = null;
  let ci = 0;
  let current: HistogramArrays | null = null;
  let at = 0;
  return new ReadableStream<Uint8Array>({
    async pull(controller) {
      if (!classes) {
        classes = await classIdsAndNames(db, baselineId);
        controller.enqueue(enc.encode(csvLine(["class", "length_um", "count"])));
        return;
      }
      while (ci < classes.length) {
        const c = classes[ci]!;
        if (!current) {
          current = await classHistogram(db, c.id);
          at = 0;
        }
        if (!current || at >= current.lengthsM.length) {
          current = null;
          ci += 1;
          continue;
        }
        const end = Math.min(at + PAGE, current.lengthsM.length);
        let text = "";
        for (let i = at; i < end; i++) text += csvLine([c.name, formatScaled(current.lengthsM[i]!, -6), current.counts[i]!]);
        at = end;
        controller.enqueue(enc.encode(text));
        return;
      }
      controller.close();
    },
  });
}

/** Per-class results columns: [header with unit, value]. Units in the header; numbers in that unit. */
const RESULT_COLUMNS: [string, (c: ClassComparison) => string | number | null][] = [
  ["class", (c) => c.name],
  ["tier", (c) => c.scenario.tier],
  ["width_nm", (c) => formatScaled(c.scenario.widthM, -9)],
  ["thickness_nm", (c) => formatScaled(c.scenario.thicknessM, -9)],
  ["spacing_nm", (c) => formatScaled(c.scenario.spacingM, -9)],
  ["pitch_nm", (c) => formatScaled(c.scenario.pitchM, -9)],
  ["barrier_nm", (c) => formatScaled(c.scenario.barrierM, -9)],
  ["length_um", (c) => formatScaled(c.scenario.lengthM, -6)],
  ["metal", (c) => c.scenario.metal],
  ["k", (c) => c.scenario.k],
  ["resistivity_uohm_cm", (c) => formatScaled(c.scenario.resistivityOhmM, -8)],
  ["r_ohm_per_um", (c) => formatScaled(c.scenario.rOhmPerM, 6)],
  ["c_ff_per_um", (c) => formatScaled(c.scenario.cFPerM, -9)],
  ["r_ohm", (c) => formatScaled(c.scenario.rOhm, 0)],
  ["c_ff", (c) => formatScaled(c.scenario.cF, -15)],
  ["rc_ps", (c) => formatScaled(c.scenario.rcS, -12)],
  ["delay_ps", (c) => formatScaled(c.scenario.delayS, -12)],
  ["baseline_delay_ps", (c) => formatScaled(c.baseline.delayS, -12)],
  ["delay_ratio", (c) => c.ratio.delayS],
  // stages = inserted repeaters + 1 (lib/figures.ts); the inserted count is repeater_count
  ["repeater_stages", (c) => c.scenario.repeaters.count],
  ["baseline_repeater_stages", (c) => c.baseline.repeaters.count],
  ["energy_fj", (c) => formatScaled(c.scenario.energyJ, -15)],
  ["baseline_energy_fj", (c) => formatScaled(c.baseline.energyJ, -15)],
  ["energy_ratio", (c) => c.ratio.energyJ],
  ["power_uw", (c) => formatScaled(c.scenario.powerW, -6)],
  ["distribution_source", (c) => c.scenario.distribution.source],
  ["nets", (c) => c.scenario.distribution.totalNets],
  ["share_over_budget", (c) => c.scenario.distribution.shareOverBudget],
  ["baseline_share_over_budget", (c) => c.baseline.distribution.shareOverBudget],
  ["mean_delay_ps", (c) => formatScaled(c.scenario.distribution.meanDelayS, -12)],
  ["total_repeaters", (c) => c.scenario.distribution.totalRepeaters],
  ["baseline_total_repeaters", (c) => c.baseline.distribution.totalRepeaters],
  ["validity_flags", (c) => c.scenario.validity.map((v) => v.message).join(" | ")],
  // engine 2 (appended: earlier columns keep their positions)
  ["repeater_count", (c) => c.scenario.repeaterCount],
  ["repeater_size", (c) => c.scenario.repeaterSize],
  ["repeater_area_um2", (c) => formatScaled(c.scenario.repeaterAreaM2, -12)],
  ["repeater_energy_fj", (c) => formatScaled(c.scenario.repeaterEnergyJ, -15)],
  ["via_ohm", (c) => formatScaled(c.scenario.viaOhm, 0)],
  ["temperature_c", (c) => c.scenario.temperatureC],
];

export const RESULT_HEADERS = RESULT_COLUMNS.map(([h]) => h);

/** A scenario's per-class results as CSV (engine units converted to the header's units). */
export function resultsCsv(ev: Evaluation): string {
  let out = csvLine(RESULT_HEADERS);
  for (const c of ev.classes) out += csvLine(RESULT_COLUMNS.map(([, f]) => f(c)));
  return out;
}

"use client";
import type { DesignObjective } from "@/lib/scaling";
import { OBJECTIVE_LABEL, SHAPING_OBJECTIVES } from "@/lib/workspace/shaping-view";

/** The compose form's "Layer shaping" choice: include the section (null = no), and for which objective. */
export function ShapingChoice({ value, onChange }: { value: DesignObjective | null; onChange: (v: DesignObjective | null) => void }) {
  return (
    <fieldset className="flex flex-wrap items-center gap-x-4 gap-y-1.5">
      <legend className="mb-1 text-sm font-medium text-ink">Layer shaping</legend>
      <label className="inline-flex items-center gap-2 text-sm text-ink">
        <input
          type="checkbox"
          name="shaping"
          checked={value !== null}
          onChange={(e) => onChange(e.target.checked ? "delay" : null)}
          className="accent-copper"
        />
        Include the best line fraction and aspect ratio per class, and what drives delay (first 12 classes)
      </label>
      {value !== null ? (
        <label className="inline-flex items-center gap-2 text-sm text-ink">
          Objective
          <select
            name="shapingObjective"
            value={value}
            onChange={(e) => onChange(e.target.value as DesignObjective)}
            className="rounded-md border border-rule-strong bg-panel px-2 py-1 text-sm"
          >
            {SHAPING_OBJECTIVES.map((o) => (
              <option key={o} value={o}>
                {OBJECTIVE_LABEL[o].short} ({OBJECTIVE_LABEL[o].unit})
              </option>
            ))}
          </select>
        </label>
      ) : null}
    </fieldset>
  );
}

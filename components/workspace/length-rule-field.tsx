"use client";
import { useId } from "react";
import type { LengthRule } from "@/lib/scaling/client";
import { describeLengthRule } from "@/lib/workspace/roadmap-view";
import { inputClass } from "@/components/ui/field";
import { OptionalNumber } from "./optional-number";

type Kind = LengthRule["kind"];
const KIND_LABEL: Record<Kind, string> = {
  "follows-s": "follows S",
  fixed: "fixed (S_L = 1)",
  factor: "fixed factor",
  power: "power law S^a",
};
const KINDS = Object.keys(KIND_LABEL) as Kind[];

const sLCheck = (v: number) => (v <= 0 ? "The factor must be greater than 0." : v > 20 ? "The factor must be at most 20." : undefined);
const expCheck = (v: number) => (v < 0 || v > 2 ? "The exponent must be between 0 and 2." : undefined);

/**
 * How wire lengths follow a shrink: none (`emptyLabel`: inherit), follows S, fixed, a fixed factor or S^a, and what
 * the rule does in words at the cross-section factor `s`. `compact`: a table cell (per class).
 */
export function LengthRuleField({
  label,
  value,
  onChange,
  s,
  emptyLabel,
  compact = false,
  errors,
}: {
  label: string;
  value: LengthRule | undefined;
  onChange: (r: LengthRule | undefined) => void;
  /** The cross-section factor the sentence uses. */
  s: number;
  emptyLabel: string;
  compact?: boolean;
  errors?: string[];
}) {
  const id = useId();
  const kind = value?.kind ?? "";
  return (
    <div className={compact ? "w-32" : ""} data-testid="length-rule">
      <label htmlFor={id} className={compact ? "sr-only" : "mb-1 block text-xs font-medium text-ink"}>
        {label}
      </label>
      <div className="flex gap-1">
        <select
          id={id}
          className={`${inputClass} ${compact ? "px-1 py-1 text-xs" : ""}`}
          value={kind}
          onChange={(e) => {
            const k = e.target.value as Kind | "";
            if (k === "") onChange(undefined);
            else if (k === "factor") onChange({ kind: "factor", sL: value?.kind === "factor" ? value.sL : 1.2 });
            else if (k === "power") onChange({ kind: "power", exponent: value?.kind === "power" ? value.exponent : 0.5 });
            else onChange({ kind: k });
          }}
        >
          <option value="">{emptyLabel}</option>
          {KINDS.map((k) => (
            <option key={k} value={k}>
              {KIND_LABEL[k]}
            </option>
          ))}
        </select>
        {value?.kind === "factor" ? (
          <OptionalNumber
            label={`${label}: S_L factor`}
            className="w-14 shrink-0"
            value={value.sL}
            onChange={(v) => v !== undefined && onChange({ kind: "factor", sL: v })}
            check={sLCheck}
          />
        ) : null}
        {value?.kind === "power" ? (
          <OptionalNumber
            label={`${label}: exponent a`}
            className="w-14 shrink-0"
            value={value.exponent}
            onChange={(v) => v !== undefined && onChange({ kind: "power", exponent: v })}
            check={expCheck}
          />
        ) : null}
      </div>
      {value ? (
        <p className={`mt-0.5 text-muted ${compact ? "text-[10px] leading-tight" : "text-[11px]"}`} data-testid="length-rule-words">
          {describeLengthRule(value, s)}
        </p>
      ) : null}
      {errors?.length ? <p className="text-[11px] text-bad">{errors.join(" ")}</p> : null}
    </div>
  );
}

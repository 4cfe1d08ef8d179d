"use client";
import { useId, useState } from "react";
import { FieldErrors, inputClass } from "@/components/ui/field";
import { formatValue, parseValue, U, type DisplayUnit } from "./units";

export interface NumberFieldProps {
  label: string;
  /** Value in SI. */
  value: number;
  onChange: (valueSI: number) => void;
  unit?: DisplayUnit;
  /** Extra check on the parsed SI value: a message when it is not acceptable. */
  check?: (v: number) => string | undefined;
  errors?: string[];
  className?: string;
  compact?: boolean;
  hint?: string;
  name?: string;
}

/**
 * A typed quantity: keeps the user's text while it is being typed, reports parse and range messages under
 * the field, and only calls onChange with valid values. Follows external changes (a slider) when they differ.
 */
export function NumberField({ label, value, onChange, unit = U.none, check, errors, className = "", compact, hint, name }: NumberFieldProps) {
  const id = useId();
  const [text, setText] = useState(() => formatValue(value, unit));
  const [local, setLocal] = useState<string | undefined>();
  // Follow a new value from outside (adjusted while rendering, not in an effect): keep the text when it already says it.
  const [shown, setShown] = useState(value);
  if (!Object.is(shown, value)) {
    setShown(value);
    const p = parseValue(text, unit);
    if (!p.ok || p.value !== value) {
      setText(formatValue(value, unit));
      setLocal(undefined);
    }
  }
  const all = [...(local ? [local] : []), ...(errors ?? [])];
  return (
    <div className={className}>
      <label htmlFor={id} className={compact ? "sr-only" : "mb-1 block text-xs font-medium text-ink"}>
        {label}
        {unit.label && !compact ? <span className="font-normal text-muted"> ({unit.label})</span> : null}
      </label>
      <input
        id={id}
        name={name}
        inputMode="decimal"
        autoComplete="off"
        value={text}
        aria-invalid={all.length ? true : undefined}
        aria-describedby={all.length ? `${id}-err` : hint ? `${id}-hint` : undefined}
        className={`${inputClass} tabular text-right ${compact ? "px-1.5 py-1 text-xs" : ""}`}
        onChange={(e) => {
          setText(e.target.value);
          const p = parseValue(e.target.value, unit);
          if (!p.ok) return setLocal(p.message);
          const msg = check?.(p.value);
          if (msg) return setLocal(msg);
          setLocal(undefined);
          if (p.value !== value) onChange(p.value);
        }}
        onBlur={() => {
          if (!local) setText(formatValue(value, unit));
        }}
      />
      {hint && !all.length ? (
        <p id={`${id}-hint`} className="mt-0.5 text-[11px] text-muted">
          {hint}
        </p>
      ) : null}
      <FieldErrors id={`${id}-err`} errors={all} />
    </div>
  );
}

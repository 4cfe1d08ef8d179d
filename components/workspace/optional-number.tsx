"use client";
import { useState } from "react";
import { inputClass } from "@/components/ui/field";
import { formatValue, parseValue, U, type DisplayUnit } from "./units";

/** A typed quantity that may be empty (= inherit / not set): the table cells of overrides and roadmap steps. */
export function OptionalNumber({
  label,
  value,
  onChange,
  check,
  errors,
  unit = U.none,
  className = "w-16",
  placeholder = "—",
  fit = false,
}: {
  /** Grow with the text (at least the class's width), so a derived 1.428571429 shows whole instead of "1.4285". */
  fit?: boolean;
  unit?: DisplayUnit;
  className?: string;
  placeholder?: string;
  label: string;
  value: number | undefined;
  onChange: (v: number | undefined) => void;
  check: (v: number) => string | undefined;
  errors?: string[];
}) {
  const [text, setText] = useState(value === undefined ? "" : formatValue(value, unit));
  const [msg, setMsg] = useState<string | undefined>();
  // Follow a new value from outside (adjusted while rendering, not in an effect): keep the text when it already says it.
  const [shown, setShown] = useState(value);
  if (!Object.is(shown, value)) {
    setShown(value);
    const p = parseValue(text, unit);
    if ((value === undefined && text.trim() !== "") || (value !== undefined && (!p.ok || p.value !== value))) {
      setText(value === undefined ? "" : formatValue(value, unit));
      setMsg(undefined);
    }
  }
  const all = [...(msg ? [msg] : []), ...(errors ?? [])];
  return (
    <div className={fit ? "min-w-16" : className}>
      <input
        aria-label={label}
        title={text || undefined}
        // the width in the input's own ch (its font), so a derived value shows whole
        style={fit ? { width: `calc(${Math.max(5, text.length) + 1}ch + 1rem)` } : undefined}
        inputMode="decimal"
        value={text}
        placeholder={placeholder}
        aria-invalid={all.length ? true : undefined}
        className={`${inputClass} tabular px-1 py-1 text-right text-xs`}
        onChange={(e) => {
          setText(e.target.value);
          if (e.target.value.trim() === "") {
            setMsg(undefined);
            return onChange(undefined);
          }
          const p = parseValue(e.target.value, unit);
          if (!p.ok) return setMsg(p.message);
          const m = check(p.value);
          if (m) return setMsg(m);
          setMsg(undefined);
          onChange(p.value);
        }}
      />
      {all.length ? <p className="text-[11px] text-bad">{all.join(" ")}</p> : null}
    </div>
  );
}

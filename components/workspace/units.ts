import Decimal from "decimal.js";
import { parseQuantity, type BaseUnit, type CapacitanceChoice } from "@/lib/scaling/client";

/** A column's display unit: SI size of one display unit, its label and the base unit for parsing. */
export interface DisplayUnit {
  label: string;
  unitSI: number;
  base: BaseUnit;
  /** Text appended to a bare number before parsing ("20" in an nm column means 20 nm). */
  suffix: string;
}

export const U = {
  nm: { label: "nm", unitSI: 1e-9, base: "m", suffix: "nm" },
  um: { label: "µm", unitSI: 1e-6, base: "m", suffix: "µm" },
  mm: { label: "mm", unitSI: 1e-3, base: "m", suffix: "mm" },
  ohm: { label: "Ω", unitSI: 1, base: "ohm", suffix: "ohm" },
  kohm: { label: "kΩ", unitSI: 1e3, base: "ohm", suffix: "kohm" },
  fF: { label: "fF", unitSI: 1e-15, base: "F", suffix: "fF" },
  ps: { label: "ps", unitSI: 1e-12, base: "s", suffix: "ps" },
  V: { label: "V", unitSI: 1, base: "V", suffix: "V" },
  GHz: { label: "GHz", unitSI: 1e9, base: "Hz", suffix: "GHz" },
  degC: { label: "°C", unitSI: 1, base: "", suffix: "" },
  none: { label: "", unitSI: 1, base: "", suffix: "" },
} satisfies Record<string, DisplayUnit>;

const BARE = /^\s*[+-]?(?:\d+\.?\d*|\.\d+)(?:[eE][+-]?\d+)?\s*$/;

/** Exact decimal value of `valueSI` in the display unit, as a short string ("20", never "19.999999"). */
export function formatValue(valueSI: number | null | undefined, u: DisplayUnit, significant = 10): string {
  if (valueSI === null || valueSI === undefined || !Number.isFinite(valueSI)) return "";
  const d = new Decimal(valueSI).toSignificantDigits(15).div(u.unitSI).toSignificantDigits(significant);
  return d
    .toFixed()
    .replace(/(\.\d*?)0+$/, "$1")
    .replace(/\.$/, "");
}

export type ParseResult = { ok: true; value: number } | { ok: false; message: string };

/**
 * Parse what the user typed: a bare number is in the column's unit; a number with a unit may use any SI
 * prefix ("0.02 µm" in an nm column). Exact with decimal.js.
 */
export function parseValue(text: string, u: DisplayUnit): ParseResult {
  const t = text.trim();
  if (t === "") return { ok: false, message: "Required." };
  // a decimal comma ("1,55"): say so, with the fix (issue 13 item 8)
  if (/^[+-]?\d*,\d+\s*[a-zA-Zµμ]*$/.test(t)) {
    return { ok: false, message: `Use a decimal point: ${t.replace(",", ".")}, not ${t} (and no thousands separators).` };
  }
  try {
    const v = BARE.test(t) ? parseQuantity(u.suffix ? `${t} ${u.suffix}` : t, u.base) : parseQuantity(t, u.base);
    return { ok: true, value: v };
  } catch {
    const ex: Partial<Record<BaseUnit, string>> = {
      m: '"20" or "0.02 µm"',
      ohm: '"500" or "1.2 kΩ"',
      F: '"1.5" or "0.0015 pF"',
      s: '"100" or "0.1 ns"',
      V: '"0.75" or "750 mV"',
      Hz: '"2" or "2000 MHz"',
    };
    return { ok: false, message: u.base ? `Not a number with a known unit (e.g. ${ex[u.base] ?? "20"}).` : "Not a number." };
  }
}

/**
 * Formatted figures by value, unit and digits: the results table formats a few hundred figures per slider step, most
 * of them (the baseline's) the same as the step before, and exact decimal formatting is the costly part of a render.
 * Bounded: emptied when it grows past FORMAT_CACHE_MAX entries.
 */
const formatCache = new Map<string, string>();
const FORMAT_CACHE_MAX = 4000;
function cached(key: string, make: () => string): string {
  let v = formatCache.get(key);
  if (v === undefined) {
    if (formatCache.size >= FORMAT_CACHE_MAX) formatCache.clear();
    v = make();
    formatCache.set(key, v);
  }
  return v;
}

/** Format a result figure in a fixed unit with `significant` digits, exact in decimal. */
export function fmt(valueSI: number | null | undefined, u: DisplayUnit, significant = 4): string {
  if (valueSI === null || valueSI === undefined || !Number.isFinite(valueSI)) return "—";
  if (valueSI === 0) return "0";
  return cached(`f${valueSI}|${u.unitSI}|${significant}`, () => fmtExact(valueSI, u.unitSI, significant));
}

function fmtExact(valueSI: number, unitSI: number, significant: number): string {
  const d = new Decimal(valueSI).div(unitSI);
  const abs = d.abs();
  if (abs.gte(1e5) || abs.lt(1e-3)) return d.toSignificantDigits(3).toExponential().replace("e+", "e");
  return d
    .toSignificantDigits(significant)
    .toFixed()
    .replace(/(\.\d*?)0+$/, "$1")
    .replace(/\.$/, "");
}

/** Ratio as "0.72×". */
export function fmtRatio(r: number): string {
  if (!Number.isFinite(r)) return "—";
  return cached(`r${r}`, () => `${new Decimal(r).toSignificantDigits(3).toFixed()}×`);
}

/** The technology's capacitance model (capacitanceModel) in words. */
export const CAPACITANCE_CHOICE_LABEL: Record<CapacitanceChoice, string> = {
  accurate: "Field-solver tables",
  published: "Published forms",
};

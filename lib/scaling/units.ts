/**
 * Units at the edges of the engine: SI-prefix parsing ("20nm", "0.02 µm", "1.5fF", "2kohm") with
 * decimal.js, and exact formatting to engineering units (20 nm, never 19.999999 nm).
 * Inside the engine everything is in SI base units.
 */
import { hasOwnKey } from "./own";
import Decimal from "decimal.js";

export const NM = 1e-9;
export const UM = 1e-6;
export const FF = 1e-15;
export const PS = 1e-12;

/** Metres → nanometres. */
export const toNm = (m: number): number => m / NM;
/**
 * Scale a decimal value by a power of ten exactly (24 nm → 2.4e-8 m, not 2.4000000000000003e-8):
 * the product is formed in decimal and rounded once to the nearest double.
 */
export const scaleExact = (x: number, exp: number): number => (Number.isFinite(x) ? new Decimal(x).times(new Decimal(10).pow(exp)).toNumber() : x * 10 ** exp);
/** Nanometres → metres, exactly rounded. */
export const fromNm = (nm: number): number => scaleExact(nm, -9);
/** Metres → micrometres. */
export const toUm = (m: number): number => m / UM;
/** Micrometres → metres, exactly rounded. */
export const fromUm = (um: number): number => scaleExact(um, -6);

const DECIMAL_RE = /^[+-]?(?:\d+\.?\d*|\.\d+)(?:[eE][+-]?\d+)?$/;
const DECIMAL_COMMA_RE = /^[+-]?\d*,\d+(?:[eE][+-]?\d+)?$/;

/** A number written with a decimal comma ("1,55", "-0,5", ",25", "1,5E-3"; surrounding spaces ignored): 1.55 meant. */
export const isDecimalComma = (text: string): boolean => DECIMAL_COMMA_RE.test(text.trim());

/** A checked number cell: its SI value, or the reason it was refused (a phrase after the column name). */
export type NumberCheck = { ok: true; value: number } | { ok: false; reason: string };

/**
 * Parse a plain decimal number written in a display unit and return it in SI, correctly rounded:
 * the decimal exponent is shifted in the text ("0.3" µm → "0.3e-6" → 3e-7), so no binary
 * multiplication error creeps in (0.3 * 1e-6 would give 2.9999999999999997e-7). The one SI
 * conversion of the CSV formats (formats.ts).
 * @param text the cell (surrounding spaces ignored)
 * @param exp10 power of ten of the unit (-9 for nm, -6 for µm, -15 for fF, 0 for a plain number)
 */
export function parseScaled(text: string, exp10: number): NumberCheck {
  const t = text.trim();
  if (t === "") return { ok: false, reason: "is required" };
  if (!DECIMAL_RE.test(t)) {
    if (DECIMAL_COMMA_RE.test(t)) return { ok: false, reason: "is not a number: use a decimal point, not a comma" };
    if (/^[+-]?(nan|inf(inity)?)$/i.test(t)) return { ok: false, reason: "must be a finite number" };
    return { ok: false, reason: "is not a number" };
  }
  let value: number;
  if (exp10 === 0) value = Number(t);
  else {
    const e = t.search(/[eE]/);
    value = e === -1 ? Number(`${t}e${exp10}`) : Number(`${t.slice(0, e)}e${Number(t.slice(e + 1)) + exp10}`);
  }
  if (!Number.isFinite(value)) return { ok: false, reason: "must be a finite number" };
  return { ok: true, value };
}

/** SI value → shortest decimal text in the display unit that parses back (parseScaled) to exactly the same number. */
export function formatScaled(valueSI: number, exp10: number): string {
  if (!Number.isFinite(valueSI)) return "";
  if (exp10 === 0) return String(valueSI);
  return new Decimal(String(valueSI)).times(new Decimal(10).pow(-exp10)).toString();
}

/** Base units the parser and formatter know. "ohm" also accepts "Ω" and "Ohm". */
export type BaseUnit = "m" | "F" | "ohm" | "s" | "J" | "W" | "V" | "Hz" | "";

const PREFIX_EXP: Record<string, number> = {
  a: -18,
  f: -15,
  p: -12,
  n: -9,
  u: -6,
  µ: -6,
  μ: -6,
  m: -3,
  "": 0,
  k: 3,
  K: 3,
  M: 6,
  G: 9,
  T: 12,
};

const UNIT_ALIASES: Record<Exclude<BaseUnit, "">, string[]> = {
  m: ["m"],
  F: ["F"],
  ohm: ["ohm", "Ohm", "OHM", "ohms", "\u03A9", "\u2126"],
  s: ["s"],
  J: ["J"],
  W: ["W"],
  V: ["V"],
  Hz: ["Hz", "hz"],
};

const NUMBER_RE = /^\s*([+-]?(?:\d+\.?\d*|\.\d+)(?:[eE][+-]?\d+)?)\s*(.*?)\s*$/;

Decimal.set({ precision: 40 });

/**
 * Parses a quantity with an optional SI prefix and unit into SI base units.
 * "20nm" → 2e-8, "0.02 µm" → 2e-8, "1.5fF" → 1.5e-15, "2kohm" → 2000, "2e-8" → 2e-8 (bare SI).
 * A prefix without the unit ("20n") is accepted too. Throws RangeError naming the expected unit.
 * @param text the input string
 * @param unit expected base unit ("" for a dimensionless number)
 */
export function parseQuantity(text: string, unit: BaseUnit): number {
  const m = NUMBER_RE.exec(text);
  const expected = unit === "" ? "a plain number" : `a number with an optional SI-prefixed unit of ${unitLabel(unit)} (e.g. ${example(unit)})`;
  if (!m || m[1] === undefined) throw new RangeError(`"${text}" is not ${expected}`);
  const num = new Decimal(m[1]);
  const rest = m[2] ?? "";
  let exp: number | undefined;
  if (rest === "") exp = 0;
  else if (unit === "") exp = undefined;
  else {
    for (const alias of UNIT_ALIASES[unit]) {
      if (rest.endsWith(alias)) {
        const prefix = rest.slice(0, rest.length - alias.length).trim();
        if (hasOwnKey(PREFIX_EXP, prefix)) {
          exp = PREFIX_EXP[prefix];
          break;
        }
      }
    }
    // bare prefix without the unit, e.g. "20n" or "2k" (but never a lone unit-less "m" for metre quantities: "20m" is 20 m)
    if (exp === undefined && hasOwnKey(PREFIX_EXP, rest) && !(unit === "m" && rest === "m")) exp = PREFIX_EXP[rest];
  }
  if (exp === undefined) throw new RangeError(`"${text}" is not ${expected}`);
  const value = num.times(new Decimal(10).pow(exp)).toNumber();
  if (!Number.isFinite(value)) throw new RangeError(`"${text}" is not a finite number`);
  return value;
}

function unitLabel(unit: Exclude<BaseUnit, "">): string {
  return { m: "metres", F: "farads", ohm: "ohms", s: "seconds", J: "joules", W: "watts", V: "volts", Hz: "hertz" }[unit];
}

function example(unit: Exclude<BaseUnit, "">): string {
  return { m: "20nm", F: "1.5fF", ohm: "2kohm", s: "10ps", J: "1fJ", W: "2mW", V: "0.75V", Hz: "2GHz" }[unit];
}

const FORMAT_PREFIXES: [number, string][] = [
  [-18, "a"],
  [-15, "f"],
  [-12, "p"],
  [-9, "n"],
  [-6, "µ"],
  [-3, "m"],
  [0, ""],
  [3, "k"],
  [6, "M"],
  [9, "G"],
  [12, "T"],
];

/**
 * Formats an SI value in engineering notation with an SI prefix, exactly in decimal:
 * formatEngineering(2e-8, "m") → "20 nm"; formatEngineering(1.5e-15, "F") → "1.5 fF".
 * @param valueSI value in SI base units
 * @param unit display unit symbol ("m", "F", "Ω", "s", ...)
 * @param significant significant digits (default 4); trailing zeros are dropped
 */
export function formatEngineering(valueSI: number, unit: string, significant = 4): string {
  if (!Number.isFinite(valueSI)) return `${valueSI} ${unit}`.trim();
  if (valueSI === 0) return `0 ${unit}`.trim();
  const d = new Decimal(valueSI).toSignificantDigits(significant);
  const e = Math.floor(d.abs().log(10).toNumber() + 1e-12);
  let exp3 = Math.floor(e / 3) * 3;
  exp3 = Math.max(-18, Math.min(12, exp3));
  const prefix = FORMAT_PREFIXES.find(([x]) => x === exp3)?.[1] ?? "";
  const scaled = d.times(new Decimal(10).pow(-exp3));
  return `${trimZeros(scaled.toSignificantDigits(significant).toFixed())} ${prefix}${unit}`.trim();
}

/**
 * Formats an SI value in a fixed display unit: formatIn(2e-8, 1e-9, "nm") → "20 nm".
 * @param valueSI value in SI base units
 * @param unitSI size of the display unit in SI (e.g. 1e-9 for nm, 1e-9 for fF/µm = 1e-9 F/m)
 */
export function formatIn(valueSI: number, unitSI: number, label: string, significant = 4): string {
  if (!Number.isFinite(valueSI)) return `${valueSI} ${label}`;
  const v = new Decimal(valueSI).toSignificantDigits(significant).div(new Decimal(unitSI));
  return `${trimZeros(v.toSignificantDigits(significant).toFixed())} ${label}`;
}

/** Exact decimal conversion between SI and a display unit: convertExact(2e-8, 1e-9) → 20 (no 19.999999). */
export function convertExact(valueSI: number, unitSI: number): number {
  return new Decimal(valueSI).div(new Decimal(unitSI)).toNumber();
}

function trimZeros(s: string): string {
  return s.includes(".") ? s.replace(/\.?0+$/, "") : s;
}

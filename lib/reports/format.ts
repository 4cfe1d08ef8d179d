import { formatEngineering, formatIn } from "@/lib/scaling/client";

/** A number in a fixed display unit, without the unit (the unit sits in the column header). */
export function fixed(valueSI: number, unitSI: number, significant = 4): string {
  if (!Number.isFinite(valueSI)) return "n/a";
  return formatIn(valueSI, unitSI, "", significant).trim();
}

/** A value with an engineering prefix and its unit, for prose and cards: "1.234 nF". */
export function eng(valueSI: number, unit: string, significant = 4): string {
  return formatEngineering(valueSI, unit, significant);
}

export function count(n: number): string {
  if (!Number.isFinite(n)) return "n/a";
  return Math.round(n).toLocaleString("en-US");
}

/** A plain number with up to `digits` significant digits and no trailing zeros: 1.43, 0.7. */
export function plain(n: number, digits = 3): string {
  if (!Number.isFinite(n)) return "n/a";
  return String(Number(n.toPrecision(digits)));
}

/** Stable, locale-independent date for reports (UTC): "2026-12-01 14:05 UTC". */
export function dateTime(ms: number): string {
  const d = new Date(ms);
  const p = (x: number) => String(x).padStart(2, "0");
  return `${d.getUTCFullYear()}-${p(d.getUTCMonth() + 1)}-${p(d.getUTCDate())} ${p(d.getUTCHours())}:${p(d.getUTCMinutes())} UTC`;
}

export function date(ms: number): string {
  return dateTime(ms).slice(0, 10);
}

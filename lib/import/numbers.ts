import Decimal from "decimal.js";

const DECIMAL_RE = /^[+-]?(?:\d+\.?\d*|\.\d+)(?:[eE][+-]?\d+)?$/;

export type NumberCheck = { ok: true; value: number } | { ok: false; reason: string };

/**
 * Parse a plain decimal number written in a display unit and return it in SI, correctly rounded:
 * the decimal exponent is shifted in the text ("0.3" µm → "0.3e-6" → 3e-7), so no binary
 * multiplication error creeps in (0.3 * 1e-6 would give 2.9999999999999997e-7).
 * @param text the cell
 * @param exp10 power of ten of the unit (-9 for nm, -6 for µm, -15 for fF, 0 for a plain number)
 */
export function parseScaled(text: string, exp10: number): NumberCheck {
  const t = text.trim();
  if (t === "") return { ok: false, reason: "is required" };
  if (!DECIMAL_RE.test(t)) {
    if (/^[+-]?\d+,\d+$/.test(t)) return { ok: false, reason: "is not a number: use a decimal point, not a comma" };
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

/** SI value → shortest decimal text in the display unit that parses back to exactly the same number. */
export function formatScaled(valueSI: number, exp10: number): string {
  if (!Number.isFinite(valueSI)) return "";
  if (exp10 === 0) return String(valueSI);
  const d = new Decimal(String(valueSI)).times(new Decimal(10).pow(-exp10));
  return d.toString();
}

/** Input checks shared by the engine's modules (private: not re-exported). */
import type { ValidityFlag } from "./types";

export function positive(name: string, v: number): void {
  if (!(v > 0) || v === Infinity) throw new RangeError(`${name} must be > 0 (got ${v})`);
}

export function nonNegative(name: string, v: number): void {
  if (!(v >= 0) || v === Infinity) throw new RangeError(`${name} must be >= 0 (got ${v})`);
}

export function inRange(name: string, v: number, min: number, max: number): void {
  if (!(v >= min && v <= max)) throw new RangeError(`${name} must be between ${min} and ${max} (got ${v})`);
}

export function atLeast(name: string, v: number, min: number): void {
  if (!(v >= min) || v === Infinity) throw new RangeError(`${name} must be >= ${min} (got ${v})`);
}

/** Pushes a flag when value is outside [min, max] (null = open side). */
export function rangeFlag(out: ValidityFlag[], model: string, quantity: string, value: number, min: number | null, max: number | null, what: string): void {
  if ((min !== null && value < min) || (max !== null && value > max)) {
    const range = min !== null && max !== null ? `${min}–${max}` : min !== null ? `≥ ${min}` : `≤ ${max}`;
    out.push({ model, quantity, value, min, max, message: `${quantity} = ${round3(value)} is outside ${what} range ${range}` });
  }
}

export function round3(v: number): string {
  return Number(v.toPrecision(3)).toString();
}

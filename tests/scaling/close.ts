import { expect } from "vitest";

/** Relative comparison (house style: d3's absolute delta would let nanometre-scale SI values pass). */
export function expectClose(actual: number, expected: number, rel = 1e-9): void {
  const err = Math.abs(actual - expected) / Math.max(Math.abs(expected), 1e-300);
  if (!(err <= rel)) expect.fail(`expected ${actual} to be within ${rel} (relative) of ${expected}; off by ${err.toExponential(3)}`);
}

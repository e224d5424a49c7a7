import { expect } from 'vitest';

/**
 * The one numerical assertion helper (DEVELOPERS.md, "Checks and benchmarks"): prints actual, expected,
 * tolerance and what was checked, so a failure explains itself.
 */
export function expectClose(actual: number, expected: number, tol: number, what: string): void {
  const err = Math.abs(actual - expected);
  const ok = Number.isFinite(actual) && err <= tol;
  expect(ok, `${what}: actual ${actual}, expected ${expected}, |diff| ${err.toExponential(3)} > tol ${tol}`).toBe(true);
}

/** Assert a <= b with a message printing both. */
export function expectAtMost(actual: number, limit: number, what: string): void {
  expect(Number.isFinite(actual) && actual <= limit, `${what}: ${actual} exceeds ${limit}`).toBe(true);
}

/** Assert lo <= x <= hi with a message. */
export function expectBetween(actual: number, lo: number, hi: number, what: string): void {
  expect(Number.isFinite(actual) && actual >= lo && actual <= hi, `${what}: ${actual} not in [${lo}, ${hi}]`).toBe(true);
}

/** Great-circle angle (deg) between geocentric points i of a and j of b (xyz triples). */
export function pointAngleDeg(a: Float64Array, i: number, b: Float64Array, j: number): number {
  const ax = a[3 * i], ay = a[3 * i + 1], az = a[3 * i + 2], bx = b[3 * j], by = b[3 * j + 1], bz = b[3 * j + 2];
  const cr = Math.hypot(ay * bz - az * by, az * bx - ax * bz, ax * by - ay * bx);
  return (Math.atan2(cr, ax * bx + ay * by + az * bz) * 180) / Math.PI;
}

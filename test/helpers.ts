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

/**
 * Which wavenumber pairs (i, j) the compression basis keeps (see fit.ts): those
 * with k/κ = √(i² + j²) an integer or an integer times √2, so every exponential
 * is a power of exp(κ dx) or exp(√2 κ dx). No imports: the kernel generator
 * (scripts/gen-compression-kernel.ts) reads the same rule.
 */

/** The square-free part f of s = m² f. */
export function squareFreePart(s: number): number {
  let m = 1;
  for (let t = 2; t * t <= s; t++) if (s % (t * t) === 0) m = t;
  return s / (m * m);
}

/** The kept pairs for 0 ≤ i, j ≤ order, (0, 0) excluded, flattened [i0, j0, i1, j1, …], i outer, j inner. */
export function compressionPairs(order: number): number[] {
  const pairs: number[] = [];
  for (let i = 0; i <= order; i++) for (let j = 0; j <= order; j++) if (i + j > 0 && squareFreePart(i * i + j * j) <= 2) pairs.push(i, j);
  return pairs;
}

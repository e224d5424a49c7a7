/**
 * Coefficient layout shared by every main-field array in the engine:
 * index(n, m) = n(n+1)/2 + m, 0 ≤ m ≤ n, so g[0] (n = 0) is unused and
 * degree 1 is g[1] = g10, g[2] = g11 (the same order as the WMM coefficient files).
 * h[coefIndex(n, 0)] is always 0.
 */

/** Index of the degree-n, order-m coefficient: n(n+1)/2 + m. */
export function coefIndex(n: number, m: number): number {
  return (n * (n + 1)) / 2 + m;
}

/** Length of a coefficient array holding degrees 0..nmax: (nmax+1)(nmax+2)/2. */
export function coefCount(nmax: number): number {
  return ((nmax + 1) * (nmax + 2)) / 2;
}

/** Radii beyond which the high degrees of a main field are negligible (optional truncation). */
import type { MainFieldCoefficients } from './coefficients';
import { coefIndex } from './layout';

/**
 * rCut[n] (RE) such that for r ≥ rCut[n] the degrees n..N together contribute at most
 * relTol × B0/r³ (B0/r³ bounds the dipole field from below). Bound per degree:
 * |B_n| ≤ √2 (n+1) Σm √(g²+h²) r^−(n+2), from the Schmidt bounds |P_n^m| ≤ 1 and
 * |dP_n^m/dθ|, |m P_n^m / sin θ| ≤ √(n(n+1)/2) ≤ (n+1)/√2 (derived for m = 0 from
 * dP_n^0/dθ = −√(n(n+1)/2) P_n^1; for m ≥ 1 checked by brute force over θ for n ≤ 13).
 * relTol = 0 gives rCut = ∞ (no truncation).
 */
export function truncationRadii(c: MainFieldCoefficients, relTol: number): Float64Array {
  const N = c.nmax;
  const rCut = new Float64Array(N + 2).fill(Number.POSITIVE_INFINITY);
  if (!(relTol > 0) || N < 2) return rCut;
  const b0 = Math.hypot(c.g[1], c.g[2], c.h[2]);
  const K = new Float64Array(N + 1);
  for (let n = 2; n <= N; n++) {
    let sum = 0;
    for (let m = 0; m <= n; m++) sum += Math.hypot(c.g[coefIndex(n, m)], c.h[coefIndex(n, m)]);
    K[n] = Math.SQRT2 * (n + 1) * sum;
  }
  const excess = (n: number, r: number): number => {
    let e = 0;
    for (let j = n; j <= N; j++) e += K[j] * Math.pow(r, -(j - 1));
    return e - relTol * b0;
  };
  for (let n = 2; n <= N; n++) {
    if (excess(n, 1) <= 0) { rCut[n] = 1; continue; }
    let lo = 1, hi = 2;
    while (excess(n, hi) > 0 && hi < 1e6) hi *= 2;
    for (let i = 0; i < 60; i++) {
      const mid = 0.5 * (lo + hi);
      if (excess(n, mid) > 0) lo = mid; else hi = mid;
    }
    rCut[n] = hi;
  }
  // Keep rCut non-increasing in n so dropping degree n implies dropping all above it.
  for (let n = N - 1; n >= 2; n--) rCut[n] = Math.max(rCut[n], rCut[n + 1]);
  return rCut;
}

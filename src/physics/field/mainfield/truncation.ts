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
  return cutRadii(K, N, relTol * b0, rCut);
}

/**
 * Largest field of degree n anywhere on the reference sphere, nT:
 * |B_n| ≤ √((n+1)(2n+1)) · √(Σm g²+h²) (Cauchy–Schwarz with the addition theorem for Schmidt
 * semi-normalised functions, Σm (P_n^m)² = 1, and its gradient form Σm |∇₁(P_n^m cos mφ)|² +
 * |∇₁(P_n^m sin mφ)|² = n(n+1) (Unsöld's theorem); derived, and checked by sampling in
 * test/physics/field/mainfield/truncation.test.ts). Beyond r the bound falls as r^−(n+2).
 */
export function degreeBoundsNt(c: MainFieldCoefficients): Float64Array {
  const N = c.nmax;
  const u = new Float64Array(N + 1);
  for (let n = 1; n <= N; n++) {
    let ss = 0;
    for (let m = 0; m <= n; m++) {
      const g = c.g[coefIndex(n, m)], h = m === 0 ? 0 : c.h[coefIndex(n, m)];
      ss += g * g + h * h;
    }
    u[n] = Math.sqrt((n + 1) * (2 * n + 1) * ss);
  }
  return u;
}

/**
 * κ, the relative field tolerance per radian of footpoint tolerance: degrees ≥ n are dropped
 * where their summed bound is below κ · tol(rad) · B0/r³. A direction error δ along a line moves
 * the footpoint by about ∫ δ ds weighted by the flux-tube narrowing (≈ r^−3/2), so the footpoint
 * error is of order the relative tolerance; the constant is set by measurement: with κ = 1 the
 * largest footpoint difference against the full synthesis was 1.6e-4°–1.9e-4° for a 0.001°
 * tolerance over 320–380 random lines from invented sites and dates 1950–2029
 * (test/physics/field/mainfield/accelerated-trace.test.ts); κ = 5 gave up to 1.45e-3° on a
 * stretched nightside line (35 RE long, near the open–closed boundary, where every small
 * change of the field is amplified) for only ~7 % less synthesis work.
 */
export const FOOTPOINT_REL_PER_RAD = 1;

/**
 * rCut[n] for a footpoint tolerance (degrees of arc on the ground): degrees ≥ n are summed
 * only below rCut[n]. Uses the sharper per-degree bound of degreeBoundsNt.
 */
export function footpointTruncationRadii(c: MainFieldCoefficients, footpointTolDeg: number, relPerRad = FOOTPOINT_REL_PER_RAD): Float64Array {
  const N = c.nmax;
  const rCut = new Float64Array(N + 2).fill(Number.POSITIVE_INFINITY);
  if (!(footpointTolDeg > 0) || N < 2) return rCut;
  const relTol = relPerRad * footpointTolDeg * (Math.PI / 180);
  const b0 = Math.hypot(c.g[1], c.g[2], c.h[2]);
  const U = degreeBoundsNt(c);
  return cutRadii(U, N, relTol * b0, rCut);
}

/**
 * Bisection for rCut[n]: Σ_{j ≥ n} U_j r^−(j−1) = limit (U_j the degree bound at r = 1), then made
 * non-increasing in n so dropping degree n implies dropping all above it.
 */
function cutRadii(U: Float64Array, N: number, limit: number, rCut: Float64Array): Float64Array {
  const excess = (n: number, r: number): number => {
    let e = 0;
    for (let j = n; j <= N; j++) e += U[j] * Math.pow(r, -(j - 1));
    return e - limit;
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
  for (let n = N - 1; n >= 2; n--) rCut[n] = Math.max(rCut[n], rCut[n + 1]);
  return rCut;
}

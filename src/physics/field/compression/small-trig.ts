/**
 * sin and cos for the small arguments met inside the magnetopause (|κy|, |κz|
 * ≲ 1.4 with κ = 0.35/r0): Taylor series to u¹⁷ / u¹⁸, truncation error
 * < 1e-13 for |u| ≤ 1.6 (derived from the next term); Math.* beyond.
 * Cheaper than Math.sin/Math.cos, which dominate the compression evaluation.
 */
export function sinSmall(u: number): number {
  if (u > 1.6 || u < -1.6) return Math.sin(u);
  const v = u * u;
  return u * (1 + v * (-1 / 6 + v * (1 / 120 + v * (-1 / 5040 + v * (1 / 362880 + v * (-1 / 39916800 + v * (1 / 6227020800 + v * (-1 / 1307674368000 + v * (1 / 355687428096000)))))))));
}

/** cos for small arguments; see sinSmall. */
export function cosSmall(u: number): number {
  if (u > 1.6 || u < -1.6) return Math.cos(u);
  const v = u * u;
  return 1 + v * (-1 / 2 + v * (1 / 24 + v * (-1 / 720 + v * (1 / 40320 + v * (-1 / 3628800 + v * (1 / 479001600 + v * (-1 / 87178291200 + v * (1 / 20922789888000 + v * (-1 / 6402373705728000)))))))));
}

/**
 * Dense linear least squares min‖A x − b‖₂ by Householder QR (Golub & Van Loan,
 * Matrix Computations, 4th ed., §5.2 and §5.3) with column equilibration (each
 * column scaled to unit 2-norm first, §5.3.7). A is column-major m × n, m ≥ n.
 */

export interface LeastSquaresInfo {
  /** max|R_ii| / min|R_ii| of the column-scaled problem: a cheap lower bound on its condition number. */
  conditionEstimate: number;
  /** ‖A x − b‖₂ of the solution (from the QR-transformed right-hand side). */
  residualNorm: number;
}

/**
 * Solves in place: `a` (column-major, m·n) and `b` (length m) are overwritten;
 * the solution is written to x (length n). Columns that are exactly zero get x = 0.
 */
export function leastSquaresQr(a: Float64Array, b: Float64Array, m: number, n: number, x: Float64Array): LeastSquaresInfo {
  if (m < n) throw new RangeError(`leastSquaresQr: need at least as many rows (${m}) as columns (${n})`);
  const scale = new Float64Array(n);
  for (let j = 0; j < n; j++) {
    let s = 0;
    const o = j * m;
    for (let i = 0; i < m; i++) s += a[o + i] * a[o + i];
    s = Math.sqrt(s);
    const inv = s > 0 ? 1 / s : 0;
    scale[j] = inv;
    for (let i = 0; i < m; i++) a[o + i] *= inv;
  }
  const diag = new Float64Array(n);
  for (let k = 0; k < n; k++) {
    const ok = k * m;
    let norm = 0;
    for (let i = k; i < m; i++) norm += a[ok + i] * a[ok + i];
    norm = Math.sqrt(norm);
    if (norm === 0) {
      diag[k] = 0;
      continue;
    }
    // Householder vector v = a_k − α e_k with α = −sign(a_kk)‖a_k‖ (no cancellation).
    const alpha = a[ok + k] > 0 ? -norm : norm;
    a[ok + k] -= alpha;
    let vtv = 0;
    for (let i = k; i < m; i++) vtv += a[ok + i] * a[ok + i];
    const beta = 2 / vtv;
    for (let j = k + 1; j < n; j++) {
      const oj = j * m;
      let d = 0;
      for (let i = k; i < m; i++) d += a[ok + i] * a[oj + i];
      d *= beta;
      for (let i = k; i < m; i++) a[oj + i] -= d * a[ok + i];
    }
    let d = 0;
    for (let i = k; i < m; i++) d += a[ok + i] * b[i];
    d *= beta;
    for (let i = k; i < m; i++) b[i] -= d * a[ok + i];
    diag[k] = alpha;
  }
  // Back substitution R x = Qᵀb (upper triangle above the diagonal is in a, diagonal in diag).
  let dmax = 0;
  let dmin = Infinity;
  for (let k = n - 1; k >= 0; k--) {
    const rkk = diag[k];
    if (rkk === 0) {
      x[k] = 0;
      continue;
    }
    let s = b[k];
    for (let j = k + 1; j < n; j++) s -= a[j * m + k] * x[j];
    x[k] = s / rkk;
    const ad = Math.abs(rkk);
    if (ad > dmax) dmax = ad;
    if (ad < dmin) dmin = ad;
  }
  let res = 0;
  for (let i = n; i < m; i++) res += b[i] * b[i];
  for (let j = 0; j < n; j++) x[j] *= scale[j];
  return { conditionEstimate: dmin > 0 ? dmax / dmin : Infinity, residualNorm: Math.sqrt(res) };
}

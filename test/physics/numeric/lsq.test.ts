import { describe, it } from 'vitest';
import { expectAtMost, expectClose } from '../../helpers';
import { leastSquaresQr } from '../../../src/physics/numeric/lsq';

describe('Householder least squares (Golub & Van Loan §5.3)', () => {
  it('fits a line to (0,0), (1,1), (2,1): slope 1/2, intercept 1/6, residual √(1/6) (closed form, derived)', () => {
    // Columns: [1, t] (column-major).
    const a = new Float64Array([1, 1, 1, 0, 1, 2]);
    const b = new Float64Array([0, 1, 1]);
    const x = new Float64Array(2);
    const info = leastSquaresQr(a, b, 3, 2, x);
    expectClose(x[0], 1 / 6, 1e-15, 'intercept');
    expectClose(x[1], 0.5, 1e-15, 'slope');
    expectClose(info.residualNorm, Math.sqrt(1 / 6), 1e-15, 'residual norm');
  });

  it('recovers exact coefficients of a badly scaled consistent system (column scaling)', () => {
    const m = 40, n = 6;
    const a = new Float64Array(m * n);
    // Column j is scaled by 10^(3j−6); the coefficients undo it so every column contributes O(1).
    const truth = [3e6, -2e3, 0.5, 7e-3, -1e-6, 4e-9];
    const b = new Float64Array(m);
    for (let i = 0; i < m; i++) {
      const t = i / (m - 1);
      for (let j = 0; j < n; j++) a[j * m + i] = Math.pow(t, j) * Math.pow(10, 3 * j - 6);
      for (let j = 0; j < n; j++) b[i] += a[j * m + i] * truth[j];
    }
    const x = new Float64Array(n);
    const info = leastSquaresQr(a, b, m, n, x);
    for (let j = 0; j < n; j++) expectClose(x[j], truth[j], 5e-12 * Math.abs(truth[j]), `coefficient ${j} (measured rel. error ≤ 1.3e-12)`);
    expectAtMost(info.conditionEstimate, 300, 'condition estimate after column scaling (monomials t^0..t^5 on [0,1]; measured 239, so the 10^15 column scales were removed)');
  });

  it('equals the one-column-at-a-time Householder QR to the bit (blocked update; every remainder of 4 columns; Golub & Van Loan Alg. 5.2.1 written out below)', () => {
    let seed = 12345;
    const rnd = (): number => { seed = (seed * 16807) % 2147483647; return seed / 2147483647 - 0.5; };
    for (const [m, n] of [[9, 1], [9, 2], [12, 3], [12, 4], [30, 5], [30, 6], [40, 7], [60, 11], [548, 26], [548, 43]]) {
      const a = new Float64Array(m * n).map(rnd);
      const b = new Float64Array(m).map(rnd);
      if (n >= 7) a.fill(0, 2 * m, 3 * m); // an exactly zero column (x = 0 there)
      const want = new Float64Array(n), got = new Float64Array(n);
      const ref = referenceQr(a.slice(), b.slice(), m, n, want);
      const info = leastSquaresQr(a.slice(), b.slice(), m, n, got);
      for (let j = 0; j < n; j++) {
        if (!Object.is(got[j], want[j])) throw new Error(`${m}×${n}: x[${j}] = ${got[j]}, one column at a time ${want[j]}`);
      }
      if (info.conditionEstimate !== ref.conditionEstimate || info.residualNorm !== ref.residualNorm) throw new Error(`${m}×${n}: condition or residual differs`);
    }
  });
});

/** The plain algorithm (column equilibration, then one reflection applied to one column at a time, then b). */
function referenceQr(a: Float64Array, b: Float64Array, m: number, n: number, x: Float64Array): { conditionEstimate: number; residualNorm: number } {
  const scale = new Float64Array(n);
  for (let j = 0; j < n; j++) {
    let s = 0;
    for (let i = 0; i < m; i++) s += a[j * m + i] * a[j * m + i];
    s = Math.sqrt(s);
    scale[j] = s > 0 ? 1 / s : 0;
    for (let i = 0; i < m; i++) a[j * m + i] *= scale[j];
  }
  const diag = new Float64Array(n);
  for (let k = 0; k < n; k++) {
    const ok = k * m;
    let norm = 0;
    for (let i = k; i < m; i++) norm += a[ok + i] * a[ok + i];
    norm = Math.sqrt(norm);
    if (norm === 0) continue;
    const alpha = a[ok + k] > 0 ? -norm : norm;
    a[ok + k] -= alpha;
    let vtv = 0;
    for (let i = k; i < m; i++) vtv += a[ok + i] * a[ok + i];
    const beta = 2 / vtv;
    for (let j = k + 1; j < n; j++) {
      let d = 0;
      for (let i = k; i < m; i++) d += a[ok + i] * a[j * m + i];
      d *= beta;
      for (let i = k; i < m; i++) a[j * m + i] -= d * a[ok + i];
    }
    let d = 0;
    for (let i = k; i < m; i++) d += a[ok + i] * b[i];
    d *= beta;
    for (let i = k; i < m; i++) b[i] -= d * a[ok + i];
    diag[k] = alpha;
  }
  let dmax = 0, dmin = Infinity;
  for (let k = n - 1; k >= 0; k--) {
    if (diag[k] === 0) { x[k] = 0; continue; }
    let s = b[k];
    for (let j = k + 1; j < n; j++) s -= a[j * m + k] * x[j];
    x[k] = s / diag[k];
    dmax = Math.max(dmax, Math.abs(diag[k]));
    dmin = Math.min(dmin, Math.abs(diag[k]));
  }
  let res = 0;
  for (let i = n; i < m; i++) res += b[i] * b[i];
  for (let j = 0; j < n; j++) x[j] *= scale[j];
  return { conditionEstimate: dmin > 0 ? dmax / dmin : Infinity, residualNorm: Math.sqrt(res) };
}

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
});

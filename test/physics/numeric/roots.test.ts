import { describe, it, expect } from 'vitest';
import { bisectBoundary, illinoisRoot } from '../../../src/physics/numeric/roots';
import { expectClose } from '../../helpers';

describe('bisectBoundary (analytic boundaries)', () => {
  it('finds x = √2 as the edge of {x : x² < 2} to the tolerance (analytic root √2)', () => {
    const root = bisectBoundary(0, 3, 1e-9, (x) => x * x < 2);
    expectClose(root, Math.SQRT2, 0.5e-9, 'bisection edge of x² < 2');
  });

  it('finds the cube root of 2 from a wide bracket (analytic 2^(1/3))', () => {
    const root = bisectBoundary(-10, 10, 1e-6, (x) => x * x * x < 2);
    expectClose(root, Math.cbrt(2), 0.5e-6, 'bisection edge of x³ < 2');
  });

  it('calls the predicate once per halving, in order (probes may record samples)', () => {
    const seen: number[] = [];
    bisectBoundary(0, 1, 0.125, (x) => { seen.push(x); return x < 0.3; });
    // [0,1] → 0.5 (fails) → [0,0.5] → 0.25 (holds) → [0.25,0.5] → 0.375 (fails) → [0.25,0.375], width 0.125.
    expect(seen).toEqual([0.5, 0.25, 0.375]);
  });

  it('returns the midpoint at once when the bracket is already within the tolerance', () => {
    let calls = 0;
    const root = bisectBoundary(1, 1.001, 0.01, () => { calls++; return true; });
    expect(calls).toBe(0);
    expectClose(root, 1.0005, 1e-15, 'midpoint of a narrow bracket');
  });
});

describe('illinoisRoot (analytic roots)', () => {
  it('x² − 2 on [0, 3]: √2 to well within the tolerance, in few evaluations', () => {
    let n = 0;
    const g = (x: number) => { n++; return x * x - 2; };
    const root = illinoisRoot(g, 0, g(0), 3, g(3), 1e-6);
    expectClose(root, Math.SQRT2, 2e-10, 'Illinois root of x² − 2 (analytic √2)'); // measured 1.0e-10
    expect(n).toBeLessThanOrEqual(19); // measured 19 evaluations with the two end values (one probe placed across the root to close the bracket)
  });

  it('exp(x) − 3 on [0, 2]: ln 3 (analytic)', () => {
    const g = (x: number) => Math.exp(x) - 3;
    const root = illinoisRoot(g, 0, g(0), 2, g(2), 1e-8);
    expectClose(root, Math.log(3), 1e-11, // measured 4.3e-12
      'Illinois root of eˣ − 3 (analytic ln 3)');
  });

  it('a strongly curved function (x¹⁰ − 0.5 on [0, 1]) still converges: the Illinois halving keeps plain regula falsi from stalling', () => {
    let n = 0;
    const g = (x: number) => { n++; return Math.pow(x, 10) - 0.5; };
    const root = illinoisRoot(g, 0, g(0), 1, g(1), 1e-7);
    expectClose(root, Math.pow(0.5, 0.1), 2e-8, 'Illinois root of x¹⁰ − 0.5 (analytic 0.5^(1/10))'); // measured 1.4e-8
    expect(n).toBeLessThanOrEqual(27); // measured 27 evaluations with the two end values
  });

  it('undefined (NaN) values above the root count as the high side: bisects back to the root of x − 1 defined only below 1.5', () => {
    const g = (x: number) => (x < 1.5 ? x - 1 : NaN);
    const root = illinoisRoot(g, 0, g(0), 4, NaN, 1e-6);
    expectClose(root, 1, 5e-7, 'root of x − 1 with g undefined beyond 1.5 (analytic 1)'); // measured 4.8e-7 (bisection, half the tolerance)
  });

  it('a flat stretch around the root ((x − 1)³/1000, steep beyond 2): the answer lies within the tolerance of the analytic root 1', () => {
    const g = (x: number) => Math.pow(x - 1, 3) * 1e-3 + (x > 2 ? (x - 2) * 5 : 0);
    const root = illinoisRoot(g, 0, g(0), 3, g(3), 0.01);
    expectClose(root, 1, 0.002, 'Illinois root on a flat stretch (analytic 1)'); // measured 1.0e-3 (the secant-step stop gave 6.1e-3)
  });

  it('stops at the tolerance when the bracket is already narrow (midpoint)', () => {
    let calls = 0;
    const root = illinoisRoot(() => { calls++; return 0; }, 2, -1, 2.001, 1, 0.01);
    expect(calls).toBe(0);
    expectClose(root, 2.0005, 1e-15, 'midpoint of a narrow bracket');
  });
});

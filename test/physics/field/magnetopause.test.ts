import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { expectAtMost, expectClose } from '../../helpers';
import { InputError } from '../../../src/physics/errors';
import {
  isInsideMagnetopause,
  magnetopauseNormal,
  magnetopausePoint,
  pdynFromPlasma,
  pdynFromPlasmaNominal,
  shueMagnetopause,
  shueRadius,
} from '../../../src/physics/field/magnetopause';

function expectInputError(fn: () => unknown, field: string, text: RegExp): void {
  try {
    fn();
  } catch (e) {
    expect(e, 'an InputError').toBeInstanceOf(InputError);
    expect((e as InputError).field).toBe(field);
    expect((e as Error).message).toMatch(text);
    return;
  }
  throw new Error(`expected an InputError for ${field}`);
}

describe('Shue et al. (1998) surface', () => {
  it('reproduces the worked values of references §3 (Shue et al. 1998, eqs. 1, 10, 11)', () => {
    const a = shueMagnetopause(2, 0);
    expectClose(a.r0Re, 10.2519, 5e-5, 'r0, Dp 2 nPa, Bz 0');
    expectClose(a.alpha, 0.58965, 5e-6, 'alpha, Dp 2, Bz 0');
    expectClose(shueRadius(a, Math.PI / 2), 15.43, 5e-3, 'r(90°), Dp 2, Bz 0');
    const b = shueMagnetopause(10, -10);
    expectClose(b.r0Re, 6.9102, 5e-5, 'r0, Dp 10, Bz −10');
    expectClose(b.alpha, 0.68592, 5e-6, 'alpha, Dp 10, Bz −10');
    expectClose(shueRadius(b, Math.PI / 2), 11.12, 5e-3, 'r(90°), Dp 10, Bz −10');
    expectClose(shueRadius(b, 0), b.r0Re, 1e-15, 'r(0) = r0 (eq. 1)');
  });

  it('warns outside the fitted range (Shue et al. 1997: −18 < Bz < 15 nT, 0.5 < Dp < 8.5 nPa) but does not refuse', () => {
    expect(shueMagnetopause(2, 0).warnings).toEqual([]);
    expect(shueMagnetopause(8.4, 14.9).warnings).toEqual([]);
    const hi = shueMagnetopause(10, 0);
    expect(hi.warnings.length).toBe(1);
    expect(hi.warnings[0]).toMatch(/0\.5\.\.8\.5 nPa/);
    const bz = shueMagnetopause(2, -20);
    expect(bz.warnings.length).toBe(1);
    expect(bz.warnings[0]).toMatch(/−18\.\.15 nT/);
    expect(shueMagnetopause(0.3, 20).warnings.length).toBe(2);
    expect(Number.isFinite(shueMagnetopause(0.3, 20).r0Re)).toBe(true);
  });

  it('refuses non-physical input with InputError naming the field and the allowed range', () => {
    for (const p of [0, -1, Number.NaN, Infinity, -Infinity]) expectInputError(() => shueMagnetopause(p, 0), 'pdynNpa', /> 0 nPa/);
    for (const b of [1001, -1001, Number.NaN, Infinity]) expectInputError(() => shueMagnetopause(2, b), 'bzNt', /−1000\.\.1000 nT/);
    for (const b of [1e4, Number.NaN, -Infinity]) expectInputError(() => shueMagnetopause(2, 0, b), 'byNt', /−1000\.\.1000 nT/);
  });

  it('isInsideMagnetopause agrees with r(θ) (property, fast-check; axisymmetric about x_GSM)', () => {
    fc.assert(
      fc.property(
        fc.double({ min: 0.3, max: 20, noNaN: true }),
        fc.double({ min: -25, max: 25, noNaN: true }),
        fc.double({ min: 0, max: 3.1, noNaN: true }),
        fc.double({ min: -Math.PI, max: Math.PI, noNaN: true }),
        fc.double({ min: 0.01, max: 3, noNaN: true }),
        (p, bz, theta, phi, f) => {
          if (Math.abs(f - 1) < 1e-6) return;
          const mp = shueMagnetopause(p, bz);
          const r = f * shueRadius(mp, theta);
          const x = r * Math.cos(theta), y = r * Math.sin(theta) * Math.cos(phi), z = r * Math.sin(theta) * Math.sin(phi);
          expect(isInsideMagnetopause(mp, x, y, z)).toBe(f < 1);
        },
      ),
      { numRuns: 2000 },
    );
    const mp = shueMagnetopause(2, 0);
    expect(isInsideMagnetopause(mp, 0, 0, 0)).toBe(true);
    expect(isInsideMagnetopause(mp, -1000, 0, 0)).toBe(true);
    expect(isInsideMagnetopause(mp, 10.3, 0, 0)).toBe(false);
  });

  it('magnetopausePoint lies on the surface at the requested direction', () => {
    const mp = shueMagnetopause(3, -4);
    const p = new Float64Array(3);
    for (const th of [0, 0.4, 1.2, 2.0, 2.6]) {
      for (const ph of [0, 1, 2.5, -2]) {
        magnetopausePoint(p, mp, th, ph);
        const r = Math.hypot(p[0], p[1], p[2]);
        expectClose(r, shueRadius(mp, th), 1e-12 * r, `|P| = r(θ) at θ ${th}`);
        expectClose(Math.acos(p[0] / r), th, 1e-7, `polar angle θ ${th}`);
        if (th > 0) expectClose(Math.atan2(p[2], p[1]), ph, 1e-12, `azimuth from +y toward +z, φ ${ph}`);
      }
    }
  });

  it('magnetopauseNormal is the unit gradient of F = r − r(θ): orthogonal to both surface tangents, outward (derived)', () => {
    const n = new Float64Array(3);
    const a = new Float64Array(3), b = new Float64Array(3), c = new Float64Array(3);
    let worst = 0;
    for (const [pd, bz] of [[2, 0], [10, -10], [0.6, 12]]) {
      const mp = shueMagnetopause(pd, bz);
      for (const th of [0.05, 0.7, 1.5, 2.2, 2.8]) {
        for (const ph of [0.3, 1.9, -2.4]) {
          magnetopausePoint(c, mp, th, ph);
          magnetopauseNormal(n, mp, c[0], c[1], c[2]);
          expectClose(Math.hypot(n[0], n[1], n[2]), 1, 1e-14, 'unit length');
          const h = 1e-6;
          magnetopausePoint(a, mp, th + h, ph);
          magnetopausePoint(b, mp, th - h, ph);
          const tt = [a[0] - b[0], a[1] - b[1], a[2] - b[2]];
          magnetopausePoint(a, mp, th, ph + h);
          magnetopausePoint(b, mp, th, ph - h);
          const tp = [a[0] - b[0], a[1] - b[1], a[2] - b[2]];
          const dt = Math.abs(n[0] * tt[0] + n[1] * tt[1] + n[2] * tt[2]) / Math.hypot(...tt);
          const dp = Math.abs(n[0] * tp[0] + n[1] * tp[1] + n[2] * tp[2]) / Math.hypot(...tp);
          worst = Math.max(worst, dt, dp);
          // Outward: a point slightly along n is outside, slightly against n inside.
          expect(isInsideMagnetopause(mp, c[0] + 1e-3 * n[0], c[1] + 1e-3 * n[1], c[2] + 1e-3 * n[2])).toBe(false);
          expect(isInsideMagnetopause(mp, c[0] - 1e-3 * n[0], c[1] - 1e-3 * n[1], c[2] - 1e-3 * n[2])).toBe(true);
          // The normal depends only on the direction of (x, y, z).
          const m2 = new Float64Array(3);
          magnetopauseNormal(m2, mp, 0.5 * c[0], 0.5 * c[1], 0.5 * c[2]);
          expectClose(m2[0], n[0], 1e-15, 'normal independent of distance (x)');
        }
      }
    }
    expectAtMost(worst, 2e-9, 'max |n·tangent| (central differences, h = 1e-6)');
    const mp = shueMagnetopause(2, 0);
    magnetopauseNormal(n, mp, 5, 0, 0);
    expect(Array.from(n)).toEqual([1, 0, 0]);
    // On the −x axis the Shue normal points radially away from the axis (θ → π limit).
    magnetopauseNormal(n, mp, -5, 0, 0);
    expectClose(n[0], 0, 1e-15, 'normal on the −x axis has no x part');
  });
});

describe('dynamic pressure from density and speed (references §3)', () => {
  it('is m_p n v² for protons, × (1 + 4 Na/Np) with alphas (OMNI definition), 2.0e-6 n v² nominal', () => {
    // 1.6726e-6 nPa per cm⁻³ (km/s)² (references §3; proton mass CODATA 2018).
    expectClose(pdynFromPlasma(5, 400), 1.6726e-6 * 5 * 400 * 400, 2e-5 * 1.338, 'protons, n 5, v 400');
    expectClose(pdynFromPlasma(5, 400, 0.04), 1.6726e-6 * 5 * 400 * 400 * 1.16, 2e-5 * 1.55, 'with 4 % alphas');
    expectClose(pdynFromPlasma(5, 400, 0), pdynFromPlasma(5, 400), 0, 'ratio 0 = protons only');
    expectClose(pdynFromPlasmaNominal(5, 400), 1.6, 1e-15, '2.0e-6·n·v², n 5, v 400');
  });

  it('validates density, speed and the alpha ratio', () => {
    for (const n of [0, -2, Number.NaN, Infinity]) expectInputError(() => pdynFromPlasma(n, 400), 'densityCm3', /> 0 cm⁻³/);
    for (const v of [0, -400, Number.NaN]) expectInputError(() => pdynFromPlasmaNominal(5, v), 'speedKms', /> 0 km\/s/);
    for (const a of [-0.1, 2, Number.NaN]) expectInputError(() => pdynFromPlasma(5, 400, a), 'alphaRatio', /0\.\.1/);
  });
});

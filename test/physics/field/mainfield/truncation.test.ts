import { describe, it, expect } from 'vitest';
import { expectAtMost, expectBetween } from '../../../helpers';
import { igrfCoefficients, type MainFieldCoefficients } from '../../../../src/physics/field/mainfield/coefficients';
import { prepareMainField } from '../../../../src/physics/field/mainfield/synthesis';
import { coefIndex, coefCount } from '../../../../src/physics/field/mainfield/layout';
import { degreeBoundsNt, footpointTruncationRadii, truncationRadii } from '../../../../src/physics/field/mainfield/truncation';
import { InputError } from '../../../../src/physics/errors';

/** The degree-n part of a coefficient set alone (all other degrees zero). */
function degreeOnly(c: MainFieldCoefficients, n: number): MainFieldCoefficients {
  const g = new Float64Array(coefCount(c.nmax)), h = new Float64Array(coefCount(c.nmax));
  for (let m = 0; m <= n; m++) {
    g[coefIndex(n, m)] = c.g[coefIndex(n, m)];
    h[coefIndex(n, m)] = c.h[coefIndex(n, m)];
  }
  return { ...c, g, h };
}

describe('per-degree field bound (addition theorem + Unsöld, derived)', () => {
  it('bounds |B_n| on the reference sphere and is within 2.5× of the largest sampled value', () => {
    for (const year of [1965, 2025.5]) {
      const c = igrfCoefficients(year);
      const U = degreeBoundsNt(c);
      const b = new Float64Array(3);
      const ratios: number[] = [];
      for (let n = 1; n <= 13; n++) {
        if (U[n] === 0) continue; // IGRF before 2000 stops at degree 10 (higher coefficients are 0)
        const f = prepareMainField(degreeOnly(c, n));
        let worst = 0;
        // 181 × 360 grid on r = 1 (1° spacing): the sampled maximum is a lower bound of the true maximum.
        for (let i = 0; i <= 180; i++) {
          const th = (i * Math.PI) / 180;
          for (let j = 0; j < 360; j++) {
            f.evaluateSpherical(b, 1, th, (j * Math.PI) / 180);
            worst = Math.max(worst, Math.hypot(b[0], b[1], b[2]));
          }
        }
        // Measured: bound / sampled max 1.22–2.17 over both years and all degrees.
        expectAtMost(worst, U[n] * (1 + 1e-12), `|B_${n}| sampled max vs bound, ${year}`);
        expectBetween(U[n] / worst, 1, 2.5, `bound / sampled max, degree ${n}, ${year}`);
        ratios.push(U[n] / worst);
      }
      expect(ratios.length).toBe(year < 2000 ? 10 : 13);
    }
  });

  it('is never looser than the per-order bound used by truncationRelTol', () => {
    const c = igrfCoefficients(2025);
    // Equal limits: the sharper bound gives smaller or equal cut radii.
    const b0 = Math.hypot(c.g[1], c.g[2], c.h[2]);
    const loose = truncationRadii(c, 1e-5);
    const sharp = footpointTruncationRadii(c, (1e-5 * 180) / Math.PI, 1);
    for (let n = 2; n <= 13; n++) expectAtMost(sharp[n], loose[n], `rCut[${n}] sharper bound vs per-order bound`);
    expect(b0 > 0).toBe(true);
  });
});

describe('footpointTolDeg option', () => {
  const c = igrfCoefficients(2025);
  it('keeps degree 13 at the ground and drops degrees with distance', () => {
    const f = prepareMainField(c, { footpointTolDeg: 0.001 });
    expect(f.effectiveDegree(1)).toBe(13);
    const d2 = f.effectiveDegree(2), d5 = f.effectiveDegree(5), d20 = f.effectiveDegree(20);
    expect(d2 < 13 && d5 < d2 && d20 <= d5 && d20 >= 2, `degrees at 2, 5, 20 RE: ${d2}, ${d5}, ${d20}`).toBe(true);
    // The bound guarantee: |ΔB| ≤ FOOTPOINT_REL_PER_RAD · tol(rad) · B0/r³ (FOOTPOINT_REL_PER_RAD = 1).
    const full = prepareMainField(c);
    const a = new Float64Array(3), e = new Float64Array(3);
    const b0 = Math.hypot(c.g[1], c.g[2], c.h[2]);
    let worst = 0;
    for (let k = 0; k < 400; k++) {
      const r = 1 + 0.05 * k, th = 0.37 + 2.3 * ((k * 0.618) % 1), ph = 6.28 * ((k * 0.414) % 1);
      const x = r * Math.sin(th) * Math.cos(ph), y = r * Math.sin(th) * Math.sin(ph), z = r * Math.cos(th);
      f.evaluateGeo(a, x, y, z);
      full.evaluateGeo(e, x, y, z);
      worst = Math.max(worst, Math.hypot(a[0] - e[0], a[1] - e[1], a[2] - e[2]) / (b0 / (r * r * r)));
    }
    expectAtMost(worst, (0.001 * Math.PI) / 180, 'truncated vs full, |ΔB| / (B0/r³)');
  });

  it('rejects bad values with a message naming the option and the range', () => {
    expect(() => prepareMainField(c, { footpointTolDeg: -1 })).toThrow(InputError);
    expect(() => prepareMainField(c, { footpointTolDeg: Number.NaN })).toThrow('footpointTolDeg: expected a number of degrees in 0..0.1, got NaN');
    expect(() => prepareMainField(c, { footpointTolDeg: 0.001, truncationRelTol: 1e-7 })).toThrow('footpointTolDeg: give either truncationRelTol or footpointTolDeg, not both');
  });
});

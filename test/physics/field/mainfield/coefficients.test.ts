import { describe, it, expect } from 'vitest';
import { expectClose } from '../../../helpers';
import { igrfCoefficients, applySecularVariation } from '../../../../src/physics/field/mainfield/coefficients';
import { centredDipole } from '../../../../src/physics/field/mainfield/centred-dipole';
import { coefIndex, coefCount } from '../../../../src/physics/field/mainfield/layout';
import { IGRF14_TABLE } from '../../../../src/physics/field/mainfield/igrf14-table';
import { InputError } from '../../../../src/physics/errors';
import { DEG_PER_RAD } from '../../../../src/physics/constants';

const G10 = coefIndex(1, 0), G11 = coefIndex(1, 1);

describe('IGRF-14 coefficients by date', () => {
  it('dipole terms 2020 and 2025 and the 2025–30 SV (references §2, IGRF-14 IAGA 2024)', () => {
    const c20 = igrfCoefficients(2020);
    expect([c20.g[G10], c20.g[G11], c20.h[G11]]).toEqual([-29403.41, -1451.37, 4653.35]);
    const c25 = igrfCoefficients(2025);
    expect([c25.g[G10], c25.g[G11], c25.h[G11]]).toEqual([-29350.0, -1410.3, 4545.5]);
    // SV from one year's step (2026 − 2025), rounding only.
    const c26 = igrfCoefficients(2026);
    expectClose(c26.g[G10] - c25.g[G10], 12.6, 1e-9, 'SV g10 nT/yr');
    expectClose(c26.g[G11] - c25.g[G11], 10.0, 1e-9, 'SV g11 nT/yr');
    expectClose(c26.h[G11] - c25.h[G11], -21.5, 1e-9, 'SV h11 nT/yr');
  });

  it('centred dipole pole and B0 2020 / 2025 (references §2, derived; arctan per Hapgood 1997)', () => {
    const d20 = centredDipole(igrfCoefficients(2020));
    expectClose(d20.poleLatDeg, 80.587, 5e-4, '2020 pole latitude °N');
    expectClose(d20.poleLonDeg, -72.677, 5e-4, '2020 pole longitude °E');
    expectClose(d20.b0Nt, 29804.7, 0.05, '2020 B0 nT');
    const d25 = centredDipole(igrfCoefficients(2025));
    expectClose(d25.poleLatDeg, 80.789, 5e-4, '2025 pole latitude °N');
    expectClose(d25.poleLonDeg, -72.763, 5e-4, '2025 pole longitude °E');
    expectClose(d25.b0Nt, 29733.4, 0.05, '2025 B0 nT');
    // Axis is a unit vector consistent with the quoted lat/lon (derived).
    const a = d25.axisGeo;
    expectClose(Math.hypot(a[0], a[1], a[2]), 1, 1e-15, 'axis norm');
    expectClose(Math.asin(a[2]) * DEG_PER_RAD, d25.poleLatDeg, 1e-9, 'axis z vs pole latitude');
    expectClose(Math.atan2(a[1], a[0]) * DEG_PER_RAD, d25.poleLonDeg, 1e-9, 'axis lon vs pole longitude');
  });

  it('mid-epoch values are the average of the neighbouring epochs (IGRF linear interpolation rule)', () => {
    const len = coefCount(13);
    for (const [y0, y1] of [[1900, 1905], [1995, 2000], [2020, 2025]]) {
      const a = igrfCoefficients(y0), b = igrfCoefficients(y1), mid = igrfCoefficients((y0 + y1) / 2);
      for (let k = 1; k < len; k++) {
        expectClose(mid.g[k], (a.g[k] + b.g[k]) / 2, 1e-9, `g[${k}] at ${(y0 + y1) / 2}`);
        expectClose(mid.h[k], (a.h[k] + b.h[k]) / 2, 1e-9, `h[${k}] at ${(y0 + y1) / 2}`);
      }
    }
    // 1/5 of the way: linear weight (IGRF rule).
    const a = igrfCoefficients(2015), b = igrfCoefficients(2020), q = igrfCoefficients(2016);
    expectClose(q.g[G10], 0.8 * a.g[G10] + 0.2 * b.g[G10], 1e-9, 'g10 at 2016');
  });

  it('2030.0 equals 2025 + 5×SV for every term (IGRF-14 SV rule; the README cross-check with the published 2030 column)', () => {
    const c30 = igrfCoefficients(2030);
    const e = IGRF14_TABLE.epochs.length - 1;
    for (let k = 1; k < coefCount(13); k++) {
      expectClose(c30.g[k], IGRF14_TABLE.g[e][k] + 5 * IGRF14_TABLE.svG[k], 1e-9, `g[${k}] 2030`);
      expectClose(c30.h[k], IGRF14_TABLE.h[e][k] + 5 * IGRF14_TABLE.svH[k], 1e-9, `h[${k}] 2030`);
    }
    // Published IGRF-14 2030 dipole terms (2025 + 5 × SV, references §2 numbers).
    expectClose(c30.g[G10], -29287.0, 1e-9, 'g10 2030');
    expectClose(c30.h[G11], 4438.0, 1e-9, 'h11 2030');
  });

  it('truncates to the requested degree and records provenance', () => {
    const c = igrfCoefficients(2024.5, 8);
    expect(c.nmax).toBe(8);
    expect(c.g.length).toBe(coefCount(8));
    expect(c.epochYear).toBe(2024.5);
    expect(c.source).toBe('IGRF-14 at 2024.5');
  });

  it('refuses dates outside 1900.0–2030.0 and bad degrees with InputError', () => {
    expect(() => igrfCoefficients(2031.25)).toThrow(InputError);
    expect(() => igrfCoefficients(2031.25)).toThrow('time: IGRF-14 covers 1900.0–2030.0; got 2031.25');
    expect(() => igrfCoefficients(1899.5)).toThrow('time: IGRF-14 covers 1900.0–2030.0; got 1899.5');
    expect(() => igrfCoefficients(Number.NaN)).toThrow('time: expected a finite number, got NaN');
    expect(() => igrfCoefficients(2020, 14)).toThrow('nmax: expected an integer degree 1..13, got 14');
    expect(() => igrfCoefficients(2020, 0)).toThrow(InputError);
    expect(() => igrfCoefficients(1900)).not.toThrow();
    expect(() => igrfCoefficients(2030)).not.toThrow();
  });

  it('applySecularVariation checks array lengths', () => {
    const z = new Float64Array(3);
    expect(() => applySecularVariation(z, z, z, z, 2, 2025, 2026, 'x')).toThrow(/need 6 entries for degree 2/);
  });
});

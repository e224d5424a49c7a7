import { describe, it } from 'vitest';
import { expectClose } from '../helpers';
import { bearingDeg, centralAngleDeg, destination, visibilityAngleDeg, visibilityDistanceKm, visibilityLimit } from '../../src/app/lib/visibility';

describe('visibility ring geometry', () => {
  // references §7 (derived): γ = acos(RE cos e / (RE + h)) − e. The printed values carry 3 decimals (deg) and
  // 1 decimal (km); the largest measured difference from them is 6.0e-4° and 0.062 km, hence the tolerances.
  const cases = [
    { h: 110, e: 0, deg: 10.571, km: 1175.5 },
    { h: 110, e: 10, deg: 4.513, km: 501.8 },
    { h: 250, e: 0, deg: 15.795, km: 1756.3 },
    { h: 250, e: 10, deg: 8.626, km: 959.2 },
  ];
  for (const c of cases) {
    it(`h = ${c.h} km, e = ${c.e}°: γ = ${c.deg}° (references §7)`, () => {
      expectClose(visibilityAngleDeg(c.h, c.e), c.deg, 7e-4, 'central angle, deg');
      expectClose(visibilityDistanceKm(c.h, c.e), c.km, 0.07, 'ground distance, km');
    });
  }

  it('γ shrinks as the minimum elevation rises and vanishes at the zenith limit (derived)', () => {
    expectClose(visibilityAngleDeg(110, 90), 0, 1e-9, 'γ at e = 90°');
    expectClose(visibilityAngleDeg(0, 0), 0, 1e-9, 'γ for an arc on the ground');
  });

  it('destination / bearing / central angle agree (spherical trigonometry round trip)', () => {
    for (const [la, lo, b, d] of [[65, 20, 200, 10.571], [-70, 150, 15, 8.6], [80, -170, 90, 20]]) {
      const [la2, lo2] = destination(la, lo, b, d);
      expectClose(centralAngleDeg(la, lo, la2, lo2), d, 1e-9, 'distance to the destination, deg');
      expectClose(bearingDeg(la, lo, la2, lo2), b, 1e-9, 'initial bearing, deg');
    }
  });

  it('offsets each boundary point by γ straight away from the pole (meridian case, derived)', () => {
    // Pole at the geographic pole: moving away is due south, so latitude drops by exactly γ.
    const g = visibilityAngleDeg(110, 10);
    const pts = visibilityLimit([67, 70, NaN], [0, 120, 5], 90, 0, g);
    expectClose(pts[0][1], 67 - g, 1e-9, 'lat of the first limit point');
    expectClose(pts[0][0], 0, 1e-9, 'lon of the first limit point');
    expectClose(pts[1][1], 70 - g, 1e-9, 'lat of the second limit point');
    expectClose(Number.isNaN(pts[2][0]) ? 1 : 0, 1, 0, 'a missing boundary point stays missing');
  });

  it('south hemisphere: away from the south pole is northward', () => {
    const g = visibilityAngleDeg(250, 0);
    const [p] = visibilityLimit([-68], [40], -90, 0, g);
    expectClose(p[1], -68 + g, 1e-9, 'lat moves north by γ');
  });
});

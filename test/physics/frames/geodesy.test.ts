import { describe, expect, it } from 'vitest';
import { expectAtMost, expectClose } from '../../helpers';
import { ellipsoidRadiusRe, geodeticFromGeo, geoFromGeodetic } from '../../../src/physics/frames/geodesy';
import { RE_KM, RAD_PER_DEG, DEG_PER_RAD } from '../../../src/physics/constants';

/** WGS84 semi-major and semi-minor axes, km (NIMA TR8350.2, Tables 3.1 and 3.3). */
const A_KM = 6378.137;
const B_KM = 6356.7523142;
const F = 1 / 298.257223563;

function normKm(v: Float64Array): number {
  return Math.hypot(v[0], v[1], v[2]) * RE_KM;
}

describe('WGS84 geodetic ↔ GEO (NIMA TR8350.2)', () => {
  const p = new Float64Array(3);

  it('equator radius 6378.137 km, pole radius 6356.752 km', () => {
    expectClose(normKm(geoFromGeodetic(p, 0, 0, 0)), A_KM, 1e-9, 'equatorial radius (km)');
    expectClose(normKm(geoFromGeodetic(p, 0, 123, 0)), A_KM, 1e-9, 'equatorial radius at 123°E (km)');
    expectClose(normKm(geoFromGeodetic(p, 90, 0, 0)), B_KM, 1e-7, 'polar radius (km)');
    expectClose(p[2] * RE_KM, B_KM, 1e-7, 'north pole z (km)');
    expectClose(normKm(geoFromGeodetic(p, -90, 0, 0)), B_KM, 1e-7, 'south polar radius (km)');
    expectClose(ellipsoidRadiusRe(0, 0) * RE_KM, A_KM, 1e-9, 'ellipsoidRadiusRe at the equator');
    expectClose(ellipsoidRadiusRe(1, 0) * RE_KM, B_KM, 1e-7, 'ellipsoidRadiusRe at the pole');
  });

  it('geodetic 45° on the ellipsoid has geocentric latitude atan((1−f)² tan 45°) = 44.8076° (derived)', () => {
    geoFromGeodetic(p, 45, 10, 0);
    const gc = Math.atan2(p[2], Math.hypot(p[0], p[1])) * DEG_PER_RAD;
    expectClose(gc, Math.atan((1 - F) * (1 - F)) * DEG_PER_RAD, 1e-12, 'geocentric latitude (deg)');
    expectClose(gc, 44.8076, 1e-4, 'geocentric latitude, 4 decimals (deg)');
    expectClose(Math.atan2(p[1], p[0]) * DEG_PER_RAD, 10, 1e-12, 'longitude unchanged');
  });

  it('a height is measured along the ellipsoid normal (derived)', () => {
    const q = new Float64Array(3);
    for (const lat of [-67, 0, 30, 89]) {
      geoFromGeodetic(p, lat, 40, 0);
      geoFromGeodetic(q, lat, 40, 1000);
      const d = [(q[0] - p[0]) * RE_KM, (q[1] - p[1]) * RE_KM, (q[2] - p[2]) * RE_KM];
      expectClose(Math.hypot(d[0], d[1], d[2]), 1000, 1e-9, `offset length at ${lat}° (km)`);
      const n = [Math.cos(lat * RAD_PER_DEG) * Math.cos(40 * RAD_PER_DEG), Math.cos(lat * RAD_PER_DEG) * Math.sin(40 * RAD_PER_DEG), Math.sin(lat * RAD_PER_DEG)];
      expectClose((d[0] * n[0] + d[1] * n[1] + d[2] * n[2]) / 1000, 1, 1e-12, `offset along the normal at ${lat}°`);
    }
  });

  it('round trips to 1e-12° and 1e-9 km (measured 1.4e-14°, 1.5e-11 km), −90..90°, heights −1..40000 km', () => {
    let worstAng = 0;
    let worstH = 0;
    for (let lat = -90; lat <= 90; lat += 2.5) {
      for (const lon of [-179.5, -72.763, 0, 33.3, 151]) {
        for (const h of [-1, 0, 0.5, 110, 1000, 6371.2, 20200, 40000]) {
          geoFromGeodetic(p, lat, lon, h);
          const g = geodeticFromGeo(p[0], p[1], p[2]);
          worstAng = Math.max(worstAng, Math.abs(g.latDeg - lat));
          if (Math.abs(lat) < 90) worstAng = Math.max(worstAng, Math.abs(g.lonDeg - lon));
          worstH = Math.max(worstH, Math.abs(g.altKm - h));
        }
      }
    }
    expectAtMost(worstAng, 1e-12, 'worst latitude/longitude error (deg)');
    expectAtMost(worstH, 1e-9, 'worst height error (km)');
  });

  it('the poles and the equator invert exactly', () => {
    // b = a(1 − f) exactly (TR8350.2 prints it rounded to 0.1 mm).
    const bExact = A_KM * (1 - F);
    const np = geodeticFromGeo(0, 0, bExact / RE_KM);
    expect(np.latDeg).toBe(90);
    expectClose(np.altKm, 0, 1e-9, 'north-pole height (km)');
    const sp = geodeticFromGeo(0, 0, -(bExact + 100) / RE_KM);
    expect(sp.latDeg).toBe(-90);
    expectClose(sp.altKm, 100, 1e-9, 'south-pole height (km)');
    const eq = geodeticFromGeo(0, -(A_KM + 110) / RE_KM, 0);
    expectClose(eq.latDeg, 0, 1e-12, 'equator latitude');
    expectClose(eq.lonDeg, -90, 1e-12, 'equator longitude');
    expectClose(eq.altKm, 110, 1e-9, 'equator height (km)');
  });

  it('ellipsoidRadiusRe is exact on the ellipsoid and within 10 m of the height for |h| ≤ 1000 km (its documented bound; measured 4.9 m)', () => {
    const q = new Float64Array(3);
    let worstM = 0;
    for (let lat = -89; lat <= 89; lat += 4) {
      geoFromGeodetic(q, lat, 0, 0);
      const r = Math.hypot(q[0], q[1], q[2]);
      expectClose(ellipsoidRadiusRe(q[2] / r, 0), r, 1e-14, `surface radius at geodetic ${lat}°`);
      for (const h of [-1, 110, 1000]) {
        const sinGc = q[2] / r;
        const rr = ellipsoidRadiusRe(sinGc, h);
        const cosGc = Math.sqrt(1 - sinGc * sinGc);
        const g = geodeticFromGeo(rr * cosGc, 0, rr * sinGc);
        worstM = Math.max(worstM, Math.abs(g.altKm - h) * 1000);
      }
    }
    expectAtMost(worstM, 10, 'worst height error of ellipsoidRadiusRe (m)');
  });
});

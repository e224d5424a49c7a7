/**
 * The CGM graticule (src/physics/mapping/cgm-graticule.ts), checked against
 * things outside the builder:
 * (1) centred dipole: CGM coordinates are the dipole (MAG) coordinates (derived:
 *     on a dipole line cos²λ = r/R, references §1), so every circle is the MAG
 *     latitude circle and every meridian the MAG meridian of that MLT, found here
 *     directly by rotating MAG → GEO and solving for the height on the ellipsoid;
 * (2) IGRF-14: every sample converted back by the engine's forward converter
 *     (cgmOf, the published definition; references §6) has the line's CGM latitude
 *     and MLT;
 * (3) near the dipole equator samples are undefined and the lines break there.
 */
import { describe, it, expect } from 'vitest';
import { prepareModel } from '../../../src/physics/field/model';
import { cgmGraticuleOf, type CgmGraticule } from '../../../src/physics/mapping/cgm-graticule';
import { cgmOf } from '../../../src/physics/mapping/cgm-model';
import { geoFromMag, magFromGeo, mltOfGeo } from '../../../src/physics/frames/rotations';
import { geodeticFromGeo, geoFromGeodetic } from '../../../src/physics/frames/geodesy';
import { DEG_PER_RAD, RAD_PER_DEG } from '../../../src/physics/constants';
import { InputError } from '../../../src/physics/errors';
import { expectClose } from '../../helpers';

const TIME = '2026-03-14T21:30:00Z';
const dipoleModel = prepareModel({ time: TIME, internal: 'dipole', magnetopause: false, tail: false });
const igrfModel = prepareModel({ time: TIME, internal: 'igrf', magnetopause: false, tail: false });

/** Geodetic point at `heightKm` straight out along the MAG direction (lat, lon): bisection on the radius. */
function magPointGeodetic(latDeg: number, lonDeg: number, heightKm: number): { latDeg: number; lonDeg: number } {
  const la = latDeg * RAD_PER_DEG, lo = lonDeg * RAD_PER_DEG;
  const u = geoFromMag(new Float64Array(3), [Math.cos(la) * Math.cos(lo), Math.cos(la) * Math.sin(lo), Math.sin(la)], dipoleModel.frames);
  let a = 0.9, b = 1.2;
  for (let i = 0; i < 80; i++) {
    const m = 0.5 * (a + b);
    if (geodeticFromGeo(m * u[0], m * u[1], m * u[2]).altKm < heightKm) a = m; else b = m;
  }
  const g = geodeticFromGeo(a * u[0], a * u[1], a * u[2]);
  return { latDeg: g.latDeg, lonDeg: g.lonDeg };
}

const wrap180 = (d: number) => ((d % 360) + 540) % 360 - 180;

describe('CGM graticule with the centred dipole = the MAG graticule (derived: CGM = dipole coordinates in a dipole, references §1)', () => {
  for (const heightKm of [0, 110]) {
    const g = cgmGraticuleOf(dipoleModel, { heightKm });
    it(`${heightKm} km: circles at MAG latitude ±40…80° and MAG longitude every 5°, to 1e-3°`, () => {
      const circles = g.lines.filter((l) => l.kind === 'latitude');
      expect(circles.length).toBe(10);
      let worst = 0;
      for (const l of circles) {
        for (let i = 0; i < l.latDeg.length - 1; i++) {
          const want = magPointGeodetic(l.value, i * 5, heightKm);
          worst = Math.max(worst, Math.abs(l.latDeg[i] - want.latDeg), Math.abs(wrap180(l.lonDeg[i] - want.lonDeg)) * Math.cos(want.latDeg * RAD_PER_DEG));
        }
        expect(l.latDeg[l.latDeg.length - 1]).toBe(l.latDeg[0]);
      }
      // Measured 6.6e-5° (the converter's own tracing error); the brief's bound is 1e-3°.
      expectClose(worst, 0, 1e-3, 'largest distance from the MAG graticule (deg)');
    });
    it(`${heightKm} km: meridians at the MAG longitude of their MLT (mltOfGeo), to 1e-3°`, () => {
      const sun = magFromGeo(new Float64Array(3), dipoleModel.frames.sunGeo, dipoleModel.frames);
      const sunLon = Math.atan2(sun[1], sun[0]) * DEG_PER_RAD;
      const meridians = g.lines.filter((l) => l.kind === 'mlt');
      expect(meridians.length).toBe(16);
      let worst = 0;
      const u = new Float64Array(3);
      for (const l of meridians) {
        const lon = sunLon + (l.value - 12) * 15;
        // The meridian's MAG longitude has that MLT (the engine's MLT, an independent rotation chain).
        const la0 = 0;
        geoFromMag(u, [Math.cos(la0) * Math.cos(lon * RAD_PER_DEG), Math.cos(la0) * Math.sin(lon * RAD_PER_DEG), 0], dipoleModel.frames);
        const mlt = mltOfGeo(dipoleModel.frames, u[0], u[1], u[2]);
        expectClose(Math.min(Math.abs(mlt - l.value), 24 - Math.abs(mlt - l.value)), 0, 1e-9, `MLT of the meridian ${l.value} h`);
        for (let i = 0; i < l.latDeg.length; i++) {
          const want = magPointGeodetic(l.cgmLatDeg[i], lon, heightKm);
          worst = Math.max(worst, Math.abs(l.latDeg[i] - want.latDeg), Math.abs(wrap180(l.lonDeg[i] - want.lonDeg)) * Math.cos(want.latDeg * RAD_PER_DEG));
        }
      }
      expectClose(worst, 0, 1e-3, 'largest distance from the MAG meridians (deg)');
    });
  }
});

describe('CGM graticule with IGRF-14: samples converted back by the engine\'s converter (cgmOf; references §6)', () => {
  const g: CgmGraticule = cgmGraticuleOf(igrfModel, { heightKm: 110 });
  const conv = cgmOf(igrfModel);
  it('every sample of the ±60° circles has CGM latitude ±60° (to 0.01°; measured ≤ 9.9e-5°)', () => {
    const sixty = g.lines.filter((l) => l.kind === 'latitude' && Math.abs(l.value) === 60);
    expect(sixty.length).toBe(2);
    for (const l of sixty) {
      for (let i = 0; i < l.latDeg.length; i++) {
        const r = conv.fromGeodetic(l.latDeg[i], l.lonDeg[i], 110);
        expect(r.defined).toBe(true);
        if (r.defined) expectClose(r.latDeg, l.value, 1.5e-4, `CGM latitude of sample ${i} of the ${l.value}° circle`);
        if (r.defined) expectClose(Math.abs(wrap180(r.lonDeg - i * 5)), 0, 1e-3, `CGM longitude of sample ${i}`);
      }
    }
  });
  it('every meridian sample has its MLT (CGM) and its CGM latitude', () => {
    let n = 0;
    for (const l of g.lines.filter((x) => x.kind === 'mlt')) {
      for (let i = 0; i < l.latDeg.length; i += 3) {
        const r = conv.fromGeodetic(l.latDeg[i], l.lonDeg[i], 110);
        expect(r.defined).toBe(true);
        if (!r.defined) continue;
        const d = Math.abs(r.mltH - l.value);
        expectClose(Math.min(d, 24 - d), 0, 1e-4, `MLT (CGM) of a sample of the ${l.value} h meridian (${l.hemisphere})`);
        expectClose(r.latDeg, l.cgmLatDeg[i], 1.5e-4, 'CGM latitude of a meridian sample');
        n++;
      }
    }
    expect(n).toBeGreaterThan(100);
  });
  it('meridians stop below the highest defined CGM latitude (apex ≤ 60 RE)', () => {
    expect(g.maxLatDeg).toBeGreaterThan(82);
    expect(g.maxLatDeg).toBeLessThan(83);
    for (const l of g.lines.filter((x) => x.kind === 'mlt')) expect(Math.abs(l.cgmLatDeg[l.cgmLatDeg.length - 1])).toBeLessThan(g.maxLatDeg);
    expect(g.undefinedSamples).toBe(0);
  });
});

describe('CGM graticule near the dipole equator', () => {
  it('1° and 2° circles with IGRF break where the undefined band lies between samples; what is drawn converts back (cgmOf)', () => {
    const g = cgmGraticuleOf(igrfModel, { heightKm: 0, latitudesDeg: [1, 2], mltHours: [] });
    const conv = cgmOf(igrfModel);
    const a = new Float64Array(3), b = new Float64Array(3);
    let breaks = 0, segments = 0;
    for (const l of g.lines) {
      for (let i = 0; i < l.latDeg.length; i++) {
        if (!Number.isFinite(l.latDeg[i])) { expect(Number.isNaN(l.lonDeg[i])).toBe(true); breaks++; continue; }
        const r = conv.fromGeodetic(l.latDeg[i], l.lonDeg[i], 0);
        expect(r.defined).toBe(true);
        if (r.defined) expectClose(r.latDeg, l.value, 1e-3, 'CGM latitude of a sample near the equator');
        if (i === 0 || !Number.isFinite(l.latDeg[i - 1])) continue;
        // A drawn segment: its midpoint is defined and on the line (within 0.5°).
        geoFromGeodetic(a, l.latDeg[i - 1], l.lonDeg[i - 1], 0);
        geoFromGeodetic(b, l.latDeg[i], l.lonDeg[i], 0);
        const m = geodeticFromGeo((a[0] + b[0]) / 2, (a[1] + b[1]) / 2, (a[2] + b[2]) / 2);
        const rm = conv.fromGeodetic(m.latDeg, m.lonDeg, 0);
        expect(rm.defined).toBe(true);
        if (rm.defined) expectClose(rm.latDeg, l.value, 0.5, 'CGM latitude of a drawn segment\'s midpoint');
        segments++;
      }
    }
    // Measured: 17 breaks in the 4 lines (292 samples; midpoint undefined or off the line).
    expect(breaks).toBeGreaterThan(0);
    expect(segments).toBeGreaterThan(100);
  });
  it('refuses a height outside 0–5000 km and a step that does not divide 360°, naming the input', () => {
    expect(() => cgmGraticuleOf(dipoleModel, { heightKm: -3 })).toThrow(InputError);
    expect(() => cgmGraticuleOf(dipoleModel, { heightKm: -3 })).toThrow(/heightKm/);
    expect(() => cgmGraticuleOf(dipoleModel, { heightKm: 0, lonStepDeg: 7 })).toThrow(/lonStepDeg/);
  });
});

import { describe, expect, it } from 'vitest';
import { createEngineApi } from '../../workers/engine-api';
import { prepareModel } from '../../src/physics/field/model';
import { cgmPair } from '../../src/physics/mapping';
import { cgmLatText, cgmSentence } from '../../src/app/panels/answer';
import { expectClose } from '../helpers';

const C = { time: '2025-03-20T22:00:00Z', pdynNpa: 4, bzNt: -8, byNt: 0, magnetopause: true, imfEfficiency: 0.2, tail: true };
const SITES = [
  { name: 'Loam Ridge', latDeg: 58, lonDeg: 12 },
  { name: 'Skerra Fell', latDeg: 69.5, lonDeg: -20 },
  { name: 'Pelling Sound', latDeg: -64, lonDeg: 140 },
  { name: 'Brannock Quay', latDeg: -5, lonDeg: -60 },
];

/** WGS84 geodetic → geocentric GEO unit direction and radius (RE of 6371.2 km); the ellipsoid's standard formulas, written out here. */
function geoOfGeodetic(latDeg: number, lonDeg: number): { x: number; y: number; z: number } {
  const a = 6378.137, f = 1 / 298.257223563, e2 = f * (2 - f);
  const p = (latDeg * Math.PI) / 180, l = (lonDeg * Math.PI) / 180;
  const n = a / Math.sqrt(1 - e2 * Math.sin(p) ** 2);
  return { x: (n * Math.cos(p) * Math.cos(l)) / 6371.2, y: (n * Math.cos(p) * Math.sin(l)) / 6371.2, z: (n * (1 - e2) * Math.sin(p)) / 6371.2 };
}

describe('sites channel: corrected geomagnetic (CGM) position of each site', () => {
  it('centred dipole: CGM latitude equals the site\'s dipole latitude (apex = r/cos²λ, so arccos√(r/apex) = |λ|: derived), MLT (CGM) = MLT (MAG)', async () => {
    const api = createEngineApi();
    const c = { ...C, internal: 'dipole' as const };
    const scene = await api.scene(1, c, { mltHours: [0], magLatDeg: [70] });
    const ax = scene.frames.axisGeo;
    const r = await api.sites(2, c, { altKm: 0, conjugateAltKm: 0 }, SITES.slice(0, 3));
    expect(r.error).toBeUndefined();
    for (const [i, s] of SITES.slice(0, 3).entries()) {
      const g = geoOfGeodetic(s.latDeg, s.lonDeg);
      const magLat = (Math.asin((ax[0] * g.x + ax[1] * g.y + ax[2] * g.z) / Math.hypot(g.x, g.y, g.z)) * 180) / Math.PI;
      const cg = r.sites[i].cgm!;
      expect(cg.defined, s.name).toBe(true);
      if (!cg.defined) continue;
      expectClose(cg.latDeg, magLat, 1e-4, `${s.name} CGM latitude vs dipole latitude (deg)`);
      expectClose(cg.mltH, r.sites[i].mltHours, 1e-4, `${s.name} MLT (CGM) vs MLT (MAG) at the ground (h)`);
    }
  });

  it('IGRF-14: the same values as the CLI\'s helper (cgmPair at the site\'s height) and "undefined near the dipole equator" for a site on it', async () => {
    const api = createEngineApi();
    const c = { ...C, internal: 'igrf' as const };
    const r = await api.sites(1, c, { altKm: 110, conjugateAltKm: 110 }, SITES);
    const m = prepareModel(c);
    for (const [i, s] of SITES.slice(0, 3).entries()) {
      const want = cgmPair(m, s.latDeg, s.lonDeg, 0).atAlt;
      expect(r.sites[i].cgm).toEqual(want);
    }
    const eq = r.sites[3].cgm!;
    expect(eq.defined).toBe(false);
    if (!eq.defined) expect(eq.reason).toMatch(/undefined near the dipole equator/);
    expect(cgmLatText(eq)).toBe('undefined');
    expect(cgmSentence(eq)).toMatch(/^Corrected geomagnetic latitude: undefined near the dipole equator/);
  });

  it('words: two decimals in the table, MLT (CGM) as hh:mm in the sentence, a dash when not computed', () => {
    expect(cgmLatText({ defined: true, latDeg: 64.256, lonDeg: 100, mltH: 23.5, apexRe: 5.3 })).toBe('64.26');
    expect(cgmLatText(undefined)).toBe('–');
    expect(cgmSentence({ defined: true, latDeg: -61.04, lonDeg: 100, mltH: 24.25, apexRe: 4.3 })).toBe('Corrected geomagnetic latitude -61.0°, MLT (CGM) 00:15.');
  });
});

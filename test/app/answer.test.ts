import { describe, expect, it } from 'vitest';
import { expectClose } from '../helpers';
import { compassPhrase, compassPoint, groundDistanceKm, latLonText, lineSentence, lookSentence, ovalPlace, utcText } from '../../src/app/panels/answer';
import type { SiteResult } from '../../workers/protocol';
import { RE_KM } from '../../src/physics/constants';

/** A site result with only the fields the wording reads (the rest neutral). */
function site(magLatDeg: number, oc: number | null, eq: number | null, extra: Partial<SiteResult> = {}): SiteResult {
  return {
    name: 'Tarnwick Rise', latDeg: magLatDeg, lonDeg: 10, type: 'closed', conjugate: null, footpoints: [], equatorRe: 6, lShell: 6,
    mltHours: 23.5, magLatDeg, ovalRelation: 'unknown', sky: null, boundaries: { openClosedMagLatDeg: oc, equatorwardMagLatDeg: eq }, lineGeo: new Float64Array(0),
    ...extra,
  };
}

describe('answer wording', () => {
  it('names the 16 compass points with 22.5° sectors centred on each (the standard 16-wind rose)', () => {
    expect([0, 22.5, 45, 67.5, 90, 180, 270, 337.5].map(compassPoint)).toEqual(['N', 'NNE', 'NE', 'ENE', 'E', 'S', 'W', 'NNW']);
    expect(compassPoint(11.24)).toBe('N');
    expect(compassPoint(11.26)).toBe('NNE');
    expect(compassPoint(359)).toBe('N');
    expect(compassPoint(-22.5)).toBe('NNW');
    expect(compassPhrase(22)).toBe('NNE (22° from north, eastward)');
  });

  it('puts a northern site south of the oval, with the edge north of it, in degrees of magnetic latitude', () => {
    const p = ovalPlace(site(63.8, 67.4, 64.9));
    expect(p.short).toBe('south of the oval');
    expect(p.sentence).toMatch(/equatorward edge is 1\.1° of magnetic latitude north of you/);
  });

  it('uses the southern hemisphere’s own terms: equatorward is north, poleward is south', () => {
    expect(ovalPlace(site(-60, -70, -65)).short).toBe('north of the oval');
    expect(ovalPlace(site(-60, -70, -65)).sentence).toMatch(/5\.0° of magnetic latitude south of you/);
    expect(ovalPlace(site(-75, -70, -65)).short).toBe('south of the oval');
    expect(ovalPlace(site(75, 70, 65)).short).toBe('north of the oval');
  });

  it('says inside only with both edges', () => {
    expect(ovalPlace(site(68, 70, 65)).short).toBe('inside the oval');
    const one = ovalPlace(site(68, 70, null));
    expect(one.short).not.toMatch(/inside/);
    expect(one.sentence).toMatch(/equatorward edge: not found, so whether you are inside the oval cannot be said/);
  });

  it('gives the engine’s reason for a missing edge when it has one', () => {
    const r = site(68, 70, null);
    (r.boundaries as Record<string, unknown>).equatorwardReason = 'source distance outside the magnetopause';
    expect(ovalPlace(r).sentence).toMatch(/equatorward edge: source distance outside the magnetopause/);
    expect(ovalPlace(site(68, null, null)).sentence).toMatch(/open–closed boundary: not found; equatorward edge: not found/);
  });

  it('describes line types and where to look', () => {
    expect(lineSentence(site(60, 70, 65))).toMatch(/closed/);
    expect(lineSentence(site(80, 70, 65, { type: 'open' }))).toMatch(/no conjugate point/);
    const s = site(60, 70, 65, { sky: { elevationDeg: 12.4, azimuthDeg: 22, distanceKm: 812.6, visible: true } });
    expect(lookSentence(s, 10)).toBe('Nearest oval point: look NNE (22° from north, eastward), 12° above the horizon; slant distance 813 km.');
    expect(lookSentence({ ...s, sky: { ...s.sky!, visible: false } }, 15)).toMatch(/below your 15° minimum elevation/);
  });

  it('measures ground distances on the sphere of radius RE (a quarter meridian is π/2·RE, derived)', () => {
    expectClose(groundDistanceKm(0, 0, 90, 0), (Math.PI / 2) * RE_KM, 1e-6, 'equator to pole (km)');
    expectClose(groundDistanceKm(60, 10, 60, 10), 0, 1e-9, 'same point (km)');
  });

  it('formats positions and 24-hour UTC times', () => {
    expect(latLonText(-59.086, 58.092)).toBe('59.09° S, 58.09° E');
    expect(latLonText(63.1, 208.8)).toBe('63.10° N, 151.20° W');
    expect(utcText('2025-03-20T22:00:00Z')).toBe('2025-03-20 22:00 UTC');
    expect(utcText('nonsense')).toBe('time not set');
  });
});

import { describe, expect, it } from 'vitest';
import { decodeUrlState, encodeUrlState, parseSiteParam, type UrlState } from '../../src/app/lib/urlState';
import { DEMO_SCENARIO } from '../../src/app/scenario';

const defaults: UrlState = { conditions: DEMO_SCENARIO.conditions, products: DEMO_SCENARIO.products, sites: DEMO_SCENARIO.sites };

describe('URL state', () => {
  it('round trips conditions, products and awkward site names', () => {
    const s: UrlState = {
      conditions: { ...defaults.conditions, time: '2024-11-02T03:15:00Z', pdynNpa: 12.5, bzNt: -17.25, byNt: 0, internal: 'igrf', magnetopause: false, imfEfficiency: 0.35, tiltDeg: -12 },
      products: { altPreset: 'custom', altKm: 175, sourceRe: 9.5, minElevationDeg: 5 },
      sites: [
        { name: 'Tarn & Ridge | north', latDeg: 71.25, lonDeg: -156.5 },
        { name: '<img src=x onerror=alert(1)>', latDeg: -66.1, lonDeg: 110.5 },
        { name: 'Ñuble "hut" =1+1', latDeg: 0, lonDeg: 179.999 },
      ],
    };
    const back = decodeUrlState(encodeUrlState(s), defaults);
    expect(back).toEqual(s);
  });

  it('round trips the presets by name', () => {
    const s: UrlState = { ...defaults, products: { ...defaults.products, altPreset: 'red', altKm: 250 } };
    const q = encodeUrlState(s);
    expect(new URLSearchParams(q).get('alt')).toBe('red');
    expect(decodeUrlState(q, defaults).products).toEqual(s.products);
  });

  it('falls back to defaults for malformed values instead of failing', () => {
    const d = decodeUrlState('?p=abc&bz=1e9&t=yesterday&int=foo&eps=2&alt=-5&site=bad&site=Good|10|20', defaults);
    expect(d.conditions.pdynNpa).toBe(defaults.conditions.pdynNpa);
    expect(d.conditions.bzNt).toBe(defaults.conditions.bzNt);
    expect(d.conditions.time).toBe(defaults.conditions.time);
    expect(d.conditions.internal).toBe(defaults.conditions.internal);
    expect(d.conditions.imfEfficiency).toBe(defaults.conditions.imfEfficiency);
    expect(d.products.altKm).toBe(defaults.products.altKm);
    expect(d.sites).toEqual([{ name: 'Good', latDeg: 10, lonDeg: 20 }]);
  });

  it('no site parameter keeps the default sites; an empty list stays empty only when asked', () => {
    expect(decodeUrlState('?p=2', defaults).sites).toEqual(defaults.sites);
  });

  it('parses site params with lon > 180 and rejects out-of-range latitudes', () => {
    expect(parseSiteParam('A|10|200')).toEqual({ name: 'A', latDeg: 10, lonDeg: -160 });
    expect(parseSiteParam('A|95|0')).toBeNull();
  });
});

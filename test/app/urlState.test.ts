import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { compressQuery, decodeUrlState, encodeUrlState, parseSiteParam, shareLink, type UrlState } from '../../src/app/lib/urlState';
import { DEMO_SCENARIO } from '../../src/app/scenario';
import { APP_LIMITS, APP_RANGES, inRange } from '../../src/io/app-inputs';

const defaults: UrlState = { conditions: DEMO_SCENARIO.conditions, products: DEMO_SCENARIO.products, sites: DEMO_SCENARIO.sites };

describe('URL state', () => {
  it('round trips conditions (storm inputs too), products and awkward site names', () => {
    const s: UrlState = {
      conditions: { ...defaults.conditions, time: '2024-11-02T03:15:00Z', pdynNpa: 12.5, bzNt: -17.25, byNt: 0, internal: 'igrf', magnetopause: false, imfEfficiency: 0.35, tiltDeg: -12, dstNt: -215, speedKms: 720 },
      products: { altPreset: 'custom', altKm: 175, conjugateAltKm: 0, sourceRe: 9.5, minElevationDeg: 5, minLatDeg: 35 },
      sites: [
        { name: 'Tarn & Ridge | north', latDeg: 71.25, lonDeg: -156.5 },
        { name: '<img src=x onerror=alert(1)>', latDeg: -66.1, lonDeg: 110.5 },
        { name: 'Ñuble "hut" =1+1', latDeg: 0, lonDeg: 179.999 },
      ],
    };
    const back = decodeUrlState(encodeUrlState(s), defaults);
    expect(back).toEqual({ ...s, maps: { cgmGraticule: false }, notices: [] });
  });

  it('round trips the presets by name, and unset optional values stay unset', () => {
    const s: UrlState = { ...defaults, products: { ...defaults.products, altPreset: 'red', altKm: 250 } };
    const q = encodeUrlState(s);
    expect(new URLSearchParams(q).get('alt')).toBe('red');
    expect(new URLSearchParams(q).has('dst')).toBe(false);
    const back = decodeUrlState(q, defaults);
    expect(back.products).toEqual(s.products);
    expect(back.conditions.dstNt).toBeNull();
    expect(back.products.sourceRe).toBeNull();
  });

  it('keeps the default for each refused value and names it in a notice (never swapped silently)', () => {
    const d = decodeUrlState('?p=abc&bz=1e9&t=yesterday&int=foo&eps=2&alt=-5&tilt=abc&site=bad&site=Good|10|20', defaults);
    expect(d.conditions.pdynNpa).toBe(defaults.conditions.pdynNpa);
    expect(d.conditions.bzNt).toBe(defaults.conditions.bzNt);
    expect(d.conditions.time).toBe(defaults.conditions.time);
    expect(d.conditions.internal).toBe(defaults.conditions.internal);
    expect(d.conditions.imfEfficiency).toBe(defaults.conditions.imfEfficiency);
    expect(d.conditions.tiltDeg).toBeNull();
    expect(d.products.altKm).toBe(defaults.products.altKm);
    expect(d.sites).toEqual([{ name: 'Good', latDeg: 10, lonDeg: 20 }]);
    const text = d.notices.join('\n');
    for (const k of ['p=', 'bz=', 't=', 'int=', 'eps=', 'alt=', 'tilt=']) expect(text, k).toContain(`(${k})`);
    expect(text).toMatch(/1 site in the link refused: site 1: expected name\|lat\|lon, got "bad"/);
  });

  it('refuses tilt=95, tilt= and p=NaN, bz=999 stays (inside the CLI range ±1000 nT), p=500&bz=-400 kept as the CLI would', () => {
    const d = decodeUrlState('?tilt=95&p=NaN', defaults);
    expect(d.conditions.tiltDeg).toBeNull();
    expect(d.notices.some((n) => n.includes('tilt='))).toBe(true);
    expect(d.notices.some((n) => n.includes('p='))).toBe(true);
    expect(decodeUrlState('?tilt=', defaults).conditions.tiltDeg).toBeNull();
    expect(decodeUrlState('?tilt=', defaults).notices.length).toBe(1);
    const e = decodeUrlState('?p=500&bz=-400', defaults);
    expect([e.conditions.pdynNpa, e.conditions.bzNt, e.notices]).toEqual([500, -400, []]);
  });

  it('refuses hex and exponent numbers like the command line refuses hex (0x3C, 6e1)', () => {
    const d = decodeUrlState('?p=0x3C&bz=6e1', defaults);
    expect([d.conditions.pdynNpa, d.conditions.bzNt]).toEqual([defaults.conditions.pdynNpa, defaults.conditions.bzNt]);
    expect(d.notices[0]).toMatch(/dynamic pressure \(p=\): expected a decimal number in 0.01..10000 nPa, got "0x3C"/);
  });

  it('reads a time without a zone as UTC and says so; refuses 30 February instead of rolling it over', () => {
    const d = decodeUrlState('?t=2024-02-10T12:30', defaults);
    expect(d.conditions.time).toBe('2024-02-10T12:30:00Z');
    expect(d.notices[0]).toMatch(/no zone; it is read as UTC/);
    const f = decodeUrlState('?t=2024-02-30T00:00Z', defaults);
    expect(f.conditions.time).toBe(defaults.conditions.time);
    expect(f.notices[0]).toMatch(/time \(t=\): expected an ISO 8601 time/);
    expect(decodeUrlState('?t=2024-03-20T01:00%2B02:00', defaults).conditions.time).toBe('2024-03-19T23:00:00Z');
  });

  it('holds the site-count and name-length limits and says what was not loaded', () => {
    const q = Array.from({ length: 2000 }, (_, i) => `site=${encodeURIComponent(`S${i}|${(i % 170) - 85}|${i % 360}`)}`).join('&');
    const d = decodeUrlState(q, defaults);
    expect(d.sites.length).toBe(APP_LIMITS.maxSites);
    expect(d.notices.join(' ')).toMatch(/names 2000 sites; the app holds at most 200, so 1800 were not loaded/);
    const long = decodeUrlState(`site=${'x'.repeat(100_000)}|10|10`, defaults);
    expect(long.sites).toEqual([]);
    expect(long.notices[0]).toMatch(/at most 80 characters, got 100000/);
  });

  it('parses site params with lon > 180 and refuses out-of-range latitudes', () => {
    expect(parseSiteParam('A|10|200')).toEqual({ ok: true, value: { name: 'A', latDeg: 10, lonDeg: -160 } });
    expect(parseSiteParam('A|95|0')).toEqual({ ok: false, message: 'site 1 latitude: expected a decimal number in -90..90 deg, got "95"' });
  });

  it('keeps 200-site share links under the safe size by compressing them (deflate-raw, base64url) and decodes them back', () => {
    // Sites spread over the globe with 4-decimal coordinates and 20-character names: a realistic worst case.
    let seed = 7;
    const rnd = () => ((seed = (seed * 16807) % 2147483647) / 2147483647);
    const sites = Array.from({ length: 200 }, (_, i) => ({ name: `Survey point ${String(i).padStart(3, '0')} ab`, latDeg: Math.round((rnd() * 180 - 90) * 1e4) / 1e4, lonDeg: Math.round((rnd() * 360 - 180) * 1e4) / 1e4 }));
    const s: UrlState = { ...defaults, sites };
    expect(`http://x/?${encodeUrlState(s)}`.length).toBeGreaterThan(APP_LIMITS.maxLinkChars);
    const l = shareLink('http://localhost:5173/', s);
    expect(l.compressed).toBe(true);
    expect(l.url).not.toBeNull();
    expect(l.url!.length).toBeLessThanOrEqual(APP_LIMITS.maxLinkChars);
    const back = decodeUrlState(new URL(l.url!).search, defaults);
    expect(back.sites).toEqual(sites);
    expect(back.notices).toEqual([]);
  });

  it('says when even the compressed link is too long (null url) and reports a damaged z= value', () => {
    const sites = Array.from({ length: 200 }, (_, i) => ({ name: Array.from({ length: 80 }, (_, k) => String.fromCharCode(0x4e00 + ((i * 97 + k * 31) % 5000))).join(''), latDeg: (i % 170) - 85 + 0.1234, lonDeg: i - 100 + 0.5678 }));
    const l = shareLink('http://h/', { ...defaults, sites });
    expect(l.url).toBeNull();
    expect(l.chars).toBeGreaterThan(APP_LIMITS.maxLinkChars);
    const d = decodeUrlState('?z=!!notbase64', defaults);
    expect(d.notices[0]).toMatch(/compressed state \(z=\) could not be read/);
    expect(decodeUrlState(compressQuery('p=4.5'), defaults).conditions.pdynNpa).toBe(4.5);
  });

  it('fuzz (fast-check, seeded): the decoder never throws and never exceeds a limit over random queries', () => {
    const keys = ['t', 'p', 'bz', 'by', 'int', 'mp', 'eps', 'tail', 'tilt', 'dst', 'v', 'alt', 'calt', 'src', 'minel', 'minlat', 'site', 'z', 'x'];
    const value = fc.oneof(fc.string(), fc.double().map(String), fc.constantFrom('0x3C', '6e1', 'NaN', 'Infinity', '', '2024-02-30', '1|2|3', 'a|b|c', '|||'), fc.string({ unit: 'binary' }));
    const query = fc.array(fc.tuple(fc.constantFrom(...keys), value), { maxLength: 40 }).map((kv) => kv.map(([k, v]) => `${k}=${encodeURIComponent(v)}`).join('&'));
    const raw = fc.string({ maxLength: 300 });
    fc.assert(fc.property(fc.oneof(query, raw), (q) => {
      const d = decodeUrlState(q, defaults);
      const c = d.conditions;
      expect(d.sites.length).toBeLessThanOrEqual(APP_LIMITS.maxSites);
      for (const s of d.sites) {
        expect([...s.name].length).toBeLessThanOrEqual(APP_LIMITS.maxNameChars);
        expect(inRange(s.latDeg, APP_RANGES.latDeg) && s.lonDeg >= -180 && s.lonDeg <= 180).toBe(true);
      }
      expect(inRange(c.pdynNpa, APP_RANGES.pdynNpa) && inRange(c.bzNt, APP_RANGES.imfNt) && inRange(c.byNt, APP_RANGES.imfNt)).toBe(true);
      expect(inRange(c.imfEfficiency, APP_RANGES.imfEfficiency)).toBe(true);
      expect(c.tiltDeg === null || inRange(c.tiltDeg!, APP_RANGES.tiltDeg)).toBe(true);
      expect(c.dstNt === null || inRange(c.dstNt!, APP_RANGES.dstNt)).toBe(true);
      expect(c.speedKms === null || inRange(c.speedKms!, APP_RANGES.speedKms)).toBe(true);
      expect(Number.isFinite(Date.parse(c.time))).toBe(true);
      expect(inRange(d.products.altKm, APP_RANGES.altKm) && inRange(d.products.minLatDeg, APP_RANGES.minLatDeg)).toBe(true);
      expect(d.products.sourceRe === null || inRange(d.products.sourceRe, APP_RANGES.sourceRe)).toBe(true);
    }), { seed: 20261203, numRuns: 600 });
  });
});

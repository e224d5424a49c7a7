/**
 * The polar maps' CGM grid on the app side: the link carries the option
 * (cgm=1), the worker channel's answer (in-process) and cache key, the
 * geometry breaks where CGM is undefined, the legend and the SVG export name
 * the grid. The graticule's numbers are checked in
 * test/physics/mapping/cgm-graticule.test.ts.
 */
import { describe, expect, it } from 'vitest';
import { decodeUrlState, encodeUrlState, type UrlState } from '../../src/app/lib/urlState';
import { DEMO_SCENARIO } from '../../src/app/scenario';
import { hemisphereGraticule, splitAtUndefined } from '../../src/app/lib/graticulePaths';
import { computeGraticule, graticuleKey, type GraticuleRequest } from '../../workers/channels/graticule';
import { mapLegend } from '../../src/app/panels/mapLegend';
import { mapsSvgDocument } from '../../src/app/panels/mapSvg';
import { MAP_STYLES } from '../../src/app/lib/palette';
import { prepareModel } from '../../src/physics/field/model';
import { cgmOf } from '../../src/physics/mapping';
import { expectClose } from '../helpers';
import { graticuleStore, graticuleView } from '../../src/app/lib/cgmGraticule';
import type { CgmGraticule, GraticuleLine } from '../../src/physics/mapping';

const defaults: UrlState = { conditions: DEMO_SCENARIO.conditions, products: DEMO_SCENARIO.products, sites: DEMO_SCENARIO.sites };

describe('CGM grid in the link', () => {
  it('cgm=1 round trips; off leaves no parameter; absent reads as off', () => {
    const on = encodeUrlState({ ...defaults, maps: { cgmGraticule: true } });
    expect(new URLSearchParams(on).get('cgm')).toBe('1');
    expect(decodeUrlState(on, defaults).maps).toEqual({ cgmGraticule: true });
    const off = encodeUrlState({ ...defaults, maps: { cgmGraticule: false } });
    expect(new URLSearchParams(off).has('cgm')).toBe(false);
    expect(decodeUrlState(off, defaults).maps).toEqual({ cgmGraticule: false });
  });
  it('a bad value keeps the default and says so', () => {
    const d = decodeUrlState('?cgm=yes', defaults);
    expect(d.maps.cgmGraticule).toBe(false);
    expect(d.notices.join(' ')).toContain('cgm=: expected 1 or 0, got "yes"');
  });
});

describe('CGM grid worker channel (in-process)', () => {
  const req: GraticuleRequest = { time: '2025-03-20T22:00:00Z', internal: 'dipole', tiltDeg: null, heightKm: 110 };
  it('keys by main field, time, tilt and height only', () => {
    expect(graticuleKey(req)).toBe('dipole|2025-03-20T22:00:00Z||110');
    expect(graticuleKey({ ...req, tiltDeg: 5 })).not.toBe(graticuleKey(req));
    expect(graticuleKey({ ...req, heightKm: 0 })).not.toBe(graticuleKey(req));
  });
  it('answers with the graticule at the requested height, both hemispheres', () => {
    const a = computeGraticule(req);
    expect(a.ok).toBe(true);
    if (!a.ok) return;
    expect(a.key).toBe(graticuleKey(req));
    expect(a.graticule.heightKm).toBe(110);
    expect(a.graticule.lines.filter((l) => l.hemisphere === 'south' && l.kind === 'latitude').map((l) => l.value)).toEqual([-40, -50, -60, -70, -80]);
    const h = hemisphereGraticule(a.graticule, 'north');
    expect(h.circles.coordinates.length).toBe(5);
    expect(h.meridians.coordinates.length).toBe(8);
    expect(h.labels.filter((l) => l.kind === 'latitude').map((l) => l.text)).toEqual(['40°', '50°', '60°', '70°', '80°']);
    expect(h.labels.filter((l) => l.kind === 'mlt').map((l) => l.text)).toEqual(['00 MLT', '06 MLT', '12 MLT', '18 MLT']);
  });
  it('a second time of the same date traces only the meridians; its circles convert back by cgmOf at that time within 3e-4°', () => {
    const first = computeGraticule({ ...req, internal: 'igrf', time: '2025-03-21T01:00:00Z' });
    const second = computeGraticule({ ...req, internal: 'igrf', time: '2025-03-21T23:30:00Z' });
    expect(first.ok && second.ok).toBe(true);
    if (!first.ok || !second.ok) return;
    expect(second.graticule.traces).toBeLessThan(first.graticule.traces / 2);
    // The circles were traced for 12:00 UTC: the main field's secular change in 11.5 h moves them (measured ≤ 2.4e-4°,
    // 1e-4° of it the converter's own tracing error).
    const conv = cgmOf(prepareModel({ time: '2025-03-21T23:30:00Z', internal: 'igrf', magnetopause: false, tail: false }));
    for (const l of second.graticule.lines.filter((x) => x.kind === 'latitude')) {
      for (let i = 0; i < l.latDeg.length; i += 6) {
        const r = conv.fromGeodetic(l.latDeg[i], l.lonDeg[i], 110);
        expect(r.defined).toBe(true);
        if (r.defined) expectClose(r.latDeg, l.value, 3e-4, `CGM latitude of a ${l.value}° circle sample at 23:30`);
      }
    }
    // Answers are copies: changing one leaves the cached circles alone.
    const circle = second.graticule.lines[0];
    circle.latDeg[0] = NaN;
    const third = computeGraticule({ ...req, internal: 'igrf', time: '2025-03-21T12:00:00Z' });
    expect(third.ok && Number.isFinite(third.graticule.lines[0].latDeg[0])).toBe(true);
  });
  it('refuses a time outside IGRF-14 with the engine\'s message', () => {
    const a = computeGraticule({ ...req, time: '2035-01-01T00:00:00Z' });
    expect(a.ok).toBe(false);
    if (!a.ok) expect(a.error).toMatch(/time|2030/);
  });
});

describe('CGM grid geometry', () => {
  it('splits a line at undefined (NaN) samples and drops single points', () => {
    const lat = [60, 61, NaN, 62, NaN, 63, 64, 65];
    const lon = [0, 5, NaN, 10, NaN, 15, 20, 25];
    expect(splitAtUndefined(lat, lon)).toEqual([[[0, 60], [5, 61]], [[15, 63], [20, 64], [25, 65]]]);
    expect(splitAtUndefined([NaN, NaN], [NaN, NaN])).toEqual([]);
  });
});

describe('CGM grid in the legend and the SVG export', () => {
  const st = MAP_STYLES.light;
  it('the legend names the grid, its height and where its lines stop only when shown', () => {
    expect(mapLegend(st, 10, 8, 110, 'h').some((l) => l.key === 'cgm')).toBe(false);
    const e = mapLegend(st, 10, 8, 110, 'h', { heightKm: 110, maxLatDeg: 82.527 }).find((l) => l.key === 'cgm')!;
    expect(e.label).toContain('CGM grid at 110 km');
    expect(e.label).toContain('about 82.5°');
    expect(e.label).toContain('near the dipole equator');
    expect(e.swatch).toContain(st.cgm);
  });
  it('the SVG document says the grid is drawn and lists it in the legend', () => {
    const doc = mapsSvgDocument({ maps: [], conditions: DEMO_SCENARIO.conditions, products: DEMO_SCENARIO.products, basemap: 'dark', cgm: { heightKm: 110, maxLatDeg: 82.5 } });
    expect(doc).toContain('· CGM grid at 110 km ·');
    expect(doc).toMatch(/<g id="legend"[^]*CGM grid at 110 km: corrected geomagnetic latitude every 10°/);
    expect(mapsSvgDocument({ maps: [], conditions: DEMO_SCENARIO.conditions, products: DEMO_SCENARIO.products, basemap: 'dark' })).not.toContain('CGM');
  });
});

describe('CGM grid view while a new time is computed (app cache)', () => {
  const line = (kind: 'latitude' | 'mlt', value: number): GraticuleLine => ({ kind, hemisphere: 'north', value, latDeg: Float64Array.of(60, 61), lonDeg: Float64Array.of(0, 5), cgmLatDeg: Float64Array.of(60, 60) });
  const g: CgmGraticule = { heightKm: 110, lines: [line('latitude', 60), line('mlt', 0)], maxLatDeg: 82.5, undefinedSamples: 0, traces: 1 };
  const at = (time: string) => graticuleKey({ time, internal: 'igrf', tiltDeg: null, heightKm: 110 });
  it('the exact answer when cached; the circles of the same date while a new time is computed; nothing for another date', () => {
    graticuleStore.set({ cache: new Map([[at('2025-03-20T22:00:00Z'), g]]), wanted: at('2025-03-20T22:00:00Z'), computing: null, error: null });
    expect(graticuleView()).toMatchObject({ graticule: g, busy: false, partial: false });
    graticuleStore.set({ wanted: at('2025-03-20T23:00:00Z'), computing: at('2025-03-20T23:00:00Z') });
    const v = graticuleView();
    expect(v.busy && v.partial).toBe(true);
    expect(v.graticule?.lines.map((l) => l.kind)).toEqual(['latitude']);
    expect(graticuleView()).toBe(v);
    graticuleStore.set({ wanted: at('2025-03-21T00:00:00Z') });
    expect(graticuleView()).toMatchObject({ graticule: null, busy: true, partial: false });
    graticuleStore.set({ wanted: graticuleKey({ time: '2025-03-20T23:00:00Z', internal: 'dipole', tiltDeg: null, heightKm: 110 }) });
    expect(graticuleView().graticule).toBeNull();
    graticuleStore.set({ wanted: null, cache: new Map(), computing: null });
    expect(graticuleView()).toMatchObject({ graticule: null, busy: false });
  });
});

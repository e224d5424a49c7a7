/** The worker's timeline channel (in-process): every site at every step in one call. */
import { readFileSync } from 'node:fs';
import { resolve } from 'node:path';
import { describe, it, expect } from 'vitest';
import * as Astro from 'astronomy-engine';
import { createEngineApi } from '../../workers/engine-api';
import type { TimelineStepInput } from '../../workers/protocol';
import { ovalMarginDeg } from '../../workers/channels/timeline';
import { readSeriesText } from '../../src/io/series/series';
import { expectClose } from '../helpers';

const BASE = { time: '2027-10-14T00:00:00Z', pdynNpa: 2, bzNt: 0, byNt: 0, internal: 'dipole' as const, magnetopause: true, imfEfficiency: 0.2, tail: true };
const O = { altKm: 110, sourceRe: 8, conjugateAltKm: 0, minElevationDeg: 10, sunLimitDeg: -12 };
// Invented sites (fictional names).
const SITES = [
  { name: 'Varn Ridge', latDeg: 66.5, lonDeg: 18.2 },
  { name: 'Ostrel Bay', latDeg: 58.1, lonDeg: -96.4 },
];

/** Three steps of the invented demo storm (examples/demo-storm.csv): quiet, main phase, recovery. */
function demoSteps(): TimelineStepInput[] {
  const recs = readSeriesText(readFileSync(resolve(import.meta.dirname, '../../examples/demo-storm.csv'), 'utf8'));
  return [3, 22, 60].map((i) => {
    const r = recs[i];
    if (r.kind !== 'ok') throw new Error(`demo row ${i} is not a value`);
    const v = r.value;
    return { time: v.time, pdynNpa: v.pdynNpa, bzNt: v.bzNt, byNt: v.byNt, dstNt: v.dstNt ?? null, speedKms: v.speedKms ?? null };
  });
}

describe('timeline channel', () => {
  it('each step equals the sites channel for the same conditions (same engine) and the storm index is the step\'s', async () => {
    const api = createEngineApi();
    const steps = demoSteps();
    let last = 0;
    const r = await api.timeline(1, BASE, steps, O, SITES, (done) => { last = done; });
    expect(r.error).toBeUndefined();
    expect(last).toBe(3);
    expect(r.stepsMs).toEqual(steps.map((s) => Date.parse(s.time)));
    expect(r.dstSource).toEqual(['given', 'given', 'given']);
    steps.forEach((s, i) => expectClose(r.dstNt[i], s.dstNt!, 0, `step ${i} storm index passed through`));
    for (let i = 0; i < steps.length; i++) {
      const s = steps[i];
      const one = await api.sites(10 + i, { ...BASE, ...s }, O, SITES);
      SITES.forEach((_, k) => {
        const a = r.sites[k].cells[i];
        const b = one.sites[k];
        expect(a.type).toBe(b.type);
        expect(a.ovalRelation).toBe(b.ovalRelation);
        expectClose(a.magLatDeg, b.magLatDeg, 1e-9, `step ${i} site ${k} magnetic latitude`);
        expectClose(a.mltHours, b.mltHours, 1e-9, `step ${i} site ${k} MLT`);
        if (b.sky) expectClose(a.ovalElevationDeg!, b.sky.elevationDeg, 1e-9, `step ${i} site ${k} oval elevation`);
        if (b.conjugate) expectClose(a.conjugateLatDeg!, b.conjugate.geoLatDeg, 1e-9, `step ${i} site ${k} conjugate latitude`);
      });
    }
    // The main phase (Dst ≈ −300 nT) moves the oval equatorward: the midnight-ish site's open–closed boundary is lower than when quiet.
    const oc = r.sites[0].cells.map((c) => Math.abs(c.openClosedMagLatDeg ?? NaN));
    expect(oc[1]).toBeLessThan(oc[0]);
  });

  it('the Sun and the Moon in each cell agree with astronomy-engine (Sun 0.05°, Moon 0.1°, illuminated fraction 0.001)', async () => {
    const api = createEngineApi();
    const steps = demoSteps();
    const r = await api.timeline(1, BASE, steps, O, SITES);
    r.sites.forEach((s, k) => s.cells.forEach((c, i) => {
      const t = Astro.MakeTime(new Date(r.stepsMs[i]));
      const obs = new Astro.Observer(SITES[k].latDeg, SITES[k].lonDeg, 0);
      const sun = Astro.Equator(Astro.Body.Sun, t, obs, true, true);
      expectClose(c.sunElevationDeg, Astro.Horizon(t, obs, sun.ra, sun.dec).altitude, 0.05, `Sun elevation, site ${k} step ${i} (astronomy-engine)`);
      const moon = Astro.Equator(Astro.Body.Moon, t, obs, true, true);
      expectClose(c.moonElevationDeg, Astro.Horizon(t, obs, moon.ra, moon.dec).altitude, 0.1, `Moon elevation, site ${k} step ${i} (astronomy-engine)`);
      expectClose(c.moonIlluminatedFraction, Astro.Illumination(Astro.Body.Moon, t).phase_fraction, 0.001, `Moon illuminated fraction (astronomy-engine)`);
      expect(c.dark).toBe(c.sunElevationDeg < -12);
    }));
    for (const s of r.sites) expect(s.bestHours).toMatch(/UTC/);
  });

  it('a focused step (timelineFocus) is computed next; each step\'s cells come with the progress once; the answer equals the one computed in order', async () => {
    const steps = demoSteps();
    const inOrder = await createEngineApi().timeline(1, BASE, steps, O, SITES);
    const api = createEngineApi();
    const seen: { done: number; step: number | undefined; cells: unknown }[] = [];
    const running = api.timeline(2, BASE, steps, O, SITES, (done, _total, step, cells) => seen.push({ done, step, cells }));
    // Sent after the request, as the app does: taken at the worker's first pause, before step 0.
    await api.timelineFocus(2, 2);
    const r = await running;
    expect(seen.map((e) => e.step)).toEqual([2, 0, 1]);
    expect(seen.map((e) => e.done)).toEqual([1, 2, 3]);
    for (const e of seen) expect(e.cells, `step ${e.step} cells`).toEqual(SITES.map((_, k) => r.sites[k].cells[e.step!]));
    // The same answer whatever the order (cells, storm index, warnings, best hours).
    expect({ ...r, requestId: 1 }).toEqual(inOrder);
    // A focus for a request that is not running is ignored.
    await api.timelineFocus(7, 1);
    const again = await api.timeline(3, BASE, steps, O, SITES);
    expect({ ...again, requestId: 1 }).toEqual(inOrder);
  }, 120_000);

  it('the margin is the distance to the nearest oval edge by the definition of each relation', () => {
    const b = { openClosedMagLatDeg: 72, equatorwardMagLatDeg: 65 };
    expect(ovalMarginDeg({ ovalRelation: 'poleward', magLatDeg: 75, boundaries: b })).toBeCloseTo(3, 12);
    expect(ovalMarginDeg({ ovalRelation: 'equatorward', magLatDeg: -60, boundaries: { openClosedMagLatDeg: -72, equatorwardMagLatDeg: -65 } })).toBeCloseTo(5, 12);
    expect(ovalMarginDeg({ ovalRelation: 'inside', magLatDeg: 70, boundaries: b })).toBeCloseTo(2, 12);
    expect(ovalMarginDeg({ ovalRelation: 'inside', magLatDeg: 70, boundaries: { openClosedMagLatDeg: 72, equatorwardMagLatDeg: null } })).toBeCloseTo(2, 12);
    expect(ovalMarginDeg({ ovalRelation: 'unknown', magLatDeg: 70, boundaries: null })).toBeNull();
  });

  it('a newer timeline request makes the older answer stale; bad input comes back as a message', async () => {
    const api = createEngineApi();
    const steps = demoSteps();
    const [a, b] = await Promise.all([api.timeline(1, BASE, steps, O, SITES), api.timeline(2, BASE, steps.slice(0, 1), O, SITES)]);
    expect(a.stale).toBe(true);
    expect(b.stale).toBeUndefined();
    expect(b.sites[0].cells.length).toBe(1);
    const bad = await api.timeline(3, BASE, steps, { ...O, sunLimitDeg: 5 }, SITES);
    expect(bad.error).toMatch(/sunLimitDeg/);
    const backwards = await api.timeline(4, BASE, [steps[1], steps[0]], O, SITES);
    expect(backwards.error).toMatch(/step 2: times must increase/);
    const none = await api.timeline(5, BASE, [], O, SITES);
    expect(none.error).toMatch(/at least one time step/);
  });
});

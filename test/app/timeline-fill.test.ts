import { describe, expect, it } from 'vitest';
import { createEngineApi } from '../../workers/engine-api';
import { sitesFromTimeline } from '../../src/app/timeline/fill';
import type { TimelineStepInput } from '../../workers/protocol';

// Source: the app's contract (src/app/timeline/fill.ts): the timeline worker runs the sites channel's siteReport
// for every step, so a table filled from a step's cells equals the sites channel's answer for that step's conditions.
// Invented conditions and sites (our own numbers).
const BASE = { time: '2026-01-10T20:00:00Z', pdynNpa: 2, bzNt: -2, byNt: 1, internal: 'igrf' as const, magnetopause: true, imfEfficiency: 0.2, tail: true };
const SITES = [{ name: 'Harl Moor', latDeg: 66.2, lonDeg: 24.5 }, { name: 'Wenna Bay', latDeg: 58.4, lonDeg: -101.3 }, { name: 'Ostrel', latDeg: -68.5, lonDeg: 77.9 }];
const STEPS: TimelineStepInput[] = [
  { time: '2026-01-10T20:00:00Z', pdynNpa: 2, bzNt: -2, byNt: 1, dstNt: -10, speedKms: 420 },
  { time: '2026-01-10T21:00:00Z', pdynNpa: 7.5, bzNt: -14, byNt: -3, dstNt: -95, speedKms: 640 },
];
const O = { altKm: 110, minLatDeg: 30, conjugateAltKm: 110, minElevationDeg: 10 };
const stepConditions = (k: number) => ({ ...BASE, ...STEPS[k] });

describe('sites table filled from the site timelines at the cursor\'s step', () => {
  it('equals the sites channel\'s answer for the same conditions (same siteReport; field lines and CGM left to that answer)', async () => {
    const api = createEngineApi();
    const tl = await api.timeline(1, BASE, STEPS, { ...O, sunLimitDeg: -12 }, SITES);
    for (const k of [0, 1]) {
      const c = stepConditions(k);
      const filled = sitesFromTimeline(tl, STEPS, k, c, SITES)!;
      expect(filled.fromTimeline).toBe(true);
      const direct = await api.sites(2 + k, c, O, SITES);
      filled.sites.forEach((got, i) => {
        const want = direct.sites[i];
        const { lineGeo: _a, footpoints: _b, cgm: _c, ...w } = want;
        const { lineGeo: _d, footpoints: _e, ...g } = got;
        expect(g, `${want.name} at step ${k}`).toEqual(w);
      });
    }
  });

  it('fills nothing when the conditions are not the step\'s, the cursor is elsewhere, the sites differ or the result is stale', async () => {
    const api = createEngineApi();
    const tl = await api.timeline(1, BASE, STEPS, { ...O, sunLimitDeg: -12 }, SITES);
    const c = stepConditions(1);
    expect(sitesFromTimeline(tl, STEPS, 1, c, SITES)).not.toBeNull();
    expect(sitesFromTimeline(tl, STEPS, 1, { ...c, bzNt: -13.5 }, SITES)).toBeNull();
    expect(sitesFromTimeline(tl, STEPS, 1, { ...c, dstNt: null }, SITES)).toBeNull();
    expect(sitesFromTimeline(tl, STEPS, 0, c, SITES)).toBeNull();
    expect(sitesFromTimeline(tl, STEPS, 1, c, SITES.slice(0, 2))).toBeNull();
    expect(sitesFromTimeline(tl, STEPS, 1, c, [SITES[0], { ...SITES[1], latDeg: 58.5 }, SITES[2]])).toBeNull();
    expect(sitesFromTimeline(tl, STEPS.slice(0, 1), 0, stepConditions(0), SITES)).toBeNull();
    expect(sitesFromTimeline({ ...tl, stale: true }, STEPS, 1, c, SITES)).toBeNull();
  });
});

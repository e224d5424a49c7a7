import { describe, expect, it } from 'vitest';
import { createEngineApi } from '../../workers/engine-api';
import { sitesFromTimeline } from '../../src/app/timeline/fill';
import type { TimelineState } from '../../src/app/timeline/state';
import type { AppState } from '../../src/app/store';
import type { TimelineStepInput } from '../../workers/protocol';

// Invented conditions and sites (our own numbers).
const BASE = { time: '2026-01-10T20:00:00Z', pdynNpa: 2, bzNt: -2, byNt: 1, internal: 'igrf' as const, magnetopause: true, imfEfficiency: 0.2, tail: true };
const SITES = [{ name: 'Harl Moor', latDeg: 66.2, lonDeg: 24.5 }, { name: 'Wenna Bay', latDeg: 58.4, lonDeg: -101.3 }, { name: 'Ostrel', latDeg: -68.5, lonDeg: 77.9 }];
const STEPS: TimelineStepInput[] = [
  { time: '2026-01-10T20:00:00Z', pdynNpa: 2, bzNt: -2, byNt: 1, dstNt: -10, speedKms: 420 },
  { time: '2026-01-10T21:00:00Z', pdynNpa: 7.5, bzNt: -14, byNt: -3, dstNt: -95, speedKms: 640 },
];
const O = { altKm: 110, minLatDeg: 30, conjugateAltKm: 110, minElevationDeg: 10 };

function states(k: number, result: TimelineState['result']) {
  const steps = STEPS.map((s) => ({ ...s, ms: Date.parse(s.time), dstNt: s.dstNt!, dstSource: 'given' as const }));
  const t = { series: { name: 'x', steps }, cursor: k, result } as unknown as TimelineState;
  const st = STEPS[k];
  const s = { conditions: { ...BASE, time: st.time, pdynNpa: st.pdynNpa, bzNt: st.bzNt, byNt: st.byNt, dstNt: st.dstNt, speedKms: st.speedKms }, sites: SITES } as unknown as AppState;
  return { t, s };
}

describe('sites table filled from the site timelines at the cursor\'s step', () => {
  it('equals the sites channel\'s answer for the same conditions (same siteReport; field lines and CGM left to that answer)', async () => {
    const api = createEngineApi();
    const tl = await api.timeline(1, BASE, STEPS, { ...O, sunLimitDeg: -12 }, SITES);
    for (const k of [0, 1]) {
      const { t, s } = states(k, tl);
      const filled = sitesFromTimeline(t, s, true)!;
      expect(filled.fromTimeline).toBe(true);
      const direct = await api.sites(2 + k, s.conditions, O, SITES);
      filled.sites.forEach((got, i) => {
        const want = direct.sites[i];
        const { lineGeo: _a, footpoints: _b, cgm: _c, ...w } = want;
        const { lineGeo: _d, footpoints: _e, ...g } = got;
        expect(g, `${want.name} at step ${k}`).toEqual(w);
      });
    }
  });

  it('fills nothing when the conditions are not the step\'s, the cursor is elsewhere, or the result was asked for other inputs', async () => {
    const api = createEngineApi();
    const tl = await api.timeline(1, BASE, STEPS, { ...O, sunLimitDeg: -12 }, SITES);
    const { t, s } = states(1, tl);
    expect(sitesFromTimeline(t, s, false)).toBeNull();
    expect(sitesFromTimeline(t, { ...s, conditions: { ...s.conditions, bzNt: -13.5 } }, true)).toBeNull();
    expect(sitesFromTimeline({ ...t, cursor: 0 }, s, true)).toBeNull();
    expect(sitesFromTimeline(t, { ...s, sites: SITES.slice(0, 2) }, true)).toBeNull();
    expect(sitesFromTimeline({ ...t, series: null }, s, true)).toBeNull();
  });
});

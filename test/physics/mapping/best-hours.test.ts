/**
 * "Best hours" (src/physics/mapping/best-hours.ts) on hand-built timelines:
 * the expected intervals and sentences are worked out by hand from the step
 * rule (a step stands for the time up to the next step, at most one cadence).
 */
import { describe, expect, it } from 'vitest';
import { bestHours, type TimelineStep } from '../../../src/physics/mapping/best-hours';
import { InputError } from '../../../src/physics/errors';

const T0 = Date.UTC(2027, 9, 29, 18, 0); // 18:00 UTC, an invented night
const MIN = 60_000;

/** 10-minute steps from 18:00 to 06:00 (73 steps); dark 19:30–04:30; oval elevation by a hand-made rule. */
function night(elevation: (minutes: number) => number | null, dark = (m: number) => m >= 90 && m <= 630, relation: (m: number) => TimelineStep['ovalRelation'] = () => 'equatorward'): TimelineStep[] {
  const out: TimelineStep[] = [];
  for (let m = 0; m <= 720; m += 10) {
    out.push({ ms: T0 + m * MIN, lineType: 'closed', ovalRelation: relation(m), ovalMarginDeg: 2, ovalElevationDeg: elevation(m), dark: dark(m) });
  }
  return out;
}

/** 21:40 is minute 220 after 18:00, 01:00 is minute 420. */
const nearFrom220To420 = (m: number) => (m >= 220 && m <= 420 ? 70 : 40);

describe('bestHours', () => {
  it('one interval across midnight: 21:40 to the end of the 01:00 step (01:10)', () => {
    const r = bestHours(night(nearFrom220To420));
    expect(r.intervals).toEqual([{ startMs: T0 + 220 * MIN, endMs: T0 + 430 * MIN }]);
    expect(r.sentence).toBe('Dark sky with the oval within 25° of the zenith: 21:40–01:10 UTC.');
    expect(r.counts).toEqual({ steps: 73, dark: 55, ovalNear: 21, both: 21, unknown: 0 });
  });

  it('elevation exactly 90° − limit qualifies; the limit is the caller’s', () => {
    expect(bestHours(night((m) => (m === 300 ? 65 : 10))).sentence).toBe('Dark sky with the oval within 25° of the zenith: 23:00–23:10 UTC.');
    expect(bestHours(night(() => 52), { maxZenithDeg: 40 }).sentence).toBe('Dark sky with the oval within 40° of the zenith: 19:30–04:40 UTC.');
  });

  it('two intervals when the oval moves away for a while', () => {
    const r = bestHours(night((m) => (nearFrom220To420(m) === 70 && !(m > 300 && m < 330) ? 70 : 40)));
    expect(r.sentence).toBe('Dark sky with the oval within 25° of the zenith: 21:40–23:10 and 23:30–01:10 UTC.');
  });

  it('inside the oval counts as overhead whatever the elevation given', () => {
    const r = bestHours(night(() => null, undefined, (m) => (m >= 600 && m <= 640 ? 'inside' : 'equatorward')));
    expect(r.sentence).toBe('Dark sky with the oval within 25° of the zenith: 04:00–04:40 UTC.');
  });

  it('a gap in the timeline is not bridged (a step stands for one cadence at most)', () => {
    const steps = night(() => 80).filter((s) => !(s.ms > T0 + 240 * MIN && s.ms < T0 + 360 * MIN));
    expect(bestHours(steps).sentence).toBe('Dark sky with the oval within 25° of the zenith: 19:30–22:10 and 00:00–04:40 UTC.');
  });

  it('no result, with the reason: never dark, oval never near, only in daylight, unknown', () => {
    expect(bestHours(night(() => 80, () => false)).sentence).toBe('No dark hours with the oval within 25° of the zenith between 18:00 and 06:10 UTC: the sky is never dark.');
    expect(bestHours(night(() => 30)).sentence).toBe('No dark hours with the oval within 25° of the zenith between 18:00 and 06:10 UTC: the oval never comes within 25° of the zenith.');
    expect(bestHours(night((m) => (m < 60 ? 80 : 20))).sentence).toBe('No dark hours with the oval within 25° of the zenith between 18:00 and 06:10 UTC: the oval comes that near only while the sky is light.');
    expect(bestHours(night(() => 80, undefined, () => 'unknown')).sentence).toBe('No dark hours with the oval within 25° of the zenith between 18:00 and 06:10 UTC: the oval position is unknown at every step.');
  });

  it('a timeline longer than a day gives dates', () => {
    const steps: TimelineStep[] = [];
    for (let h = 0; h < 72; h++) {
      const hourOfDay = (18 + h) % 24;
      const darkHour = hourOfDay >= 20 || hourOfDay < 4;
      steps.push({ ms: T0 + h * 60 * MIN, lineType: 'open', ovalRelation: 'poleward', ovalMarginDeg: 1, ovalElevationDeg: h >= 24 && h < 36 ? 75 : 20, dark: darkHour });
    }
    // Oval near 2027-10-30 18:00 .. 2027-10-31 05:00 (steps 24..35); dark 20:00..03:00 steps → 20:00 to the end of the 03:00 step.
    expect(bestHours(steps).sentence).toBe('Dark sky with the oval within 25° of the zenith: 2027-10-30 20:00–2027-10-31 04:00 UTC.');
  });

  it('refuses an empty timeline, times that do not increase, and a zenith limit outside 0..90°', () => {
    expect(() => bestHours([])).toThrow('timeline: expected at least one time step');
    const s = night(() => 80);
    expect(() => bestHours([s[1], s[0]])).toThrow('timeline: step 2: times must increase; 2027-10-29T18:00:00.000Z is not after 2027-10-29T18:10:00.000Z');
    expect(() => bestHours(s, { maxZenithDeg: 100 })).toThrow(InputError);
    expect(() => bestHours(s, { maxZenithDeg: 100 })).toThrow('maxZenithDeg: 100 deg is outside the allowed range 0..90 deg');
  });

  it('a single step is an instant', () => {
    expect(bestHours([{ ms: T0 + 220 * MIN, lineType: 'closed', ovalRelation: 'inside', ovalMarginDeg: 0.5, ovalElevationDeg: 88, dark: true }]).sentence)
      .toBe('Dark sky with the oval within 25° of the zenith: 21:40 UTC.');
  });
});

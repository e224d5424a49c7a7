/** The timeline's steps: those of the loaded series, or the night's times at the chosen step with the current solar wind. */
import type { FieldConditions } from '../../physics/field/conditions';
import type { TimelineStepInput } from '../../../workers/protocol';
import type { NightPlan, TimelineState } from './state';

const MS_PER_MIN = 60_000;
/** Most steps of a planned night (a day at one minute). */
const MAX_NIGHT_STEPS = 1440;

/** ISO UTC without `.000`. */
export function isoUtc(ms: number): string {
  const s = new Date(ms).toISOString();
  return s.endsWith('.000Z') ? `${s.slice(0, 19)}Z` : s;
}

/** The night's first instant: the plan's, or the current time rounded down to the hour. */
export function nightStartMs(plan: NightPlan, c: FieldConditions): number {
  const t = Date.parse(plan.startIso || c.time);
  return Math.floor(t / (60 * MS_PER_MIN)) * 60 * MS_PER_MIN;
}

/** Unix ms of each step of a night plan. */
export function nightTimesMs(plan: NightPlan, c: FieldConditions): number[] {
  const start = nightStartMs(plan, c);
  const stepMs = plan.stepMin * MS_PER_MIN;
  const n = Math.min(MAX_NIGHT_STEPS, Math.floor((plan.hours * 60) / plan.stepMin) + 1);
  return Array.from({ length: n }, (_, i) => start + i * stepMs);
}

/** The steps the worker computes: the series rows, or the night's times with the conditions' solar wind. */
export function timelineSteps(t: TimelineState, c: FieldConditions): TimelineStepInput[] {
  if (t.series) return t.series.steps.map((s) => ({ time: s.time, pdynNpa: s.pdynNpa, bzNt: s.bzNt, byNt: s.byNt, dstNt: s.dstNt, speedKms: s.speedKms }));
  return nightTimesMs(t.night, c).map((ms) => ({ time: isoUtc(ms), pdynNpa: c.pdynNpa, bzNt: c.bzNt, byNt: c.byNt, dstNt: c.dstNt ?? null, speedKms: c.speedKms ?? null }));
}

/**
 * What the cursor at step k writes into the app's conditions: the series row's time and solar
 * wind, or the night's time (the night keeps the current solar wind). Null when there is no step k.
 */
export function cursorPatch(t: Pick<TimelineState, 'series' | 'night'>, c: FieldConditions, k: number): Partial<FieldConditions> | null {
  if (t.series) {
    const s = t.series.steps[k];
    return s ? { time: s.time, pdynNpa: s.pdynNpa, bzNt: s.bzNt, byNt: s.byNt, dstNt: s.dstNt, speedKms: s.speedKms } : null;
  }
  const times = nightTimesMs(t.night, c);
  return k >= 0 && k < times.length ? { time: isoUtc(times[k]) } : null;
}

/**
 * "Best hours" for one site: from a timeline of time steps (line type, place
 * against the oval, the sky elevation of the nearest oval point, dark or
 * not), the intervals when the oval is within a chosen zenith distance and
 * the sky is dark, and one plain sentence saying so. Pure: no DOM or Node APIs.
 *
 * Each step stands for the time from its instant to the next step's (at most
 * the timeline's usual cadence, the median spacing, so a gap in the series is
 * not bridged); the last step stands for one cadence. A site inside the oval
 * has the oval at its zenith (zenith distance 0) whatever the elevation given.
 */
import { InputError, requireInRange } from '../errors';

export interface TimelineStep {
  /** Unix ms, UTC; strictly increasing along the timeline. */
  ms: number;
  lineType: 'closed' | 'open' | 'unresolved';
  ovalRelation: 'poleward' | 'inside' | 'equatorward' | 'unknown';
  /** Distance to the nearest oval edge, deg of magnetic latitude (null when unknown). */
  ovalMarginDeg: number | null;
  /** Elevation of the nearest oval point in the site's sky, deg (null when unknown). */
  ovalElevationDeg: number | null;
  /** The sky is dark enough (the Sun below the chosen limit). */
  dark: boolean;
}

export interface BestHoursOptions {
  /** Largest zenith distance of the oval, deg (0..90); default 25. */
  maxZenithDeg?: number;
  /** Duration one step stands for, ms; default the median spacing of the steps (0 for a single step). */
  stepMs?: number;
}

export interface BestInterval {
  startMs: number;
  endMs: number;
}

export interface BestHours {
  intervals: BestInterval[];
  /** One plain-language sentence, UTC. */
  sentence: string;
  /** How many steps were dark, had the oval near the zenith, both, or no oval position. */
  counts: { steps: number; dark: number; ovalNear: number; both: number; unknown: number };
}

export const DEFAULT_MAX_ZENITH_DEG = 25;
const MS_PER_MIN = 60_000;
const MS_PER_DAY = 86_400_000;

function pad2(v: number): string {
  return v < 10 ? `0${v}` : String(v);
}

/** HH:MM (UTC) of a Unix-ms time, rounded to the minute; with the date when `withDate`. */
function clock(ms: number, withDate: boolean): string {
  const d = new Date(Math.round(ms / MS_PER_MIN) * MS_PER_MIN);
  const hm = `${pad2(d.getUTCHours())}:${pad2(d.getUTCMinutes())}`;
  return withDate ? `${d.toISOString().slice(0, 10)} ${hm}` : hm;
}

function dateOf(ms: number): string {
  return new Date(Math.round(ms / MS_PER_MIN) * MS_PER_MIN).toISOString().slice(0, 10);
}

/** "21:40–01:10", or with dates when the timeline is longer than a day. */
function span(a: number, b: number, withDate: boolean): string {
  if (b === a) return clock(a, withDate);
  const end = withDate && dateOf(a) !== dateOf(b) ? clock(b, true) : clock(b, false);
  return `${clock(a, withDate)}–${end}`;
}

function list(items: string[]): string {
  return items.length === 1 ? items[0] : `${items.slice(0, -1).join(', ')} and ${items[items.length - 1]}`;
}

function degText(v: number): string {
  return `${Math.round(v * 10) / 10}°`;
}

function median(xs: number[]): number {
  const s = [...xs].sort((a, b) => a - b);
  const n = s.length;
  return n % 2 ? s[(n - 1) >> 1] : 0.5 * (s[n / 2 - 1] + s[n / 2]);
}

/** The oval is within `maxZenithDeg` of the zenith at this step (null: unknown). */
function ovalNear(s: TimelineStep, maxZenithDeg: number): boolean | null {
  if (s.lineType === 'unresolved' || s.ovalRelation === 'unknown') return null;
  if (s.ovalRelation === 'inside') return true;
  if (s.ovalElevationDeg === null || !Number.isFinite(s.ovalElevationDeg)) return null;
  return 90 - s.ovalElevationDeg <= maxZenithDeg;
}

/** The dark intervals with the oval near the zenith, and a sentence. */
export function bestHours(steps: readonly TimelineStep[], options: BestHoursOptions = {}): BestHours {
  const maxZenithDeg = options.maxZenithDeg === undefined ? DEFAULT_MAX_ZENITH_DEG : requireInRange('maxZenithDeg', options.maxZenithDeg, 0, 90, 'deg');
  if (!Array.isArray(steps) || steps.length === 0) throw new InputError('timeline', 'expected at least one time step');
  steps.forEach((s, i) => {
    if (!s || typeof s.ms !== 'number' || !Number.isFinite(s.ms)) throw new InputError('timeline', `step ${i + 1}: expected a finite time in Unix ms, got ${String(s?.ms)}`);
    if (i > 0 && !(s.ms > steps[i - 1].ms)) throw new InputError('timeline', `step ${i + 1}: times must increase; ${new Date(s.ms).toISOString()} is not after ${new Date(steps[i - 1].ms).toISOString()}`);
    if (typeof s.dark !== 'boolean') throw new InputError('timeline', `step ${i + 1}: dark must be true or false, got ${String(s.dark)}`);
  });
  const gaps = steps.slice(1).map((s, i) => s.ms - steps[i].ms);
  const cadence = options.stepMs !== undefined ? requireInRange('stepMs', options.stepMs, 0, 7 * MS_PER_DAY, 'ms') : gaps.length ? median(gaps) : 0;

  const counts = { steps: steps.length, dark: 0, ovalNear: 0, both: 0, unknown: 0 };
  const intervals: BestInterval[] = [];
  let open: BestInterval | null = null;
  steps.forEach((s, i) => {
    const near = ovalNear(s, maxZenithDeg);
    if (s.dark) counts.dark++;
    if (near === null) counts.unknown++;
    else if (near) counts.ovalNear++;
    const good = s.dark && near === true;
    const end = s.ms + Math.min(i + 1 < steps.length ? steps[i + 1].ms - s.ms : cadence, cadence);
    if (good) {
      counts.both++;
      if (open && open.endMs === s.ms) open.endMs = end;
      else { open = { startMs: s.ms, endMs: end }; intervals.push(open); }
    }
  });

  const first = steps[0].ms;
  const last = steps[steps.length - 1].ms + cadence;
  const withDate = last - first > MS_PER_DAY;
  const what = `the oval within ${degText(maxZenithDeg)} of the zenith`;
  let sentence: string;
  if (intervals.length > 0) {
    sentence = `Dark sky with ${what}: ${list(intervals.map((iv) => span(iv.startMs, iv.endMs, withDate)))} UTC.`;
  } else {
    let why: string;
    if (counts.unknown === counts.steps) why = 'the oval position is unknown at every step';
    else if (counts.dark === 0) why = 'the sky is never dark';
    else if (counts.ovalNear === 0) why = `the oval never comes within ${degText(maxZenithDeg)} of the zenith`;
    else why = 'the oval comes that near only while the sky is light';
    sentence = `No dark hours with ${what} between ${clock(first, withDate)} and ${clock(last, withDate)} UTC: ${why}.`;
  }
  return { intervals, sentence, counts };
}

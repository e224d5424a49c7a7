/**
 * The timeline's state: the loaded series (or the night planned when none is
 * loaded), the cursor, playback, the darkness settings and the worker's
 * per-site answer. Its own framework-free store (../store/core.ts), so the
 * timeline adds no keys to the app state; the cursor writes the app's
 * conditions through setConditions.
 */
import { createStore, type Store } from '../store/core';
import type { TimelineResult } from '../../../workers/protocol';

/** One step of a loaded series, as the app uses it. */
export interface SeriesStep {
  time: string;
  ms: number;
  pdynNpa: number;
  bzNt: number;
  byNt: number;
  /** Storm index at the step, nT: from the file ('given') or integrated through the series ('estimated'). */
  dstNt: number;
  dstSource: 'given' | 'estimated';
  speedKms: number | null;
}

/** A line of the file that gave no step, with its number and why. */
export interface LineNote {
  line: number;
  text: string;
}

export interface LoadedSeries {
  /** File name (or the demo's). */
  name: string;
  format: 'csv' | 'hourly' | 'highres';
  steps: SeriesStep[];
  /** Median spacing of the steps, ms. */
  cadenceMs: number;
  skipped: LineNote[];
  errors: LineNote[];
}

/** The night planned when no series is loaded: times at a chosen step with the current solar wind. */
export interface NightPlan {
  /** First instant, ISO UTC. */
  startIso: string;
  hours: number;
  stepMin: number;
}

export interface TimelineState {
  series: LoadedSeries | null;
  /** A load in progress, or its failure (whole-file problems: unknown format, bad header). */
  loading: boolean;
  loadError: string | null;
  night: NightPlan;
  /** Index of the current step (of the series, or of the night). */
  cursor: number;
  playing: boolean;
  /** Playback speed, steps per second (upper limit: each step waits for its table and maps). */
  stepsPerSecond: number;
  /** Sun elevation below which the sky counts as dark, deg. */
  sunLimitDeg: number;
  result: TimelineResult | null;
  pending: boolean;
  progress: { done: number; total: number };
  error: string | null;
}

const NIGHT_DEFAULT: NightPlan = { startIso: '', hours: 12, stepMin: 30 };

export const timelineStore: Store<TimelineState> = createStore<TimelineState>({
  series: null,
  loading: false,
  loadError: null,
  night: NIGHT_DEFAULT,
  cursor: 0,
  playing: false,
  stepsPerSecond: 2,
  sunLimitDeg: -12,
  result: null,
  pending: false,
  progress: { done: 0, total: 0 },
  error: null,
});

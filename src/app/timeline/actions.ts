/**
 * What the timeline panels call: load a series (file, drop or the demo),
 * move the cursor (which sets the app's conditions from the step's row), and
 * play through every step (each step waits until the sites table and the
 * maps answer for it, so play never skips one).
 */
import { setConditions, store } from '../store';
import { timelineStore, type LoadedSeries, type NightPlan } from './state';
import { loadSeriesBlob, loadSeriesText } from './load';
import { cursorPatch, nightTimesMs, isoUtc } from './steps';

function errorText(e: unknown): string {
  return e instanceof Error ? e.message : String(e);
}

async function useLoad(load: () => Promise<LoadedSeries>): Promise<void> {
  timelineStore.set({ loading: true, loadError: null, playing: false });
  try {
    const series = await load();
    if (series.steps.length === 0) {
      timelineStore.set({ loading: false, loadError: `${series.name}: no usable step (${series.skipped.length} skipped, ${series.errors.length} unreadable)`, series: null });
      return;
    }
    timelineStore.set({ loading: false, series, cursor: 0, result: null, error: null });
    moveCursor(0);
  } catch (e) {
    timelineStore.set({ loading: false, loadError: errorText(e) });
  }
}

export function loadFile(file: File): Promise<void> {
  return useLoad(() => loadSeriesBlob(file, file.name));
}

/** The demo files as text, each its own chunk loaded on first use (Vite's glob import with the raw query). */
const DEMO_FILES = import.meta.glob<string>(['../../../examples/demo-storm.csv', '../../../examples/demo-storm-hourly.txt'], { query: '?raw', import: 'default' });

/** The invented demo storm (our own numbers), in our CSV or as the community hourly file. */
export function loadDemo(which: 'csv' | 'hourly' = 'csv'): Promise<void> {
  return useLoad(async () => {
    const name = which === 'csv' ? 'demo-storm.csv' : 'demo-storm-hourly.txt';
    const load = DEMO_FILES[`../../../examples/${name}`];
    if (!load) throw new Error(`the demo file ${name} is missing from this build`);
    return loadSeriesText(name, await load());
  });
}

export function unloadSeries(): void {
  timelineStore.set({ series: null, cursor: 0, playing: false, result: null, error: null, loadError: null });
}

export function setNight(patch: Partial<NightPlan>): void {
  timelineStore.set((t) => ({ night: { ...t.night, ...patch }, cursor: 0, result: null }));
}

/** Move the cursor to step i (clamped) and set the app's conditions from it (cursorPatch). */
export function moveCursor(i: number): void {
  const t = timelineStore.get();
  const c = store.get().conditions;
  const n = t.series ? t.series.steps.length : nightTimesMs(t.night, c).length;
  const k = Math.max(0, Math.min(n - 1, Math.round(i)));
  const patch = cursorPatch(t, c, k);
  if (!patch) return;
  // A night: pin its start before the cursor moves the time it was taken from.
  timelineStore.set(t.series || t.night.startIso ? { cursor: k } : { cursor: k, night: { ...t.night, startIso: isoUtc(nightTimesMs(t.night, c)[0]) } });
  setConditions(patch);
}

/** True once the sites table and the maps show the current conditions (or their channel failed). */
function stepShown(): boolean {
  const s = store.get();
  const fresh = (ch: 'sites' | 'oval') => s.answeredFor[ch]?.conditions === s.conditions || s.errors[ch] !== undefined;
  return fresh('sites') && fresh('oval');
}

let timer: ReturnType<typeof setTimeout> | undefined;
let lastMoveAt = 0;

function tick(): void {
  const t = timelineStore.get();
  if (!t.playing) return;
  const n = t.series ? t.series.steps.length : nightTimesMs(t.night, store.get().conditions).length;
  const now = performance.now();
  if (stepShown() && now - lastMoveAt >= 1000 / t.stepsPerSecond) {
    if (t.cursor >= n - 1) {
      timelineStore.set({ playing: false });
      return;
    }
    lastMoveAt = now;
    moveCursor(t.cursor + 1);
  }
  timer = setTimeout(tick, 30);
}

export function setPlaying(on: boolean): void {
  clearTimeout(timer);
  timelineStore.set({ playing: on });
  if (!on) return;
  const t = timelineStore.get();
  const n = t.series ? t.series.steps.length : nightTimesMs(t.night, store.get().conditions).length;
  // From the start again once at the end.
  if (t.cursor >= n - 1) moveCursor(0);
  lastMoveAt = performance.now();
  timer = setTimeout(tick, 30);
}

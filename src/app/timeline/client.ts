/**
 * The timeline's link to the engine: a second engine worker of its own (so a
 * long timeline never delays the scene, maps and table the cursor drives, and
 * runs on the other core), one timeline request per change of the steps, the
 * sites, the products or the darkness limit; a newer request makes the
 * older one stale (answered { stale } by the worker, dropped here).
 */
import * as Comlink from 'comlink';
import type { EngineApi, TimelineResult } from '../../../workers/protocol';
import { Channel } from '../channel';
import { conjugateAltOf, store, type AppState } from '../store';
import { timelineStore, type TimelineState } from './state';
import { nightStartMs, timelineSteps } from './steps';
import { sitesFromTimeline } from './fill';
import { MAX_TIMELINE_STEPS } from '../../../workers/channels/timeline-limits';

/** Wait this long after the last change before asking (typing a night length, editing sites). */
const SETTLE_MS = 250;

/** The inputs of a timeline request, as a key: the same key asks nothing new. */
function requestKey(t: TimelineState, s: AppState): string {
  const c = s.conditions;
  const base = { internal: c.internal, magnetopause: c.magnetopause, imfEfficiency: c.imfEfficiency, tail: c.tail, tiltDeg: c.tiltDeg };
  // A series fixes every step; a night follows the current solar wind (not the cursor's time).
  const wind = t.series ? null : { p: c.pdynNpa, bz: c.bzNt, by: c.byNt, dst: c.dstNt, v: c.speedKms, hours: t.night.hours, stepMin: t.night.stepMin, start: nightStartMs(t.night, c) };
  return JSON.stringify([t.series?.name, t.series?.steps.length, t.series?.steps[0]?.ms, wind, base, s.products, s.sites, t.sunLimitDeg]);
}

let started = false;

/** Start watching both stores (once); the worker is created on the first request. */
export function startTimelineClient(): void {
  if (started) return;
  started = true;
  let api: Comlink.Remote<EngineApi> | null = null;
  // The inputs each request was asked for, and those of the result shown (for filling the sites table from it).
  const keyOf = new Map<number, string>();
  let resultKey = '';
  const channel = new Channel<TimelineResult>(
    (a) => {
      resultKey = keyOf.get(a.requestId) ?? '';
      timelineStore.set({ result: a, error: null });
    },
    (msg) => timelineStore.set({ error: msg }),
    (busy) => timelineStore.set({ pending: busy }),
  );
  let lastKey = '';
  let settle: ReturnType<typeof setTimeout> | undefined;
  const ask = () => {
    const t = timelineStore.get();
    const s = store.get();
    const key = requestKey(t, s);
    if (key === lastKey) return;
    lastKey = key;
    const steps = timelineSteps(t, s.conditions);
    if (steps.length > MAX_TIMELINE_STEPS) {
      timelineStore.set({ result: null, error: `the site timelines cover at most ${MAX_TIMELINE_STEPS.toLocaleString('en')} steps; this series has ${steps.length.toLocaleString('en')} (the strips and the cursor still work; use a shorter file or a coarser cadence for the site timelines)` });
      return;
    }
    api ??= Comlink.wrap<EngineApi>(new Worker(new URL('../../../workers/engine.worker.ts', import.meta.url), { type: 'module' }));
    const remote = api;
    timelineStore.set({ progress: { done: 0, total: steps.length } });
    channel.request((id) => {
      keyOf.set(id, key);
      if (keyOf.size > 16) keyOf.delete(keyOf.keys().next().value as number);
      return remote.timeline(id, s.conditions, steps, {
      altKm: s.products.altKm, ...(s.products.sourceRe === null ? {} : { sourceRe: s.products.sourceRe }), minLatDeg: s.products.minLatDeg, conjugateAltKm: conjugateAltOf(s.products), minElevationDeg: s.products.minElevationDeg, sunLimitDeg: t.sunLimitDeg,
    }, s.sites, Comlink.proxy((done: number, total: number) => { if (channel.latestId === id) timelineStore.set({ progress: { done, total } }); }));
    });
  };
  // A cursor move onto a step the result answers: the sites table from the result at once.
  const fill = (s: AppState) => {
    const t = timelineStore.get();
    const f = sitesFromTimeline(t, s, t.result !== null && resultKey === requestKey(t, s));
    if (!f) return;
    const fresh = s.answeredFor.sites?.conditions === s.conditions && !s.siteResults?.fromTimeline;
    if (fresh) return;
    store.set({ siteResults: f, answeredFor: { ...s.answeredFor, sites: { conditions: s.conditions, products: s.products, sites: s.sites, view: s.view } } });
  };
  const schedule = () => {
    clearTimeout(settle);
    settle = setTimeout(ask, SETTLE_MS);
  };
  store.subscribe((s, prev) => {
    if (s.conditions !== prev.conditions) fill(s);
    schedule();
  });
  timelineStore.subscribe(schedule);
  schedule();
}

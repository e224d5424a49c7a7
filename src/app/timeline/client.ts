/**
 * The timeline's link to the engine: a second engine worker of its own (so a
 * long timeline never delays the scene, maps and table the cursor drives, and
 * runs on the other core).
 *
 * Site timelines: one request per change of the steps, the sites, the products,
 * the model switches or the darkness limit; a newer request goes out at once and
 * the older one stops at its next step (the worker answers it { stale }). The
 * last answer is kept with the inputs it was asked for: it is shown only while
 * those are the current inputs, and shown again at once when they come back
 * (loading the same series again asks nothing new).
 *
 * Scrubbing: a cursor move onto a step the site timelines answered fills the
 * sites table from them at once (fill.ts; the sites channel's own answer
 * follows and replaces it), and onto a step whose oval is kept shows that oval
 * at once (oval-cache.ts). Once the site timelines are in, the worker computes
 * the ovals of the steps around the cursor, nearest first, one at a time; a
 * change of the inputs makes the one in progress stale at its next sector.
 */
import * as Comlink from 'comlink';
import type { EngineApi, OvalResult, RequestProducts, TimelineCell, TimelineOptions, TimelineProgress, TimelineResult, TimelineStepInput, SiteInput } from '../../../workers/protocol';
import type { FieldConditions } from '../../physics/field/conditions';
import { Channel } from '../channel';
import { conjugateAltOf, store, type AnsweredFor, type AppState } from '../store';
import { timelineStore, type LoadedSeries, type TimelineState } from './state';
import { cursorPatch, nightStartMs, timelineSteps } from './steps';
import { sitesFromStep, sitesFromTimeline } from './fill';
import { OVAL_CACHE_SIZE, OvalCache, ovalKey, ovalRequestOptions, stepsAround } from './oval-cache';
import { MAX_TIMELINE_STEPS } from '../../../workers/channels/timeline-limits';

/** Wait this long after the last change of the inputs before asking (typing a night length, editing sites). */
const SETTLE_MS = 250;

/** The calls the client makes: the engine API's timeline and oval (a worker in the app, in-process in the tests). */
export interface TimelineEngine {
  timeline(requestId: number, base: FieldConditions, steps: TimelineStepInput[], o: TimelineOptions, sites: SiteInput[], progress?: TimelineProgress): Promise<TimelineResult>;
  /** Have the running timeline request compute this step next (absent: the steps go in order). */
  focus?(requestId: number, step: number): void;
  oval(requestId: number, c: FieldConditions, o: RequestProducts & { mltStepHours: number }): Promise<OvalResult>;
}

export interface TimelineClientOptions {
  settleMs?: number;
  /** Ovals kept for scrubbing. */
  ovalCacheSize?: number;
  /** Compute the ovals around the cursor ahead (off in tests that count requests). */
  ovalsAhead?: boolean;
}

export interface TimelineClient {
  dispose(): void;
  /** Ovals kept (for tests and the benchmark). */
  readonly ovals: OvalCache;
  /** How many of the timeline's steps (the cursor's included) have no kept oval for the current inputs. */
  ovalsMissing(): number;
}

/** A fingerprint of a series' steps, once per loaded series (the same file loaded again gives the same one). */
const fingerprints = new WeakMap<LoadedSeries, string>();
function seriesFingerprint(s: LoadedSeries): string {
  let f = fingerprints.get(s);
  if (f === undefined) {
    // FNV-1a over the steps' text: two series with the same name, length and first time but other rows differ.
    let h = 0x811c9dc5;
    for (const st of s.steps) {
      const line = `${st.ms},${st.pdynNpa},${st.bzNt},${st.byNt},${st.dstNt},${st.speedKms};`;
      for (let i = 0; i < line.length; i++) h = Math.imul(h ^ line.charCodeAt(i), 0x01000193);
    }
    f = `${s.name}|${s.steps.length}|${(h >>> 0).toString(16)}`;
    fingerprints.set(s, f);
  }
  return f;
}

/** The inputs of a timeline request, as a key: the same key asks nothing new. */
export function requestKey(t: TimelineState, s: AppState): string {
  const c = s.conditions;
  const base = { internal: c.internal, magnetopause: c.magnetopause, imfEfficiency: c.imfEfficiency, tail: c.tail, tiltDeg: c.tiltDeg };
  // A series fixes every step; a night follows the current solar wind (not the cursor's time).
  const wind = t.series ? null : { p: c.pdynNpa, bz: c.bzNt, by: c.byNt, dst: c.dstNt, v: c.speedKms, hours: t.night.hours, stepMin: t.night.stepMin, start: nightStartMs(t.night, c) };
  return JSON.stringify([t.series ? seriesFingerprint(t.series) : null, wind, base, s.products, s.sites, t.sunLimitDeg]);
}

/** The inputs a result shown now stands for (by reference, as the freshness rule compares them). */
const answered = (s: AppState): AnsweredFor => ({ conditions: s.conditions, products: s.products, sites: s.sites, view: s.view });

/** Most ovals computed ahead around the cursor (half the kept ones, so scrubbing back finds the earlier ones). */
const aheadLimit = (cacheSize: number) => Math.floor(cacheSize / 2);

/**
 * The client over `engine`: watches both stores from now on; dispose() stops it. The app starts
 * one (startTimelineClient); tests make their own with an in-process engine.
 */
export function createTimelineClient(engine: () => TimelineEngine, opt: TimelineClientOptions = {}): TimelineClient {
  const settleMs = opt.settleMs ?? SETTLE_MS;
  const ovals = new OvalCache(opt.ovalCacheSize ?? OVAL_CACHE_SIZE);
  const ahead = opt.ovalsAhead ?? true;

  // ---- site timelines ----
  /** Inputs and steps of each request sent (the last 16). */
  const asked = new Map<number, { key: string; steps: TimelineStepInput[] }>();
  /** The last answer (or refusal) and the inputs it was asked for; `shownKey`: those of the result in the store. */
  let last: { key: string; steps: TimelineStepInput[]; result: TimelineResult | null; error: string | null } | null = null;
  let shownKey = '';
  let shownSteps: TimelineStepInput[] = [];
  let askedKey = '';
  /** The cells of the newest request's steps done so far (they fill the table before the whole answer is in). */
  let partial: { id: number; key: string; steps: TimelineStepInput[]; sites: SiteInput[]; cells: (TimelineCell[] | undefined)[] } | null = null;
  let busy = false;
  let disposed = false;

  const currentKey = () => requestKey(timelineStore.get(), store.get());
  /** Pending: the site timelines of the current inputs are being computed (not an older request finishing). */
  const showPending = () => timelineStore.set({ pending: busy && askedKey === currentKey() });

  /** Put the kept answer into the timeline store when it is for the current inputs. */
  const showLast = (): boolean => {
    const key = currentKey();
    if (!last || last.key !== key) return false;
    shownKey = key;
    shownSteps = last.steps;
    timelineStore.set(last.result ? { result: last.result, error: null } : { result: null, error: last.error });
    return true;
  };

  const channel = new Channel<TimelineResult>(
    (a) => {
      const q = asked.get(a.requestId);
      if (!q) return;
      last = { key: q.key, steps: q.steps, result: a, error: null };
      // An answer for inputs that are no longer current is kept (they may come back) but not shown.
      if (!showLast()) poke();
    },
    (msg) => {
      const q = asked.get(channel.latestId);
      if (q) last = { key: q.key, steps: q.steps, result: null, error: msg };
      if (!showLast()) poke();
    },
    (b) => {
      busy = b;
      showPending();
      if (!b) pumpOvals();
    },
    true,
  );

  /** Nothing to ask: the current inputs' answer is shown, or is on its way. */
  const satisfied = (key: string): boolean => {
    const t = timelineStore.get();
    if (shownKey === key && (t.result !== null || t.error !== null)) return true;
    return askedKey === key && busy;
  };

  const ask = () => {
    if (disposed) return;
    const key = currentKey();
    if (satisfied(key) || showLast()) return;
    const t = timelineStore.get();
    const s = store.get();
    const steps = timelineSteps(t, s.conditions);
    if (steps.length > MAX_TIMELINE_STEPS) {
      last = { key, steps, result: null, error: `the site timelines cover at most ${MAX_TIMELINE_STEPS.toLocaleString('en')} steps; this series has ${steps.length.toLocaleString('en')} (the strips and the cursor still work; use a shorter file or a coarser cadence for the site timelines)` };
      showLast();
      return;
    }
    askedKey = key;
    showPending();
    const api = engine();
    timelineStore.set({ progress: { done: 0, total: steps.length } });
    channel.request((id) => {
      asked.set(id, { key, steps });
      if (asked.size > 16) asked.delete(asked.keys().next().value as number);
      const mine = { id, key, steps, sites: s.sites, cells: [] as (TimelineCell[] | undefined)[] };
      partial = mine;
      const answer = api.timeline(id, s.conditions, steps, {
        altKm: s.products.altKm, ...(s.products.sourceRe === null ? {} : { sourceRe: s.products.sourceRe }), minLatDeg: s.products.minLatDeg, conjugateAltKm: conjugateAltOf(s.products), minElevationDeg: s.products.minElevationDeg, sunLimitDeg: t.sunLimitDeg,
      }, s.sites, (done, total, step, cells) => {
        if (channel.latestId !== id) return;
        timelineStore.set({ progress: { done, total } });
        if (step === undefined || !cells || partial !== mine) return;
        mine.cells[step] = cells;
        if (step === timelineStore.get().cursor) scheduleFill();
      });
      // The cursor's step first (the worker takes it at its first pause).
      focusCursor();
      return answer;
    });
  };

  // The settle timer runs for one key: progress and answers do not postpone it, a change of the inputs does.
  let settle: ReturnType<typeof setTimeout> | undefined;
  let timerKey = '';
  function poke(): void {
    if (disposed) return;
    showPending();
    const key = currentKey();
    if (satisfied(key)) {
      clearTimeout(settle);
      timerKey = '';
      return;
    }
    // Inputs that come back (the same series loaded again): their kept answer at once.
    if (last && last.key === key) {
      queueMicrotask(() => { if (!disposed && !satisfied(currentKey())) showLast(); });
      return;
    }
    if (timerKey === key) return;
    timerKey = key;
    clearTimeout(settle);
    settle = setTimeout(() => { timerKey = ''; ask(); }, settleMs);
  }

  /** While the newest request runs: the cursor's step next, unless it is done. */
  function focusCursor(): void {
    const p = partial;
    const k = timelineStore.get().cursor;
    if (!p || !busy || channel.latestId !== p.id || p.cells[k] || p.key !== currentKey()) return;
    engine().focus?.(p.id, k);
  }

  // ---- scrubbing: fill the table and the maps for the cursor's step ----
  let filling = false;
  const fill = () => {
    if (disposed) return;
    const s = store.get();
    const t = timelineStore.get();
    const patch: Partial<AppState> = {};
    let answeredFor = s.answeredFor;
    // Nothing is filled over a channel's refusal of the current inputs (its message stays until it answers them).
    const sitesFresh = answeredFor.sites?.conditions === s.conditions && answeredFor.sites.products === s.products && answeredFor.sites.sites === s.sites;
    if (!sitesFresh && !s.errors.sites && !s.errors.engine) {
      const key = currentKey();
      const p = partial;
      // The whole answer, or else the newest request's cells of the steps done so far.
      const f = t.result && shownKey === key ? sitesFromTimeline(t.result, shownSteps, t.cursor, s.conditions, s.sites)
        : p && p.key === key && p.cells[t.cursor] ? sitesFromStep(p.sites, p.cells[t.cursor]!, p.steps, t.cursor, s.conditions, s.sites) : null;
      if (f) {
        patch.siteResults = f;
        answeredFor = { ...answeredFor, sites: answered(s) };
      }
    }
    const ovalFresh = answeredFor.oval?.conditions === s.conditions && answeredFor.oval.products === s.products;
    if (!ovalFresh && !s.errors.oval && !s.errors.engine) {
      const kept = ovals.get(ovalKey(s.conditions, s.products));
      if (kept) {
        patch.oval = kept;
        patch.ovalSeq = s.perf.seq;
        answeredFor = { ...answeredFor, oval: answered(s) };
      }
    }
    if (answeredFor !== s.answeredFor) store.set({ ...patch, answeredFor });
  };
  /**
   * At once, inside the notification of the change that called it, so the app renders the new
   * step once with its table and oval (a later task would cost a second render of the whole app).
   * The store hands every later subscriber the state after this write (store/core.ts reads the
   * current state for each), and the write below notifies again only when it changes something.
   */
  const scheduleFill = () => {
    if (filling) return; // the notification of the fill's own write
    filling = true;
    try {
      fill();
    } finally {
      filling = false;
    }
  };

  // ---- ovals ahead of the cursor ----
  let ovalId = 0;
  /** Ovals the worker refused or failed (asked once; the engine client's own request reports the reason). */
  const unavailable = new Set<string>();
  /** The oval in progress and the inputs it is for. */
  let ovalInFlight: { key: string; gen: string } | null = null;
  /** Which inputs the ovals ahead are for (steps, model switches, products); a change abandons the one in progress. */
  const aheadGen = () => {
    const t = timelineStore.get();
    const s = store.get();
    return JSON.stringify([t.series ? seriesFingerprint(t.series) : null, t.series ? null : [t.night, s.conditions.pdynNpa, s.conditions.bzNt, s.conditions.byNt, s.conditions.dstNt, s.conditions.speedKms], s.conditions.internal, s.conditions.magnetopause, s.conditions.imfEfficiency, s.conditions.tail, s.conditions.tiltDeg, s.products.altKm, s.products.minLatDeg, s.products.sourceRe]);
  };
  /** The next step to compute ahead: nearest the cursor without a kept oval. */
  const nextAhead = (): { key: string; c: FieldConditions } | null => {
    const t = timelineStore.get();
    const s = store.get();
    const n = t.series ? t.series.steps.length : timelineSteps(t, s.conditions).length;
    for (const k of stepsAround(t.cursor, n, aheadLimit(ovals.capacity))) {
      const p = cursorPatch(t, s.conditions, k);
      if (!p) continue;
      const c = { ...s.conditions, ...p };
      const key = ovalKey(c, s.products);
      if (!ovals.has(key) && !unavailable.has(key)) return { key, c };
    }
    return null;
  };
  function pumpOvals(): void {
    // Low priority: only once the site timelines for the current inputs are in (or refused).
    if (disposed || !ahead || busy || shownKey !== currentKey()) return;
    const gen = aheadGen();
    // One at a time; a change of the inputs sends the next one at once (the worker drops the old at its next sector).
    if (ovalInFlight && ovalInFlight.gen === gen) return;
    const next = nextAhead();
    if (!next) return;
    const s = store.get();
    const api = engine();
    const mine = { key: next.key, gen };
    ovalInFlight = mine;
    const refused = () => {
      if (unavailable.size >= ovals.capacity) unavailable.clear();
      unavailable.add(next.key);
    };
    api.oval(++ovalId, next.c, ovalRequestOptions(s.products)).then((a) => {
      if (a.error) refused();
      else if (!a.stale) {
        ovals.set(next.key, a);
        scheduleFill();
      }
    }, refused).finally(() => {
      if (ovalInFlight === mine) ovalInFlight = null;
      pumpOvals();
    });
  }

  // Keep the engine client's ovals too (a step visited before comes back at once).
  const learn = (s: AppState, prev: AppState) => {
    if (s.oval === prev.oval || !s.oval) return;
    const a = s.answeredFor.oval;
    if (a && s.ovalSeq >= 0) ovals.set(ovalKey(a.conditions, a.products), s.oval);
  };

  const unsubStore = store.subscribe((s, prev) => {
    learn(s, prev);
    if (s.conditions !== prev.conditions || s.products !== prev.products || s.sites !== prev.sites || s.siteResults !== prev.siteResults || s.oval !== prev.oval) scheduleFill();
    if (s.conditions !== prev.conditions || s.products !== prev.products || s.sites !== prev.sites) {
      poke();
      pumpOvals();
    }
  });
  const unsubTimeline = timelineStore.subscribe((t, prev) => {
    if (t.result !== prev.result || t.cursor !== prev.cursor) scheduleFill();
    if (t.series !== prev.series || t.night !== prev.night || t.sunLimitDeg !== prev.sunLimitDeg || t.result !== prev.result || t.error !== prev.error) poke();
    if (t.cursor !== prev.cursor || t.series !== prev.series || t.result !== prev.result) pumpOvals();
    if (t.cursor !== prev.cursor) focusCursor();
  });
  poke();

  return {
    ovals,
    ovalsMissing() {
      const t = timelineStore.get();
      const s = store.get();
      const n = t.series ? t.series.steps.length : timelineSteps(t, s.conditions).length;
      let missing = 0;
      for (let k = 0; k < n; k++) {
        const p = cursorPatch(t, s.conditions, k);
        if (p && !ovals.has(ovalKey({ ...s.conditions, ...p }, s.products))) missing++;
      }
      return missing;
    },
    dispose() {
      disposed = true;
      clearTimeout(settle);
      unsubStore();
      unsubTimeline();
    },
  };
}

let started = false;

/** Start the app's client (once); its worker is created on the first request. */
export function startTimelineClient(): void {
  if (started) return;
  started = true;
  let api: Comlink.Remote<EngineApi> | null = null;
  const remote = () => (api ??= Comlink.wrap<EngineApi>(new Worker(new URL('../../../workers/engine.worker.ts', import.meta.url), { type: 'module' })));
  const client = createTimelineClient(() => {
    const r = remote();
    return {
      timeline: (id, base, steps, o, sites, progress) => r.timeline(id, base, steps, o, sites, progress ? Comlink.proxy(progress) : undefined),
      focus: (id, step) => { void r.timelineFocus(id, step); },
      oval: (id, c, o) => r.oval(id, c, o),
    };
  });
  // Read-only hook for the browser benchmark (bench/timeline-browser.ts): steps without a kept oval.
  (globalThis as unknown as { __atlasTimelineClient?: { ovalsMissing(): number } }).__atlasTimelineClient = { ovalsMissing: () => client.ovalsMissing() };
}

/**
 * The timeline client (src/app/timeline/client.ts) against a scripted engine and the in-process one.
 * Source of each expectation: the app's contract in that file's header (one request per change of the
 * inputs, the newest at once, an answer shown only for the current inputs, a kept answer shown again,
 * scrubbing fills from the site timelines and the kept ovals) and, for the numbers, the engine's own
 * sites and oval channels (workers/engine-api.ts) for the same inputs.
 */
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { portWorker } from '../fake-worker';
import { createTimelineClient, type TimelineClient, type TimelineEngine } from '../../src/app/timeline/client';
import { timelineStore, type LoadedSeries } from '../../src/app/timeline/state';
import { moveCursor } from '../../src/app/timeline/actions';
import { ovalKey, ovalRequestOptions, stepsAround, OvalCache } from '../../src/app/timeline/oval-cache';
import { store, type AppState } from '../../src/app/store';
import { staleReason } from '../../src/app/store/freshness';
import { exportRefusal } from '../../src/app/exports';
import { startEngine } from '../../src/app/engine';
import { createEngineApi } from '../../workers/engine-api';
import type { OvalResult, TimelineResult, TimelineStepInput } from '../../workers/protocol';
import { expectClose } from '../helpers';

async function until(ok: () => boolean, what: string, ms = 60_000): Promise<void> {
  const t0 = Date.now();
  while (!ok()) {
    if (Date.now() - t0 > ms) throw new Error(`timed out waiting for ${what}`);
    await new Promise((r) => setTimeout(r, 5));
  }
}

/** An invented hourly series of n steps (our own numbers). */
function series(name: string, n: number, bz0 = -2): LoadedSeries {
  const t0 = Date.UTC(2027, 2, 3, 18);
  const steps = Array.from({ length: n }, (_, i) => {
    const ms = t0 + i * 3_600_000;
    return { time: new Date(ms).toISOString().replace('.000Z', 'Z'), ms, pdynNpa: 2 + 0.5 * i, bzNt: bz0 - 1.5 * i, byNt: 1, dstNt: -10 - 8 * i, dstSource: 'given' as const, speedKms: 450 };
  });
  return { name, format: 'csv', steps, cadenceMs: 3_600_000, skipped: [], errors: [] };
}

/** Load a series as the app's load action does (result cleared, cursor to 0, conditions from step 0). */
function load(s: LoadedSeries): void {
  timelineStore.set({ loading: false, series: s, cursor: 0, result: null, error: null });
  moveCursor(0);
}

/** A scripted engine: every timeline call waits until the test answers it. */
function scripted() {
  const calls: { id: number; steps: TimelineStepInput[]; resolve: (r: TimelineResult) => void }[] = [];
  const answer = (i: number) => {
    const c = calls[i];
    c.resolve({ requestId: c.id, warnings: [], stepsMs: c.steps.map((s) => Date.parse(s.time)), dstNt: [], dstSource: [], sites: [] });
  };
  const engine: TimelineEngine = {
    timeline: (id, _b, steps) => new Promise<TimelineResult>((resolve) => { calls.push({ id, steps, resolve }); }),
    oval: () => Promise.reject(new Error('not used')),
  };
  return { calls, answer, engine };
}

/** Largest |difference| of the boundary latitudes of two ovals (deg); a boundary present in one and absent in the other fails. */
function largestDifference(a: OvalResult, b: OvalResult): number {
  let worst = 0;
  a.curves.forEach((cur, h) => {
    for (const col of ['openClosedMagLatDeg', 'equatorwardMagLatDeg'] as const) {
      cur[col].forEach((v, i) => {
        const w = b.curves[h][col][i];
        expect(Number.isNaN(v), `${cur.hemisphere} ${col} sector ${i} present in both`).toBe(Number.isNaN(w));
        if (!Number.isNaN(v)) worst = Math.max(worst, Math.abs(v - w));
      });
    }
  });
  return worst;
}

const SITES = [{ name: 'Harl Moor', latDeg: 66.2, lonDeg: 24.5 }, { name: 'Wenna Bay', latDeg: 58.4, lonDeg: -101.3 }];
let client: TimelineClient | null = null;

beforeEach(() => {
  timelineStore.set({ series: null, cursor: 0, result: null, error: null, pending: false, playing: false });
  store.set({ sites: SITES.map((s) => ({ ...s })) });
});
afterEach(() => {
  client?.dispose();
  client = null;
});

describe('timeline client: requests and answers', () => {
  it('the same series loaded again after other loads gets its result back (the timeline export used to wait for ever)', async () => {
    const a = series('storm-a.csv', 6), b = series('storm-b.csv', 4), c = series('storm-c.csv', 3);
    const { calls, answer, engine } = scripted();
    client = createTimelineClient(() => engine, { settleMs: 20, ovalsAhead: false });
    load(a);
    await until(() => calls.length === 1, 'the request for A');
    // B and C loaded in quick succession while A is computed; A's answer arrives while C is loaded.
    load(b);
    load(c);
    answer(0);
    await new Promise((r) => setTimeout(r, 0));
    expect(timelineStore.get().result, 'an answer for other inputs is not shown').toBeNull();
    // A loaded again: its kept answer is shown without a new request.
    load({ ...a, steps: a.steps.map((s) => ({ ...s })) });
    await until(() => timelineStore.get().result !== null, 'A\'s result shown again', 5_000);
    expect(timelineStore.get().result!.stepsMs.length).toBe(6);
    await new Promise((r) => setTimeout(r, 60));
    expect(calls.filter((x) => x.steps.length !== 6).every((x) => x.steps.length === 3), 'only C was asked in between').toBe(true);
    // C may still be computed, but the timelines shown (A's) are complete: not pending.
    expect(timelineStore.get().pending).toBe(false);
  });

  it('a change of the inputs sends the newer request at once (the older one goes stale in the worker), and a finished request is not asked again', async () => {
    const { calls, answer, engine } = scripted();
    client = createTimelineClient(() => engine, { settleMs: 10, ovalsAhead: false });
    load(series('storm-a.csv', 5));
    await until(() => calls.length === 1, 'the first request');
    load(series('storm-b.csv', 4));
    await until(() => calls.length === 2, 'the second request sent while the first is in flight', 2_000);
    answer(0);
    answer(1);
    await until(() => timelineStore.get().result?.stepsMs.length === 4 && !timelineStore.get().pending, 'B shown');
    // Cursor moves and unrelated store changes ask nothing new.
    moveCursor(2);
    moveCursor(3);
    store.set({ notices: ['x'] });
    await new Promise((r) => setTimeout(r, 50));
    expect(calls.length).toBe(2);
  });

  it('a refusal is shown once and not asked again in a loop', async () => {
    let n = 0;
    const engine: TimelineEngine = {
      timeline: async (id) => { n++; return { requestId: id, error: 'timeline: expected at most 3 things', warnings: [], stepsMs: [], dstNt: [], dstSource: [], sites: [] }; },
      oval: () => Promise.reject(new Error('not used')),
    };
    client = createTimelineClient(() => engine, { settleMs: 5, ovalsAhead: false });
    load(series('storm-a.csv', 5));
    await until(() => timelineStore.get().error !== null, 'the refusal');
    await new Promise((r) => setTimeout(r, 60));
    expect(n).toBe(1);
    expect(timelineStore.get().error).toBe('timeline: expected at most 3 things');
  });
});

describe('timeline client: ovals ahead', () => {
  it('a refused or failed oval is asked once, not again in a loop', async () => {
    const ovalCalls: string[] = [];
    const engine: TimelineEngine = {
      timeline: async (id, _b, steps) => ({ requestId: id, warnings: [], stepsMs: steps.map((x) => Date.parse(x.time)), dstNt: [], dstSource: [], sites: [] }),
      oval: async (id, c) => {
        ovalCalls.push(c.time);
        if (ovalCalls.length % 2) return { requestId: id, error: 'oval: refused for the test', warnings: [], curves: [] };
        throw new Error('worker gone');
      },
    };
    client = createTimelineClient(() => engine, { settleMs: 5 });
    load(series('storm-a.csv', 5));
    await until(() => ovalCalls.length >= 4, 'the ovals ahead asked');
    await new Promise((r) => setTimeout(r, 80));
    // Steps 1–4 ahead of the cursor at 0, each once.
    expect([...ovalCalls].sort()).toEqual(series('x', 5).steps.slice(1).map((x) => x.time).sort());
  });
});

/** The table filled from the site timelines equals the sites channel's answer for the same inputs (field lines, footpoints and CGM aside). */
async function expectTableIsSitesAnswer(st: AppState): Promise<void> {
  const o = { altKm: st.products.altKm, minLatDeg: st.products.minLatDeg, conjugateAltKm: st.products.conjugateAltKm ?? st.products.altKm, minElevationDeg: st.products.minElevationDeg };
  const direct = await createEngineApi().sites(1, st.conditions, o, st.sites);
  st.siteResults!.sites.forEach((got, i) => {
    const { lineGeo: _a, footpoints: _b, cgm: _c, ...w } = direct.sites[i];
    const { lineGeo: _d, footpoints: _e, ...g } = got;
    expect(g, got.name).toEqual(w);
  });
}

describe('timeline client: scrubbing fills the table and the maps at once', () => {
  it('after the site timelines and the ovals ahead are in, a cursor move shows the step\'s table (filled) and oval (kept) in the same task', async () => {
    const api = createEngineApi();
    const s = series('storm-fill.csv', 4);
    client = createTimelineClient(() => api, { settleMs: 5 });
    load(s);
    await until(() => timelineStore.get().result !== null, 'the site timelines', 60_000);
    // The ovals of steps 1–3 (the cursor's own step 0 is the engine client's).
    await until(() => client!.ovals.size >= 3, 'the ovals ahead', 60_000);
    moveCursor(2);
    await Promise.resolve();
    await Promise.resolve();
    const st = store.get();
    expect(staleReason(st, 'sites')).toBeNull();
    expect(staleReason(st, 'oval')).toBeNull();
    expect(st.siteResults!.fromTimeline).toBe(true);
    expect(exportRefusal(st, 'sites-csv')).toMatch(/still being completed/);
    await expectTableIsSitesAnswer(st);
    // The kept oval equals a fresh oval channel's answer to the search tolerance (0.01°; hints change the cost, not the answer; measured: 0.0075°).
    const fresh = await createEngineApi().oval(1, st.conditions, ovalRequestOptions(st.products));
    expectClose(largestDifference(st.oval!, fresh), 0, 0.01, 'kept oval vs a fresh oval, largest difference (deg)');
    // Over a channel's refusal nothing is filled: its message stays until the channel answers.
    store.set({ errors: { oval: 'oval: refused for the test' } });
    moveCursor(3);
    expect(staleReason(store.get(), 'oval')).toBe('no boundaries for the current inputs: oval: refused for the test');
    expect(store.get().answeredFor.oval?.conditions).not.toBe(store.get().conditions);
    expect(store.get().siteResults!.fromTimeline && store.get().answeredFor.sites?.conditions === store.get().conditions).toBe(true);
    store.set({ errors: {} });
  }, 180_000);

  it('before the site timelines are in: the cursor\'s step is computed next and fills the table from its cells (equal to the sites channel\'s answer)', async () => {
    const api = createEngineApi();
    const s = series('storm-partial.csv', 12);
    const order: number[] = [];
    let release = () => {};
    const held = new Promise<void>((r) => { release = r; });
    const engine: TimelineEngine = {
      // The whole answer is held back until the test has looked at the filled table.
      timeline: (id, b, st, o, si, progress) => api.timeline(id, b, st, o, si, (done, total, step, cells) => {
        if (step !== undefined) order.push(step);
        if (order.length === 1) moveCursor(9);
        progress?.(done, total, step, cells);
      }).then(async (r) => { await held; return r; }),
      focus: (id, k) => { void api.timelineFocus(id, k); },
      oval: (id, c, o) => api.oval(id, c, o),
    };
    client = createTimelineClient(() => engine, { settleMs: 5, ovalsAhead: false });
    load(s);
    await until(() => order.length === 12, 'every step of the site timelines', 60_000);
    // Step 0 first (the cursor's at the request), then the cursor's new step 9, then the rest in order.
    expect(order.slice(0, 3)).toEqual([0, 9, 1]);
    const st = store.get();
    expect(timelineStore.get().result).toBeNull();
    expect(timelineStore.get().cursor).toBe(9);
    expect(staleReason(st, 'sites')).toBeNull();
    expect(st.siteResults!.fromTimeline).toBe(true);
    await expectTableIsSitesAnswer(st);
    release();
    await until(() => timelineStore.get().result !== null, 'the site timelines', 60_000);
  }, 180_000);

  it('the oval request of the kept ovals is the engine client\'s: its first oval equals one asked with ovalRequestOptions', async () => {
    const fake = portWorker();
    store.set({ sites: [] });
    const engine = startEngine(() => fake);
    try {
      await until(() => store.get().oval !== null && staleReason(store.get(), 'oval') === null, 'the engine client\'s oval', 60_000);
      const st = store.get();
      const mine: OvalResult = await createEngineApi().oval(1, st.conditions, ovalRequestOptions(st.products));
      expect(mine.curves.map((c) => [...c.mltHours])).toEqual(st.oval!.curves.map((c) => [...c.mltHours]));
      // Another altitude, source distance or search floor moves the boundaries by tenths of a degree; the engine's
      // own hints (a second request) by at most the search tolerance, 0.01° (measured: 0.0075°).
      expectClose(largestDifference(mine, st.oval!), 0, 0.01, 'engine client\'s oval vs ovalRequestOptions, largest difference (deg)');
    } finally {
      engine.dispose();
    }
  }, 180_000);
});

describe('oval cache and the order ahead', () => {
  it('keys: field order and absent vs undefined fields do not matter; any value does', () => {
    const p = store.get().products;
    const c = store.get().conditions;
    const reordered = Object.fromEntries(Object.entries(c).reverse()) as typeof c;
    expect(ovalKey(reordered, p)).toBe(ovalKey(c, p));
    expect(ovalKey({ ...c, speedKms: undefined }, p)).toBe(ovalKey((({ speedKms: _s, ...r }) => r)(c), p));
    expect(ovalKey({ ...c, bzNt: c.bzNt + 0.1 }, p)).not.toBe(ovalKey(c, p));
    expect(ovalKey(c, { ...p, altKm: p.altKm + 1 })).not.toBe(ovalKey(c, p));
    expect(ovalKey(c, { ...p, sourceRe: 6 })).not.toBe(ovalKey(c, p));
  });

  it('least recently used dropped first; stale or failed answers not kept', () => {
    const cache = new OvalCache(2);
    const o = (id: number): OvalResult => ({ requestId: id, warnings: [], curves: [{} as OvalResult['curves'][number]] });
    cache.set('a', o(1));
    cache.set('b', o(2));
    cache.get('a');
    cache.set('c', o(3));
    expect([cache.has('a'), cache.has('b'), cache.has('c')]).toEqual([true, false, true]);
    cache.set('d', { ...o(4), stale: true });
    cache.set('e', { ...o(5), error: 'x' });
    expect(cache.size).toBe(2);
  });

  it('steps ahead: nearest first, forward before backward, the cursor left out, within the limit', () => {
    expect(stepsAround(3, 6, 10)).toEqual([4, 2, 5, 1, 0]);
    expect(stepsAround(0, 4, 2)).toEqual([1, 2]);
    expect(stepsAround(5, 6, 3)).toEqual([4, 3, 2]);
  });
});

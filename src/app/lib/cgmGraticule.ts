/**
 * The polar maps' CGM graticule on the app side: asks the graticule worker
 * (workers/graticule.worker.ts) off the main thread, keeps the answers in a
 * small cache keyed by what the graticule depends on (main field, time, tilt,
 * height: `graticuleKey`), so toggling the option or changing any other
 * control never recomputes it, and holds at most one request in flight (a
 * scrubbed time asks only for the latest one when the worker is free).
 */
import { useSyncExternalStore } from 'react';
import * as Comlink from 'comlink';
import { createStore } from '../store/core';
import { graticuleKey, type GraticuleRequest } from '../../../workers/channels/graticule-key';
import type { GraticuleAnswer } from '../../../workers/channels/graticule';
import type { GraticuleApi } from '../../../workers/graticule.worker';
import type { CgmGraticule } from '../../physics/mapping';

export { graticuleKey, type GraticuleRequest };

interface GraticuleState {
  /** Key of the graticule the maps want now (null: the option is off). */
  wanted: string | null;
  /** Answers by key (the cache; the latest few). */
  cache: ReadonlyMap<string, CgmGraticule>;
  /** Key being computed, or null. */
  computing: string | null;
  /** Refusal or failure of the last request, with its key. */
  error: { key: string; message: string } | null;
  /** Requests sent to the worker so far (the maps show it as data-cgm-requests, for the tests). */
  sent: number;
}

const CACHE_SIZE = 6;

export const graticuleStore = createStore<GraticuleState>({ wanted: null, cache: new Map(), computing: null, error: null, sent: 0 });

let api: Comlink.Remote<GraticuleApi> | null = null;
let nextRequest: GraticuleRequest | null = null;

function remember(key: string, g: CgmGraticule): ReadonlyMap<string, CgmGraticule> {
  const m = new Map(graticuleStore.get().cache);
  m.delete(key);
  m.set(key, g);
  while (m.size > CACHE_SIZE) m.delete(m.keys().next().value as string);
  return m;
}

function send(r: GraticuleRequest): void {
  const key = graticuleKey(r);
  api ??= Comlink.wrap<GraticuleApi>(new Worker(new URL('../../../workers/graticule.worker.ts', import.meta.url), { type: 'module' }));
  graticuleStore.set((s) => ({ computing: key, sent: s.sent + 1 }));
  api.graticule(r)
    .then(
      (a: GraticuleAnswer) => graticuleStore.set(a.ok ? { cache: remember(a.key, a.graticule), error: null } : { error: { key: a.key, message: a.error } }),
      (e: unknown) => graticuleStore.set({ error: { key, message: e instanceof Error ? e.message : String(e) } }),
    )
    .finally(() => {
      graticuleStore.set({ computing: null });
      const q = nextRequest;
      nextRequest = null;
      if (q) wantGraticule(q);
    });
}

/** The maps want this graticule (null: none). Served from the cache when it holds it; else computed once the worker is free. */
export function wantGraticule(r: GraticuleRequest | null): void {
  if (r === null) {
    nextRequest = null;
    graticuleStore.set({ wanted: null });
    return;
  }
  const key = graticuleKey(r);
  const s = graticuleStore.get();
  graticuleStore.set({ wanted: key });
  if (s.cache.has(key) || s.computing === key) return;
  if (s.error?.key === key) return;
  if (s.computing !== null) {
    nextRequest = r;
    return;
  }
  send(r);
}

export interface GraticuleView {
  /** The graticule for the wanted key when computed; while it is computed, the circles of an earlier answer of the same date (see `partial`). */
  graticule: CgmGraticule | null;
  /** True while the wanted graticule is being computed or waits for the worker. */
  busy: boolean;
  /** True when `graticule` holds only the latitude circles of an earlier time of the same date (they do not turn with the Sun). */
  partial: boolean;
  error: string | null;
}

/** The parts of a key the latitude circles depend on: main field, UTC date, height (not the time of day, not the tilt). */
function circlesKeyOf(key: string): string {
  const [internal, time, , height] = key.split('|');
  return `${internal}|${time.slice(0, 10)}|${height}`;
}

const circlesOnly = new WeakMap<CgmGraticule, CgmGraticule>();
function circlesOf(g: CgmGraticule): CgmGraticule {
  let c = circlesOnly.get(g);
  if (!c) {
    c = { ...g, lines: g.lines.filter((l) => l.kind === 'latitude') };
    circlesOnly.set(g, c);
  }
  return c;
}

function viewOf(s: GraticuleState): GraticuleView {
  if (s.wanted === null) return NONE;
  const g = s.cache.get(s.wanted) ?? null;
  const error = s.error?.key === s.wanted ? s.error.message : null;
  if (g || error) return { graticule: g, busy: false, partial: false, error };
  // While the meridians of a new time are traced, the circles of the latest answer of the same date stay drawn.
  const ck = circlesKeyOf(s.wanted);
  const earlier = [...s.cache.entries()].reverse().find(([k]) => circlesKeyOf(k) === ck);
  return { graticule: earlier ? circlesOf(earlier[1]) : null, busy: true, partial: !!earlier, error: null };
}
const NONE: GraticuleView = { graticule: null, busy: false, partial: false, error: null };

let lastState: GraticuleState | null = null;
let lastView: GraticuleView = NONE;
/** The wanted graticule (a stable object per store state). */
export function graticuleView(): GraticuleView {
  const s = graticuleStore.get();
  if (s !== lastState) {
    const v = viewOf(s);
    if (v.graticule !== lastView.graticule || v.busy !== lastView.busy || v.partial !== lastView.partial || v.error !== lastView.error) lastView = v;
    lastState = s;
  }
  return lastView;
}

/** Requests sent to the worker so far. */
export function useGraticuleRequests(): number {
  return useSyncExternalStore(graticuleStore.subscribe, () => graticuleStore.get().sent, () => graticuleStore.get().sent);
}

export function useGraticule(): GraticuleView {
  return useSyncExternalStore(graticuleStore.subscribe, graticuleView, graticuleView);
}

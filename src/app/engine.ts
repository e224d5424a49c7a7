/**
 * The engine client: the app's only link to the worker. Watches the store,
 * asks for the fast scene first and the refined oval, sites and sweep after,
 * and writes current answers back into the store.
 */
import * as Comlink from 'comlink';
import type { EngineApi, FanSpec, OvalResult, SceneResult, SitesResult, SweepResult } from '../../workers/protocol';
import { Channel } from './channel';
import { conjugateAltOf, store, type AnsweredFor, type AppState } from './store';

/** The field-line fan: MLT meridians every 3 h, seeds from 58° to 82° magnetic latitude. */
const FAN: FanSpec = {
  mltHours: [0, 3, 6, 9, 12, 15, 18, 21],
  magLatDeg: [58, 63, 67, 70, 73, 76, 79, 82],
};

/** Sweep ranges: Pdyn 0.3–30 nPa (log spaced), Bz −20..+10 nT. */
const SWEEP = { pdyn: { from: 0.3, to: 30, steps: 13 }, bz: { from: -20, to: 10, steps: 13 } } as const;

const OVAL_MLT_STEP_H = 0.5;

/** Rest of the controls (ms) before the refined products are asked for. */
const SETTLE_MS = 40;

interface EngineClient {
  dispose(): void;
  refreshSweep(): void;
}

type ChannelName = 'scene' | 'oval' | 'sites' | 'sweep';

const RESULT_KEY = { scene: 'scene', oval: 'oval', sites: 'siteResults', sweep: 'sweep' } as const;

/**
 * Store writer: an engine error for a channel. The channel's result is
 * cleared with it, so no number computed for earlier inputs stays on screen
 * or goes into an export while the current inputs are refused.
 */
const reportError = (ch: keyof AppState['errors']) => (msg: string) => store.set((s) => {
  if (ch === 'engine') return { errors: { ...s.errors, engine: msg } };
  const answeredFor = { ...s.answeredFor };
  delete answeredFor[ch];
  return { errors: { ...s.errors, [ch]: msg }, [RESULT_KEY[ch]]: null, answeredFor };
});

/** The errors without the channel's (the same object when it had none). */
function errorsWithout(ch: keyof AppState['errors']): AppState['errors'] {
  const e = store.get().errors;
  if (e[ch] === undefined) return e;
  const rest = { ...e };
  delete rest[ch];
  return rest;
}

/** Store writer: whether a channel has a request in flight. */
const reportBusy = (ch: keyof AppState['pending']) => (b: boolean) => store.set((s) => ({ pending: { ...s.pending, [ch]: b } }));

/** Which change (perf sequence) and which inputs each request was made for; the last 64 requests. */
function requestBook() {
  const seqOf = new Map<string, number>();
  const inputsOf = new Map<string, AnsweredFor>();
  return {
    remember(ch: ChannelName, id: number): AppState {
      const s = store.get();
      const key = `${ch}${id}`;
      seqOf.set(key, s.perf.seq);
      inputsOf.set(key, { conditions: s.conditions, products: s.products, sites: s.sites, view: s.view });
      if (inputsOf.size > 64) { const k = inputsOf.keys().next().value as string; inputsOf.delete(k); seqOf.delete(k); }
      return s;
    },
    seq: (ch: ChannelName, id: number) => seqOf.get(`${ch}${id}`) ?? -1,
    answered: (ch: ChannelName, id: number) => ({ answeredFor: { ...store.get().answeredFor, [ch]: inputsOf.get(`${ch}${id}`) } }),
  };
}

/** Product options of a request; a source distance left to follow the conditions is not sent. */
const productOpts = (s: AppState) => ({
  altKm: s.products.altKm,
  minLatDeg: s.products.minLatDeg,
  ...(s.products.sourceRe === null ? {} : { sourceRe: s.products.sourceRe }),
});

export function startEngine(makeWorker?: () => Worker): EngineClient {
  const worker = makeWorker ? makeWorker() : new Worker(new URL('../../workers/engine.worker.ts', import.meta.url), { type: 'module' });
  const api = Comlink.wrap<EngineApi>(worker);
  worker.addEventListener('error', (e) => reportError('engine')(`engine worker failed: ${e.message || 'could not start'}`));

  // Each answer remembers which change and which inputs it belongs to.
  const book = requestBook();
  const scene = new Channel<SceneResult>((a) => store.set({ scene: a, errors: errorsWithout('scene'), sceneSeq: book.seq('scene', a.requestId), ...book.answered('scene', a.requestId) }), reportError('scene'), reportBusy('scene'));
  // After a change the sites and the sweep (many model preparations) wait until the oval is idle,
  // so the refined oval has the worker to itself (their work would interleave with its sectors).
  let sweepDue = false;
  let sitesDue = false;
  const ovalBusy = reportBusy('oval');
  // Oval, sites and sweep pause between pieces of work in the worker, so a newer request goes out at
  // once and the older one stops at its next pause (Channel's supersede); the scene does not pause.
  const oval = new Channel<OvalResult>((a) => store.set({ oval: a, errors: errorsWithout('oval'), ovalSeq: book.seq('oval', a.requestId), ...book.answered('oval', a.requestId) }), reportError('oval'), (b) => {
    ovalBusy(b);
    if (b) return;
    if (sitesDue) {
      sitesDue = false;
      askSites();
    }
    if (sweepDue) {
      sweepDue = false;
      askSweep();
    }
  }, true);
  const sites = new Channel<SitesResult>((a) => store.set({ siteResults: a, errors: errorsWithout('sites'), ...book.answered('sites', a.requestId) }), reportError('sites'), reportBusy('sites'), true);
  const sweep = new Channel<SweepResult>((a) => store.set({ sweep: a, errors: errorsWithout('sweep'), ...book.answered('sweep', a.requestId) }), reportError('sweep'), reportBusy('sweep'), true);

  const askScene = () => scene.request((id) => api.scene(id, book.remember('scene', id).conditions, FAN));
  const askOval = () => oval.request((id) => {
    const s = book.remember('oval', id);
    return api.oval(id, s.conditions, { ...productOpts(s), mltStepHours: OVAL_MLT_STEP_H });
  });
  const askSites = () => sites.request((id) => {
    const s = book.remember('sites', id);
    return api.sites(id, s.conditions, { ...productOpts(s), conjugateAltKm: conjugateAltOf(s.products), minElevationDeg: s.products.minElevationDeg }, s.sites);
  });
  const askSweep = () => sweep.request((id) => {
    const s = book.remember('sweep', id);
    const v = s.view.sweepVary;
    return api.sweep(id, s.conditions, { ...productOpts(s), vary: v, ...SWEEP[v], mltHours: s.view.sweepMlt });
  });

  // Refined products wait until the controls rest a moment (longer than the interval of a drag's
  // input events), so dragging stays fluid; a stale oval stops at its next sector anyway.
  let settle: ReturnType<typeof setTimeout> | undefined;
  const refine = (withSweep: boolean) => {
    clearTimeout(settle);
    settle = setTimeout(() => {
      if (withSweep) sweepDue = true;
      sitesDue = true;
      askOval();
    }, SETTLE_MS);
  };

  const unsub = store.subscribe((s, prev) => {
    if (s.conditions !== prev.conditions) {
      askScene();
      refine(true);
    } else if (s.products !== prev.products) {
      refine(true);
    } else if (s.sites !== prev.sites) {
      askSites();
    }
    if (s.view.sweepVary !== prev.view.sweepVary || s.view.sweepMlt !== prev.view.sweepMlt) askSweep();
  });

  askScene();
  sweepDue = true;
  sitesDue = true;
  askOval();

  return {
    dispose() {
      unsub();
      clearTimeout(settle);
      worker.terminate();
    },
    refreshSweep: askSweep,
  };
}

/**
 * The engine client: the app's only link to the workers. Watches the store,
 * asks for the fast scene first and the refined oval, sites and sweep after,
 * and writes current answers back into the store. Two engine workers (two
 * cores): each traces half of the scene's fan and then searches one
 * hemisphere's oval; the main one also answers sites and sweep.
 */
import * as Comlink from 'comlink';
import type { EngineApi, FanSpec, FrameInfo, OvalResult, SceneResult, SitesResult, SweepResult } from '../../workers/protocol';
import { Channel } from './channel';
import { conjugateAltOf, store, type AnsweredFor, type AppState } from './store';
import { noteStep } from './perf';
import { ovalRequestOptions } from './timeline/oval-cache';
import { nextTask } from '../lib/next-task';

/** The field-line fan: MLT meridians every 3 h, seeds from 58° to 82° magnetic latitude. */
const FAN: FanSpec = {
  mltHours: [0, 3, 6, 9, 12, 15, 18, 21],
  magLatDeg: [58, 63, 67, 70, 73, 76, 79, 82],
};

/** Sweep ranges: Pdyn 0.3–30 nPa (log spaced), Bz −20..+10 nT. */
const SWEEP = { pdyn: { from: 0.3, to: 30, steps: 13 }, bz: { from: -20, to: 10, steps: 13 } } as const;

/** Changes closer than this (ms) are a drag: the refined products wait until the controls rest this long. */
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

/** Whether the store shows an oval computed for the current conditions and products (no error). */
function ovalShownForCurrent(): boolean {
  const s = store.get();
  const a = s.answeredFor.oval;
  return s.oval !== null && !s.errors.oval && !s.errors.engine && a?.conditions === s.conditions && a.products === s.products;
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

/** Whether two frame blocks hold the same numbers (typed arrays element by element). */
export function sameFrames(a: FrameInfo, b: FrameInfo): boolean {
  for (const k of Object.keys(a) as (keyof FrameInfo)[]) {
    const x = a[k], y = b[k];
    if (typeof x === 'number' || typeof y === 'number') {
      if (!Object.is(x, y)) return false;
    } else if (x.length !== y.length || x.some((v, i) => !Object.is(v, y[i]))) return false;
  }
  return Object.keys(b).length === Object.keys(a).length;
}

/**
 * A scene answer with the current answer's frames and magnetopause objects kept where their
 * numbers did not change (a pressure step changes neither the frames nor, with the
 * magnetopause off, its block): the parts of the page that draw only those (axes, globe,
 * graticules, polar maps) then skip the answer.
 */
function keepUnchanged(a: SceneResult, cur: SceneResult | null): SceneResult {
  if (!cur) return a;
  const frames = sameFrames(cur.frames, a.frames) ? cur.frames : a.frames;
  const m = a.magnetopause, n = cur.magnetopause;
  const magnetopause = m.enabled === n.enabled && Object.is(m.r0Re, n.r0Re) && Object.is(m.alpha, n.alpha) ? n : m;
  return frames === a.frames && magnetopause === a.magnetopause ? a : { ...a, frames, magnetopause };
}

/**
 * One oval from the answers of its parts (one hemisphere per worker): stale when any part is, the
 * first part's error when any failed, else the curves in the parts' order, the warnings of all
 * (each once), the first part's `used` (every part prepared the same conditions) and the longest
 * worker time.
 */
export function mergeOvalParts(requestId: number, parts: OvalResult[]): OvalResult {
  if (parts.length === 1) return parts[0];
  if (parts.some((p) => p.stale)) return { requestId, stale: true, warnings: [], curves: [] };
  const failed = parts.find((p) => p.error !== undefined);
  if (failed) return { requestId, error: failed.error, warnings: [], curves: [] };
  const times = parts.map((p) => p.workerMs).filter((t): t is number => t !== undefined);
  return {
    requestId,
    warnings: [...new Set(parts.flatMap((p) => p.warnings))],
    curves: parts.flatMap((p) => p.curves),
    ...(parts[0].used ? { used: parts[0].used } : {}),
    ...(times.length > 0 ? { workerMs: Math.max(...times) } : {}),
  };
}

/**
 * One scene from the answers of its parts (the fan's MLT meridians split between the workers, in
 * order): stale when any part is, the first error when any failed, else the first part's frames and
 * magnetopause (every part prepared the same conditions), the lines of all parts one after the
 * other (offsets moved on), the warnings of all (each once) and the longest worker time.
 */
export function mergeSceneParts(requestId: number, parts: SceneResult[]): SceneResult {
  if (parts.length === 1) return parts[0];
  const first = parts[0];
  const base = { requestId, warnings: [], frames: first.frames, magnetopause: first.magnetopause, lines: first.lines };
  if (parts.some((p) => p.stale)) return { ...base, stale: true };
  const failed = parts.find((p) => p.error !== undefined);
  if (failed) return { ...base, error: failed.error };
  let nPoints = 0, nLines = 0;
  for (const p of parts) { nPoints += p.lines.pointsGeo.length / 3; nLines += p.lines.types.length; }
  const pointsGeo = new Float64Array(3 * nPoints);
  const offsets = new Int32Array(nLines + 1);
  const types = new Uint8Array(nLines);
  let pt = 0, ln = 0;
  for (const p of parts) {
    const b = p.lines;
    pointsGeo.set(b.pointsGeo, 3 * pt);
    types.set(b.types, ln);
    for (let i = 1; i < b.offsets.length; i++) offsets[ln + i] = pt + b.offsets[i];
    pt += b.pointsGeo.length / 3;
    ln += b.types.length;
  }
  const times = parts.map((p) => p.workerMs).filter((t): t is number => t !== undefined);
  return {
    ...base,
    warnings: [...new Set(parts.flatMap((p) => p.warnings))],
    lines: { pointsGeo, offsets, types },
    ...(times.length > 0 ? { workerMs: Math.max(...times) } : {}),
  };
}

/** The fan split in two by MLT meridians (first half, second half), or the whole fan alone when it has one meridian. */
export function splitFan(fan: FanSpec): FanSpec[] {
  const k = Math.ceil(fan.mltHours.length / 2);
  if (fan.mltHours.length < 2) return [fan];
  return [{ mltHours: fan.mltHours.slice(0, k), magLatDeg: fan.magLatDeg }, { mltHours: fan.mltHours.slice(k), magLatDeg: fan.magLatDeg }];
}


/** Product options of a request; a source distance left to follow the conditions is not sent. */
const productOpts = (s: AppState) => ({
  altKm: s.products.altKm,
  minLatDeg: s.products.minLatDeg,
  ...(s.products.sourceRe === null ? {} : { sourceRe: s.products.sourceRe }),
});

/** Which engine worker: 'main' (half the scene, the north oval, sites, sweep) or 'oval' (the other half of the scene, the south oval). */
export type WorkerRole = 'main' | 'oval';

/**
 * Start the client. `makeWorker` (tests) makes each worker; by default two module workers of
 * workers/engine.worker.ts, or one where the browser reports a single core (`workers: 1`).
 */
export function startEngine(makeWorker?: (role: WorkerRole) => Worker, opts: { workers?: 1 | 2 } = {}): EngineClient {
  const make = makeWorker ?? (() => new Worker(new URL('../../workers/engine.worker.ts', import.meta.url), { type: 'module' }));
  const nWorkers = opts.workers ?? (typeof navigator !== 'undefined' && navigator.hardwareConcurrency === 1 ? 1 : 2);
  const worker = make('main');
  const api = Comlink.wrap<EngineApi>(worker);
  worker.addEventListener('error', (e) => reportError('engine')(`engine worker failed: ${e.message || 'could not start'}`));
  // The second worker traces half the fan and searches the south oval while the first does the rest.
  const ovalWorker = nWorkers > 1 ? make('oval') : null;
  const ovalApi = ovalWorker ? Comlink.wrap<EngineApi>(ovalWorker) : null;
  ovalWorker?.addEventListener('error', (e) => reportError('engine')(`oval worker failed: ${e.message || 'could not start'}`));

  // Each answer remembers which change and which inputs it belongs to.
  const book = requestBook();
  /** Timing marks of an answer (perf.ts): back on the main thread, the worker's time, then stored. */
  const marked = <A extends { requestId: number; workerMs?: number }>(what: 'scene' | 'oval', write: (a: A, seq: number) => void) => (a: A) => {
    const seq = book.seq(what, a.requestId);
    noteStep(what, seq, 'answered');
    if (a.workerMs !== undefined) noteStep(what, seq, 'workerMs', a.workerMs);
    write(a, seq);
    noteStep(what, seq, 'stored');
  };
  // Set below (the refined products' schedule): the scene channel went idle; the oval waits for the scene or for rest.
  let sceneDone = () => {};
  let ovalWaits = () => false;
  const sceneBusy = reportBusy('scene');
  let sceneInFlight = false;
  const scene = new Channel<SceneResult>(marked('scene', (a, seq) => {
    const answered = book.answered('scene', a.requestId);
    // The scene for the current conditions is in: the oval waiting for it goes out once React has drawn the lines (sceneDone).
    if (answered.answeredFor.scene?.conditions === store.get().conditions) sceneDone();
    store.set({ scene: keepUnchanged(a, store.get().scene), errors: errorsWithout('scene'), sceneSeq: seq, ...answered });
  }), reportError('scene'), (b) => {
    sceneBusy(b);
    sceneInFlight = b;
    if (!b) sceneDone();
  });
  // After a change the sites and the sweep (many model preparations) wait until the oval is idle,
  // so the refined oval has the worker to itself (their work would interleave with its sectors).
  let sweepDue = false;
  let sitesDue = false;
  const ovalBusy = reportBusy('oval');
  // Oval, sites and sweep pause between pieces of work in the worker, so a newer request goes out at
  // once and the older one stops at its next pause (Channel's supersede); the scene does not pause.
  const oval = new Channel<OvalResult>(marked('oval', (a, seq) => {
    const answered = book.answered('oval', a.requestId);
    // An oval for earlier inputs never replaces one shown for the current inputs (a kept oval filled by the timeline).
    const cur = store.get();
    const forCurrent = answered.answeredFor.oval?.conditions === cur.conditions && answered.answeredFor.oval.products === cur.products;
    if (!forCurrent && ovalShownForCurrent()) return;
    store.set({ oval: a, errors: errorsWithout('oval'), ovalSeq: seq, ...answered });
  }), reportError('oval'), (b) => {
    ovalBusy(b);
    // Busy, or idle while the next oval waits (for the scene, or for the controls to rest): sites and sweep wait.
    if (b || ovalWaits()) return;
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

  const askScene = () => scene.request((id) => {
    const s = book.remember('scene', id);
    noteStep('scene', s.perf.seq, 'sent');
    if (!ovalApi) return api.scene(id, s.conditions, FAN);
    // Half the fan on each worker, each before its half of the oval (asked right after).
    const [a, b] = splitFan(FAN);
    return Promise.all([api.scene(id, s.conditions, a), ovalApi.scene(id, s.conditions, b)]).then((parts) => mergeSceneParts(id, parts));
  });
  const askOval = () => oval.request((id) => {
    const s = book.remember('oval', id);
    noteStep('oval', s.perf.seq, 'sent');
    const o = ovalRequestOptions(s.products);
    if (!ovalApi) return api.oval(id, s.conditions, o);
    // One hemisphere per worker (each keeps its own previous answer as the next request's hints).
    return Promise.all([api.oval(id, s.conditions, { ...o, hemispheres: ['north'] }), ovalApi.oval(id, s.conditions, { ...o, hemispheres: ['south'] })])
      .then((parts) => mergeOvalParts(id, parts));
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

  // Scene first: after an isolated condition change the oval is asked once the scene's answer is
  // in and drawn (both workers trace their half of the fan first; the searches start in the task
  // after the one that stored the scene), so the oval searches slow neither the scene's tracing nor
  // its drawing; a change of the products alone (no new scene) asks at once. A change that
  // follows the previous one within SETTLE_MS is part of a drag: the refined products wait until
  // the controls rest that long (longer than the interval of a drag's input events), so dragging
  // stays fluid; an oval already running is superseded by the request at rest, and sites and
  // sweep wait for it.
  let settle: ReturnType<typeof setTimeout> | undefined;
  let afterScene: (() => void) | null = null;
  let lastChangeAt = -Infinity;
  const refine = (withSweep: boolean, sceneAsked: boolean) => {
    const now = performance.now();
    const inDrag = now - lastChangeAt < SETTLE_MS;
    lastChangeAt = now;
    clearTimeout(settle);
    settle = undefined;
    afterScene = null;
    const ask = () => {
      settle = undefined;
      // The oval for these inputs is already shown (kept from an earlier visit of a timeline step):
      // no second search; the sites and the sweep go at once.
      if (ovalShownForCurrent()) {
        sitesDue = false;
        if (withSweep) sweepDue = false;
        askSites();
        if (withSweep) askSweep();
        return;
      }
      if (withSweep) sweepDue = true;
      sitesDue = true;
      askOval();
    };
    if (inDrag) settle = setTimeout(ask, SETTLE_MS);
    else if (sceneAsked && sceneInFlight) afterScene = ask;
    else ask();
  };
  // The scene's answer is drawn by React's render and effects of its store change, which run as
  // microtasks of the task that wrote it; the oval goes out in the task after, so the two oval searches
  // do not take the cores while the main thread builds and draws the lines. A newer change in
  // between replaces `afterScene`, and the older release then does nothing.
  sceneDone = () => {
    const ask = afterScene;
    if (!ask) return;
    void nextTask().then(() => {
      if (afterScene !== ask) return;
      afterScene = null;
      ask();
    });
  };
  ovalWaits = () => settle !== undefined || afterScene !== null;

  const unsub = store.subscribe((s, prev) => {
    if (s.conditions !== prev.conditions) {
      askScene();
      refine(true, true);
    } else if (s.products !== prev.products) {
      refine(true, false);
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
      ovalWorker?.terminate();
    },
    refreshSweep: askSweep,
  };
}

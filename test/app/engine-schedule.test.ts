import { describe, it, expect } from 'vitest';
import { portWorker } from '../fake-worker';
import { createEngineApi } from '../../workers/engine-api';
import type { EngineApi } from '../../workers/protocol';
import { startEngine } from '../../src/app/engine';
import { setConditions, store, type AppState } from '../../src/app/store';
import type { OvalResult } from '../../workers/protocol';
import { staleReason } from '../../src/app/store/freshness';

// The engine client's schedule (src/app/engine.ts): scene first, the oval once the scene is in, one
// hemisphere per worker; during a drag (changes closer than 40 ms) the oval waits until the controls rest.
type Ev = { worker: string; what: 'scene' | 'oval' | 'sites'; edge: 'start' | 'end'; pdynNpa: number; hemispheres?: string[] };

function loggingWorker(name: string, log: Ev[], onOvalStart: (pdynNpa: number) => void = () => {}): Worker {
  const inner = createEngineApi();
  const api: EngineApi = {
    ...inner,
    scene: async (id, c, fan) => { log.push({ worker: name, what: 'scene', edge: 'start', pdynNpa: c.pdynNpa }); const r = await inner.scene(id, c, fan); log.push({ worker: name, what: 'scene', edge: 'end', pdynNpa: c.pdynNpa }); return r; },
    sites: async (id, c, o, sites) => { log.push({ worker: name, what: 'sites', edge: 'start', pdynNpa: c.pdynNpa }); const r = await inner.sites(id, c, o, sites); log.push({ worker: name, what: 'sites', edge: 'end', pdynNpa: c.pdynNpa }); return r; },
    oval: async (id, c, o) => { log.push({ worker: name, what: 'oval', edge: 'start', pdynNpa: c.pdynNpa, hemispheres: o.hemispheres }); onOvalStart(c.pdynNpa); const r = await inner.oval(id, c, o); log.push({ worker: name, what: 'oval', edge: 'end', pdynNpa: c.pdynNpa }); return r; },
  };
  return portWorker(api);
}

async function until(ok: () => boolean, ms = 60_000): Promise<void> {
  const t0 = Date.now();
  while (!ok()) {
    if (Date.now() - t0 > ms) throw new Error('timed out');
    await new Promise((r) => setTimeout(r, 10));
  }
}

const fresh = () => ['scene', 'oval'].every((c) => staleReason(store.get(), c as 'scene' | 'oval') === null) && store.get().oval !== null && store.get().scene !== null;

/** Wait until the scene and oval are fresh and the sites and sweep have answered: the start of each test's change. */
async function settled(): Promise<void> {
  await until(fresh);
  await until(() => !store.get().pending.sites && !store.get().pending.sweep);
}

describe('engine client schedule', () => {
  it('an isolated change: both scene halves end before either oval half starts; one hemisphere per worker', async () => {
    setConditions({ internal: 'dipole', tail: false, pdynNpa: 3 });
    const log: Ev[] = [];
    const engine = startEngine((role) => loggingWorker(role, log), { workers: 2 });
    try {
      await settled();
      log.length = 0;
      setConditions({ pdynNpa: 5 });
      await until(fresh);
      const mine = log.filter((e) => e.pdynNpa === 5);
      const lastSceneEnd = mine.map((e) => e.what === 'scene' && e.edge === 'end').lastIndexOf(true);
      const firstOvalStart = mine.findIndex((e) => e.what === 'oval' && e.edge === 'start');
      expect(mine.filter((e) => e.what === 'scene' && e.edge === 'end').map((e) => e.worker).sort()).toEqual(['main', 'oval']);
      expect(firstOvalStart).toBeGreaterThan(lastSceneEnd);
      expect(mine.filter((e) => e.what === 'oval' && e.edge === 'start').map((e) => `${e.worker}:${e.hemispheres?.join()}`).sort()).toEqual(['main:north', 'oval:south']);
    } finally {
      engine.dispose();
    }
  }, 120_000);

  it('the oval request leaves in a task after the one that stored the scene answer: its microtasks (React renders and draws the lines there) come first', async () => {
    setConditions({ internal: 'dipole', tail: false, pdynNpa: 3 });
    let state = 'waiting for the scene';
    const posted: string[] = [];
    // Note the state at the moment each oval request is posted to a worker (comlink's APPLY message names the call).
    const watched = (w: Worker) => {
      const post = w.postMessage.bind(w);
      w.postMessage = ((m: { path?: string[] }, t?: Transferable[]) => {
        if (m?.path?.[0] === 'oval') posted.push(state);
        return post(m, t as Transferable[]);
      }) as Worker['postMessage'];
      return w;
    };
    const engine = startEngine((role) => watched(loggingWorker(role, [])), { workers: 2 });
    // A stand-in for React's render and draw of the stored scene: a long chain of microtasks.
    const unsub = store.subscribe((s, prev) => {
      if (s.scene === prev.scene || s.conditions.pdynNpa !== 5 || s.answeredFor.scene?.conditions !== s.conditions) return;
      state = 'scene stored, not drawn';
      let p = Promise.resolve();
      for (let i = 0; i < 200; i++) p = p.then(() => {});
      void p.then(() => { state = 'scene drawn'; });
    });
    try {
      await settled();
      posted.length = 0;
      setConditions({ pdynNpa: 5 });
      await until(fresh);
      expect(posted).toEqual(['scene drawn', 'scene drawn']);
    } finally {
      unsub();
      engine.dispose();
    }
  }, 120_000);

  it('a drag (changes closer than 40 ms): no oval for the steps in between, one for the value at rest', async () => {
    setConditions({ internal: 'dipole', tail: false, pdynNpa: 3 });
    const log: Ev[] = [];
    const engine = startEngine((role) => loggingWorker(role, log), { workers: 2 });
    try {
      await settled();
      log.length = 0;
      for (const p of [4, 5, 6, 7]) setConditions({ pdynNpa: p });
      await until(fresh);
      const ovals = log.filter((e) => e.what === 'oval' && e.edge === 'start');
      expect(ovals.map((e) => e.pdynNpa)).toEqual([7, 7]);
      expect(store.get().oval!.curves.map((c) => c.hemisphere)).toEqual(['north', 'south']);
    } finally {
      engine.dispose();
    }
  }, 120_000);

  it('an oval already shown for the new inputs (kept by the timeline): no second oval search, the sites go at once; an older oval finishing later does not replace it', async () => {
    setConditions({ internal: 'dipole', tail: false, pdynNpa: 3 });
    const log: Ev[] = [];
    let onOvalStart = (_p: number) => {};
    const engine = startEngine((role) => loggingWorker(role, log, (p) => onOvalStart(p)), { workers: 2 });
    // As the timeline's scrubbing fill: inside the change's notification, the kept oval of pdyn 3 is shown.
    let kept: OvalResult | null = null;
    const fillKept = (s: AppState, prev: AppState) => {
      if (kept && s.conditions !== prev.conditions && s.conditions.pdynNpa === 3) {
        store.set({ oval: kept, answeredFor: { ...s.answeredFor, oval: { conditions: s.conditions, products: s.products, sites: s.sites, view: s.view } } });
      }
    };
    const unsubFill = store.subscribe(fillKept);
    const sitesFresh = () => staleReason(store.get(), 'sites') === null && !store.get().pending.sites;
    try {
      await settled();
      kept = store.get().oval;
      setConditions({ pdynNpa: 5 });
      await until(() => fresh() && sitesFresh() && !store.get().pending.oval && !store.get().pending.sweep);
      // Back to pdyn 3: the kept oval is shown; the engine asks the scene and the sites, no oval.
      log.length = 0;
      setConditions({ pdynNpa: 3 });
      await until(() => fresh() && sitesFresh() && !store.get().pending.sweep);
      expect(store.get().oval).toBe(kept);
      expect(log.filter((e) => e.what === 'oval')).toEqual([]);
      expect(log.filter((e) => e.what === 'sites' && e.edge === 'start').map((e) => e.pdynNpa)).toEqual([3]);
      // A move while an oval for pdyn 7 is being searched, onto pdyn 3 (kept): the pdyn-7 oval answers later and is dropped.
      log.length = 0;
      onOvalStart = (p) => { if (p === 7) { onOvalStart = () => {}; setTimeout(() => setConditions({ pdynNpa: 3 }), 0); } };
      setConditions({ pdynNpa: 7 });
      await until(() => log.some((e) => e.what === 'oval' && e.edge === 'end' && e.pdynNpa === 7) && store.get().conditions.pdynNpa === 3);
      await until(() => fresh() && sitesFresh() && !store.get().pending.oval && !store.get().pending.sweep);
      expect(store.get().oval).toBe(kept);
      expect(log.filter((e) => e.what === 'oval' && e.edge === 'start').map((e) => e.pdynNpa)).toEqual([7, 7]);
    } finally {
      unsubFill();
      engine.dispose();
    }
  }, 120_000);
});

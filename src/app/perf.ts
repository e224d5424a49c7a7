/**
 * Timing marks for the browser benchmark: when a condition change happened
 * and when the frame that first showed its lines / its oval was rendered,
 * with the steps in between (request sent, answer back on the main thread,
 * geometry built, React commit, the frame's render cost) and the worker's own
 * compute time, so the bench can say where the time goes.
 * Exposed on window.__atlasPerf (read by bench/browser.ts and the e2e tests).
 */
type What = 'scene' | 'oval';

/** Steps of one product of one change, ms since the change (performance.now() clock). */
interface Steps {
  /** Request sent to the worker. */
  sent?: number;
  /** Answer back on the main thread (before the store is told). */
  answered?: number;
  /** The store has been told (React's synchronous work for it is done). */
  stored?: number;
  /** The three.js geometry of the answer has been built. */
  built?: number;
  /** The component's effect ran (React commit done). */
  committed?: number;
  /** Worker compute time of the answer (max over the workers that answered parts of it), ms. */
  workerMs?: number;
  /** Main-thread cost of gl.render for the frame that drew it, ms. */
  renderMs?: number;
}

interface PerfRecord {
  seq: number;
  changedAt: number;
  sceneDrawnAt?: number;
  ovalDrawnAt?: number;
  scene?: Steps;
  oval?: Steps;
}

const records = new Map<number, PerfRecord>();
const MAX = 500;

export function noteChange(seq: number): void {
  records.set(seq, { seq, changedAt: performance.now() });
  if (records.size > MAX) records.delete(records.keys().next().value as number);
}

/** Record a step of change `seq`'s scene or oval (the first time it happens; workerMs as a value). */
export function noteStep(what: What, seq: number, step: Exclude<keyof Steps, 'workerMs' | 'renderMs'>): void;
export function noteStep(what: What, seq: number, step: 'workerMs', ms: number): void;
export function noteStep(what: What, seq: number, step: keyof Steps, ms?: number): void {
  const r = records.get(seq);
  if (!r) return;
  const s = (r[what] ??= {});
  if (s[step] === undefined) s[step] = ms ?? performance.now() - r.changedAt;
}

const pending: { scene: number; oval: number } = { scene: -1, oval: -1 };

/** A component put new data of change `seq` into the scene; the next rendered frame shows it. */
export function awaitDraw(what: What, seq: number): void {
  pending[what] = seq;
  noteStep(what, seq, 'committed');
}

const renders: { ms: number; calls: number; prims: number }[] = [];

/** Recent frame render costs (main-thread ms of gl.render, draw calls, primitives). */
export function renderStats(): { ms: number; calls: number; prims: number }[] {
  return renders.slice();
}

/** Called by the frame loop right after gl.render. */
export function frameRendered(ms = 0, calls = 0, prims = 0): void {
  renders.push({ ms, calls, prims });
  if (renders.length > 200) renders.shift();
  for (const w of ['scene', 'oval'] as const) {
    if (pending[w] >= 0) {
      noteDrawn(w, pending[w], ms);
      pending[w] = -1;
    }
  }
}

/** Record when a frame with that change's data was rendered. */
function noteDrawn(what: What, seq: number, renderMs: number): void {
  const r = records.get(seq);
  if (!r) return;
  const key = what === 'scene' ? 'sceneDrawnAt' : 'ovalDrawnAt';
  if (r[key] === undefined) {
    r[key] = performance.now();
    const s = (r[what] ??= {});
    s.renderMs = renderMs;
  }
}

export function perfRecords(): PerfRecord[] {
  return [...records.values()];
}

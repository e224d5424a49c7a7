/**
 * Timing marks for the browser benchmark: when a condition change happened
 * and when the frame that first showed its lines / its oval was rendered.
 * Exposed on window.__atlasPerf (read by bench/browser.ts and the e2e tests).
 */
interface PerfRecord {
  seq: number;
  changedAt: number;
  sceneDrawnAt?: number;
  ovalDrawnAt?: number;
}

const records = new Map<number, PerfRecord>();
const MAX = 500;

export function noteChange(seq: number): void {
  records.set(seq, { seq, changedAt: performance.now() });
  if (records.size > MAX) records.delete(records.keys().next().value as number);
}

const pending: { scene: number; oval: number } = { scene: -1, oval: -1 };

/** A component put new data of change `seq` into the scene; the next rendered frame shows it. */
export function awaitDraw(what: 'scene' | 'oval', seq: number): void {
  pending[what] = seq;
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
      noteDrawn(w, pending[w]);
      pending[w] = -1;
    }
  }
}

/** Record when a frame with that change's data was rendered. */
function noteDrawn(what: 'scene' | 'oval', seq: number): void {
  const r = records.get(seq);
  if (!r) return;
  const key = what === 'scene' ? 'sceneDrawnAt' : 'ovalDrawnAt';
  if (r[key] === undefined) r[key] = performance.now();
}

export function perfRecords(): PerfRecord[] {
  return [...records.values()];
}

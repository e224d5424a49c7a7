/**
 * Timing marks for the browser benchmark: when a condition change happened
 * and when the frame that first showed its lines / its oval was rendered.
 * Exposed on window.__atlasPerf (read by bench/browser.ts and the e2e tests).
 */
export interface PerfRecord {
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

/** Called from the frame loop when a frame with that change's data is rendered. */
export function noteDrawn(what: 'scene' | 'oval', seq: number): void {
  const r = records.get(seq);
  if (!r) return;
  const key = what === 'scene' ? 'sceneDrawnAt' : 'ovalDrawnAt';
  if (r[key] === undefined) r[key] = performance.now();
}

export function perfRecords(): PerfRecord[] {
  return [...records.values()];
}

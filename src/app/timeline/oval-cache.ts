/**
 * Ovals kept for scrubbing: the oval channel's answers by the inputs they were
 * computed for (conditions and the oval's product options), least recently
 * used dropped first, and the order in which the steps around the cursor are
 * computed ahead. A cursor move onto a step whose oval is kept shows it at once.
 */
import type { FieldConditions } from '../../physics/field/conditions';
import type { OvalResult, RequestProducts } from '../../../workers/protocol';
import type { ProductSettings } from '../store';

/** MLT spacing of the app's oval (h). */
export const OVAL_MLT_STEP_H = 0.5;

/** Ovals kept: a 5-minute series over 33 h, or a storm at 1 h twice over (about 6 KB each). */
export const OVAL_CACHE_SIZE = 400;

/** The app's oval request for these product settings: the engine client (src/app/engine.ts) asks with it, so a kept oval is the one it would ask for. */
export function ovalRequestOptions(p: ProductSettings): RequestProducts & { mltStepHours: number } {
  return { altKm: p.altKm, minLatDeg: p.minLatDeg, ...(p.sourceRe === null ? {} : { sourceRe: p.sourceRe }), mltStepHours: OVAL_MLT_STEP_H };
}

/**
 * The key of an oval: every condition field with a value (sorted by name, so objects built in
 * another order give the same key; an absent and an undefined field are the same) and the
 * product settings the oval depends on.
 */
export function ovalKey(c: FieldConditions, p: ProductSettings): string {
  const fields = (Object.keys(c) as (keyof FieldConditions)[]).filter((k) => c[k] !== undefined).sort().map((k) => [k, c[k]]);
  return JSON.stringify([fields, p.altKm, p.minLatDeg, p.sourceRe]);
}

/** A least-recently-used map of ovals by key. */
export class OvalCache {
  private readonly map = new Map<string, OvalResult>();
  constructor(readonly capacity = OVAL_CACHE_SIZE) {}

  get size(): number {
    return this.map.size;
  }

  has(key: string): boolean {
    return this.map.has(key);
  }

  /** The kept oval (now the most recently used), or undefined. */
  get(key: string): OvalResult | undefined {
    const v = this.map.get(key);
    if (v !== undefined) {
      this.map.delete(key);
      this.map.set(key, v);
    }
    return v;
  }

  /** Keep an answer; only complete ones (not stale, no error, both curves). */
  set(key: string, v: OvalResult): void {
    if (v.stale || v.error || v.curves.length === 0) return;
    this.map.delete(key);
    this.map.set(key, v);
    while (this.map.size > this.capacity) this.map.delete(this.map.keys().next().value as string);
  }

  clear(): void {
    this.map.clear();
  }
}

/**
 * Steps to compute ahead, nearest the cursor first (the next step before the previous one at
 * each distance: replay goes forward), the cursor's own step left out (the engine client asks
 * for it), at most `limit` of them.
 */
export function stepsAround(cursor: number, n: number, limit: number): number[] {
  const out: number[] = [];
  for (let d = 1; d < n && out.length < limit; d++) {
    if (cursor + d < n) out.push(cursor + d);
    if (cursor - d >= 0 && out.length < limit) out.push(cursor - d);
  }
  return out;
}

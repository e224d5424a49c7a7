/**
 * What every worker channel shares: the prepared model of the latest
 * conditions (one cache, cleared with its tracers when the conditions change),
 * tracers per footpoint altitude, and the stale-request bookkeeping.
 * Stale requests: each channel remembers the newest request id it has seen;
 * long calls pause between pieces of work and answer { stale: true } once a
 * newer request for the same channel has arrived.
 */
import type { FieldConditions } from '../../src/physics/field/conditions';
import { prepareModel, type PreparedModel } from '../../src/physics/field/model';
import { makeTracer } from '../../src/physics/mapping';
import type { Tracer } from '../../src/physics/trace/tracer';
import { nextTask } from '../../src/lib/next-task';

type Channel = 'scene' | 'oval' | 'sites' | 'sweep' | 'timeline';

/** The text of a thrown value (an engine InputError's message names the input and what is allowed). */
function errorText(e: unknown): string {
  return e instanceof Error ? e.message : String(e);
}

/** Thrown inside a channel's work when a newer request for the channel has arrived. */
class StaleRequest extends Error {}


export interface EngineContext {
  /** The prepared model for conditions `c` (cached while the conditions stay the same). */
  model(c: FieldConditions): PreparedModel;
  /** The tracer of model `m` with footpoints at altKm on the ellipsoid (cached with the model). */
  tracer(m: PreparedModel, altKm: number): Tracer;
  /** Let newer requests in; throws (ending `work` of `run`) when one for `ch` newer than `id` has arrived. */
  pause(ch: Channel, id: number): Promise<void>;
  /**
   * Run one request: `work`'s answer, or `empty()` marked { stale: true } when
   * superseded, or `empty()` with { error } when the work threw.
   */
  run<T extends { requestId: number }>(ch: Channel, id: number, empty: () => T, work: () => Promise<T>): Promise<T>;
}

export function createEngineContext(): EngineContext {
  const latest: Record<Channel, number> = { scene: -1, oval: -1, sites: -1, sweep: -1, timeline: -1 };
  let cacheKey = '';
  let cacheModel: PreparedModel | null = null;
  const tracers = new Map<number, Tracer>();

  return {
    model(c) {
      const key = JSON.stringify(c);
      if (key !== cacheKey || !cacheModel) {
        cacheModel = prepareModel(c);
        cacheKey = key;
        tracers.clear();
      }
      return cacheModel;
    },
    tracer(m, altKm) {
      let t = tracers.get(altKm);
      if (!t) {
        t = makeTracer(m, { altKm, ellipsoid: true });
        tracers.set(altKm, t);
      }
      return t;
    },
    async pause(ch, id) {
      await nextTask(); // let newer requests in
      if (latest[ch] > id) throw new StaleRequest();
    },
    async run(ch, id, empty, work) {
      if (id > latest[ch]) latest[ch] = id;
      try {
        return await work();
      } catch (e) {
        const base = empty();
        if (e instanceof StaleRequest) return { ...base, stale: true };
        return { ...base, error: errorText(e) };
      }
    },
  };
}

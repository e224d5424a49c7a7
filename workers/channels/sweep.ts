/** The `sweep` channel: boundaries at one MLT while Pdyn or Bz steps through a range (sweepBoundaries), stoppable between steps. */
import { sweepBoundaries } from '../../src/physics/mapping';
import type { EngineApi, SweepResult } from '../protocol';
import type { EngineContext } from './context';

export function sweepChannel(ctx: EngineContext): EngineApi['sweep'] {
  return (requestId, c, o) => {
    const steps = Math.max(0, Math.floor(o.steps));
    const none = new Float64Array(0);
    return ctx.run<SweepResult>('sweep', requestId,
      () => ({ requestId, warnings: [], vary: o.vary, mltHours: o.mltHours, values: none, northOpenClosedMagLatDeg: none, northEquatorwardMagLatDeg: none, southOpenClosedMagLatDeg: none, southEquatorwardMagLatDeg: none }),
      async () => {
        const rows = await sweepBoundaries(c, { vary: o.vary, from: o.from, to: o.to, steps, mltHours: o.mltHours, altKm: o.altKm, sourceRe: o.sourceRe },
          () => ctx.pause('sweep', requestId));
        return {
          requestId, warnings: rows.warnings, vary: o.vary, mltHours: o.mltHours, values: Float64Array.from(rows.values),
          northOpenClosedMagLatDeg: Float64Array.from(rows.north.map((r) => r.openClosed?.magLatDeg ?? NaN)),
          northEquatorwardMagLatDeg: Float64Array.from(rows.north.map((r) => r.equatorward?.magLatDeg ?? NaN)),
          southOpenClosedMagLatDeg: Float64Array.from(rows.south.map((r) => r.openClosed?.magLatDeg ?? NaN)),
          southEquatorwardMagLatDeg: Float64Array.from(rows.south.map((r) => r.equatorward?.magLatDeg ?? NaN)),
          ...(rows.values.length === 0 ? { error: 'sweep: no steps' } : {}),
        };
      });
  };
}

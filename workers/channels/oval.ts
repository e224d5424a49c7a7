/**
 * The `oval` channel: the open–closed boundary and the equatorward edge per
 * MLT for both hemispheres, one sector at a time (a newer request stops it
 * between sectors), each search hinted by its two predecessors.
 */
import { sectorBoundaries, mltGrid, predictHint, DEFAULT_SOURCE_RE, type SectorBoundaries, type Hemisphere } from '../../src/physics/mapping/mapping';
import type { BoundaryCurve, EngineApi, OvalResult } from '../protocol';
import type { EngineContext } from './context';

function emptyCurve(hemisphere: Hemisphere, mlts: number[]): BoundaryCurve {
  const n = mlts.length;
  const nan = () => new Float64Array(n).fill(NaN);
  return {
    hemisphere, mltHours: Float64Array.from(mlts),
    openClosedMagLatDeg: nan(), openClosedGeoLatDeg: nan(), openClosedGeoLonDeg: nan(),
    equatorwardMagLatDeg: nan(), equatorwardGeoLatDeg: nan(), equatorwardGeoLonDeg: nan(),
  };
}

/** Sector i's answer into the curve's columns (NaN stays where a boundary is absent). */
function fillSector(cur: BoundaryCurve, i: number, b: SectorBoundaries): void {
  if (b.openClosed) {
    cur.openClosedMagLatDeg[i] = b.openClosed.magLatDeg; cur.openClosedGeoLatDeg[i] = b.openClosed.geoLatDeg; cur.openClosedGeoLonDeg[i] = b.openClosed.geoLonDeg;
  }
  if (b.equatorward) {
    cur.equatorwardMagLatDeg[i] = b.equatorward.magLatDeg; cur.equatorwardGeoLatDeg[i] = b.equatorward.geoLatDeg; cur.equatorwardGeoLonDeg[i] = b.equatorward.geoLonDeg;
  }
}

export function ovalChannel(ctx: EngineContext): EngineApi['oval'] {
  return (requestId, c, o) => ctx.run<OvalResult>('oval', requestId, () => ({ requestId, warnings: [], curves: [] }), async () => {
    const m = ctx.model(c);
    const t = ctx.tracer(m, o.altKm);
    const mlts = mltGrid(o.mltStepHours);
    const opts = { sourceRe: o.sourceRe ?? DEFAULT_SOURCE_RE, latTolDeg: o.latTolDeg ?? 0.01 };
    const curves: BoundaryCurve[] = [];
    for (const hemisphere of ['north', 'south'] as const) {
      const cur = emptyCurve(hemisphere, mlts);
      let prev: SectorBoundaries | null = null, prev2: SectorBoundaries | null = null;
      for (let i = 0; i < mlts.length; i++) {
        await ctx.pause('oval', requestId);
        const b = sectorBoundaries(m, t, hemisphere, mlts[i], opts, predictHint(prev, prev2));
        prev2 = prev;
        prev = b;
        fillSector(cur, i, b);
      }
      curves.push(cur);
    }
    return { requestId, warnings: [...m.warnings], curves };
  });
}

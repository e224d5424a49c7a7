/**
 * The `oval` channel: the open–closed boundary and the equatorward edge per
 * MLT for both hemispheres, from the engine's oval loop (ovalSectors, the
 * loop of ovalBoundaries) taken one sector at a time, so a newer request
 * stops it between sectors.
 */
import { mltGrid, type SectorBoundaries, type Hemisphere } from '../../src/physics/mapping';
import { ovalSectors } from '../../src/physics/mapping';
import type { BoundaryCurve, EngineApi, OvalResult } from '../protocol';
import type { EngineContext } from './context';
import { modelUsed } from './used';

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
    // No source distance in the request: the model's storm-following value (sectorBoundaries).
    const opts = { sourceRe: o.sourceRe, latTolDeg: o.latTolDeg ?? 0.01, ...(o.minLatDeg === undefined ? {} : { minLatDeg: o.minLatDeg }) };
    const curves: BoundaryCurve[] = [];
    for (const hemisphere of ['north', 'south'] as const) {
      const cur = emptyCurve(hemisphere, mlts);
      let i = 0;
      await ctx.pause('oval', requestId);
      // The generator computes a sector when asked for it: the pause sits before each sector's search.
      for (const b of ovalSectors(m, t, hemisphere, mlts, opts)) {
        fillSector(cur, i, b);
        if (++i < mlts.length) await ctx.pause('oval', requestId);
      }
      curves.push(cur);
    }
    return { requestId, warnings: [...m.warnings], curves, used: modelUsed(m, o.sourceRe) };
  });
}

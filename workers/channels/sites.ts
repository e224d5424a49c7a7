/** The `sites` channel: the per-site report (siteReport) for each site, a newer request stopping it between sites. */
import { sectorBoundaries, siteReport } from '../../src/physics/mapping';
import type { EngineApi, SiteResult, SitesResult } from '../protocol';
import type { EngineContext } from './context';
import { modelUsed } from './used';

/** Lowest elevation (deg) at which the oval counts as visible when the request gives none. */
const DEFAULT_MIN_ELEVATION_DEG = 10;

export function sitesChannel(ctx: EngineContext): EngineApi['sites'] {
  return (requestId, c, o, sites) => ctx.run<SitesResult>('sites', requestId, () => ({ requestId, warnings: [], sites: [] }), async () => {
    const m = ctx.model(c);
    const conjugateAltKm = o.conjugateAltKm ?? 0;
    const tConj = ctx.tracer(m, conjugateAltKm);
    const tAlt = ctx.tracer(m, o.altKm);
    // No source distance in the request: the model's storm-following value.
    const sourceRe = o.sourceRe ?? m.sourceRe;
    const options = { conjugateAltKm, altKm: o.altKm, sourceRe, minElevationDeg: o.minElevationDeg ?? DEFAULT_MIN_ELEVATION_DEG };
    const boundaryAt = o.minLatDeg === undefined ? undefined
      : (h: 'north' | 'south', mlt: number) => sectorBoundaries(m, tAlt, h, mlt, { sourceRe, minLatDeg: o.minLatDeg });
    const out: SiteResult[] = [];
    for (const site of sites) {
      await ctx.pause('sites', requestId);
      out.push(siteReport(m, tConj, tAlt, site, options, boundaryAt));
    }
    return { requestId, warnings: [...m.warnings], sites: out, used: modelUsed(m, o.sourceRe) };
  });
}

/**
 * The `sites` channel: the per-site report (siteReport) for each site with its
 * corrected geomagnetic position (cgmPair: the model's own main field, IGRF-14
 * or its centred dipole), a newer request stopping it between sites.
 */
import { cgmPair, sectorBoundaries, siteReport, type CgmResult } from '../../src/physics/mapping';
import type { AppSiteResult, EngineApi, SitesResult } from '../protocol';
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
    const out: AppSiteResult[] = [];
    for (const site of sites) {
      await ctx.pause('sites', requestId);
      out.push({ ...siteReport(m, tConj, tAlt, site, options, boundaryAt), cgm: siteCgm(m, site.latDeg, site.lonDeg, site.heightKm ?? 0) });
    }
    return { requestId, warnings: [...m.warnings], sites: out, used: modelUsed(m, o.sourceRe) };
  });
}

/** CGM of a site at its own height; a refused point (bad input) becomes 'undefined' with the refusal's words. */
function siteCgm(m: Parameters<typeof cgmPair>[0], latDeg: number, lonDeg: number, heightKm: number): CgmResult {
  try {
    return cgmPair(m, latDeg, lonDeg, heightKm).atAlt;
  } catch (e) {
    return { defined: false, reason: e instanceof Error ? e.message : String(e) };
  }
}

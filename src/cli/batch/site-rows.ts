/**
 * The per-site report of the batch command, with the boundary search as a
 * parameter: siteReport (src/physics/mapping/site-report.ts) without the site's line
 * points, which a table does not need. With `exactBoundaries` its searches start from the
 * nearest site already answered for the condition (mapping/hints.ts boundaryFinder),
 * which changes the cost, not the answer beyond the 0.01° search tolerance. With `gridBoundaries` the
 * boundaries come from an MLT grid computed once per condition and
 * interpolated: an opt-in approximation (--boundary-mlt-step) for speed.
 */
import type { PreparedModel } from '../../physics/field/model';
import type { Tracer } from '../../physics/trace/tracer';
import { sectorBoundaries, boundaryFinder, mltGrid, type SectorBoundaries, type BoundaryPoint, type Hemisphere, siteReport, type BoundaryProvider, type SiteInput, type SiteResult, type SiteReportOptions } from '../../physics/mapping';
import { describePoint, gsmAtMagneticLatMlt } from '../../physics/trace/footpoint';

export type { BoundaryProvider };

/** The engine's search at the exact MLT (what `oval` and the app compute). */
export function exactBoundaries(m: PreparedModel, tAlt: Tracer, sourceRe: number): BoundaryProvider {
  return boundaryFinder(m, tAlt, { sourceRe });
}

const tmp = new Float64Array(3);

/**
 * Boundaries at grid MLTs k·step (computed on first use, kept for the model),
 * linearly interpolated in MLT (periodic) between the two nodes around the
 * asked MLT; null when either node has none. The interpolated point's
 * geographic position is exact for its (magnetic latitude, MLT).
 */
export function gridBoundaries(m: PreparedModel, tAlt: Tracer, sourceRe: number, stepH: number): BoundaryProvider {
  const n = mltGrid(stepH).length;
  const nodes = new Map<string, SectorBoundaries>();
  const node = (h: Hemisphere, i: number): SectorBoundaries => {
    const key = `${h}${i}`;
    let b = nodes.get(key);
    if (!b) { b = sectorBoundaries(m, tAlt, h, i * stepH, { sourceRe }); nodes.set(key, b); }
    return b;
  };
  const o = tAlt.options;
  const point = (lat: number, mlt: number): BoundaryPoint => {
    gsmAtMagneticLatMlt(tmp, m.frames, lat, mlt, o.altKm, o.ellipsoid);
    const d = describePoint(m.frames, tmp[0], tmp[1], tmp[2]);
    return { magLatDeg: lat, geoLatDeg: d.geoLatDeg, geoLonDeg: d.geoLonDeg };
  };
  return (h, mlt) => {
    const x = (((mlt / stepH) % n) + n) % n;
    const i0 = Math.min(n - 1, Math.floor(x));
    const w = x - i0;
    const a = node(h, i0), b = w === 0 ? a : node(h, (i0 + 1) % n);
    const lerp = (p: BoundaryPoint | null, q: BoundaryPoint | null) => (p && q ? point(p.magLatDeg + w * (q.magLatDeg - p.magLatDeg), mlt) : null);
    return { mltHours: mlt, openClosed: lerp(a.openClosed, b.openClosed), equatorward: lerp(a.equatorward, b.equatorward) };
  };
}

/** siteReport with the boundaries from `boundaries`; lineGeo is left empty. Never throws. */
export function siteRow(m: PreparedModel, tConj: Tracer, tAlt: Tracer, site: SiteInput, o: SiteReportOptions, boundaries: BoundaryProvider): SiteResult {
  return siteReport(m, tConj, tAlt, site, o, boundaries, false);
}

/**
 * The per-site report of the batch command, with the boundary search as a
 * parameter. With `exactBoundaries` it is siteReport (src/physics/site-report.ts)
 * line for line, less the site's line points, which a table does not need
 * (test/cli/batch-rows.test.ts holds the two equal); its searches start from the
 * nearest site already answered for the condition (mapping.ts boundaryFinder),
 * which changes the cost, not the answer beyond the 0.01° search tolerance. With `gridBoundaries` the
 * boundaries come from an MLT grid computed once per condition and
 * interpolated: an opt-in approximation (--boundary-mlt-step) for speed.
 */
import type { PreparedModel } from '../../physics/model';
import type { Tracer } from '../../physics/trace';
import { traceSite, sectorBoundaries, boundaryFinder, ovalRelation, mltGrid, type SectorBoundaries, type BoundaryPoint, type Hemisphere } from '../../physics/mapping';
import { skyPosition } from '../../physics/sky';
import { describePoint, gsmAtMagneticLatMlt } from '../../physics/footpoint';
import type { SiteInput, SiteResult, SiteReportOptions } from '../../physics/site-report';

/** Boundaries at one MLT in one hemisphere, for one prepared model. */
export type BoundaryProvider = (hemisphere: Hemisphere, mltH: number) => SectorBoundaries;

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
  const { altKm, minElevationDeg } = o;
  const base = { name: site.name, latDeg: site.latDeg, lonDeg: site.lonDeg };
  try {
    const line = traceSite(m, tConj, site.latDeg, site.lonDeg, site.heightKm ?? 0, 'geo', false);
    const atAlt = traceSite(m, tAlt, site.latDeg, site.lonDeg, site.heightKm ?? 0, 'geo', false);
    const near = atAlt.near ?? line.near;
    const magLat = near ? near.magLatDeg : NaN;
    const mlt = near ? near.mltHours : NaN;
    const hemisphere = magLat >= 0 ? 'north' : 'south';
    let relation: SiteResult['ovalRelation'] = 'unknown';
    let bounds: SiteResult['boundaries'] = null;
    let sky: SiteResult['sky'] = null;
    if (Number.isFinite(mlt)) {
      const b = boundaries(hemisphere, mlt);
      bounds = { openClosedMagLatDeg: b.openClosed ? b.openClosed.magLatDeg : null, equatorwardMagLatDeg: b.equatorward ? b.equatorward.magLatDeg : null };
      relation = atAlt.type === 'closed' || atAlt.type === 'open' ? ovalRelation(magLat, b) : 'unknown';
      let best: { el: number; az: number; d: number } | null = null;
      for (const p of [b.openClosed, b.equatorward]) {
        if (!p) continue;
        const s = skyPosition(site.latDeg, site.lonDeg, site.heightKm ?? 0, p.geoLatDeg, p.geoLonDeg, altKm);
        if (!best || s.distanceKm < best.d) best = { el: s.elevationDeg, az: s.azimuthDeg, d: s.distanceKm };
      }
      if (relation === 'inside' && near) {
        const s = skyPosition(site.latDeg, site.lonDeg, site.heightKm ?? 0, near.geoLatDeg, near.geoLonDeg, near.altKm);
        best = { el: s.elevationDeg, az: s.azimuthDeg, d: s.distanceKm };
      }
      if (best) sky = { elevationDeg: best.el, azimuthDeg: best.az, distanceKm: best.d, visible: best.el >= minElevationDeg };
    }
    return {
      ...base, type: line.type, conjugate: line.conjugate, footpoints: atAlt.footpoints,
      equatorRe: line.equator ? line.equator.rRe : null, lShell: line.type === 'closed' && line.equator ? line.equator.rRe : null,
      mltHours: mlt, magLatDeg: magLat, ovalRelation: relation, sky, lineGeo: new Float64Array(0), boundaries: bounds,
    };
  } catch (e) {
    return { ...base, type: 'unresolved', conjugate: null, footpoints: [], equatorRe: null, lShell: null, mltHours: NaN, magLatDeg: NaN, ovalRelation: 'unknown', sky: null, boundaries: null, lineGeo: new Float64Array(0), error: e instanceof Error ? e.message : String(e) };
  }
}

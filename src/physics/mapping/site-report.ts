/**
 * The per-site report: conjugate point, footpoints, line type, L, MLT,
 * boundaries at the site's MLT, oval relation and sky visibility.
 */
import type { PreparedModel } from '../field/model';
import type { Tracer } from '../trace/tracer';
import { traceSite } from './sites';
import { sectorBoundaries, type MissingBoundaryReason, type SectorBoundaries } from './boundaries';
import { ovalRelation, ovalRelationReason, type OvalRelation } from './oval';
import type { LineType } from '../trace/line-type';
import type { Hemisphere } from '../trace/footpoint';
import { skyPosition } from './sky';
import { applyMat3T } from '../frames/rotations';
import type { Footpoint } from '../trace/footpoint';

export interface SiteInput {
  name: string;
  latDeg: number; // geodetic
  lonDeg: number;
  heightKm?: number;
}

export interface SiteResult {
  name: string;
  latDeg: number;
  lonDeg: number;
  type: LineType;
  /** The far footpoint at the conjugate altitude (ground by default); null when the line is open. */
  conjugate: Footpoint | null;
  footpoints: Footpoint[];
  equatorRe: number | null;
  lShell: number | null;
  mltHours: number;
  magLatDeg: number;
  /** Relative to the oval at the site's MLT in its hemisphere. */
  ovalRelation: OvalRelation;
  /** Why ovalRelation is 'unknown' (plain words; e.g. which edge is missing and why); null or absent when it is known. */
  ovalRelationReason?: string | null;
  /** Nearest oval point at the emission altitude as seen from the site. */
  sky: { elevationDeg: number; azimuthDeg: number; distanceKm: number; visible: boolean } | null;
  /** Boundaries at the site's MLT in its hemisphere (magnetic latitude, deg), null when not found. */
  boundaries: {
    openClosedMagLatDeg: number | null; equatorwardMagLatDeg: number | null;
    /** Why a boundary is null (SectorBoundaries' reasons); null when found. */
    openClosedReason?: MissingBoundaryReason | null; equatorwardReason?: MissingBoundaryReason | null;
  } | null;
  /** The site's own field line, GEO RE, xyz. */
  lineGeo: Float64Array;
  error?: string;
}

export interface SiteReportOptions {
  /** Altitude of the conjugate footpoint (km; 0 = ground). tConj must be a tracer at this altitude. */
  conjugateAltKm: number;
  /** Emission / footpoint altitude (km). tAlt must be a tracer at this altitude. */
  altKm: number;
  /** Equatorial source distance of the equatorward edge, RE; undefined = the model's storm-following one (model.sourceRe). */
  sourceRe?: number;
  minElevationDeg: number;
}

/** Boundaries at one MLT in one hemisphere, for the model of the report. */
export type BoundaryProvider = (hemisphere: Hemisphere, mltH: number) => SectorBoundaries;

/**
 * Everything about one site (shared by the worker and the batch command):
 * its line through the conjugate altitude, footpoints and MLT at the emission
 * altitude, the boundaries at its MLT, where it stands against the oval, and
 * the nearest oval point in its sky. Never throws: a failure comes back in `error`.
 * `boundaryAt` replaces the search at the site's MLT (the batch passes a finder
 * that reuses neighbouring answers); `withLine` false leaves lineGeo empty.
 */
export function siteReport(model: PreparedModel, tConj: Tracer, tAlt: Tracer, site: SiteInput, options: SiteReportOptions, boundaryAt?: BoundaryProvider, withLine = true): SiteResult {
  const { altKm, sourceRe, minElevationDeg } = options;
  const base = { name: site.name, latDeg: site.latDeg, lonDeg: site.lonDeg };
  try {
    const line = traceSite(model, tConj, site.latDeg, site.lonDeg, site.heightKm ?? 0, 'geo', withLine);
    const pts = line.points ?? new Float64Array(0);
    const g = model.frames.gsmFromGeo;
    const lineGeo = new Float64Array(pts.length);
    const v = new Float64Array(3);
    for (let k = 0; k < pts.length; k += 3) {
      applyMat3T(v, g, pts[k], pts[k + 1], pts[k + 2]);
      lineGeo[k] = v[0]; lineGeo[k + 1] = v[1]; lineGeo[k + 2] = v[2];
    }
    // Footpoints and MLT at the emission altitude (the same line when one tracer serves both altitudes).
    const atAlt = tAlt === tConj ? line : traceSite(model, tAlt, site.latDeg, site.lonDeg, site.heightKm ?? 0, 'geo', false);
    const near = atAlt.near ?? line.near;
    const magLat = near ? near.magLatDeg : NaN;
    const mlt = near ? near.mltHours : NaN;
    const hemisphere = magLat >= 0 ? 'north' : 'south';
    let relation: SiteResult['ovalRelation'] = 'unknown';
    let relationReason: string | null = near ? null : 'no footpoint at the emission altitude';
    let boundaries: SiteResult['boundaries'] = null;
    let sky: SiteResult['sky'] = null;
    if (Number.isFinite(mlt)) {
      const b: SectorBoundaries = boundaryAt ? boundaryAt(hemisphere, mlt) : sectorBoundaries(model, tAlt, hemisphere, mlt, { sourceRe });
      boundaries = {
        openClosedMagLatDeg: b.openClosed ? b.openClosed.magLatDeg : null, equatorwardMagLatDeg: b.equatorward ? b.equatorward.magLatDeg : null,
        openClosedReason: b.openClosedReason ?? null, equatorwardReason: b.equatorwardReason ?? null,
      };
      const resolved = atAlt.type === 'closed' || atAlt.type === 'open';
      relation = resolved ? ovalRelation(magLat, b) : 'unknown';
      relationReason = resolved ? ovalRelationReason(magLat, b) : 'the site\'s field line is unresolved';
      // Nearest oval edge point at the emission altitude, seen from the site.
      let best: { el: number; az: number; d: number } | null = null;
      for (const p of [b.openClosed, b.equatorward]) {
        if (!p) continue;
        const s = skyPosition(site.latDeg, site.lonDeg, site.heightKm ?? 0, p.geoLatDeg, p.geoLonDeg, altKm);
        if (!best || s.distanceKm < best.d) best = { el: s.elevationDeg, az: s.azimuthDeg, d: s.distanceKm };
      }
      if (relation === 'inside' && near) {
        // Inside the oval: the nearest oval point is the site's own footpoint at the emission height.
        const s = skyPosition(site.latDeg, site.lonDeg, site.heightKm ?? 0, near.geoLatDeg, near.geoLonDeg, near.altKm);
        best = { el: s.elevationDeg, az: s.azimuthDeg, d: s.distanceKm };
      }
      if (best) sky = { elevationDeg: best.el, azimuthDeg: best.az, distanceKm: best.d, visible: best.el >= minElevationDeg };
    }
    return {
      ...base, type: line.type, conjugate: line.conjugate, footpoints: atAlt.footpoints,
      equatorRe: line.equator ? line.equator.rRe : null, lShell: line.type === 'closed' && line.equator ? line.equator.rRe : null,
      mltHours: mlt, magLatDeg: magLat, ovalRelation: relation, ovalRelationReason: relationReason, sky, lineGeo, boundaries,
    };
  } catch (e) {
    return { ...base, type: 'unresolved', conjugate: null, footpoints: [], equatorRe: null, lShell: null, mltHours: NaN, magLatDeg: NaN, ovalRelation: 'unknown', ovalRelationReason: 'the site could not be computed', sky: null, boundaries: null, lineGeo: new Float64Array(0), error: e instanceof Error ? e.message : String(e) };
  }
}


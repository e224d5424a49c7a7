/**
 * Why a boundary cell is empty (the `boundary_reason` column): one extra trace
 * at the lowest searched magnetic latitude tells the cases of the search
 * (mapping/boundaries.ts) apart. Only rows with an empty boundary pay for it,
 * and the answer is kept per (hemisphere, MLT) for the condition.
 */
import type { PreparedModel } from '../../physics/field/model';
import type { Tracer } from '../../physics/trace/tracer';
import { LINE_CLOSED } from '../../physics/trace/line-type';
import { equatorCrossing, gsmAtMagneticLatMlt, type Hemisphere } from '../../physics/trace/footpoint';
import { DEFAULT_BOUNDARY_OPTIONS, type SectorBoundaries } from '../../physics/mapping';

const p = new Float64Array(3);

function fmt(v: number): string {
  return String(Math.round(v * 100) / 100);
}

/** The reason text for the empty boundaries of `b` (null when both exist). */
export function boundaryReason(model: PreparedModel, tAlt: Tracer, hemisphere: Hemisphere, b: SectorBoundaries, sourceRe: number): string | null {
  if (b.openClosed && b.equatorward) return null;
  const minLat = DEFAULT_BOUNDARY_OPTIONS.minLatDeg;
  const o = tAlt.options;
  gsmAtMagneticLatMlt(p, model.frames, (hemisphere === 'north' ? 1 : -1) * minLat, b.mltHours, o.altKm, o.ellipsoid);
  const closed = tAlt.trace(p[0], p[1], p[2]) === LINE_CLOSED;
  const eq = closed ? equatorCrossing(tAlt.points, tAlt.bMag, tAlt.nPoints) : null;
  const parts: string[] = [];
  if (!b.openClosed) {
    parts.push(closed
      ? 'open_closed: closed field lines up to the pole at this MLT (no open line met)'
      : `open_closed: no closed field line at the lowest searched magnetic latitude (${minLat}°)`);
  }
  if (!b.equatorward) {
    if (!closed) parts.push(`equatorward: no closed field line at or above ${minLat}° magnetic latitude`);
    else if (eq && eq.rRe > sourceRe) parts.push(`equatorward: the line at ${minLat}° magnetic latitude already crosses the equator at ${fmt(eq.rRe)} RE, beyond the source distance ${fmt(sourceRe)} RE`);
    else parts.push(`equatorward: the source distance ${fmt(sourceRe)} RE lies on open field lines at this MLT (beyond the last closed line)`);
  }
  return parts.join('; ');
}

/** Sites on the ground (or above it): their GSM position, their field line, and which footpoint is the conjugate. */
import { RE_KM, RAD_PER_DEG } from '../constants';
import { requireInRange } from '../errors';
import { geoFromGeodetic } from '../frames/geodesy';
import { applyMat3, applyMat3T } from '../frames/rotations';
import type { PreparedModel } from '../field/model';
import type { Tracer } from '../trace/tracer';
import type { Footpoint } from '../trace/footpoint';
import { traceGsm, type LineResult } from './lines';

const tmp = new Float64Array(3);

/** GSM position of a site given in geodetic (coords 'geo') or magnetic (coords 'mag', spherical) lat/lon and height. */
export function siteGsm(out: Float64Array, model: PreparedModel, latDeg: number, lonDeg: number, heightKm = 0, coords: 'geo' | 'mag' = 'geo'): Float64Array {
  requireInRange('lat', latDeg, -90, 90, 'deg');
  requireInRange('lon', lonDeg, -360, 360, 'deg');
  requireInRange('heightKm', heightKm, -1, 100_000, 'km');
  const f = model.frames;
  if (coords === 'geo') {
    geoFromGeodetic(tmp, latDeg, lonDeg, heightKm);
  } else {
    const r = 1 + heightKm / RE_KM;
    const la = latDeg * RAD_PER_DEG, lo = lonDeg * RAD_PER_DEG;
    applyMat3T(tmp, f.magFromGeo, r * Math.cos(la) * Math.cos(lo), r * Math.cos(la) * Math.sin(lo), r * Math.sin(la));
  }
  return applyMat3(out, f.gsmFromGeo, tmp[0], tmp[1], tmp[2]);
}

/** A line's footpoints sorted by the site: the one on the site's side and the far one (the conjugate). */
export interface NearFarFootpoints {
  near: Footpoint | null;
  far: Footpoint | null;
}

/**
 * Split a line's footpoints by the site through which it was traced: the site's
 * side is the sign of its SM z (magnetic hemisphere), so `near` is the footpoint in
 * the site's hemisphere and `far` the other one (either may be null).
 */
export function splitFootpoints(model: PreparedModel, siteGsmRe: ArrayLike<number>, footpoints: readonly Footpoint[]): NearFarFootpoints {
  applyMat3(tmp, model.frames.smFromGsm, siteGsmRe[0], siteGsmRe[1], siteGsmRe[2]);
  const siteNorth = tmp[2] >= 0;
  let near: Footpoint | null = null;
  let far: Footpoint | null = null;
  for (const fp of footpoints) {
    if ((fp.hemisphere === 'north') === siteNorth) near = fp;
    else far = fp;
  }
  return { near, far };
}

export interface SiteLine extends LineResult {
  /** The footpoint in the other hemisphere than the site (the conjugate), or null. */
  conjugate: Footpoint | null;
  /** The footpoint on the site's own side, or null. */
  near: Footpoint | null;
  siteGsm: [number, number, number];
}

/**
 * Trace the line through a site; footpoints at the tracer's altitude. The
 * conjugate is the footpoint at the far end from the site.
 */
export function traceSite(model: PreparedModel, tracer: Tracer, latDeg: number, lonDeg: number, heightKm = 0, coords: 'geo' | 'mag' = 'geo', withPoints = false): SiteLine {
  const s = siteGsm(new Float64Array(3), model, latDeg, lonDeg, heightKm, coords);
  const line = traceGsm(model, tracer, s[0], s[1], s[2], withPoints);
  const { near, far } = splitFootpoints(model, s, line.footpoints);
  return { ...line, near, conjugate: far, siteGsm: [s[0], s[1], s[2]] };
}

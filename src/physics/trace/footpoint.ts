/**
 * Describing points of a field line: footpoints (geodetic and magnetic
 * coordinates, MLT) and the equatorial (minimum-|B|) crossing.
 */
import { DEG_PER_RAD, RAD_PER_DEG, RE_KM } from '../constants';
import { applyMat3, applyMat3T, mltHours } from '../frames/rotations';
import type { FrameSet } from '../frames/rotations';
import { geodeticFromGeo, ellipsoidRadiusRe } from '../frames/geodesy';

export type Hemisphere = 'north' | 'south';

export interface Footpoint {
  hemisphere: Hemisphere;
  /** Geodetic (WGS84) latitude and longitude, deg. */
  geoLatDeg: number;
  geoLonDeg: number;
  /** Centred-dipole (MAG) latitude and longitude, deg. */
  magLatDeg: number;
  magLonDeg: number;
  mltHours: number;
  /** Height above the WGS84 ellipsoid, km. */
  altKm: number;
}

export interface EquatorCrossing {
  /** Geocentric distance of the minimum-|B| point, RE. */
  rRe: number;
  bNt: number;
  gsmRe: [number, number, number];
}

const geo = new Float64Array(3);
const mag = new Float64Array(3);
const sm = new Float64Array(3);

/** Footpoint record of a GSM point. */
export function describePoint(f: FrameSet, x: number, y: number, z: number): Footpoint {
  applyMat3T(geo, f.gsmFromGeo, x, y, z);
  const g = geodeticFromGeo(geo[0], geo[1], geo[2]);
  applyMat3(mag, f.magFromGeo, geo[0], geo[1], geo[2]);
  const rm = Math.hypot(mag[0], mag[1], mag[2]);
  applyMat3(sm, f.smFromGsm, x, y, z);
  const magLatDeg = Math.asin(mag[2] / rm) * DEG_PER_RAD;
  return {
    hemisphere: magLatDeg >= 0 ? 'north' : 'south',
    geoLatDeg: g.latDeg,
    geoLonDeg: g.lonDeg,
    magLatDeg,
    magLonDeg: Math.atan2(mag[1], mag[0]) * DEG_PER_RAD,
    mltHours: mltHours(sm[0], sm[1]),
    altKm: g.altKm,
  };
}

/**
 * GSM position of the point at magnetic (SM) latitude and MLT, `altKm` above the
 * WGS84 ellipsoid (ellipsoid = true) or above the sphere r = 1 RE. Writes out.
 */
export function gsmAtMagneticLatMlt(out: Float64Array, f: FrameSet, magLatDeg: number, mltH: number, altKm: number, ellipsoid: boolean): Float64Array {
  const lat = magLatDeg * RAD_PER_DEG;
  const phi = (mltH - 12) * 15 * RAD_PER_DEG; // MLT = 12 + atan2(y_sm, x_sm)/15° (common practice)
  const c = Math.cos(lat);
  applyMat3T(out, f.smFromGsm, c * Math.cos(phi), c * Math.sin(phi), Math.sin(lat));
  let r = 1 + altKm / RE_KM;
  if (ellipsoid) {
    applyMat3T(geo, f.gsmFromGeo, out[0], out[1], out[2]);
    r = ellipsoidRadiusRe(geo[2], altKm);
  }
  out[0] *= r; out[1] *= r; out[2] *= r;
  return out;
}

/**
 * Minimum-|B| point of a traced line, refined by a parabola through the three
 * samples around the smallest one (positions interpolated with the same weights).
 * Returns null when the minimum sits at an end of the line (no crossing).
 */
export function equatorCrossing(points: Float64Array, bMag: Float64Array, n: number): EquatorCrossing | null {
  if (n < 3) return null;
  let k = 0;
  for (let i = 1; i < n; i++) if (bMag[i] < bMag[k]) k = i;
  if (k === 0 || k === n - 1) return null;
  // Parabola in the sample index (steps are locally near-uniform).
  const b0 = bMag[k - 1], b1 = bMag[k], b2 = bMag[k + 1];
  const den = b0 - 2 * b1 + b2;
  let t = den > 0 ? (0.5 * (b0 - b2)) / den : 0;
  if (t < -1) t = -1;
  else if (t > 1) t = 1;
  // Quadratic Lagrange weights at t for nodes −1, 0, 1.
  const w0 = 0.5 * t * (t - 1), w1 = 1 - t * t, w2 = 0.5 * t * (t + 1);
  const x = w0 * points[3 * k - 3] + w1 * points[3 * k] + w2 * points[3 * k + 3];
  const y = w0 * points[3 * k - 2] + w1 * points[3 * k + 1] + w2 * points[3 * k + 4];
  const z = w0 * points[3 * k - 1] + w1 * points[3 * k + 2] + w2 * points[3 * k + 5];
  return { rRe: Math.hypot(x, y, z), bNt: w0 * b0 + w1 * b1 + w2 * b2, gsmRe: [x, y, z] };
}

/**
 * WGS84 geodetic ↔ geocentric Cartesian (GEO). Latitudes users type or read
 * are geodetic (as maps and GPS give them); inside the engine positions are
 * geocentric Cartesian in RE (6371.2 km).
 * Forward: standard closed form (NIMA TR8350.2 §4). Inverse: Bowring (1976)
 * iteration, three rounds (converges to < 1e-12 rad for heights −100..100 000 km).
 */
import { RE_KM, WGS84_A_KM, WGS84_F, RAD_PER_DEG, DEG_PER_RAD } from '../constants';

const E2 = WGS84_F * (2 - WGS84_F);
const B_KM = WGS84_A_KM * (1 - WGS84_F);
const EP2 = E2 / (1 - E2);

/** GEO Cartesian (RE) of a geodetic point (deg, deg, km above the ellipsoid). Writes out[0..2]. */
export function geoFromGeodetic(out: Float64Array, latDeg: number, lonDeg: number, altKm: number): Float64Array {
  const phi = latDeg * RAD_PER_DEG;
  const lam = lonDeg * RAD_PER_DEG;
  const s = Math.sin(phi);
  const c = Math.cos(phi);
  const n = WGS84_A_KM / Math.sqrt(1 - E2 * s * s);
  out[0] = ((n + altKm) * c * Math.cos(lam)) / RE_KM;
  out[1] = ((n + altKm) * c * Math.sin(lam)) / RE_KM;
  out[2] = ((n * (1 - E2) + altKm) * s) / RE_KM;
  return out;
}

export interface Geodetic {
  latDeg: number;
  lonDeg: number;
  altKm: number;
}

/** Geodetic latitude/longitude/height of a GEO Cartesian point (RE). lon in −180..180. */
export function geodeticFromGeo(x: number, y: number, z: number): Geodetic {
  const X = x * RE_KM;
  const Y = y * RE_KM;
  const Z = z * RE_KM;
  const p = Math.hypot(X, Y);
  const lonDeg = Math.atan2(Y, X) * DEG_PER_RAD;
  if (p < 1e-9) {
    const latDeg = Z >= 0 ? 90 : -90;
    return { latDeg, lonDeg: 0, altKm: Math.abs(Z) - B_KM };
  }
  // Bowring's parametric-latitude iteration.
  let beta = Math.atan2(Z, (1 - WGS84_F) * p);
  let phi = 0;
  for (let i = 0; i < 4; i++) {
    const sb = Math.sin(beta);
    const cb = Math.cos(beta);
    phi = Math.atan2(Z + EP2 * B_KM * sb * sb * sb, p - E2 * WGS84_A_KM * cb * cb * cb);
    beta = Math.atan2((1 - WGS84_F) * Math.sin(phi), Math.cos(phi));
  }
  const s = Math.sin(phi);
  const n = WGS84_A_KM / Math.sqrt(1 - E2 * s * s);
  const c = Math.cos(phi);
  const altKm = Math.abs(c) > 1e-3 ? p / c - n : Math.abs(Z) / Math.abs(s) - n * (1 - E2);
  return { latDeg: phi * DEG_PER_RAD, lonDeg, altKm };
}

/** Geocentric radius (RE) of the surface `altKm` above the ellipsoid at geocentric latitude whose sine is sinLatGc (approximate to < 10 m for |altKm| < 1000: the ellipsoid radius plus the height). */
export function ellipsoidRadiusRe(sinLatGc: number, altKm: number): number {
  const s2 = sinLatGc * sinLatGc;
  // Radius of the ellipsoid at geocentric latitude: a·b / sqrt(b²cos² + a²sin²).
  const rEll = (WGS84_A_KM * B_KM) / Math.sqrt(B_KM * B_KM * (1 - s2) + WGS84_A_KM * WGS84_A_KM * s2);
  return (rEll + altKm) / RE_KM;
}

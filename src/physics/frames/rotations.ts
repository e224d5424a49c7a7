/**
 * Rotations between GEO, GEI, GSE, GSM, SM and MAG (definitions of Hapgood,
 * 1992, Planet. Space Sci. 40, 711; correction 1997, 45, 1047). Each matrix is
 * built from its axis unit vectors (rows = the target frame's axes written in
 * the source frame), which is equivalent to Hapgood's Euler-angle products.
 * Names are source-last: gsmFromGeo maps a GEO vector into GSM.
 */
import { InputError, requireFinite, requireInRange } from '../errors';
import { RAD_PER_DEG } from '../constants';
import { gmstRad, obliquityRad, sunDirectionGei } from './time';

/** 3×3 matrix, row-major, 9 entries. */
export type Mat3 = Float64Array;

/** out = m·(x, y, z). out may alias the input vector. */
export function applyMat3(out: Float64Array, m: Mat3, x: number, y: number, z: number): Float64Array {
  out[0] = m[0] * x + m[1] * y + m[2] * z;
  out[1] = m[3] * x + m[4] * y + m[5] * z;
  out[2] = m[6] * x + m[7] * y + m[8] * z;
  return out;
}

/** out = mᵀ·(x, y, z) — the inverse for a rotation. out may alias the input vector. */
export function applyMat3T(out: Float64Array, m: Mat3, x: number, y: number, z: number): Float64Array {
  out[0] = m[0] * x + m[3] * y + m[6] * z;
  out[1] = m[1] * x + m[4] * y + m[7] * z;
  out[2] = m[2] * x + m[5] * y + m[8] * z;
  return out;
}

/** Everything needed to rotate vectors at one instant, prepared once per condition change. */
export interface FrameSet {
  /** Unix ms the frames were prepared for. */
  ms: number;
  /** Dipole tilt ψ (rad), positive when the north dipole pole leans sunward. */
  tiltRad: number;
  sinTilt: number;
  cosTilt: number;
  geiFromGeo: Mat3;
  gseFromGei: Mat3;
  gsmFromGse: Mat3;
  smFromGsm: Mat3;
  magFromGeo: Mat3;
  /** gsmFromGse · gseFromGei · geiFromGeo. */
  gsmFromGeo: Mat3;
  /** Unit Sun direction in GEO (after any tilt override). */
  sunGeo: Float64Array;
  /** Unit dipole north axis in GEO (towards the geomagnetic north pole). */
  axisGeo: Float64Array;
}

// c = a × b for 3-vectors stored in plain locals; writes into c.
function cross(c: Float64Array, ax: number, ay: number, az: number, bx: number, by: number, bz: number): Float64Array {
  c[0] = ay * bz - az * by;
  c[1] = az * bx - ax * bz;
  c[2] = ax * by - ay * bx;
  return c;
}

function normalize(v: Float64Array): number {
  const n = Math.hypot(v[0], v[1], v[2]);
  if (n > 0) {
    v[0] /= n;
    v[1] /= n;
    v[2] /= n;
  }
  return n;
}

// Matrix whose rows are the unit vectors a, b, c.
function rows(a: ArrayLike<number>, b: ArrayLike<number>, c: ArrayLike<number>): Mat3 {
  return Float64Array.of(a[0], a[1], a[2], b[0], b[1], b[2], c[0], c[1], c[2]);
}

// a · bᵀ for rotation matrices (a's rows dotted with b's rows).
function mulABt(a: Mat3, b: Mat3): Mat3 {
  const r = new Float64Array(9);
  for (let i = 0; i < 3; i++) {
    for (let j = 0; j < 3; j++) {
      r[3 * i + j] = a[3 * i] * b[3 * j] + a[3 * i + 1] * b[3 * j + 1] + a[3 * i + 2] * b[3 * j + 2];
    }
  }
  return r;
}

function mul(a: Mat3, b: Mat3): Mat3 {
  const r = new Float64Array(9);
  for (let i = 0; i < 3; i++) {
    for (let j = 0; j < 3; j++) {
      r[3 * i + j] = a[3 * i] * b[j] + a[3 * i + 1] * b[3 + j] + a[3 * i + 2] * b[6 + j];
    }
  }
  return r;
}

/** Below this |a × b| two unit vectors are treated as parallel (a frame axis is then undefined). */
const PARALLEL_EPS = 1e-12;

/**
 * Prepare all frame rotations for an instant.
 * - GEI from GEO: rotation by GMST about z (Hapgood 1992, T1 = <θ, Z>, inverted).
 * - GSE: x = Sun, z = ecliptic north (0, −sin ε, cos ε)_GEI (made ⟂ x if the Sun was moved by an override).
 * - GSM: x = Sun, y = unit(axis × x), z = x × y (z is the axis projected ⟂ x).
 * - SM: z = axis, y = GSM y; a rotation by ψ about y.
 * - MAG: z = axis, y = unit(ẑ_GEO × axis), x = y × z.
 *
 * Tilt override (this project's rule): the Sun direction s is rotated within
 * the plane spanned by s and the dipole axis m, keeping its part ⟂ m fixed, until
 * asin(m·s') equals the override; GSE, GSM and SM are then built from s'. The
 * SM x axis (the sunward direction ⟂ m) is unchanged, so MLT and the
 * geographic mapping keep following the time.
 * Degenerate cases (|ψ| = 90°, axis along the Sun): GSM y falls back to GSE y.
 *
 * @param ms Unix ms (UTC)
 * @param axisGeo dipole north axis in GEO (normalised here)
 * @param tiltOverrideDeg tilt to impose, −90..90 deg; null/undefined to follow the time
 */
export function prepareFrames(ms: number, axisGeo: ArrayLike<number>, tiltOverrideDeg?: number | null): FrameSet {
  requireFinite('time', ms);
  const m = Float64Array.of(axisGeo[0], axisGeo[1], axisGeo[2]);
  if (!(Number.isFinite(m[0]) && Number.isFinite(m[1]) && Number.isFinite(m[2])) || normalize(m) === 0) {
    throw new InputError('axisGeo', `expected a finite non-zero 3-vector, got [${Array.from({ length: 3 }, (_, i) => axisGeo[i]).join(', ')}]`);
  }
  const override = tiltOverrideDeg === null || tiltOverrideDeg === undefined ? null : requireInRange('tiltDeg', tiltOverrideDeg, -90, 90, 'deg');

  const th = gmstRad(ms);
  const ct = Math.cos(th);
  const st = Math.sin(th);
  const geiFromGeo = Float64Array.of(ct, -st, 0, st, ct, 0, 0, 0, 1);

  const s = sunDirectionGei(new Float64Array(3), ms);
  const mg = applyMat3(new Float64Array(3), geiFromGeo, m[0], m[1], m[2]);

  if (override !== null) {
    // u = the Sun's direction with its axis component removed (the SM x axis).
    const sm = s[0] * mg[0] + s[1] * mg[1] + s[2] * mg[2];
    const u = Float64Array.of(s[0] - sm * mg[0], s[1] - sm * mg[1], s[2] - sm * mg[2]);
    if (normalize(u) < PARALLEL_EPS) {
      // Sun along the axis: any direction ⟂ m will do; take the one nearest GEI x.
      u[0] = 1 - mg[0] * mg[0];
      u[1] = -mg[0] * mg[1];
      u[2] = -mg[0] * mg[2];
      if (normalize(u) < PARALLEL_EPS) {
        u[0] = -mg[1] * mg[0];
        u[1] = 1 - mg[1] * mg[1];
        u[2] = -mg[1] * mg[2];
        normalize(u);
      }
    }
    const ps = Math.sin(override * RAD_PER_DEG);
    const pc = Math.cos(override * RAD_PER_DEG);
    for (let i = 0; i < 3; i++) s[i] = pc * u[i] + ps * mg[i];
    normalize(s);
  }

  // GSE axes in GEI.
  const eps = obliquityRad(ms);
  const ez = Float64Array.of(0, -Math.sin(eps), Math.cos(eps));
  const es = ez[0] * s[0] + ez[1] * s[1] + ez[2] * s[2];
  for (let i = 0; i < 3; i++) ez[i] -= es * s[i];
  normalize(ez);
  const ey = cross(new Float64Array(3), ez[0], ez[1], ez[2], s[0], s[1], s[2]);
  normalize(ey);
  const gseFromGei = rows(s, ey, ez);

  // GSM axes in GEI.
  const gy = cross(new Float64Array(3), mg[0], mg[1], mg[2], s[0], s[1], s[2]);
  if (normalize(gy) < PARALLEL_EPS) gy.set(ey);
  const gz = cross(new Float64Array(3), s[0], s[1], s[2], gy[0], gy[1], gy[2]);
  normalize(gz);
  const gsmFromGei = rows(s, gy, gz);
  const gsmFromGse = mulABt(gsmFromGei, gseFromGei);

  const sinTilt = Math.max(-1, Math.min(1, mg[0] * s[0] + mg[1] * s[1] + mg[2] * s[2]));
  const tiltRad = override !== null ? override * RAD_PER_DEG : Math.asin(sinTilt);
  const cosTilt = Math.cos(tiltRad);
  const sinT = Math.sin(tiltRad);
  // SM from GSM: rotation by ψ about y (Hapgood 1992, T4 = <−ψ, Y>).
  const smFromGsm = Float64Array.of(cosTilt, 0, -sinT, 0, 1, 0, sinT, 0, cosTilt);

  // MAG axes in GEO.
  const my = cross(new Float64Array(3), 0, 0, 1, m[0], m[1], m[2]);
  if (normalize(my) < PARALLEL_EPS) my.set([0, 1, 0]);
  const mx = cross(new Float64Array(3), my[0], my[1], my[2], m[0], m[1], m[2]);
  normalize(mx);
  const magFromGeo = rows(mx, my, m);

  const gsmFromGeo = mul(gsmFromGei, geiFromGeo);
  const sunGeo = applyMat3T(new Float64Array(3), geiFromGeo, s[0], s[1], s[2]);

  return { ms, tiltRad, sinTilt: sinT, cosTilt, geiFromGeo, gseFromGei, gsmFromGse, smFromGsm, magFromGeo, gsmFromGeo, sunGeo, axisGeo: m };
}

type Conv = (out: Float64Array, v: ArrayLike<number>, f: FrameSet) => Float64Array;

export const geiFromGeo: Conv = (out, v, f) => applyMat3(out, f.geiFromGeo, v[0], v[1], v[2]);
export const geoFromGei: Conv = (out, v, f) => applyMat3T(out, f.geiFromGeo, v[0], v[1], v[2]);
export const gseFromGei: Conv = (out, v, f) => applyMat3(out, f.gseFromGei, v[0], v[1], v[2]);
export const geiFromGse: Conv = (out, v, f) => applyMat3T(out, f.gseFromGei, v[0], v[1], v[2]);
export const gsmFromGse: Conv = (out, v, f) => applyMat3(out, f.gsmFromGse, v[0], v[1], v[2]);
export const gseFromGsm: Conv = (out, v, f) => applyMat3T(out, f.gsmFromGse, v[0], v[1], v[2]);
export const smFromGsm: Conv = (out, v, f) => applyMat3(out, f.smFromGsm, v[0], v[1], v[2]);
export const gsmFromSm: Conv = (out, v, f) => applyMat3T(out, f.smFromGsm, v[0], v[1], v[2]);
export const magFromGeo: Conv = (out, v, f) => applyMat3(out, f.magFromGeo, v[0], v[1], v[2]);
export const geoFromMag: Conv = (out, v, f) => applyMat3T(out, f.magFromGeo, v[0], v[1], v[2]);
export const gsmFromGeo: Conv = (out, v, f) => applyMat3(out, f.gsmFromGeo, v[0], v[1], v[2]);
export const geoFromGsm: Conv = (out, v, f) => applyMat3T(out, f.gsmFromGeo, v[0], v[1], v[2]);
/** GEO → SM (via GSM). */
export const smFromGeo: Conv = (out, v, f) => {
  applyMat3(out, f.gsmFromGeo, v[0], v[1], v[2]);
  return applyMat3(out, f.smFromGsm, out[0], out[1], out[2]);
};
/** SM → GEO (via GSM). */
export const geoFromSm: Conv = (out, v, f) => {
  applyMat3T(out, f.smFromGsm, v[0], v[1], v[2]);
  return applyMat3T(out, f.gsmFromGeo, out[0], out[1], out[2]);
};

export interface Spherical {
  rRe: number;
  /** Geocentric latitude, −π/2..π/2. */
  latRad: number;
  /** Longitude, −π..π. */
  lonRad: number;
}

/** Geocentric spherical coordinates of a Cartesian point (same units in, rRe out). */
export function sphericalFromCartesian(x: number, y: number, z: number): Spherical {
  const rRe = Math.hypot(x, y, z);
  return { rRe, latRad: Math.atan2(z, Math.hypot(x, y)), lonRad: Math.atan2(y, x) };
}

/** Cartesian point from geocentric radius, latitude and longitude (rad). Writes out[0..2]. */
export function cartesianFromSpherical(out: Float64Array, rRe: number, latRad: number, lonRad: number): Float64Array {
  const c = Math.cos(latRad);
  out[0] = rRe * c * Math.cos(lonRad);
  out[1] = rRe * c * Math.sin(lonRad);
  out[2] = rRe * Math.sin(latRad);
  return out;
}

/** Magnetic local time (h, 0 ≤ MLT < 24) of an SM position: 12 + atan2(y, x)/15° (common practice). */
export function mltHours(xSm: number, ySm: number): number {
  let h = 12 + (Math.atan2(ySm, xSm) * 12) / Math.PI;
  if (h >= 24) h -= 24;
  if (h < 0) h += 24;
  return h >= 24 ? 0 : h;
}

/** MLT (h) of a GEO position under the prepared frames. */
export function mltOfGeo(f: FrameSet, x: number, y: number, z: number): number {
  const g = f.gsmFromGeo;
  const xg = g[0] * x + g[1] * y + g[2] * z;
  const yg = g[3] * x + g[4] * y + g[5] * z;
  const zg = g[6] * x + g[7] * y + g[8] * z;
  const s = f.smFromGsm;
  return mltHours(s[0] * xg + s[1] * yg + s[2] * zg, yg);
}

/** Dipole tilt ψ (rad) at an instant for a GEO dipole axis: asin(m̂·ŝ) (derived; references §6). */
export function dipoleTiltRad(ms: number, axisGeo: ArrayLike<number>): number {
  const s = sunDirectionGei(new Float64Array(3), ms);
  const th = gmstRad(ms);
  const c = Math.cos(th);
  const sn = Math.sin(th);
  // Sun in GEO: rotate GEI by −θ about z.
  const sx = c * s[0] + sn * s[1];
  const sy = -sn * s[0] + c * s[1];
  const n = Math.hypot(axisGeo[0], axisGeo[1], axisGeo[2]);
  const d = (axisGeo[0] * sx + axisGeo[1] * sy + axisGeo[2] * s[2]) / n;
  return Math.asin(Math.max(-1, Math.min(1, d)));
}

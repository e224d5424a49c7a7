/**
 * Corrected geomagnetic (CGM) coordinates by tracing, after the published
 * definition (Gustafsson, Papitashvili & Papitashvili 1992, J. Atmos. Terr.
 * Phys. 54, 1609; references §6): follow the main-field line through the point
 * to the centred dipole's equatorial plane, then go back along the dipole field
 * line through that equatorial point to the point's own radius; the dipole
 * (MAG) latitude and longitude reached there are the CGM latitude and
 * longitude. For a dipole line of apex radius R (RE) reaching radius r:
 * cos²Λ = r / R (references §1), and the longitude is the apex point's MAG
 * longitude.
 *
 * Undefined where the main-field line through the point does not cross the
 * dipole equator above the point's radius (close to the dipole equator, where
 * the real field's lines stay on one side of the dipole's plane, or the apex
 * lies below the point): reported with a reason, never guessed.
 *
 * The main field only: CGM coordinates do not depend on the magnetosphere.
 * The MLT of a CGM longitude is that of the apex point (its MAG longitude
 * against the Sun's).
 */
import { DEG_PER_RAD, RE_KM } from '../constants';
import { InputError, requireInRange } from '../errors';
import { geoFromGeodetic } from '../frames/geodesy';
import { magFromGeo, mltOfGeo, type FrameSet } from '../frames/rotations';
import { Tracer, type TraceField } from '../trace/tracer';
import type { MainFieldModel } from '../field/mainfield/synthesis';

/** CGM position of one point, or why it is undefined. */
export type CgmResult =
  | { defined: true; latDeg: number; lonDeg: number; mltH: number; apexRe: number }
  | { defined: false; reason: string };

/** A prepared CGM converter for one main field (one epoch). Not re-entrant (owns a tracer). */
export interface CgmConverter {
  /** CGM coordinates of a GEO Cartesian point (RE). */
  fromGeo(x: number, y: number, z: number): CgmResult;
  /** CGM coordinates of a geodetic point (WGS84 latitude, east longitude, height above the ellipsoid). */
  fromGeodetic(latDeg: number, lonDeg: number, heightKm: number): CgmResult;
}

/**
 * Step factor of the CGM traces: half the tracer's default. CGM latitude then
 * agrees with an independent high-accuracy integration to ≤ 4e-5° (measured by
 * test/physics/mapping/cgm.test.ts); ~0.55 ms a point with the full IGRF.
 */
export const CGM_STEP_FACTOR = 0.05;
/** Lines reaching farther than this (RE) are no longer dipole-like near Earth; CGM is reported undefined. */
export const CGM_MAX_APEX_RE = 60;

const UNDEFINED_NEAR_EQUATOR = 'undefined near the dipole equator: the main-field line through this point does not cross the dipole equator above it';

/**
 * Prepare a CGM converter.
 * @param mainField the main field in GEO (IGRF of the date, or its centred dipole alone)
 * @param frames frames of the instant: their dipole axis defines the dipole equator and MAG; MLT follows the time
 */
export function prepareCgm(mainField: MainFieldModel, frames: FrameSet): CgmConverter {
  const axis = frames.axisGeo;
  const geoZRow = Float64Array.of(0, 0, 1);
  // The tracer works in whatever frame its field uses: here GEO, with no boundary.
  const field: TraceField = {
    evaluate: (out, x, y, z) => mainField.evaluateGeo(out, x, y, z),
    isInside: () => true,
    boundaryMinRe: Infinity,
    geoZRow,
  };
  const tracer = new Tracer(field, { ellipsoid: false, stepFactor: CGM_STEP_FACTOR, hMaxRe: 1, rMaxRe: CGM_MAX_APEX_RE, maxSteps: 6000 });
  const b = new Float64Array(3);
  const mag = new Float64Array(3);
  const apex = new Float64Array(3);

  const unitTangent: TangentAt = (out, x, y, z) => {
    mainField.evaluateGeo(b, x, y, z);
    const m = Math.hypot(b[0], b[1], b[2]);
    out[0] = b[0] / m; out[1] = b[1] / m; out[2] = b[2] / m;
  };

  function fromGeo(x: number, y: number, z: number): CgmResult {
    const r = Math.hypot(x, y, z);
    if (!(r >= 0.5 && r <= 20)) throw new InputError('rRe', `expected a point between 0.5 and 20 RE from Earth's centre, got ${r}`);
    const side = axis[0] * x + axis[1] * y + axis[2] * z;
    // Stop a little below the point, so the trace starts above its stop sphere.
    tracer.setOptions({ altKm: (r - 1) * RE_KM - 10 });
    tracer.trace(x, y, z);
    const p = tracer.points;
    const n = tracer.nPoints;
    const s0 = tracer.seedIndex;
    // Walk from the seed away from the point's side of the dipole equator, both ways; take the nearer crossing.
    let k = -1;
    let dir = 0;
    for (let step = 1; step < n && k < 0; step++) {
      for (const d of [1, -1]) {
        const i = s0 + d * step;
        const j = i - d;
        if (i < 0 || i >= n) continue;
        const si = axis[0] * p[3 * i] + axis[1] * p[3 * i + 1] + axis[2] * p[3 * i + 2];
        if (side === 0 || Math.sign(si) !== Math.sign(side)) { k = Math.min(i, j); dir = d; break; }
      }
    }
    if (k < 0 || dir === 0) return { defined: false, reason: UNDEFINED_NEAR_EQUATOR };
    dipoleEquatorCrossing(apex, p, k, axis, unitTangent);
    const ex = apex[0], ey = apex[1], ez = apex[2];
    const apexRe = Math.hypot(ex, ey, ez);
    if (!(apexRe > r)) return { defined: false, reason: UNDEFINED_NEAR_EQUATOR };
    magFromGeo(mag, [ex, ey, ez], frames);
    const latAbs = Math.acos(Math.sqrt(r / apexRe)) * DEG_PER_RAD;
    const latDeg = side >= 0 ? latAbs : -latAbs;
    const lonDeg = Math.atan2(mag[1], mag[0]) * DEG_PER_RAD;
    return { defined: true, latDeg, lonDeg, mltH: mltOfGeo(frames, ex, ey, ez), apexRe };
  }

  const g = new Float64Array(3);
  return {
    fromGeo,
    fromGeodetic(latDeg, lonDeg, heightKm) {
      requireInRange('latDeg', latDeg, -90, 90, 'deg');
      requireInRange('lonDeg', lonDeg, -360, 360, 'deg');
      requireInRange('heightKm', heightKm, -1, 20000, 'km');
      geoFromGeodetic(g, latDeg, lonDeg, heightKm);
      return fromGeo(g[0], g[1], g[2]);
    },
  };
}

/** Unit field direction at a point (writes out). */
type TangentAt = (out: Float64Array, x: number, y: number, z: number) => void;

const tA = new Float64Array(3);
const tB = new Float64Array(3);

function hermite(t: number, f0: number, d0: number, f1: number, d1: number): number {
  const t2 = t * t, t3 = t2 * t;
  return (2 * t3 - 3 * t2 + 1) * f0 + (t3 - 2 * t2 + t) * d0 + (-2 * t3 + 3 * t2) * f1 + (t3 - t2) * d1;
}

/**
 * Where the traced line crosses the dipole equator between points k and k+1 of
 * `p` (the axis coordinate changes sign there): a cubic Hermite segment with
 * field-aligned, chord-scaled tangents, its root found by bisection. Writes out.
 */
function dipoleEquatorCrossing(out: Float64Array, p: Float64Array, k: number, axis: ArrayLike<number>, unitTangent: TangentAt): void {
  const ax = p[3 * k], ay = p[3 * k + 1], az = p[3 * k + 2];
  const bx = p[3 * k + 3], by = p[3 * k + 4], bz = p[3 * k + 5];
  const chord = Math.hypot(bx - ax, by - ay, bz - az);
  unitTangent(tA, ax, ay, az);
  unitTangent(tB, bx, by, bz);
  // Orient the tangents from a to b.
  const oA = (tA[0] * (bx - ax) + tA[1] * (by - ay) + tA[2] * (bz - az)) < 0 ? -chord : chord;
  const oB = (tB[0] * (bx - ax) + tB[1] * (by - ay) + tB[2] * (bz - az)) < 0 ? -chord : chord;
  const sA = axis[0] * ax + axis[1] * ay + axis[2] * az;
  const dA = oA * (axis[0] * tA[0] + axis[1] * tA[1] + axis[2] * tA[2]);
  const sB = axis[0] * bx + axis[1] * by + axis[2] * bz;
  const dB = oB * (axis[0] * tB[0] + axis[1] * tB[1] + axis[2] * tB[2]);
  let lo = 0, hi = 1;
  for (let it = 0; it < 60; it++) {
    const mid = 0.5 * (lo + hi);
    if (Math.sign(hermite(mid, sA, dA, sB, dB)) === Math.sign(sA)) lo = mid; else hi = mid;
  }
  const t = 0.5 * (lo + hi);
  out[0] = hermite(t, ax, oA * tA[0], bx, oB * tB[0]);
  out[1] = hermite(t, ay, oA * tA[1], by, oB * tB[1]);
  out[2] = hermite(t, az, oA * tA[2], bz, oB * tB[2]);
}

/** CGM latitude of a point at radius rRe on a dipole line of apex apexRe (deg, ≥ 0): cos²Λ = r/R (references §1). */
export function dipoleLatitudeAtRadiusDeg(apexRe: number, rRe: number): number {
  return Math.acos(Math.sqrt(rRe / apexRe)) * DEG_PER_RAD;
}

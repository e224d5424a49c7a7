/**
 * Fit boundaries of the compression field: surfaces symmetric about x_GSM (the
 * Shue et al., 1998, magnetopause; a sphere for the exact conducting-sphere
 * limit) and their sampling on rings of equal meridian arc length (see fit.ts).
 */
import { InputError, expectedGot } from '../../errors';
import { type MagnetopauseShape, shueRadius } from '../magnetopause';

/** A boundary symmetric about the x axis, r = r(θ), θ from +x. */
export interface AxisymmetricSurface {
  radiusRe(thetaRad: number): number;
  /** dr/dθ, RE per radian. */
  radiusSlope(thetaRad: number): number;
  /** Tailward edge of the fitted region (θ of the last sampled ring), rad. */
  thetaMaxRad: number;
  /** Length scale for wavenumbers and sample spacing, RE (the standoff or sphere radius). */
  scaleRe: number;
}

/** The Shue et al. (1998) surface as a fit boundary, from the nose to x = −depth·r0. */
export function shueSurface(mp: MagnetopauseShape, fitDepthR0 = 2): AxisymmetricSurface {
  const xMin = -fitDepthR0 * mp.r0Re;
  const xAt = (t: number): number => shueRadius(mp, t) * Math.cos(t);
  const cap = 0.95 * Math.PI;
  let thetaMax = cap;
  if (xAt(cap) < xMin) {
    let lo = 0;
    let hi = cap;
    for (let it = 0; it < 60; it++) {
      const mid = 0.5 * (lo + hi);
      if (xAt(mid) > xMin) lo = mid;
      else hi = mid;
    }
    thetaMax = 0.5 * (lo + hi);
  }
  return {
    radiusRe: (t) => shueRadius(mp, t),
    // dr/dθ = r α tan(θ/2), derived from Shue et al. (1998) eq. 1.
    radiusSlope: (t) => shueRadius(mp, t) * mp.alpha * Math.tan(0.5 * t),
    thetaMaxRad: thetaMax,
    scaleRe: mp.r0Re,
  };
}

/** A sphere of radius R centred on Earth (the exact conducting-sphere limit). */
export function sphereSurface(radiusRe: number): AxisymmetricSurface {
  if (!(radiusRe > 0) || !Number.isFinite(radiusRe)) throw new InputError('radiusRe', expectedGot('a finite radius > 0 RE', radiusRe));
  return { radiusRe: () => radiusRe, radiusSlope: () => 0, thetaMaxRad: Math.PI, scaleRe: radiusRe };
}

export interface Samples {
  n: number;
  p: Float64Array; // x, y, z interleaved
  nrm: Float64Array; // outward unit normals interleaved
  area: Float64Array;
  ringStart: Int32Array; // first sample index of each ring (+ sentinel)
}

/** Rings of equal meridian arc length; φ_j = (j + ½)·2π/n_φ with n_φ a multiple of 4 (mirror-symmetric in y and z). */
export function sampleSurface(s: AxisymmetricSurface, spacing: number): Samples {
  const NT = 256;
  const th = s.thetaMaxRad;
  const cum = new Float64Array(NT + 1);
  let prev = Math.hypot(s.radiusRe(0), s.radiusSlope(0));
  for (let i = 1; i <= NT; i++) {
    const t = (th * i) / NT;
    const v = Math.hypot(s.radiusRe(t), s.radiusSlope(t));
    cum[i] = cum[i - 1] + (0.5 * (prev + v) * th) / NT;
    prev = v;
  }
  const total = cum[NT];
  const ds0 = spacing * s.scaleRe;
  const nRings = Math.max(4, Math.ceil(total / ds0));
  const ds = total / nRings;
  const thetas = new Float64Array(nRings);
  const counts = new Int32Array(nRings);
  let n = 0;
  let seg = 0;
  for (let r = 0; r < nRings; r++) {
    const target = (r + 0.5) * ds;
    while (seg < NT - 1 && cum[seg + 1] < target) seg++;
    const f = (target - cum[seg]) / (cum[seg + 1] - cum[seg]);
    const t = (th * (seg + f)) / NT;
    thetas[r] = t;
    const rho = s.radiusRe(t) * Math.sin(t);
    counts[r] = 4 * Math.max(1, Math.ceil((2 * Math.PI * rho) / (4 * ds)));
    n += counts[r];
  }
  const p = new Float64Array(3 * n);
  const nrm = new Float64Array(3 * n);
  const area = new Float64Array(n);
  const ringStart = new Int32Array(nRings + 1);
  let k = 0;
  for (let r = 0; r < nRings; r++) {
    ringStart[r] = k;
    const t = thetas[r];
    const rr = s.radiusRe(t);
    const rp = s.radiusSlope(t);
    const ct = Math.cos(t);
    const st = Math.sin(t);
    const rho = rr * st;
    // Outward normal ∝ r r̂ − r' θ̂ (gradient of F = r − r(θ), derived).
    const nxr = rr * ct + rp * st;
    const nrr = rr * st - rp * ct;
    const len = Math.hypot(nxr, nrr);
    const m = counts[r];
    const dA = (rho * ds * 2 * Math.PI) / m;
    for (let j = 0; j < m; j++) {
      const phi = ((j + 0.5) * 2 * Math.PI) / m;
      const cp = Math.cos(phi);
      const sp = Math.sin(phi);
      p[3 * k] = rr * ct;
      p[3 * k + 1] = rho * cp;
      p[3 * k + 2] = rho * sp;
      nrm[3 * k] = nxr / len;
      nrm[3 * k + 1] = (nrr / len) * cp;
      nrm[3 * k + 2] = (nrr / len) * sp;
      area[k] = dA;
      k++;
    }
  }
  ringStart[nRings] = k;
  return { n, p, nrm, area, ringStart };
}

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
  const thetaMax = shueThetaAtX(mp, -fitDepthR0 * mp.r0Re);
  return {
    radiusRe: (t) => shueRadius(mp, t),
    // dr/dθ = r α tan(θ/2), derived from Shue et al. (1998) eq. 1.
    radiusSlope: (t) => shueRadius(mp, t) * mp.alpha * Math.tan(0.5 * t),
    thetaMaxRad: thetaMax,
    scaleRe: mp.r0Re,
  };
}

/** θ of the Shue surface at GSM x = xRe (bisection; capped at 0.95π, where the surface is far down the tail). */
export function shueThetaAtX(mp: MagnetopauseShape, xRe: number): number {
  const xAt = (t: number): number => shueRadius(mp, t) * Math.cos(t);
  const cap = 0.95 * Math.PI;
  if (xAt(cap) >= xRe) return cap;
  let lo = 0;
  let hi = cap;
  for (let it = 0; it < 60; it++) {
    const mid = 0.5 * (lo + hi);
    if (xAt(mid) > xRe) lo = mid;
    else hi = mid;
  }
  return 0.5 * (lo + hi);
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

/**
 * Rings on a grid of meridian arc length measured from the nose: band k covers arc lengths
 * [k·ds, (k+1)·ds], ds = spacing·scaleRe, clipped to the part of the surface between θ = thetaFromRad
 * and thetaToRad (default: the whole fitted region); each ring sits at the middle of its band and
 * carries its area. φ_j = (j + ½)·2π/n_φ with n_φ a multiple of 4 (mirror-symmetric in y and z).
 * The grid is anchored at the nose, so moving thetaToRad moves only the last band.
 */
export function sampleSurface(s: AxisymmetricSurface, spacing: number, thetaFromRad = 0, thetaToRad = s.thetaMaxRad): Samples {
  const NT = 512;
  const th = thetaToRad;
  const cum = new Float64Array(NT + 1);
  let prev = Math.hypot(s.radiusRe(0), s.radiusSlope(0));
  for (let i = 1; i <= NT; i++) {
    const t = (th * i) / NT;
    const v = Math.hypot(s.radiusRe(t), s.radiusSlope(t));
    cum[i] = cum[i - 1] + (0.5 * (prev + v) * th) / NT;
    prev = v;
  }
  const thetaAtArc = (target: number): number => {
    let lo = 0, hi = NT;
    while (hi - lo > 1) { const mid = (lo + hi) >> 1; if (cum[mid] <= target) lo = mid; else hi = mid; }
    const f = (target - cum[lo]) / (cum[hi] - cum[lo]);
    return (th * (lo + f)) / NT;
  };
  const arcAtTheta = (t: number): number => {
    const u = Math.min(NT, Math.max(0, (t / th) * NT));
    const i = Math.min(NT - 1, Math.floor(u));
    return cum[i] + (u - i) * (cum[i + 1] - cum[i]);
  };
  const arcTo = cum[NT];
  const arcFrom = thetaFromRad > 0 ? arcAtTheta(thetaFromRad) : 0;
  const ds0 = spacing * s.scaleRe;
  const k0 = Math.floor(arcFrom / ds0), k1 = Math.ceil(arcTo / ds0);
  const thetas: number[] = [], widths: number[] = [], counts: number[] = [];
  let n = 0;
  for (let kb = k0; kb < k1; kb++) {
    const a0 = Math.max(kb * ds0, arcFrom), a1 = Math.min((kb + 1) * ds0, arcTo);
    if (!(a1 - a0 > 1e-9 * ds0)) continue;
    const t = thetaAtArc(0.5 * (a0 + a1));
    const rho = s.radiusRe(t) * Math.sin(t);
    const m = 4 * Math.max(1, Math.ceil((2 * Math.PI * rho) / (4 * ds0)));
    thetas.push(t); widths.push(a1 - a0); counts.push(m);
    n += m;
  }
  const nRings = thetas.length;
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
    const dA = (rho * widths[r] * 2 * Math.PI) / m;
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

/**
 * The magnetopause surface of Shue et al. (1998) JGR 103, 17691, in GSM (RE).
 * r = r0 (2/(1+cos θ))^α, θ the angle from +x_GSM. The surface is taken as
 * axisymmetric about x_GSM: the few-degree aberration from Earth's orbital motion
 * and the dipole-tilt dependence are ignored (the 1998 fit has neither).
 * Also: solar-wind dynamic pressure from density and speed.
 */
import { InputError, expectedGot } from '../errors';
import { requireImfComponent } from './conditions';
import { PROTON_MASS_KG } from '../constants';

export interface MagnetopauseShape {
  /** Subsolar standoff distance, RE. */
  r0Re: number;
  /** Flaring exponent (dimensionless). */
  alpha: number;
  pdynNpa: number;
  bzNt: number;
  /** Non-fatal notes, e.g. input outside the data range of the fit. */
  warnings: string[];
}

/**
 * Shue et al. (1998) standoff and flaring from dynamic pressure (nPa) and IMF Bz (nT).
 * By is validated but does not enter the 1998 fit. Values outside the data range of
 * the fit (Shue et al., 1997, JGR 102, 9497: −18 < Bz < 15 nT, 0.5 < Dp < 8.5 nPa) are
 * extrapolated with a warning, not refused.
 */
export function shueMagnetopause(pdynNpa: number, bzNt: number, byNt = 0): MagnetopauseShape {
  if (typeof pdynNpa !== 'number' || !Number.isFinite(pdynNpa) || pdynNpa <= 0) {
    throw new InputError('pdynNpa', expectedGot('a finite dynamic pressure > 0 nPa', pdynNpa));
  }
  requireImfComponent('bzNt', bzNt);
  requireImfComponent('byNt', byNt);
  const r0Re = shueStandoffRe(pdynNpa, bzNt);
  // Shue et al. (1998) JGR 103, 17691, eq. 11 (flaring).
  const alpha = (0.58 - 0.007 * bzNt) * (1 + 0.024 * Math.log(pdynNpa));
  const warnings: string[] = [];
  // Data range of the fit: Shue et al. (1997) JGR 102, 9497; its edges count as inside.
  if (!(bzNt >= -18 && bzNt <= 15)) {
    warnings.push(`magnetopause: IMF Bz ${bzNt} nT is outside the fitted range −18..15 nT of Shue et al. (1998); the surface is extrapolated`);
  }
  if (!(pdynNpa >= 0.5 && pdynNpa <= 8.5)) {
    warnings.push(`magnetopause: dynamic pressure ${pdynNpa} nPa is outside the fitted range 0.5..8.5 nPa of Shue et al. (1998); the surface is extrapolated`);
  }
  if (r0Re < 2) {
    warnings.push(`magnetopause: standoff ${r0Re.toFixed(2)} RE is within 2 RE of Earth's centre; the model is not meaningful there`);
  }
  return { r0Re, alpha, pdynNpa, bzNt, warnings };
}

/**
 * Subsolar standoff distance r0, RE, of Shue et al. (1998) JGR 103, 17691, eq. 10,
 * from dynamic pressure (nPa) and IMF Bz (nT). Kernel: no validation (the
 * callers validate); also the length scale of the tail sheet.
 */
export function shueStandoffRe(pdynNpa: number, bzNt: number): number {
  return (10.22 + 1.29 * Math.tanh(0.184 * (bzNt + 8.14))) * Math.pow(pdynNpa, -1 / 6.6);
}

/** Surface distance r(θ), RE, θ from +x_GSM (Infinity on the −x axis when α > 0). */
export function shueRadius(mp: MagnetopauseShape, thetaRad: number): number {
  // Shue et al. (1998) eq. 1.
  return mp.r0Re * Math.pow(2 / (1 + Math.cos(thetaRad)), mp.alpha);
}

/** True when the GSM point (RE) lies strictly inside the surface. */
export function isInsideMagnetopause(mp: MagnetopauseShape, x: number, y: number, z: number): boolean {
  const r = Math.sqrt(x * x + y * y + z * z);
  if (r === 0) return true;
  const rs = mp.r0Re * Math.pow(2 / (1 + x / r), mp.alpha);
  return r < rs;
}

/**
 * Outward unit normal of the surface at the surface point in the direction of (x, y, z).
 * ∇F for F = r − r(θ) on the surface is ∝ r̂ − α tan(θ/2) θ̂ (derived from eq. 1);
 * written as cos(θ/2) r̂ − α sin(θ/2) θ̂ so it stays finite on the −x axis.
 */
export function magnetopauseNormal(out: Float64Array, mp: MagnetopauseShape, x: number, y: number, z: number): Float64Array {
  const r = Math.sqrt(x * x + y * y + z * z);
  const rho = Math.sqrt(y * y + z * z);
  const ct = r > 0 ? x / r : 1;
  const st = r > 0 ? rho / r : 0;
  // Azimuth unit vector around x; on the axis any choice is valid (+z).
  const ey = rho > 0 ? y / rho : 0;
  const ez = rho > 0 ? z / rho : 1;
  // Half-angle forms: cos(θ/2) = √((1+c)/2), sin(θ/2) = √((1−c)/2).
  const ch = Math.sqrt(Math.max(0, (1 + ct) / 2));
  const sh = Math.sqrt(Math.max(0, (1 - ct) / 2));
  const a = mp.alpha;
  // r̂ = (c, s ê), θ̂ = (−s, c ê).
  const nx = ch * ct + a * sh * st;
  const nr = ch * st - a * sh * ct;
  const len = Math.sqrt(nx * nx + nr * nr);
  out[0] = nx / len;
  out[1] = (nr * ey) / len;
  out[2] = (nr * ez) / len;
  return out;
}

/**
 * Surface point (RE) at polar angle θ from +x and azimuth φ about x, measured from
 * +y toward +z: r(θ)·(cos θ, sin θ cos φ, sin θ sin φ). θ must be < π when α > 0.
 */
export function magnetopausePoint(out: Float64Array, mp: MagnetopauseShape, thetaRad: number, phiRad: number): Float64Array {
  const r = shueRadius(mp, thetaRad);
  const s = Math.sin(thetaRad);
  out[0] = r * Math.cos(thetaRad);
  out[1] = r * s * Math.cos(phiRad);
  out[2] = r * s * Math.sin(phiRad);
  return out;
}

/** Proton mass × 1e6 cm⁻³→m⁻³ × 1e6 (km/s)²→(m/s)² × 1e9 Pa→nPa: 1.6726e-6 nPa per cm⁻³ (km/s)² (references §3). */
const PDYN_PROTON = PROTON_MASS_KG * 1e21;
/** Nominal coefficient when the alpha content is unknown, nPa per cm⁻³ (km/s)² (references §3, common practice; ≈ 4.9 % alphas by number). */
export const PDYN_NOMINAL_COEFF = 2.0e-6;

function requirePlasma(densityCm3: number, speedKms: number): void {
  if (typeof densityCm3 !== 'number' || !Number.isFinite(densityCm3) || densityCm3 <= 0) {
    throw new InputError('densityCm3', expectedGot('a finite proton density > 0 cm⁻³', densityCm3));
  }
  if (typeof speedKms !== 'number' || !Number.isFinite(speedKms) || speedKms <= 0) {
    throw new InputError('speedKms', expectedGot('a finite solar-wind speed > 0 km/s', speedKms));
  }
}

/**
 * Dynamic pressure (nPa) from proton density (cm⁻³) and bulk speed (km/s):
 * m_p n v² for protons alone, × (1 + 4 Na/Np) when the alpha-to-proton number ratio is
 * given (the OMNI data set's definition; references §3). Without a ratio this is the
 * proton-only value; use `pdynFromPlasmaNominal` for the 2.0e-6·n·v² convention.
 */
export function pdynFromPlasma(densityCm3: number, speedKms: number, alphaRatio?: number): number {
  requirePlasma(densityCm3, speedKms);
  let f = 1;
  if (alphaRatio !== undefined) {
    if (typeof alphaRatio !== 'number' || !Number.isFinite(alphaRatio) || alphaRatio < 0 || alphaRatio > 1) {
      throw new InputError('alphaRatio', expectedGot('an alpha-to-proton number ratio in 0..1', alphaRatio));
    }
    f = 1 + 4 * alphaRatio;
  }
  return PDYN_PROTON * densityCm3 * speedKms * speedKms * f;
}

/** Dynamic pressure (nPa) with the 2.0e-6·n·v² convention for unknown alpha content (references §3). */
export function pdynFromPlasmaNominal(densityCm3: number, speedKms: number): number {
  requirePlasma(densityCm3, speedKms);
  return PDYN_NOMINAL_COEFF * densityCm3 * speedKms * speedKms;
}

/**
 * Ring current: an axisymmetric westward current about the dipole axis (SM frame, rotated
 * into GSM by the tilt), a sum of a few coaxial equatorial current loops with a softened
 * (vertically distributed) profile, in closed form with the complete elliptic integrals.
 *
 * One loop of radius a carrying I (references §10: Jackson, Classical Electrodynamics, §5.5;
 * Smythe): with α² = (a − ρ)² + z², β² = (a + ρ)² + z², k² = 4aρ/β², r² = ρ² + z², C = μ0 I/π,
 *   B_z = C/(2α²β)·[(a² − r²) E(k) + α² K(k)],
 *   B_ρ = C z/(2α²βρ)·[(a² + r²) E(k) − α² K(k)].
 * It derives from the vector potential A_φ(ρ, z) = (μ0 I/πk)√(a/ρ)[(1 − k²/2)K − E] by
 * B = ∇×(A_φ φ̂). Softening (derived): A_φ(ρ, z) → A_φ(ρ, √(z² + d²)). Any A_φ(ρ, z) φ̂ has a
 * divergence-free curl, so the softened field is exactly divergence-free; by the chain rule it is
 * the loop field evaluated at z_e = √(z² + d²) with B_ρ multiplied by z/z_e, i.e. the formulas
 * above with z_e in α², β², r² and the bare z in front of B_ρ. z_e ≥ d > 0, so α² ≥ d²: the
 * field is bounded everywhere (no singularity on the tracer's path). The current it stands for
 * (∇×B/μ0) is spread over |z| ≲ d about the equator; far away it tends to the loop's dipole,
 * moment I·πa² (derived).
 *
 * K and E by the polynomial approximations of Abramowitz & Stegun 17.3.34 / 17.3.36 (|error| ≤ 2e-8,
 * `ellipticKEPoly`; the field then differs from the exact loops by ≤ 3e-8 |Dst*|, footpoints by ≤ 1e-4°,
 * test/physics/field/ring-fast.test.ts), and for m < RING_POLY_MIN_M, where the bracket of B_ρ cancels,
 * by the arithmetic–geometric mean (A&S §17.6): a₀ = 1, b₀ = √(1 − m), c₀ = √m; K = π/(2a_N),
 * E = K·(1 − Σ 2^(n−1) c_n²). Near the axis (k² < 1e-8) the leading terms of the expansion in ρ
 * are used (derived), where the bracket of B_ρ would cancel.
 *
 * Strength (references §10): the index is measured from a quiet-day baseline, so the quiet
 * model (its tail and magnetopause currents) is the baseline and the ring carries the storm
 * part: its own field at Earth's centre along the dipole axis equals the pressure-corrected
 * index Dst* (negative; Dst* > 0 gives no ring). The Dessler–Parker–Sckopke relation
 * (Dessler & Parker, 1959, J. Geophys. Res. 64, 2239; Sckopke, 1966, J. Geophys. Res. 71, 3125)
 * ΔB/B0 = −(2/3) E/E_M, E_M = (4π/3μ0) B0² RE³, gives the particle energy reported.
 *
 * Radial profile (our choice, documented at `ringCurrentParameters`): three loops at 0.8, 1.1
 * and 1.5 times a peak radius, the peak moving earthward as the storm deepens.
 */
import { InputError, requireFinite, requireInRange } from '../errors';
import { MU0, RE_KM } from '../constants';

/** Complete elliptic integrals K(m), E(m) of parameter m = k² ∈ [0, 1) by the AGM (A&S §17.6). Writes [K, E]. */
export function ellipticKE(out: Float64Array, m: number): Float64Array {
  let a = 1;
  let b = Math.sqrt(1 - m);
  let c = Math.sqrt(m);
  let sum = 0.5 * c * c;
  let pow = 0.5;
  for (let n = 0; n < 12 && c > 1e-15 * a; n++) {
    const an = 0.5 * (a + b);
    c = 0.5 * (a - b);
    b = Math.sqrt(a * b);
    a = an;
    pow *= 2;
    sum += pow * c * c;
  }
  const k = Math.PI / (2 * a);
  out[0] = k;
  out[1] = k * (1 - sum);
  return out;
}

/**
 * Complete elliptic integrals by the polynomial approximations of Abramowitz & Stegun 17.3.34 (K)
 * and 17.3.36 (E) (after Hastings; references §10), in the complementary parameter m1 = 1 − m ∈ (0, 1]:
 *   K = Σ a_i m1^i + ln(1/m1) Σ b_i m1^i,  E = 1 + Σ c_i m1^i + ln(1/m1) Σ d_i m1^i  (i ≤ 4),
 * |error| ≤ 2e-8 for each (A&S; measured against the AGM over m ∈ [0, 1 − 1e-12] in
 * test/physics/field/ring-fast.test.ts: K 1.35e-8, E 1.57e-8). Taking m1 directly keeps full precision near
 * m = 1, where 1 − m would cancel. One log and four short polynomials instead of the AGM's square roots. Writes [K, E].
 */
export function ellipticKEPoly(out: Float64Array, m1: number): Float64Array {
  const l = -Math.log(m1);
  out[0] = kPoly(m1, l);
  out[1] = ePoly(m1, l);
  return out;
}

/** K of A&S 17.3.34 for m1 = 1 − m and l = ln(1/m1). */
function kPoly(m1: number, l: number): number {
  return 1.38629436112 + m1 * (0.09666344259 + m1 * (0.03590092383 + m1 * (0.03742563713 + m1 * 0.01451196212)))
    + l * (0.5 + m1 * (0.12498593597 + m1 * (0.06880248576 + m1 * (0.03328355346 + m1 * 0.00441787012))));
}

/** E of A&S 17.3.36 for m1 = 1 − m and l = ln(1/m1). */
function ePoly(m1: number, l: number): number {
  return 1 + m1 * (0.44325141463 + m1 * (0.06260601220 + m1 * (0.04757383546 + m1 * 0.01736506451)))
    + l * m1 * (0.24998368310 + m1 * (0.09200180037 + m1 * (0.04069697526 + m1 * 0.00526449639)));
}

/**
 * Below this parameter m the ring keeps the AGM: the bracket of B_ρ, (1 − m/2)E − (1 − m)K ≈ 3πm²/32,
 * cancels, so an absolute error ε of K and E becomes a relative error ≤ 2ε/(3πm²/32) ≈ 6.8 ε/m² of B_ρ
 * (≤ 1.4e-5 at m = 0.1 with ε = 2e-8, and B_ρ ≪ B_z there: near the axis or far out). Points with m < 0.1
 * are few (within ~0.025 (a² + z_e²)/a of the axis, or far above the ring).
 */
export const RING_POLY_MIN_M = 0.1;

/** Geometry and strength of the ring (SM frame, RE, nT). */
export interface RingCurrentParameters {
  /** The ring's own field at Earth's centre along the dipole axis, nT (≤ 0: westward current). */
  centreNt: number;
  /** Loop radii, RE. */
  radiiRe: readonly number[];
  /** Share of centreNt carried by each loop (sums to 1). */
  shares: readonly number[];
  /** Softening half-thickness of each loop, RE. */
  thicknessRe: readonly number[];
  /** The peak radius the loops are placed about, RE. */
  peakRe: number;
}

/** Peak radius of the quiet-time ring, RE, and its storm-time limit (see `ringPeakRe`). */
export const RING_PEAK_QUIET_RE = 4.5;
export const RING_PEAK_STORM_RE = 3.0;
/** Dst* scale over which the peak moves in, nT. */
export const RING_PEAK_SCALE_NT = 200;
/** Loop radii in units of the peak radius, their shares of the centre field, softening in units of the radius. */
const LOOP_RADII = [0.8, 1.1, 1.5];
const LOOP_SHARES = [0.3, 0.45, 0.25];
const LOOP_SOFTENING = 0.4;

/**
 * Peak radius of the ring current, RE: 3 + 1.5·exp(Dst* / 200 nT) — 4.5 RE in quiet times,
 * 3.9 at Dst* −100, 3.4 at −260 and → 3 RE in the greatest storms. Basis (from memory):
 * ring-current pressure peaks near L ≈ 4–5 in quiet and moderate times and near L ≈ 3 in
 * intense storms (AMPTE/CCE and later storm studies; common practice); the e-folding scale
 * is our choice. The loops at 0.8/1.1/1.5 × peak with shares 0.3/0.45/0.25 give a profile
 * with a sharper inner edge and a longer outer tail, like the observed pressure profile.
 */
export function ringPeakRe(dstStarNt: number): number {
  const d = Math.min(0, dstStarNt);
  return RING_PEAK_STORM_RE + (RING_PEAK_QUIET_RE - RING_PEAK_STORM_RE) * Math.exp(d / RING_PEAK_SCALE_NT);
}

/** Ring parameters for a pressure-corrected index Dst*, nT. */
export function ringCurrentParameters(dstStarNt: number): RingCurrentParameters {
  requireInRange('dstStarNt', dstStarNt, -5000, 5000, 'nT');
  const peak = ringPeakRe(dstStarNt);
  const radii = LOOP_RADII.map((f) => f * peak);
  return {
    centreNt: Math.min(0, dstStarNt),
    radiiRe: radii,
    shares: LOOP_SHARES.slice(),
    thicknessRe: radii.map((a) => LOOP_SOFTENING * a),
    peakRe: peak,
  };
}

/**
 * Dessler–Parker–Sckopke: total ring-current particle energy (J) for a field change ΔB (nT) at
 * Earth's centre and the dipole's equatorial surface field B0 (nT): E = −(3/2)(ΔB/B0)·E_M,
 * E_M = (4π/3μ0) B0² RE³ (references §10).
 */
export function dpsEnergyJ(deltaBNt: number, b0Nt: number): number {
  const b0 = b0Nt * 1e-9;
  const re = RE_KM * 1e3;
  const em = ((4 * Math.PI) / (3 * MU0)) * b0 * b0 * re * re * re;
  return -1.5 * (deltaBNt / b0Nt) * em;
}

export interface RingCurrentField {
  readonly params: RingCurrentParameters;
  /** The far-field dipole of the ring, μ0 m/4π in nT·RE³ along +z_SM (negative for a westward ring:
   *  parallel to Earth's moment, so outside the ring it adds to the northward equatorial field). */
  readonly dipoleNtRe3: number;
  /** ADDS the ring's field (GSM nT) at the GSM point (RE) into out; allocation-free. */
  evaluate(out: Float64Array, x: number, y: number, z: number): void;
}

/** Prepare the ring for the given parameters and dipole tilt (sin ψ, cos ψ; axis (sin ψ, 0, cos ψ) in GSM). */
export function prepareRingCurrent(p: RingCurrentParameters, sinTilt: number, cosTilt: number): RingCurrentField {
  requireFinite('centreNt', p.centreNt);
  requireFinite('sinTilt', sinTilt);
  requireFinite('cosTilt', cosTilt);
  const n = p.radiiRe.length;
  if (n < 1 || n > 8 || p.shares.length !== n || p.thicknessRe.length !== n) {
    throw new InputError('radiiRe', `expected 1..8 loops with one share and one thickness each, got ${n}/${p.shares.length}/${p.thicknessRe.length}`);
  }
  const aArr = new Float64Array(n);
  const a2Arr = new Float64Array(n);
  const d2Arr = new Float64Array(n);
  const cArr = new Float64Array(n); // C = μ0 I/π, nT·RE
  let dipole = 0;
  for (let j = 0; j < n; j++) {
    const a = requireInRange('radiiRe', p.radiiRe[j], 0.05, 1e3, 'RE');
    const d = requireInRange('thicknessRe', p.thicknessRe[j], 0.01, 1e3, 'RE');
    const share = requireFinite('shares', p.shares[j]);
    const q = a * a + d * d;
    // Centre field of the softened loop: μ0 I a²/(2 (a² + d²)^{3/2}) (on-axis formula at z_e = d, derived).
    const mu0I = (2 * share * p.centreNt * q * Math.sqrt(q)) / (a * a);
    aArr[j] = a;
    a2Arr[j] = a * a;
    d2Arr[j] = d * d;
    cArr[j] = mu0I / Math.PI;
    dipole += (mu0I * a * a) / 4; // μ0 (I πa²)/4π
  }
  const ke = new Float64Array(2);
  const sT = sinTilt, cT = cosTilt;
  const active = p.centreNt !== 0;
  const evaluate = (out: Float64Array, x: number, y: number, z: number): void => {
    if (!active) return;
    const xs = x * cT - z * sT;
    const zs = x * sT + z * cT;
    const rho2 = xs * xs + y * y;
    const rho = Math.sqrt(rho2);
    let bz = 0;
    let brr = 0; // B_ρ/ρ
    const iRho2 = 1 / rho2; // used only where m ≥ 1e-8, i.e. ρ > 0
    for (let j = 0; j < n; j++) {
      const a = aArr[j];
      const a2 = a2Arr[j];
      const ze2 = zs * zs + d2Arr[j];
      const ap = a + rho;
      const am = a - rho;
      const beta2 = ap * ap + ze2;
      const alpha2 = am * am + ze2;
      const iBeta2 = 1 / beta2;
      const m = 4 * a * rho * iBeta2;
      const c = cArr[j];
      if (m < 1e-8) {
        // Leading terms near the axis (derived): B_z = πC a²/(2q^{3/2}), B_ρ/ρ = 3πC a² z/(4 q^{5/2}), q = a² + z_e².
        const q = a2 + ze2;
        const iq = 1 / (q * Math.sqrt(q));
        bz += 0.5 * Math.PI * c * a2 * iq;
        brr += (0.75 * Math.PI * c * a2 * zs * iq) / q;
      } else {
        let kk: number, ee: number;
        if (m >= RING_POLY_MIN_M) {
          const m1 = alpha2 * iBeta2; // 1 − m = α²/β² without cancellation
          const l = -Math.log(m1);
          kk = kPoly(m1, l);
          ee = ePoly(m1, l);
        } else {
          ellipticKE(ke, m);
          kk = ke[0]; ee = ke[1];
        }
        const r2 = rho2 + ze2;
        const f = c / (2 * alpha2 * Math.sqrt(beta2));
        bz += f * ((a2 - r2) * ee + alpha2 * kk);
        brr += f * zs * ((a2 + r2) * ee - alpha2 * kk) * iRho2;
      }
    }
    const bxs = brr * xs;
    out[0] += bxs * cT + bz * sT;
    out[1] += brr * y;
    out[2] += -bxs * sT + bz * cT;
  };
  return { params: p, dipoleNtRe3: dipole, evaluate };
}

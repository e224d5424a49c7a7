/**
 * Tail current sheet: a two-dimensional (y-independent) dawn-to-dusk current
 * sheet on the nightside, hinged so that it follows the dipole equator near
 * Earth and the GSM equator far down the tail.
 *
 * Field from a vector potential A(x, z') ŷ, B = ∇×(A ŷ) = (−∂A/∂z, 0, ∂A/∂x), so B is
 * divergence-free exactly (derived; also for the hinged coordinate z' = z − z0(x),
 * since B is still the curl of a potential). Kernel: the line current along ŷ,
 * A = −(μ0 I/4π) ln(ρ²), regularised ρ² → (x − x')² + z'² + D² (D the sheet's
 * half-thickness scale), and integrated over x' across a band x_outer < x' < x_inner
 * in closed form with ∫ ln(u² + s²) du = u ln(u² + s²) − 2u + 2s·atan(u/s), s² = z'² + D²
 * (derived). Writing b = μ0 K/2 for the lobe field of one band (K its surface current):
 *   Bx = (b/π)(z'/s)[atan((x − x_o)/s) − atan((x − x_i)/s)],
 *   Bz = −(b/2π) ln[((x − x_o)² + s²)/((x − x_i)² + s²)] + z0'(x)·Bx.
 * Far above a wide band Bx → +b (north lobe, earthward) and below → −b (south lobe).
 *
 * Current profile: `nBands` nested bands of equal strength share the inner edge and end at
 * successively larger distances, so the current density falls tailward in steps and the
 * lobe field falls from nBands·b near Earth to b far out (the observed tailward decrease
 * of the lobe field, from memory, references §12: ~20–30 nT near 20 RE, ~10 nT beyond 60 RE). Equal
 * strengths let the logarithms combine into one call (derived), and the band angles are the
 * arguments of complex factors whose product gives their sum with a single atan2 (derived; see
 * `evaluate`): an evaluation costs one atan2, one log and two square roots.
 *
 * Dawn–dusk taper (our choice): A(x, y, z') = f(y)·A_2D(x, z') with f = (1 + y²/W²)^−p. Any
 * A(x, y, z) ŷ gives B = (−∂A/∂z, 0, ∂A/∂x), still exactly divergence-free (derived); the
 * current then has closure parts J_x, J_z ∝ f'(y), flowing round the lobes toward the flanks as
 * the real tail current closes over the magnetopause. Without it the y-infinite sheet keeps its
 * full southward Bz at the flanks, where the dipole is weak, and its normal field there cannot be
 * shielded by the smooth compression basis (rms residual 4 % instead of < 1 %, measured).
 *
 * Hinge (our choice; the hinged-sheet idea is common practice, references §12):
 * z0(x) = −tan ψ · R_H x/√(x² + R_H²): slope −tan ψ at x = 0 (the dipole equator
 * x sin ψ + z cos ψ = 0, derived), flat at z0 = R_H tan ψ far down the tail.
 *
 * Parameters from the solar wind (`tailParameters`, documented at DEFAULT_TAIL_CALIBRATION):
 * lobe field ∝ √Pdyn (lobe pressure balance B_L²/2μ0 ∝ Pdyn; Coroniti & Kennel, 1972,
 * J. Geophys. Res. 77, 3361; references §12, citation from memory), stronger and closer to Earth for southward
 * Bz (loading of open flux into the tail, common practice), lengths scaled with the
 * Shue et al. (1998) standoff r0 so the tail shrinks with the magnetopause.
 */
import { InputError, requireFinite, requireInRange } from '../errors';

/** Geometry and strength of one tail sheet (GSM, RE, nT). */
export interface TailParameters {
  /** Lobe field of the whole sheet near its inner edge, nT (μ0 K_total / 2). */
  lobeNt: number;
  /** Distance of the inner (earthward) edge down the tail, RE (x_i = −innerRe). */
  innerRe: number;
  /** Distances of the outer edges of the nested bands, RE, each > innerRe. */
  outerRe: readonly number[];
  /** Half-thickness scale D, RE. */
  thicknessRe: number;
  /** Hinge distance R_H, RE. */
  hingeRe: number;
  /** Half-width W of the dawn–dusk taper f(y) = (1 + y²/W²)^−p, RE (Infinity: no taper). */
  widthRe: number;
  /** Power p of the taper (1 or 2). */
  taperPower: number;
}

/**
 * How the tail follows the solar wind (see `tailParameters`). Values are the
 * calibration (references §12) against the oval statistics of references §8 (scripts/realism.ts).
 */
export interface TailCalibration {
  /** Lobe field at Pdyn 2 nPa, Bz ≥ 0, nT. */
  lobeNt: number;
  /** Saturation of the lobe field, nT (soft cap, see `tailParameters`). */
  lobeCapNt: number;
  /** Least distance of the outermost band's far end, RE (beyond the distant neutral line). */
  farEndMinRe: number;
  /** Fractional growth of the lobe field per nT of southward IMF Bz. */
  lobePerSouthNt: number;
  /** Largest lobe growth factor from Bz (saturation). */
  lobeMaxFactor: number;
  /** Inner edge at the reference standoff (Pdyn 2, Bz 0: 10.25 RE), in RE. */
  innerRe: number;
  /** Earthward shift of the inner edge per nT of southward Bz, RE/nT (beyond the r0 scaling). */
  innerPerSouthNt: number;
  /** Closest inner edge, RE. */
  innerMinRe: number;
  /** Band lengths beyond the inner edge, RE (at the reference standoff). */
  bandLengthsRe: readonly number[];
  /** Half-thickness scale D, RE. */
  thicknessRe: number;
  /** Hinge distance, RE. */
  hingeRe: number;
  /** Taper half-width at the reference standoff, RE. */
  widthRe: number;
  taperPower: number;
}

/**
 * Default calibration (references §12). Chosen by a scan of these parameters (and ε) for the
 * boundaries of references §8 under the constraint that the compression fit still shields
 * internal + tail to ≈ 1 % rms at zero tilt; the realism table in the README
 * (scripts/realism.ts) shows the result. Per parameter:
 *  - lobeNt 29.5 nT: the near-Earth lobe field, ~15–30 nT at 10–30 RE (from memory, references §12), the upper
 *    part: it stretches the quiet-time (Bz 0) midnight field lines toward the 66–72° boundary (28 nT before
 *    the far-tail band of the compression fit, which made the far-tail field less southward; 29.5 nT with the
 *    35 RE neutral line keeps the quiet rows of the realism table within 0.2° of their earlier values);
 *  - lobePerSouthNt 0.065, lobeMaxFactor 1.6: the lobe grows with southward Bz (open flux loaded
 *    into the tail, common practice) to ~45 nT at saturation (the tilted fit residual sets this
 *    ceiling); sets the midnight boundary's Bz dependence and, through the polar-cap size, part
 *    of the noon boundary's 0.5–0.8 °/nT (Zhou et al., 2000);
 *  - innerRe 9, innerPerSouthNt 0.55 RE/nT, innerMinRe 4: the inner edge of the tail current
 *    near 8–10 RE in quiet times, moving earthward in disturbed times (from memory, references §12); the shift
 *    keeps the noon boundary's Bz dependence above 0.5 °/nT with the smaller lobe growth;
 *  - bandLengthsRe [12, 40, 150]: the current density falls tailward in three steps, so the
 *    lobe field falls from 29.5 to ~10 nT by ~50 RE (from memory, references §12: ~10 nT beyond 60 RE) and the
 *    sheet reaches the 100 RE trace limit (lines beyond it count as open, like the distant
 *    neutral line near ~100 RE, from memory, references §12);
 *  - thicknessRe 3.5: plasma-sheet half-thickness of a few RE in quiet times (from memory, references §12);
 *    thinner sheets stretch more but the fit residual grows (2 RE: > 1 %);
 *  - hingeRe 8: hinging distance of order 8–10 RE (from memory, references §12);
 *  - lobeCapNt 80: the lobe field saturates instead of growing as √Pdyn without limit;
 *    near-Earth lobe fields in intense storms reach several tens of nT, of order 50–80 nT at
 *    10–20 RE (storm-time lobe studies, from memory). Soft cap L/(1 + (L/cap)⁴)^¼: −0.46 % at the
 *    quiet 29.5 nT, 80 nT at most (our choice of form);
 *  - farEndMinRe 150: the outermost band ends at least 150 RE down the tail, well
 *    beyond the distant neutral line of the model (model.ts), so lobe lines never close round the
 *    sheet's far end inside it (the band lengths alone scale with r0 and ended at ~76 RE at 50 nPa);
 *  - widthRe 21.5, taperPower 3: the taper falls to 1/8 at y = ±21.5 RE, about the tail's flank
 *    radius (Shue et al., 1998: ≈ 20 RE at x = −10 RE for 2 nPa), chosen for the fit residual
 *    (scan 20–22 RE: lowest worst-case rms near 21–22 RE).
 */
export const DEFAULT_TAIL_CALIBRATION: Readonly<TailCalibration> = Object.freeze({
  lobeNt: 29.5,
  lobeCapNt: 80,
  farEndMinRe: 150,
  lobePerSouthNt: 0.065,
  lobeMaxFactor: 1.6,
  innerRe: 9,
  innerPerSouthNt: 0.55,
  innerMinRe: 4,
  bandLengthsRe: Object.freeze([12, 40, 150]),
  thicknessRe: 3.5,
  hingeRe: 8,
  widthRe: 21.5,
  taperPower: 3,
});

/** Reference standoff: Shue et al. (1998) r0 at Pdyn 2 nPa, Bz 0 (references §3: 10.2519 RE). */
const R0_REF_RE = 10.2519;

/** Shue et al. (1998) eq. 10 standoff, RE (the tail's length scale; also used when the magnetopause is off). */
function shueStandoffRe(pdynNpa: number, bzNt: number): number {
  return (10.22 + 1.29 * Math.tanh(0.184 * (bzNt + 8.14))) * Math.pow(pdynNpa, -1 / 6.6);
}

/**
 * Tail parameters for dynamic pressure (nPa) and IMF Bz (nT):
 *  L = lobeNt · √(Pdyn/2) · min(1 + lobePerSouthNt·max(0, −Bz), lobeMaxFactor),
 *  lobe = L/(1 + (L/lobeCapNt)⁴)^¼ (saturation),
 *  lengths scale with r0/r0_ref (Shue et al., 1998), the last far end at least farEndMinRe,
 *  inner = max(innerMinRe, minInnerRe, innerRe·r0/r0_ref − innerPerSouthNt·max(0, −Bz)).
 * `minInnerRe` ties the inner edge to the equatorward-edge source: the sheet's current
 * starts beyond it, so the near-Earth field does not reverse inside the source.
 */
export function tailParameters(pdynNpa: number, bzNt: number, cal: Readonly<TailCalibration> = DEFAULT_TAIL_CALIBRATION, minInnerRe = 0): TailParameters {
  requireInRange('pdynNpa', pdynNpa, Number.MIN_VALUE, 1e4, 'nPa');
  requireInRange('bzNt', bzNt, -1000, 1000, 'nT');
  requireInRange('minInnerRe', minInnerRe, 0, 1e3, 'RE');
  const south = Math.max(0, -bzNt);
  const scale = shueStandoffRe(pdynNpa, bzNt) / R0_REF_RE;
  const raw = cal.lobeNt * Math.sqrt(pdynNpa / 2) * Math.min(1 + cal.lobePerSouthNt * south, cal.lobeMaxFactor);
  const q = raw / cal.lobeCapNt;
  const lobeNt = raw / Math.sqrt(Math.sqrt(1 + q * q * q * q));
  const innerRe = Math.max(cal.innerMinRe, minInnerRe, cal.innerRe * scale - cal.innerPerSouthNt * south);
  const outerRe = cal.bandLengthsRe.map((l) => innerRe + l * scale);
  const last = outerRe.length - 1;
  if (last >= 0 && outerRe[last] < cal.farEndMinRe) outerRe[last] = Math.max(cal.farEndMinRe, innerRe + 1);
  return { lobeNt, innerRe, outerRe, thicknessRe: cal.thicknessRe, hingeRe: cal.hingeRe, widthRe: cal.widthRe * scale, taperPower: cal.taperPower };
}

export interface TailField {
  readonly params: TailParameters;
  /** ADDS the sheet's field (GSM nT) at the GSM point (RE) into out; allocation-free. */
  evaluate(out: Float64Array, x: number, y: number, z: number): void;
}

/** Prepare the sheet for the given parameters and dipole tilt (sin ψ, cos ψ). */
export function prepareTail(p: TailParameters, sinTilt: number, cosTilt: number): TailField {
  requireInRange('lobeNt', p.lobeNt, 0, 1e4, 'nT');
  requireInRange('innerRe', p.innerRe, 0.5, 1e3, 'RE');
  requireInRange('thicknessRe', p.thicknessRe, 0.01, 100, 'RE');
  requireInRange('hingeRe', p.hingeRe, 0.1, 1e3, 'RE');
  requireFinite('sinTilt', sinTilt);
  requireFinite('cosTilt', cosTilt);
  if (!(cosTilt > 0)) throw new InputError('cosTilt', `expected a tilt within ±90° (cos ψ > 0), got cos ψ = ${cosTilt}`);
  const n = p.outerRe.length;
  if (n < 1 || n > 8) throw new InputError('outerRe', `expected 1..8 band outer edges, got ${n}`);
  for (const o of p.outerRe) {
    if (!(o > p.innerRe) || !Number.isFinite(o)) throw new InputError('outerRe', `expected outer edges beyond the inner edge ${p.innerRe} RE, got ${o}`);
  }
  const outer = Float64Array.from(p.outerRe);
  const xi = p.innerRe; // u_i = x − x_i = x + innerRe
  const len = Float64Array.from(p.outerRe, (o) => o - xi); // band lengths u_o − u_i
  const kPi = p.lobeNt / n / Math.PI; // b/π per band
  const k2Pi = 0.5 * kPi; // b/2π per band
  const d2 = p.thicknessRe * p.thicknessRe;
  const tanT = sinTilt / cosTilt;
  const rh = p.hingeRe;
  const rh2 = rh * rh;
  const trh = tanT * rh;
  const trh3 = tanT * rh2 * rh;
  const nb = n;
  const iw2 = Number.isFinite(p.widthRe) ? 1 / (p.widthRe * p.widthRe) : 0;
  const tp = p.taperPower;
  const evaluate = (out: Float64Array, x: number, y: number, z: number): void => {
    const g = 1 + y * y * iw2;
    let gp = g;
    for (let j = 1; j < tp; j++) gp *= g; // 1/f
    // Hinge z0(x) = −tan ψ R_H x/√(x² + R_H²), z0' = −tan ψ R_H³/(x² + R_H²)^{3/2} (derived).
    const iq = 1 / Math.sqrt(x * x + rh2);
    const zp = z + trh * x * iq;
    const dz0 = -trh3 * iq * iq * iq;
    const s2 = zp * zp + d2;
    const s = Math.sqrt(s2);
    const ui = x + xi;
    const di = ui * ui + s2;
    // Band angle θ_k = atan(u_o/s) − atan(u_i/s) = arg(c_k), c_k = (s + i u_o)(s − i u_i)
    // = s² + u_o u_i + i s (u_o − u_i), θ_k ∈ (0, π) (derived). The sum Σθ_k is the argument of
    // Π c_k, unwrapped by keeping the running product in the upper half-plane (Im ≥ 0) and counting
    // the half-turns removed: one atan2 for all bands (derived; the sign test cannot cancel near
    // the 0 and 2π ends, where both terms of Im(Qc) share a sign).
    let qr = 1, qi = 0, turns = 0;
    let num = 1, den = 1;
    for (let i = 0; i < nb; i++) {
      const uo = x + outer[i];
      const cr = s2 + uo * ui;
      const ci = s * len[i];
      const pr = qr * cr - qi * ci;
      const pi = qr * ci + qi * cr;
      if (pi >= 0) {
        qr = pr;
        qi = pi;
      } else {
        qr = -pr;
        qi = -pi;
        turns++;
      }
      num *= uo * uo + s2;
      den *= di;
    }
    // + 0 turns a −0 imaginary part into +0, so atan2 stays in [0, π].
    const at = turns * Math.PI + Math.atan2(qi + 0, qr);
    const fs = 1 / (gp * s); // f/s: one division for taper and 1/s
    const bx = kPi * zp * at * fs;
    out[0] += bx;
    out[2] += -fs * s * k2Pi * Math.log(num / den) + dz0 * bx;
  };
  return { params: p, evaluate };
}

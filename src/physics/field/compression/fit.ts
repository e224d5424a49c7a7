/**
 * Magnetopause (Chapman–Ferraro) current field: a curl-free, divergence-free field
 * B_c = ∇Φ, Φ harmonic inside, whose coefficients are fitted by least squares so
 * that (B_shielded + B_c)·n ≈ 0 on the boundary (the shielding condition of
 * Chapman & Ferraro, 1931, Terr. Magn. Atmos. Electr. 36, 77; references §4, citation from memory).
 *
 * Basis (GSM, RE; separable solutions of Laplace's equation, derived): a uniform
 * field plus Cartesian exponential harmonics
 *   φ = exp(k (x − x0)) · {cos, sin}(a y) · {cos, sin}(b z),  k = √(a² + b²),
 * a = iκ, b = jκ, 0 ≤ i, j ≤ order (4), κ = 0.35/r0, x0 = the nose distance r0.
 * Only pairs with k/κ an integer or an integer times √2 are kept (i = 0, j = 0, i = j,
 * (3,4), (4,3)): every exponential is then a power of exp(κ dx) or exp(√2 κ dx), so an
 * evaluation costs two exp and four trig calls. κ and the pair set were chosen by a
 * scan of fits over 0.5–10 nPa, Bz ±10 nT, tilt ±35° (worst rms residual 7e-4).
 * Every term decays tailward, so the field stays bounded far down the tail (it tends
 * to the fitted uniform part). Terms odd in y are added only when the shielded field
 * is not mirror-symmetric in y (e.g. the full main field), detected from the samples.
 * Sunward of x0 + 4 r0 (well outside the boundary) the exponent is clamped so values
 * stay finite; the field has no meaning there.
 *
 * Fitted region: the surface from the nose to x = −2 r0 (two standoff distances
 * tailward, ≈ −20 RE at 2 nPa; `fitDepthR0`), sampled on rings 0.3 r0 apart in meridian
 * arc length on a grid anchored at the nose, each sample weighted by its surface area and
 * by 1/|B| (a second pass re-weights by the fitted total), so the fit minimises the
 * area-weighted rms of |B·n|/|B|, the figure reported in `rmsResidualRel`.
 *
 * Far-tail band (optional, `farTail`; the model turns it on, references §12): beyond the
 * fitted region the field is otherwise an extrapolation of the fit, and a fit that ends a
 * little further down the tail gives a different far tail (at 2 nPa, Bz 0, ±0.4 nT of Bz at
 * x = −45 RE per 0.25 r0, enough to move the midnight open–closed boundary by 0.24°). The band
 * adds the shielding condition from the fitted region's edge to x = −depthRe with a low weight
 * (samples every `spacing` scale units, weights scaled by `weight`), so the far field stays small
 * and smooth and no longer depends on where the fitted region ends. Its samples do not enter
 * `rmsResidualRel` / `maxResidualRel` / `nSamples`.
 */
import { InputError, expectedGot, requireInRange } from '../../errors';
import type { MagnetopauseShape } from '../magnetopause';
import { shueSurface, shueThetaAtX, sampleSurface, type AxisymmetricSurface, type Samples } from './surface';
import { leastSquaresQr } from '../../numeric/lsq';
import { makeKernel, type Kernel } from './basis';
import { compressionPairs } from './pairs';
import type { FieldWriter } from '../writer';

export type { FieldWriter };

export interface CompressionOptions {
  /** Highest wavenumber index (default 4: 26 terms, 43 with y-odd terms). */
  order?: number;
  /** Include terms odd in y: 'auto' (default) when the shielded field is y-asymmetric. */
  yOdd?: boolean | 'auto';
  /** Tailward edge of the fitted region on the Shue surface, in r0 (default 2: x ≥ −2 r0). */
  fitDepthR0?: number;
  /** Sample spacing along the surface, in units of scaleRe (default 0.3). */
  spacing?: number;
  /**
   * Far-tail band (see the header): the Shue surface from the fitted region's edge to x = −depthRe (RE,
   * 1..1000), samples `spacing` scale units apart (0.05..5, default 1) with their weights scaled by
   * `weight` (0..1). null or absent: none (the model passes its own, FAR_TAIL_FIT in model.ts).
   */
  farTail?: { depthRe: number; weight: number; spacing?: number } | null;
  /** Use the generated unrolled evaluator for the default order (default true; false is for cross-checks). */
  unrolled?: boolean;
}

export interface CompressionField {
  /** ADDS B_c (GSM nT) at the GSM point (RE) into out; allocation-free. */
  evaluate(out: Float64Array, x: number, y: number, z: number): void;
  /** Area-weighted rms of |B_total·n| / |B_total| over the fitted samples. */
  rmsResidualRel: number;
  maxResidualRel: number;
  nTerms: number;
  nSamples: number;
  /** Condition estimate of the column-scaled least-squares matrix. */
  conditionEstimate: number;
  yOdd: boolean;
  fitRegion: { xMinRe: number; thetaMaxRad: number };
  /** The far-tail band (tailward edge, weight, sample count), or null when the fit has none. */
  farBand: { xMinRe: number; weight: number; nSamples: number } | null;
}

/** Wavenumber step in units of 1/scale (see the header). */
const KAPPA = 0.35;
/** Sunward clamp of x − x0, in units of the scale (keeps exp finite far outside; see the header). */
const CLAMP_SCALES = 4;

/** Fit the compression field on the Shue surface `mp` for the field written by `shielded`. */
export function prepareCompression(mp: MagnetopauseShape, shielded: FieldWriter, options: CompressionOptions = {}): CompressionField {
  const depth = options.fitDepthR0 ?? 2;
  if (!(depth > 0 && depth <= 10)) throw new InputError('fitDepthR0', expectedGot('0 < fitDepthR0 ≤ 10 (in r0)', depth));
  const surface = shueSurface(mp, depth);
  const ft = options.farTail ?? null;
  let far: FarBand | null = null;
  if (ft !== null) {
    requireInRange('farTail.depthRe', ft.depthRe, 1, 1000, 'RE');
    requireInRange('farTail.weight', ft.weight, 0, 1);
    const farSpacing = requireInRange('farTail.spacing', ft.spacing ?? 1, 0.05, 5, 'r0');
    // A band only where the surface reaches beyond the fitted region (none when the fit already ends tailward of −depthRe).
    const t1 = shueThetaAtX(mp, -ft.depthRe);
    if (ft.weight > 0 && t1 > surface.thetaMaxRad) far = { samples: sampleSurface(surface, farSpacing, surface.thetaMaxRad, t1), weight: ft.weight };
  }
  return prepareCompressionOnSurface(surface, shielded, options, far);
}

/** Samples beyond the fitted region that enter the fit with a reduced weight (not the reported residual). */
export interface FarBand { samples: Samples; weight: number }

/** Fit the compression field on any x-axisymmetric surface (the sphere for the exact limit), optionally with a low-weight band beyond it. */
export function prepareCompressionOnSurface(surface: AxisymmetricSurface, shielded: FieldWriter, options: CompressionOptions = {}, far: FarBand | null = null): CompressionField {
  const order = options.order ?? 4;
  if (!Number.isInteger(order) || order < 1 || order > 8) throw new InputError('order', expectedGot('an integer 1..8', order));
  const spacing = options.spacing ?? 0.3;
  if (!(spacing >= 0.05 && spacing <= 1)) throw new InputError('spacing', expectedGot('0.05..1 (in units of the scale)', spacing));

  const main = sampleSurface(surface, spacing);
  const smp = far ? joinSamples(main, far.samples) : main;
  const scale = new Float64Array(smp.n).fill(1);
  if (far) scale.fill(far.weight, main.n);
  const { bs, bMax } = sampleShieldedField(smp, shielded);
  const yOdd = options.yOdd === 'auto' || options.yOdd === undefined ? yAsymmetric(smp, bs, bMax) : options.yOdd;
  const kappa = KAPPA / surface.scaleRe;
  const pairs = compressionPairs(order);
  const cols = basisColumns(pairs, yOdd);
  const kern = makeKernel(pairs, order, kappa, surface.radiusRe(0), CLAMP_SCALES * surface.scaleRe, options.unrolled ?? true);
  const an = normalComponents(smp, kern, cols);
  const fit = solveWeighted(smp, bs, bMax, an, kern, cols, scale);
  const res = surfaceResidual(main, fit.bTotal);
  const tm = surface.thetaMaxRad;
  return {
    evaluate: fit.field,
    rmsResidualRel: res.rms,
    maxResidualRel: res.max,
    nTerms: cols.pair.length,
    nSamples: main.n,
    conditionEstimate: fit.conditionEstimate,
    yOdd,
    fitRegion: { xMinRe: surface.radiusRe(tm) * Math.cos(tm), thetaMaxRad: tm },
    farBand: far ? { xMinRe: farEdgeXRe(far.samples), weight: far.weight, nSamples: far.samples.n } : null,
  };
}

/** The shielded field at every sample (interleaved GSM nT) and its largest magnitude. */
function sampleShieldedField(smp: Samples, shielded: FieldWriter): { bs: Float64Array; bMax: number } {
  const bs = new Float64Array(3 * smp.n);
  const tmp = new Float64Array(3);
  let bMax = 0;
  for (let i = 0; i < smp.n; i++) {
    tmp[0] = 0; tmp[1] = 0; tmp[2] = 0;
    shielded(tmp, smp.p[3 * i], smp.p[3 * i + 1], smp.p[3 * i + 2]);
    bs[3 * i] = tmp[0]; bs[3 * i + 1] = tmp[1]; bs[3 * i + 2] = tmp[2];
    bMax = Math.max(bMax, Math.hypot(tmp[0], tmp[1], tmp[2]));
  }
  return { bs, bMax };
}

/** The fit's columns: per column the pair index and the kind (−1, −2, −3 uniform x, y, z; 0..3 parities cc, cs, sc, ss of Y·Z). */
interface Columns { pair: number[]; kind: number[] }

/** Term list: uniform parts, then per (i, j) the parities that are not identically zero (y-odd ones only when asked). */
function basisColumns(pairs: readonly number[], yOdd: boolean): Columns {
  const pair: number[] = [];
  const kind: number[] = [];
  pair.push(-1, -1); kind.push(-1, -3);
  if (yOdd) { pair.push(-1); kind.push(-2); }
  for (let q = 0; q < pairs.length / 2; q++) {
    const i = pairs[2 * q], j = pairs[2 * q + 1];
    pair.push(q); kind.push(0);
    if (j > 0) { pair.push(q); kind.push(1); }
    if (yOdd && i > 0) { pair.push(q); kind.push(2); }
    if (yOdd && i > 0 && j > 0) { pair.push(q); kind.push(3); }
  }
  return { pair, kind };
}

/** Unweighted normal components of every basis field at every sample (column-major, ns × nc). */
function normalComponents(smp: Samples, kern: Kernel, cols: Columns): Float64Array {
  const ns = smp.n, nc = cols.pair.length;
  const an = new Float64Array(ns * nc);
  const g = new Float64Array(3);
  for (let s = 0; s < ns; s++) {
    const x = smp.p[3 * s], y = smp.p[3 * s + 1], z = smp.p[3 * s + 2];
    const ux = smp.nrm[3 * s], uy = smp.nrm[3 * s + 1], uz = smp.nrm[3 * s + 2];
    kern.load(x, y, z);
    for (let c = 0; c < nc; c++) {
      const kind = cols.kind[c];
      let v: number;
      if (kind === -1) v = ux;
      else if (kind === -2) v = uy;
      else if (kind === -3) v = uz;
      else {
        kern.grad(g, cols.pair[c], kind);
        v = g[0] * ux + g[1] * uy + g[2] * uz;
      }
      an[c * ns + s] = v;
    }
  }
  return an;
}

/**
 * Two weighted least-squares passes: weights √area / |B| with the shielded field
 * first, then with the fitted total. Returns the field of the second pass, the
 * total field at the samples and the matrix's condition estimate.
 */
function solveWeighted(smp: Samples, bs: Float64Array, bMax: number, an: Float64Array, kern: Kernel, cols: Columns, scale: Float64Array): { field: FieldWriter; bTotal: Float64Array; conditionEstimate: number } {
  const ns = smp.n, nc = cols.pair.length;
  const coef = new Float64Array(nc);
  const a = new Float64Array(ns * nc);
  const rhs = new Float64Array(ns);
  const wt = new Float64Array(ns);
  const tmp = new Float64Array(3);
  const floor = bMax > 0 ? 1e-9 * bMax : 1;
  for (let s = 0; s < ns; s++) wt[s] = scale[s] * Math.sqrt(smp.area[s]) / Math.max(floor, Math.hypot(bs[3 * s], bs[3 * s + 1], bs[3 * s + 2]));
  let field: FieldWriter | null = null;
  let cond = 0;
  const bt = new Float64Array(3 * ns);
  for (let pass = 0; pass < 2; pass++) {
    for (let s = 0; s < ns; s++) {
      const w = wt[s];
      rhs[s] = -w * (bs[3 * s] * smp.nrm[3 * s] + bs[3 * s + 1] * smp.nrm[3 * s + 1] + bs[3 * s + 2] * smp.nrm[3 * s + 2]);
    }
    for (let c = 0; c < nc; c++) for (let s = 0; s < ns; s++) a[c * ns + s] = an[c * ns + s] * wt[s];
    cond = leastSquaresQr(a, rhs, ns, nc, coef).conditionEstimate;
    field = kern.build(cols.pair, cols.kind, coef);
    for (let s = 0; s < ns; s++) {
      tmp[0] = bs[3 * s]; tmp[1] = bs[3 * s + 1]; tmp[2] = bs[3 * s + 2];
      field(tmp, smp.p[3 * s], smp.p[3 * s + 1], smp.p[3 * s + 2]);
      bt[3 * s] = tmp[0]; bt[3 * s + 1] = tmp[1]; bt[3 * s + 2] = tmp[2];
      wt[s] = scale[s] * Math.sqrt(smp.area[s]) / Math.max(floor, Math.hypot(tmp[0], tmp[1], tmp[2]));
    }
  }
  return { field: field as FieldWriter, bTotal: bt, conditionEstimate: cond };
}

/** Area-weighted rms and maximum of |B·n| / |B| of the total field at the samples. */
function surfaceResidual(smp: Samples, bt: Float64Array): { rms: number; max: number } {
  let sw = 0, sr = 0, rmax = 0;
  for (let s = 0; s < smp.n; s++) {
    const b = Math.hypot(bt[3 * s], bt[3 * s + 1], bt[3 * s + 2]);
    const bn = bt[3 * s] * smp.nrm[3 * s] + bt[3 * s + 1] * smp.nrm[3 * s + 1] + bt[3 * s + 2] * smp.nrm[3 * s + 2];
    const r = b > 0 ? Math.abs(bn) / b : 0;
    sw += smp.area[s];
    sr += smp.area[s] * r * r;
    if (r > rmax) rmax = r;
  }
  return { rms: Math.sqrt(sr / sw), max: rmax };
}

/** x of the band's last ring (its tailward edge lies half a ring spacing further). */
function farEdgeXRe(b: Samples): number {
  let x = Infinity;
  for (let i = 0; i < b.n; i++) x = Math.min(x, b.p[3 * i]);
  return x;
}

/** The samples of a followed by those of b (ring starts of b shifted). */
function joinSamples(a: Samples, b: Samples): Samples {
  const n = a.n + b.n;
  const p = new Float64Array(3 * n), nrm = new Float64Array(3 * n), area = new Float64Array(n);
  p.set(a.p); p.set(b.p, 3 * a.n);
  nrm.set(a.nrm); nrm.set(b.nrm, 3 * a.n);
  area.set(a.area); area.set(b.area, a.n);
  const ra = a.ringStart.length - 1, rb = b.ringStart.length - 1;
  const ringStart = new Int32Array(ra + rb + 1);
  ringStart.set(a.ringStart.subarray(0, ra));
  for (let r = 0; r <= rb; r++) ringStart[ra + r] = a.n + b.ringStart[r];
  return { n, p, nrm, area, ringStart };
}

/** True when B(x, −y, z) ≠ (Bx, −By, Bz)(x, y, z) on the samples (rings are mirror-symmetric in y). */
function yAsymmetric(smp: Samples, bs: Float64Array, bMax: number): boolean {
  const tol = 1e-9 * bMax;
  const rs = smp.ringStart;
  for (let r = 0; r + 1 < rs.length; r++) {
    const m = rs[r + 1] - rs[r];
    for (let j = 0; j < m; j++) {
      // φ_j = (j+½)2π/m mirrors to π − φ_j, index m/2 − 1 − j (mod m).
      const jm = (((m >> 1) - 1 - j) % m + m) % m;
      const a = 3 * (rs[r] + j), b = 3 * (rs[r] + jm);
      if (Math.abs(bs[a] - bs[b]) > tol || Math.abs(bs[a + 1] + bs[b + 1]) > tol || Math.abs(bs[a + 2] - bs[b + 2]) > tol) return true;
    }
  }
  return false;
}

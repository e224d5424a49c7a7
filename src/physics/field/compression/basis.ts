/**
 * Evaluation kernels of the compression basis (see fit.ts for the basis and the
 * fit): a generic table-driven kernel used to build the least-squares matrix and
 * for non-default orders; the default order written out term by term for speed is
 * kernel.generated.ts (scripts/gen-compression-kernel.ts).
 * φ = exp(k (x − x0)) Y(a y) Z(b z), k = √(a² + b²) (harmonic, derived); B = Σ c ∇φ.
 */
import type { FieldWriter } from '../writer';
import { squareFreePart } from './pairs';
import { unrolledEvaluator, UNROLLED_ORDER, UNROLLED_PAIRS } from './kernel.generated';

export interface Kernel {
  /** Fill the exponential and trigonometric tables at a point. */
  load(x: number, y: number, z: number): void;
  /** ∇φ of one term (pair q, parity kind 0..3) from the loaded tables. */
  grad(out: Float64Array, q: number, kind: number): void;
  /** An allocation-free evaluator adding Σ c ∇φ for the given coefficients. */
  build(colPair: number[], colKind: number[], coef: Float64Array): FieldWriter;
}

export function makeKernel(pairs: number[], N: number, kappa: number, x0: number, dxMax: number, unrolled: boolean): Kernel {
  const useUnrolled = unrolled && N === UNROLLED_ORDER && pairs.join(',') === UNROLLED_PAIRS;
  const t = makeTables(pairs, N, kappa, x0, dxMax);
  const { pw, expIdx, pi, pj, kArr, aArr, bArr, cy, sy, cz, sz } = t;

  const grad = (out: Float64Array, q: number, kind: number): void => {
    const E = pw[expIdx[q]];
    const i = pi[q], j = pj[q];
    const Y = kind < 2 ? cy[i] : sy[i];
    const dY = kind < 2 ? -aArr[q] * sy[i] : aArr[q] * cy[i];
    const Z = (kind & 1) === 0 ? cz[j] : sz[j];
    const dZ = (kind & 1) === 0 ? -bArr[q] * sz[j] : bArr[q] * cz[j];
    out[0] = E * kArr[q] * Y * Z;
    out[1] = E * dY * Z;
    out[2] = E * Y * dZ;
  };

  const build = (colPair: number[], colKind: number[], coef: Float64Array): FieldWriter => {
    const c = splitCoefficients(colPair, colKind, coef, t.np);
    const pm = premultiply(t, c);
    if (useUnrolled) return unrolledEvaluator(interleave(pm, t.np), c.odd, c.ux, c.uy, c.uz, kappa, x0, dxMax);
    return tableEvaluator(t, pm, c);
  };
  return { load: t.load, grad, build };
}

/** Per-pair wavenumbers, exponential layout and the trigonometric tables with their loader. */
interface Tables {
  np: number;
  pi: Int32Array; pj: Int32Array;
  /** k, a, b of each pair (1/RE). */
  kArr: Float64Array; aArr: Float64Array; bArr: Float64Array;
  /** Index of each pair's exponential in pw. */
  expIdx: Int32Array;
  /** exp(κ√f dx)^m for every square-free f and power m, filled by load. */
  pw: Float64Array;
  /** cos/sin(nκy), cos/sin(nκz) for n = 0..N, filled by load. */
  cy: Float64Array; sy: Float64Array; cz: Float64Array; sz: Float64Array;
  load(x: number, y: number, z: number): void;
}

function makeTables(pairs: number[], N: number, kappa: number, x0: number, dxMax: number): Tables {
  const np = pairs.length / 2;
  // exp(k (x−x0)) with k = κ√(i²+j²) = κ m √f (f square-free): one exp per distinct f, powers by products.
  const bases: number[] = [];
  const expIdx = new Int32Array(np);
  const kArr = new Float64Array(np), aArr = new Float64Array(np), bArr = new Float64Array(np);
  const pi = new Int32Array(np), pj = new Int32Array(np);
  let maxPow = 1;
  const pw0: Array<[number, number]> = [];
  for (let q = 0; q < np; q++) {
    const i = pairs[2 * q], j = pairs[2 * q + 1];
    pi[q] = i; pj[q] = j;
    const s2 = i * i + j * j;
    const f = squareFreePart(s2);
    const m = Math.round(Math.sqrt(s2 / f));
    let b = bases.indexOf(f);
    if (b < 0) { bases.push(f); b = bases.length - 1; }
    pw0.push([b, m]);
    maxPow = Math.max(maxPow, m);
    kArr[q] = kappa * Math.sqrt(s2); aArr[q] = kappa * i; bArr[q] = kappa * j;
  }
  const nb = bases.length;
  const rate = new Float64Array(nb);
  for (let b = 0; b < nb; b++) rate[b] = kappa * Math.sqrt(bases[b]);
  for (let q = 0; q < np; q++) expIdx[q] = pw0[q][0] * maxPow + (pw0[q][1] - 1);
  const P = maxPow;
  const pw = new Float64Array(nb * P);
  const cy = new Float64Array(N + 1), sy = new Float64Array(N + 1), cz = new Float64Array(N + 1), sz = new Float64Array(N + 1);
  cy[0] = 1; cz[0] = 1;

  const load = (x: number, y: number, z: number): void => {
    let dx = x - x0;
    if (dx > dxMax) dx = dxMax;
    for (let b = 0; b < nb; b++) {
      const e = Math.exp(rate[b] * dx);
      let v = e;
      pw[b * P] = e;
      for (let m = 1; m < P; m++) { v *= e; pw[b * P + m] = v; }
    }
    // cos/sin(nκy) by the Chebyshev recurrence (angle addition).
    const c1 = Math.cos(kappa * y), d1 = Math.cos(kappa * z);
    cy[1] = c1; sy[1] = Math.sin(kappa * y); cz[1] = d1; sz[1] = Math.sin(kappa * z);
    for (let n = 2; n <= N; n++) {
      cy[n] = 2 * c1 * cy[n - 1] - cy[n - 2];
      sy[n] = 2 * c1 * sy[n - 1] - sy[n - 2];
      cz[n] = 2 * d1 * cz[n - 1] - cz[n - 2];
      sz[n] = 2 * d1 * sz[n - 1] - sz[n - 2];
    }
  };
  return { np, pi, pj, kArr, aArr, bArr, expIdx, pw, cy, sy, cz, sz, load };
}

/** Fitted coefficients sorted by kind: uniform parts and the four parities per pair. */
interface SplitCoefficients {
  ux: number; uy: number; uz: number;
  cc: Float64Array; cs: Float64Array; sc: Float64Array; ss: Float64Array;
  /** Any y-odd (sc, ss) column present. */
  odd: boolean;
}

function splitCoefficients(colPair: number[], colKind: number[], coef: Float64Array, np: number): SplitCoefficients {
  let ux = 0, uy = 0, uz = 0;
  const cc = new Float64Array(np), cs = new Float64Array(np), sc = new Float64Array(np), ss = new Float64Array(np);
  let odd = false;
  for (let c = 0; c < colPair.length; c++) {
    const k = colKind[c], q = colPair[c], v = coef[c];
    if (k === -1) ux = v;
    else if (k === -2) uy = v;
    else if (k === -3) uz = v;
    else if (k === 0) cc[q] = v;
    else if (k === 1) cs[q] = v;
    else if (k === 2) { sc[q] = v; odd = true; }
    else { ss[q] = v; odd = true; }
  }
  return { ux, uy, uz, cc, cs, sc, ss, odd };
}

/** Coefficients pre-multiplied by the wavenumbers k, a, b (names: wavenumber then parity). */
interface Premultiplied {
  kcc: Float64Array; kcs: Float64Array; ksc: Float64Array; kss: Float64Array;
  acc: Float64Array; acs: Float64Array; asc: Float64Array; ass: Float64Array;
  bcc: Float64Array; bcs: Float64Array; bsc: Float64Array; bss: Float64Array;
}

// Pre-multiplied coefficients: Bx = E k (cc u + cs v + sc w + ss t), u = cy cz, v = cy sz, w = sy cz, t = sy sz;
// By = E a (−cc w − cs t + sc u + ss v); Bz = E b (−cc v + cs u − sc t + ss w) (derivatives of φ).
function premultiply(t: Tables, c: SplitCoefficients): Premultiplied {
  const np = t.np, { kArr, aArr, bArr } = t, { cc, cs, sc, ss } = c;
  const kcc = new Float64Array(np), kcs = new Float64Array(np), acc = new Float64Array(np), acs = new Float64Array(np), bcc = new Float64Array(np), bcs = new Float64Array(np);
  const ksc = new Float64Array(np), kss = new Float64Array(np), asc = new Float64Array(np), ass = new Float64Array(np), bsc = new Float64Array(np), bss = new Float64Array(np);
  for (let q = 0; q < np; q++) {
    kcc[q] = kArr[q] * cc[q]; kcs[q] = kArr[q] * cs[q]; ksc[q] = kArr[q] * sc[q]; kss[q] = kArr[q] * ss[q];
    acc[q] = aArr[q] * cc[q]; acs[q] = aArr[q] * cs[q]; asc[q] = aArr[q] * sc[q]; ass[q] = aArr[q] * ss[q];
    bcc[q] = bArr[q] * cc[q]; bcs[q] = bArr[q] * cs[q]; bsc[q] = bArr[q] * sc[q]; bss[q] = bArr[q] * ss[q];
  }
  return { kcc, kcs, ksc, kss, acc, acs, asc, ass, bcc, bcs, bsc, bss };
}

/** The layout the generated evaluator reads: per pair [k·cc, k·cs, k·sc, k·ss, a·cc, …, b·ss]. */
function interleave(pm: Premultiplied, np: number): Float64Array {
  const K = new Float64Array(12 * np);
  for (let q = 0; q < np; q++) {
    const o = 12 * q;
    K[o] = pm.kcc[q]; K[o + 1] = pm.kcs[q]; K[o + 2] = pm.ksc[q]; K[o + 3] = pm.kss[q];
    K[o + 4] = pm.acc[q]; K[o + 5] = pm.acs[q]; K[o + 6] = pm.asc[q]; K[o + 7] = pm.ass[q];
    K[o + 8] = pm.bcc[q]; K[o + 9] = pm.bcs[q]; K[o + 10] = pm.bsc[q]; K[o + 11] = pm.bss[q];
  }
  return K;
}

/**
 * The general evaluator: loads the tables at the point and sums over the pairs, all
 * four parities (the y-odd coefficients are zero when the fit has none). Used for
 * non-default orders and as the cross-check of the generated evaluator.
 */
function tableEvaluator(t: Tables, pm: Premultiplied, c: SplitCoefficients): FieldWriter {
  const { np, pi, pj, expIdx, pw, cy, sy, cz, sz, load } = t;
  const { kcc, kcs, ksc, kss, acc, acs, asc, ass, bcc, bcs, bsc, bss } = pm;
  const { ux, uy, uz } = c;
  return (out, x, y, z) => {
    load(x, y, z);
    let bx = ux, by = uy, bz = uz;
    for (let q = 0; q < np; q++) {
      const E = pw[expIdx[q]];
      const yi = pi[q], zj = pj[q];
      const u = cy[yi] * cz[zj], v = cy[yi] * sz[zj], w = sy[yi] * cz[zj], t = sy[yi] * sz[zj];
      bx += E * (kcc[q] * u + kcs[q] * v + ksc[q] * w + kss[q] * t);
      by += E * (asc[q] * u + ass[q] * v - acc[q] * w - acs[q] * t);
      bz += E * (bcs[q] * u - bcc[q] * v + bss[q] * w - bsc[q] * t);
    }
    out[0] += bx; out[1] += by; out[2] += bz;
  };
}

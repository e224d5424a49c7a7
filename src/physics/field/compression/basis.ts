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
  const np = pairs.length / 2;
  const useUnrolled = unrolled && N === UNROLLED_ORDER && pairs.join(',') === UNROLLED_PAIRS;
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
    // Pre-multiplied coefficients: Bx = E k (cc u + cs v + sc w + ss t), u = cy cz, v = cy sz, w = sy cz, t = sy sz;
    // By = E a (−cc w − cs t + sc u + ss v); Bz = E b (−cc v + cs u − sc t + ss w) (derivatives of φ).
    const kcc = new Float64Array(np), kcs = new Float64Array(np), acc = new Float64Array(np), acs = new Float64Array(np), bcc = new Float64Array(np), bcs = new Float64Array(np);
    const ksc = new Float64Array(np), kss = new Float64Array(np), asc = new Float64Array(np), ass = new Float64Array(np), bsc = new Float64Array(np), bss = new Float64Array(np);
    for (let q = 0; q < np; q++) {
      kcc[q] = kArr[q] * cc[q]; kcs[q] = kArr[q] * cs[q]; ksc[q] = kArr[q] * sc[q]; kss[q] = kArr[q] * ss[q];
      acc[q] = aArr[q] * cc[q]; acs[q] = aArr[q] * cs[q]; asc[q] = aArr[q] * sc[q]; ass[q] = aArr[q] * ss[q];
      bcc[q] = bArr[q] * cc[q]; bcs[q] = bArr[q] * cs[q]; bsc[q] = bArr[q] * sc[q]; bss[q] = bArr[q] * ss[q];
    }
    if (useUnrolled) {
      const K = new Float64Array(12 * np);
      for (let q = 0; q < np; q++) {
        const o = 12 * q;
        K[o] = kcc[q]; K[o + 1] = kcs[q]; K[o + 2] = ksc[q]; K[o + 3] = kss[q];
        K[o + 4] = acc[q]; K[o + 5] = acs[q]; K[o + 6] = asc[q]; K[o + 7] = ass[q];
        K[o + 8] = bcc[q]; K[o + 9] = bcs[q]; K[o + 10] = bsc[q]; K[o + 11] = bss[q];
      }
      return unrolledEvaluator(K, odd, ux, uy, uz, kappa, x0, dxMax);
    }
    if (!odd) {
      return (out, x, y, z) => {
        load(x, y, z);
        let bx = ux, by = uy, bz = uz;
        for (let q = 0; q < np; q++) {
          const E = pw[expIdx[q]];
          const yi = pi[q], zj = pj[q];
          const u = cy[yi] * cz[zj], v = cy[yi] * sz[zj], w = sy[yi] * cz[zj], t = sy[yi] * sz[zj];
          bx += E * (kcc[q] * u + kcs[q] * v);
          by -= E * (acc[q] * w + acs[q] * t);
          bz += E * (bcs[q] * u - bcc[q] * v);
        }
        out[0] += bx; out[1] += by; out[2] += bz;
      };
    }
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
  };
  return { load, grad, build };
}

/**
 * Evaluation kernels of the compression basis (see compression.ts for the basis and
 * the fit): a generic table-driven kernel used to build the least-squares matrix and
 * for non-default orders, and the default order written out term by term for speed.
 * φ = exp(k (x − x0)) Y(a y) Z(b z), k = √(a² + b²) (harmonic, derived); B = Σ c ∇φ.
 */
import type { FieldWriter } from './fit';

/**
 * sin and cos for the small arguments met inside the magnetopause (|κy|, |κz|
 * ≲ 1.4 with κ = 0.35/r0): Taylor series to u¹⁷ / u¹⁸, truncation error
 * < 1e-13 for |u| ≤ 1.6 (derived from the next term); Math.* beyond.
 * Cheaper than Math.sin/Math.cos, which dominate the compression evaluation.
 */
export function sinSmall(u: number): number {
  if (u > 1.6 || u < -1.6) return Math.sin(u);
  const v = u * u;
  return u * (1 + v * (-1 / 6 + v * (1 / 120 + v * (-1 / 5040 + v * (1 / 362880 + v * (-1 / 39916800 + v * (1 / 6227020800 + v * (-1 / 1307674368000 + v * (1 / 355687428096000)))))))));
}

export function cosSmall(u: number): number {
  if (u > 1.6 || u < -1.6) return Math.cos(u);
  const v = u * u;
  return 1 + v * (-1 / 2 + v * (1 / 24 + v * (-1 / 720 + v * (1 / 40320 + v * (-1 / 3628800 + v * (1 / 479001600 + v * (-1 / 87178291200 + v * (1 / 20922789888000 + v * (-1 / 6402373705728000)))))))));
}

/** The square-free part f of s = m² f. */
export function squareFreePart(s: number): number {
  let m = 1;
  for (let t = 2; t * t <= s; t++) if (s % (t * t) === 0) m = t;
  return s / (m * m);
}

/** The (i, j) pairs of the default order 4, in the order the unrolled evaluator expects. */
const ORDER4_PAIRS = '0,1,0,2,0,3,0,4,1,0,1,1,2,0,2,2,3,0,3,3,3,4,4,0,4,3,4,4';

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
  const unrolledOrder4 = unrolled && N === 4 && pairs.join(',') === ORDER4_PAIRS;
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
    if (unrolledOrder4) {
      const K = new Float64Array(12 * np);
      for (let q = 0; q < np; q++) {
        const o = 12 * q;
        K[o] = kcc[q]; K[o + 1] = kcs[q]; K[o + 2] = ksc[q]; K[o + 3] = kss[q];
        K[o + 4] = acc[q]; K[o + 5] = acs[q]; K[o + 6] = asc[q]; K[o + 7] = ass[q];
        K[o + 8] = bcc[q]; K[o + 9] = bcs[q]; K[o + 10] = bsc[q]; K[o + 11] = bss[q];
      }
      return unrolledOrder4Evaluator(K, odd, ux, uy, uz, kappa, x0, dxMax);
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


/**
 * The default basis (order 4) written out term by term (generated from the pair list,
 * same formulas as `build`): two exp and four trig calls, powers and Chebyshev
 * recurrences for the rest, no table indirection. K holds per pair
 * [k·cc, k·cs, k·sc, k·ss, a·cc, a·cs, a·sc, a·ss, b·cc, b·cs, b·sc, b·ss].
 */
function unrolledOrder4Evaluator(K: Float64Array, odd: boolean, ux: number, uy: number, uz: number, kappa: number, x0: number, dxMax: number): FieldWriter {
  const r2 = Math.SQRT2 * kappa;
  if (!odd) {
    return (out, x, y, z) => {
      let dx = x - x0;
      if (dx > dxMax) dx = dxMax;
      const e = Math.exp(kappa * dx), g = Math.exp(r2 * dx);
      const e2 = e * e, e3 = e2 * e, e4 = e2 * e2, e5 = e4 * e;
      const g2 = g * g, g3 = g2 * g, g4 = g2 * g2;
      const uy1 = kappa * y, uz1 = kappa * z;
      const c1 = cosSmall(uy1), s1 = sinSmall(uy1);
      const d1 = cosSmall(uz1), t1 = sinSmall(uz1);
      // Chebyshev recurrences (angle addition).
      const c2 = 2 * c1 * c1 - 1, s2 = 2 * c1 * s1;
      const c3 = 2 * c1 * c2 - c1, s3 = 2 * c1 * s2 - s1;
      const c4 = 2 * c1 * c3 - c2, s4 = 2 * c1 * s3 - s2;
      const d2 = 2 * d1 * d1 - 1, t2 = 2 * d1 * t1;
      const d3 = 2 * d1 * d2 - d1, t3 = 2 * d1 * t2 - t1;
      const d4 = 2 * d1 * d3 - d2, t4 = 2 * d1 * t3 - t2;
      let bx = ux, by = uy, bz = uz;
      let ec: number, es: number;
      // (0,1)
      bx += e * (K[0] * d1 + K[1] * t1);
      bz += e * (K[9] * d1 - K[8] * t1);
      // (0,2)
      bx += e2 * (K[12] * d2 + K[13] * t2);
      bz += e2 * (K[21] * d2 - K[20] * t2);
      // (0,3)
      bx += e3 * (K[24] * d3 + K[25] * t3);
      bz += e3 * (K[33] * d3 - K[32] * t3);
      // (0,4)
      bx += e4 * (K[36] * d4 + K[37] * t4);
      bz += e4 * (K[45] * d4 - K[44] * t4);
      // (1,0)
      bx += e * K[48] * c1;
      by -= e * K[52] * s1;
      // (1,1)
      ec = g * c1; es = g * s1;
      bx += ec * (K[60] * d1 + K[61] * t1);
      by -= es * (K[64] * d1 + K[65] * t1);
      bz += ec * (K[69] * d1 - K[68] * t1);
      // (2,0)
      bx += e2 * K[72] * c2;
      by -= e2 * K[76] * s2;
      // (2,2)
      ec = g2 * c2; es = g2 * s2;
      bx += ec * (K[84] * d2 + K[85] * t2);
      by -= es * (K[88] * d2 + K[89] * t2);
      bz += ec * (K[93] * d2 - K[92] * t2);
      // (3,0)
      bx += e3 * K[96] * c3;
      by -= e3 * K[100] * s3;
      // (3,3)
      ec = g3 * c3; es = g3 * s3;
      bx += ec * (K[108] * d3 + K[109] * t3);
      by -= es * (K[112] * d3 + K[113] * t3);
      bz += ec * (K[117] * d3 - K[116] * t3);
      // (3,4)
      ec = e5 * c3; es = e5 * s3;
      bx += ec * (K[120] * d4 + K[121] * t4);
      by -= es * (K[124] * d4 + K[125] * t4);
      bz += ec * (K[129] * d4 - K[128] * t4);
      // (4,0)
      bx += e4 * K[132] * c4;
      by -= e4 * K[136] * s4;
      // (4,3)
      ec = e5 * c4; es = e5 * s4;
      bx += ec * (K[144] * d3 + K[145] * t3);
      by -= es * (K[148] * d3 + K[149] * t3);
      bz += ec * (K[153] * d3 - K[152] * t3);
      // (4,4)
      ec = g4 * c4; es = g4 * s4;
      bx += ec * (K[156] * d4 + K[157] * t4);
      by -= es * (K[160] * d4 + K[161] * t4);
      bz += ec * (K[165] * d4 - K[164] * t4);
      out[0] += bx; out[1] += by; out[2] += bz;
    };
  }
  return (out, x, y, z) => {
    let dx = x - x0;
    if (dx > dxMax) dx = dxMax;
    const e = Math.exp(kappa * dx), g = Math.exp(r2 * dx);
    const e2 = e * e, e3 = e2 * e, e4 = e2 * e2, e5 = e4 * e;
    const g2 = g * g, g3 = g2 * g, g4 = g2 * g2;
    const uy1 = kappa * y, uz1 = kappa * z;
    const c1 = cosSmall(uy1), s1 = sinSmall(uy1);
    const d1 = cosSmall(uz1), t1 = sinSmall(uz1);
    // Chebyshev recurrences (angle addition).
    const c2 = 2 * c1 * c1 - 1, s2 = 2 * c1 * s1;
    const c3 = 2 * c1 * c2 - c1, s3 = 2 * c1 * s2 - s1;
    const c4 = 2 * c1 * c3 - c2, s4 = 2 * c1 * s3 - s2;
    const d2 = 2 * d1 * d1 - 1, t2 = 2 * d1 * t1;
    const d3 = 2 * d1 * d2 - d1, t3 = 2 * d1 * t2 - t1;
    const d4 = 2 * d1 * d3 - d2, t4 = 2 * d1 * t3 - t2;
    let bx = ux, by = uy, bz = uz;
    let ec: number, es: number;
    // (0,1)
    bx += e * (K[0] * d1 + K[1] * t1);
    bz += e * (K[9] * d1 - K[8] * t1);
    // (0,2)
    bx += e2 * (K[12] * d2 + K[13] * t2);
    bz += e2 * (K[21] * d2 - K[20] * t2);
    // (0,3)
    bx += e3 * (K[24] * d3 + K[25] * t3);
    bz += e3 * (K[33] * d3 - K[32] * t3);
    // (0,4)
    bx += e4 * (K[36] * d4 + K[37] * t4);
    bz += e4 * (K[45] * d4 - K[44] * t4);
    // (1,0)
    bx += e * (K[48] * c1 + K[50] * s1);
    by += e * (K[54] * c1 - K[52] * s1);
    // (1,1)
    ec = g * c1; es = g * s1;
    bx += ec * (K[60] * d1 + K[61] * t1) + es * (K[62] * d1 + K[63] * t1);
    by += ec * (K[66] * d1 + K[67] * t1) - es * (K[64] * d1 + K[65] * t1);
    bz += ec * (K[69] * d1 - K[68] * t1) + es * (K[71] * d1 - K[70] * t1);
    // (2,0)
    bx += e2 * (K[72] * c2 + K[74] * s2);
    by += e2 * (K[78] * c2 - K[76] * s2);
    // (2,2)
    ec = g2 * c2; es = g2 * s2;
    bx += ec * (K[84] * d2 + K[85] * t2) + es * (K[86] * d2 + K[87] * t2);
    by += ec * (K[90] * d2 + K[91] * t2) - es * (K[88] * d2 + K[89] * t2);
    bz += ec * (K[93] * d2 - K[92] * t2) + es * (K[95] * d2 - K[94] * t2);
    // (3,0)
    bx += e3 * (K[96] * c3 + K[98] * s3);
    by += e3 * (K[102] * c3 - K[100] * s3);
    // (3,3)
    ec = g3 * c3; es = g3 * s3;
    bx += ec * (K[108] * d3 + K[109] * t3) + es * (K[110] * d3 + K[111] * t3);
    by += ec * (K[114] * d3 + K[115] * t3) - es * (K[112] * d3 + K[113] * t3);
    bz += ec * (K[117] * d3 - K[116] * t3) + es * (K[119] * d3 - K[118] * t3);
    // (3,4)
    ec = e5 * c3; es = e5 * s3;
    bx += ec * (K[120] * d4 + K[121] * t4) + es * (K[122] * d4 + K[123] * t4);
    by += ec * (K[126] * d4 + K[127] * t4) - es * (K[124] * d4 + K[125] * t4);
    bz += ec * (K[129] * d4 - K[128] * t4) + es * (K[131] * d4 - K[130] * t4);
    // (4,0)
    bx += e4 * (K[132] * c4 + K[134] * s4);
    by += e4 * (K[138] * c4 - K[136] * s4);
    // (4,3)
    ec = e5 * c4; es = e5 * s4;
    bx += ec * (K[144] * d3 + K[145] * t3) + es * (K[146] * d3 + K[147] * t3);
    by += ec * (K[150] * d3 + K[151] * t3) - es * (K[148] * d3 + K[149] * t3);
    bz += ec * (K[153] * d3 - K[152] * t3) + es * (K[155] * d3 - K[154] * t3);
    // (4,4)
    ec = g4 * c4; es = g4 * s4;
    bx += ec * (K[156] * d4 + K[157] * t4) + es * (K[158] * d4 + K[159] * t4);
    by += ec * (K[162] * d4 + K[163] * t4) - es * (K[160] * d4 + K[161] * t4);
    bz += ec * (K[165] * d4 - K[164] * t4) + es * (K[167] * d4 - K[166] * t4);
    out[0] += bx; out[1] += by; out[2] += bz;
  };
}

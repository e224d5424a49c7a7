/**
 * Display geometry on and around the globe (scene frame = GEO, RE units).
 * Pure: typed arrays in, typed arrays out; no three.js objects here.
 */
import type { BoundaryCurve, LineBundle } from '../../../workers/protocol';
import { lineTypeRgb } from './palette';
import { RAD_PER_DEG } from '../../physics/constants';

/** Point on a sphere of radius rRe at geocentric lat/lon (display placement). */
export function sphereXyz(latDeg: number, lonDeg: number, rRe: number): [number, number, number] {
  const p = latDeg * RAD_PER_DEG;
  const l = lonDeg * RAD_PER_DEG;
  return [rRe * Math.cos(p) * Math.cos(l), rRe * Math.cos(p) * Math.sin(l), rRe * Math.sin(p)];
}

/** Geocentric lat/lon (deg) of a direction. */
export function latLonOf(x: number, y: number, z: number): [number, number] {
  return [Math.atan2(z, Math.hypot(x, y)) / RAD_PER_DEG, Math.atan2(y, x) / RAD_PER_DEG];
}

/** v_geo = M v_gsm with M row-major (FrameInfo.geoFromGsm). */
export function rotate(m: ArrayLike<number>, x: number, y: number, z: number): [number, number, number] {
  return [m[0] * x + m[1] * y + m[2] * z, m[3] * x + m[4] * y + m[5] * z, m[6] * x + m[7] * y + m[8] * z];
}

/** Sizes of a line bundle drawn as segments: its points and the segment index's length (two entries a segment). */
export function segmentCounts(b: LineBundle): { nPoints: number; nIndex: number } {
  const nLines = b.offsets.length - 1;
  let nSeg = 0;
  for (let l = 0; l < nLines; l++) nSeg += Math.max(0, b.offsets[l + 1] - b.offsets[l] - 1);
  return { nPoints: b.pointsGeo.length / 3, nIndex: 2 * nSeg };
}

/**
 * Write a line bundle as segments into arrays the caller owns (at least segmentCounts' sizes):
 * float32 positions, per-vertex colours by line type, and the segment index (pairs within each
 * line, never across lines). Returns the index length written.
 */
export function writeSegments(b: LineBundle, positions: Float32Array, colours: Float32Array, index: Uint32Array): number {
  const nPts = b.pointsGeo.length / 3;
  for (let i = 0; i < 3 * nPts; i++) positions[i] = b.pointsGeo[i];
  const nLines = b.offsets.length - 1;
  let k = 0;
  for (let l = 0; l < nLines; l++) {
    const [r, g, bl] = lineTypeRgb(b.types[l]);
    for (let i = b.offsets[l]; i < b.offsets[l + 1]; i++) {
      colours[3 * i] = r;
      colours[3 * i + 1] = g;
      colours[3 * i + 2] = bl;
      if (i + 1 < b.offsets[l + 1]) {
        index[k++] = i;
        index[k++] = i + 1;
      }
    }
  }
  return k;
}

/** Line bundle → float32 positions, per-vertex colours and a segment index (pairs within each line). */
export function bundleSegments(b: LineBundle): { positions: Float32Array; colours: Float32Array; index: Uint32Array } {
  const { nPoints, nIndex } = segmentCounts(b);
  const positions = new Float32Array(3 * nPoints);
  const colours = new Float32Array(3 * nPoints);
  const index = new Uint32Array(nIndex);
  writeSegments(b, positions, colours, index);
  return { positions, colours, index };
}

/**
 * Shue et al. (1998) surface r = r0 (2/(1+cos θ))^α, axisymmetric about GSM x,
 * sampled in θ up to the tail cut xMinRe and rotated into GEO.
 */
export function magnetopauseMesh(r0: number, alpha: number, geoFromGsm: ArrayLike<number>, xMinRe = -40, nTheta = 48, nPhi = 48): { positions: Float32Array; index: Uint32Array } {
  const positions = new Float32Array((nTheta + 1) * (nPhi + 1) * 3);
  writeMagnetopausePositions(positions, r0, alpha, geoFromGsm, xMinRe, nTheta, nPhi);
  return { positions, index: gridTriangles(nTheta, nPhi) };
}

/**
 * The vertices of magnetopauseMesh written into `positions` (the caller's, (nTheta+1)(nPhi+1)·3
 * long): θ rows from the nose, φ around GSM x. The triangles (gridTriangles) depend only on
 * nTheta and nPhi, so a new shape can be drawn by rewriting the vertices alone.
 */
export function writeMagnetopausePositions(positions: Float32Array, r0: number, alpha: number, geoFromGsm: ArrayLike<number>, xMinRe = -40, nTheta = 48, nPhi = 48): void {
  // θ where x = r cos θ reaches xMinRe (bisection on a monotone function).
  const xAt = (t: number) => r0 * Math.pow(2 / (1 + Math.cos(t)), alpha) * Math.cos(t);
  let lo = Math.PI / 2;
  let hi = Math.PI * 0.999;
  if (xAt(hi) > xMinRe) lo = hi;
  else for (let i = 0; i < 50; i++) { const mid = (lo + hi) / 2; if (xAt(mid) > xMinRe) lo = mid; else hi = mid; }
  const tMax = lo;
  let p = 0;
  for (let i = 0; i <= nTheta; i++) {
    const t = (tMax * i) / nTheta;
    const r = r0 * Math.pow(2 / (1 + Math.cos(t)), alpha);
    for (let j = 0; j <= nPhi; j++) {
      const ph = (2 * Math.PI * j) / nPhi;
      const v = rotate(geoFromGsm, r * Math.cos(t), r * Math.sin(t) * Math.cos(ph), r * Math.sin(t) * Math.sin(ph));
      positions[p++] = v[0];
      positions[p++] = v[1];
      positions[p++] = v[2];
    }
  }
}

/** Triangles of a (nTheta+1)×(nPhi+1) vertex grid, two per cell. */
export function gridTriangles(nTheta: number, nPhi: number): Uint32Array {
  const index = new Uint32Array(nTheta * nPhi * 6);
  let k = 0;
  for (let i = 0; i < nTheta; i++)
    for (let j = 0; j < nPhi; j++) {
      const a = i * (nPhi + 1) + j;
      const b = a + nPhi + 1;
      index.set([a, b, a + 1, a + 1, b, b + 1], k);
      k += 6;
    }
  return index;
}

/** Segments of a geographic (or, given an axis, magnetic) graticule on a sphere of radius rRe. */
export function graticuleSegments(rRe: number, stepLatDeg: number, stepLonDeg: number, axis?: ArrayLike<number>): Float32Array {
  // Magnetic frame: z along the axis, y = ẑ_geo × axis (MAG convention), x = y × z.
  let ex = [1, 0, 0], ey = [0, 1, 0], ez = [0, 0, 1];
  if (axis) {
    const na = Math.hypot(axis[0], axis[1], axis[2]) || 1;
    ez = [axis[0] / na, axis[1] / na, axis[2] / na];
    const yy = [-ez[1], ez[0], 0];
    const n = Math.hypot(yy[0], yy[1]) || 1;
    ey = [yy[0] / n, yy[1] / n, 0];
    ex = [ey[1] * ez[2] - ey[2] * ez[1], ey[2] * ez[0] - ey[0] * ez[2], ey[0] * ez[1] - ey[1] * ez[0]];
  }
  const out: number[] = [];
  const push = (la: number, lo: number) => {
    const [x, y, z] = sphereXyz(la, lo, rRe);
    out.push(x * ex[0] + y * ey[0] + z * ez[0], x * ex[1] + y * ey[1] + z * ez[1], x * ex[2] + y * ey[2] + z * ez[2]);
  };
  for (let la = -90 + stepLatDeg; la < 90; la += stepLatDeg)
    for (let lo = -180; lo < 180; lo += 3) { push(la, lo); push(la, lo + 3); }
  for (let lo = -180; lo < 180; lo += stepLonDeg)
    for (let la = -90; la < 90; la += 3) { push(la, lo); push(la + 3, lo); }
  return new Float32Array(out);
}

/**
 * The oval band of one hemisphere as triangles between the equatorward edge and
 * the open–closed boundary (closed around MLT), skipping sectors with a NaN edge.
 */
export function ovalBandMesh(c: BoundaryCurve, rRe: number): { positions: Float32Array; index: Uint32Array; edges: Float32Array } {
  const n = c.mltHours.length;
  const positions = new Float32Array(n * 2 * 3);
  const ok = new Uint8Array(n);
  for (let i = 0; i < n; i++) {
    const a = sphereXyz(c.equatorwardGeoLatDeg[i], c.equatorwardGeoLonDeg[i], rRe);
    const b = sphereXyz(c.openClosedGeoLatDeg[i], c.openClosedGeoLonDeg[i], rRe);
    ok[i] = Number.isFinite(a[0] + a[1] + a[2] + b[0] + b[1] + b[2]) ? 1 : 0;
    // Sectors without a boundary stay at the origin (unindexed), so the bounding sphere stays finite.
    if (ok[i]) {
      positions.set(a, 6 * i);
      positions.set(b, 6 * i + 3);
    }
  }
  const idx: number[] = [];
  const edges: number[] = [];
  for (let i = 0; i < n; i++) {
    const j = (i + 1) % n;
    if (!ok[i] || !ok[j]) continue;
    const a = 2 * i, b = 2 * i + 1, c2 = 2 * j, d = 2 * j + 1;
    idx.push(a, c2, b, b, c2, d);
    for (const [u, v] of [[a, c2], [b, d]]) edges.push(...positions.subarray(3 * u, 3 * u + 3), ...positions.subarray(3 * v, 3 * v + 3));
  }
  return { positions, index: new Uint32Array(idx), edges: new Float32Array(edges) };
}

/**
 * Geometries the 3D view keeps from one answer to the next and refills in place: a new
 * pressure changes the numbers of the field lines and of the magnetopause, not what is drawn,
 * so the buffers stay and only their contents (and the draw range) change. three.js then
 * uploads the changed ranges into the buffers it has (bufferSubData) instead of creating new
 * ones, and the magnetopause keeps its wireframe index (three.js rebuilds it only for a new
 * geometry or a new index). Plain three.js objects, no React.
 */
import * as THREE from 'three';
import type { LineBundle } from '../../../workers/protocol';
import { gridTriangles, segmentCounts, writeMagnetopausePositions, writeSegments } from '../lib/sphere';

/** Room for this much more than an answer needs when the buffers must grow (fewer regrowths). */
const GROWTH = 1.5;

/** Bounding sphere of the first nPoints xyz triples (centre of their box, largest distance from it). */
function boundingSphereOf(p: Float32Array, nPoints: number): THREE.Sphere {
  if (nPoints === 0) return new THREE.Sphere(new THREE.Vector3(), -1);
  let x0 = Infinity, y0 = Infinity, z0 = Infinity, x1 = -Infinity, y1 = -Infinity, z1 = -Infinity;
  for (let i = 0; i < 3 * nPoints; i += 3) {
    x0 = Math.min(x0, p[i]); x1 = Math.max(x1, p[i]);
    y0 = Math.min(y0, p[i + 1]); y1 = Math.max(y1, p[i + 1]);
    z0 = Math.min(z0, p[i + 2]); z1 = Math.max(z1, p[i + 2]);
  }
  const c = new THREE.Vector3((x0 + x1) / 2, (y0 + y1) / 2, (z0 + z1) / 2);
  let r2 = 0;
  for (let i = 0; i < 3 * nPoints; i += 3) r2 = Math.max(r2, (p[i] - c.x) ** 2 + (p[i + 1] - c.y) ** 2 + (p[i + 2] - c.z) ** 2);
  return new THREE.Sphere(c, Math.sqrt(r2));
}

/**
 * The field-line fan as one indexed line-segment geometry (positions, per-vertex colours, segment
 * index; lib/sphere.ts writeSegments). `set` refills the buffers and returns the geometry to draw:
 * the same object while the answer fits, a new one (the old one disposed) when it does not.
 */
export class SegmentBuffers {
  private geom: THREE.BufferGeometry | null = null;
  private pointRoom = 0;
  private indexRoom = 0;

  get geometry(): THREE.BufferGeometry | null {
    return this.geom;
  }

  set(b: LineBundle): THREE.BufferGeometry {
    const { nPoints, nIndex } = segmentCounts(b);
    if (!this.geom || nPoints > this.pointRoom || nIndex > this.indexRoom) this.grow(Math.ceil(nPoints * GROWTH), Math.ceil(nIndex * GROWTH));
    const g = this.geom!;
    const pos = g.getAttribute('position') as THREE.BufferAttribute;
    const col = g.getAttribute('color') as THREE.BufferAttribute;
    const idx = g.getIndex()!;
    const written = writeSegments(b, pos.array as Float32Array, col.array as Float32Array, idx.array as Uint32Array);
    // Upload only what this answer uses.
    for (const [a, n] of [[pos, 3 * nPoints], [col, 3 * nPoints], [idx, written]] as const) {
      a.clearUpdateRanges();
      a.addUpdateRange(0, n);
      a.needsUpdate = true;
    }
    g.setDrawRange(0, written);
    g.boundingBox = null;
    g.boundingSphere = boundingSphereOf(pos.array as Float32Array, nPoints);
    return g;
  }

  private grow(pointRoom: number, indexRoom: number): void {
    this.geom?.dispose();
    const g = new THREE.BufferGeometry();
    g.setAttribute('position', new THREE.BufferAttribute(new Float32Array(3 * pointRoom), 3).setUsage(THREE.DynamicDrawUsage));
    g.setAttribute('color', new THREE.BufferAttribute(new Float32Array(3 * pointRoom), 3).setUsage(THREE.DynamicDrawUsage));
    g.setIndex(new THREE.BufferAttribute(new Uint32Array(indexRoom), 1).setUsage(THREE.DynamicDrawUsage));
    this.geom = g;
    this.pointRoom = pointRoom;
    this.indexRoom = indexRoom;
  }

  /** Free the GPU buffers (three.js makes them again should the geometry be drawn after: React's development double mount). */
  dispose(): void {
    this.geom?.dispose();
  }
}

/**
 * The magnetopause surface (lib/sphere.ts magnetopauseMesh's grid): one geometry whose vertices
 * are rewritten for each new shape; its triangles never change.
 */
export class SurfaceBuffers {
  private geom: THREE.BufferGeometry | null = null;

  constructor(private readonly nTheta = 48, private readonly nPhi = 48, private readonly xMinRe = -40) {}

  get geometry(): THREE.BufferGeometry | null {
    return this.geom;
  }

  set(r0Re: number, alpha: number, geoFromGsm: ArrayLike<number>): THREE.BufferGeometry {
    if (!this.geom) {
      const g = new THREE.BufferGeometry();
      g.setAttribute('position', new THREE.BufferAttribute(new Float32Array((this.nTheta + 1) * (this.nPhi + 1) * 3), 3).setUsage(THREE.DynamicDrawUsage));
      g.setIndex(new THREE.BufferAttribute(gridTriangles(this.nTheta, this.nPhi), 1));
      this.geom = g;
    }
    const pos = this.geom.getAttribute('position') as THREE.BufferAttribute;
    writeMagnetopausePositions(pos.array as Float32Array, r0Re, alpha, geoFromGsm, this.xMinRe, this.nTheta, this.nPhi);
    pos.needsUpdate = true;
    this.geom.boundingBox = null;
    this.geom.boundingSphere = boundingSphereOf(pos.array as Float32Array, pos.count);
    return this.geom;
  }

  /** Free the GPU buffers (as SegmentBuffers.dispose). */
  dispose(): void {
    this.geom?.dispose();
  }
}

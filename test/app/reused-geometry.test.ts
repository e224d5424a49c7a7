import { describe, expect, it } from 'vitest';
import * as THREE from 'three';
import { expectClose } from '../helpers';
import { bundleSegments, magnetopauseMesh } from '../../src/app/lib/sphere';
import { SegmentBuffers, SurfaceBuffers } from '../../src/app/scene/reusedGeometry';
import { createEngineApi } from '../../workers/engine-api';
import type { LineBundle } from '../../workers/protocol';

// The 3D view's geometries kept from answer to answer (src/app/scene/reusedGeometry.ts): what they
// draw must equal a geometry built afresh from the same answer (lib/sphere.ts bundleSegments,
// magnetopauseMesh), and three.js's own bounding sphere of it.
const C = { time: '2025-03-20T22:00:00Z', pdynNpa: 3, bzNt: -5, byNt: 2, internal: 'dipole' as const, magnetopause: true, imfEfficiency: 0.2, tail: true };
const FAN = { mltHours: [0, 6, 12, 18], magLatDeg: [60, 68, 76, 84] };

/** The drawn part of a reused geometry equals the fresh arrays of the same bundle. */
function expectDraws(g: THREE.BufferGeometry, b: LineBundle): void {
  const fresh = bundleSegments(b);
  const n = fresh.positions.length;
  expect(Array.from((g.getAttribute('position').array as Float32Array).subarray(0, n))).toEqual(Array.from(fresh.positions));
  expect(Array.from((g.getAttribute('color').array as Float32Array).subarray(0, n))).toEqual(Array.from(fresh.colours));
  expect(g.drawRange.start).toBe(0);
  expect(g.drawRange.count).toBe(fresh.index.length);
  expect(Array.from(g.getIndex()!.array.subarray(0, fresh.index.length))).toEqual(Array.from(fresh.index));
  // three.js's bounding sphere of a geometry built afresh (box centre, farthest point).
  const ref = new THREE.BufferGeometry();
  ref.setAttribute('position', new THREE.BufferAttribute(fresh.positions, 3));
  ref.computeBoundingSphere();
  expectClose(g.boundingSphere!.radius, ref.boundingSphere!.radius, 1e-5, 'bounding sphere radius, RE');
  expectClose(g.boundingSphere!.center.distanceTo(ref.boundingSphere!.center), 0, 1e-5, 'bounding sphere centre, RE');
}

describe('geometries kept from answer to answer', () => {
  it('field lines: a new answer that fits is written into the same geometry (only the used ranges uploaded); one that does not gets a new geometry and the old one is disposed', async () => {
    const api = createEngineApi();
    const a = (await api.scene(1, C, FAN)).lines;
    const b = (await api.scene(2, { ...C, pdynNpa: 8 }, FAN)).lines;
    expect(b.pointsGeo.length).not.toBe(a.pointsGeo.length);
    const buf = new SegmentBuffers();
    const g1 = buf.set(a);
    expectDraws(g1, a);
    const versions = ['position', 'color'].map((k) => (g1.getAttribute(k) as THREE.BufferAttribute).version).concat(g1.getIndex()!.version);
    const g2 = buf.set(b);
    expect(g2).toBe(g1);
    expectDraws(g2, b);
    const after = ['position', 'color'].map((k) => (g2.getAttribute(k) as THREE.BufferAttribute).version).concat(g2.getIndex()!.version);
    after.forEach((v, i) => expect(v).toBe(versions[i] + 1));
    expect((g2.getAttribute('position') as THREE.BufferAttribute).updateRanges).toEqual([{ start: 0, count: b.pointsGeo.length }]);
    expect(g2.getIndex()!.updateRanges).toEqual([{ start: 0, count: bundleSegments(b).index.length }]);
    // Twice the lines of a: more than the room kept (1.5 × the first answer).
    const big: LineBundle = {
      pointsGeo: Float64Array.from([...a.pointsGeo, ...a.pointsGeo]),
      offsets: Int32Array.from([...a.offsets, ...Array.from(a.offsets.subarray(1), (o) => o + a.pointsGeo.length / 3)]),
      types: Uint8Array.from([...a.types, ...a.types]),
    };
    let disposed = 0;
    g2.addEventListener('dispose', () => disposed++);
    const g3 = buf.set(big);
    expect(g3).not.toBe(g2);
    expect(disposed).toBe(1);
    expectDraws(g3, big);
    // Back to a smaller answer: the grown geometry stays.
    expect(buf.set(a)).toBe(g3);
    expectDraws(g3, a);
  });

  it('magnetopause: a new shape rewrites the vertices of the same geometry; the triangles stay the same array', () => {
    const m = Float64Array.of(1, 0, 0, 0, 1, 0, 0, 0, 1);
    const buf = new SurfaceBuffers();
    const g1 = buf.set(10.25, 0.59, m);
    const index = g1.getIndex()!.array;
    const v = (g1.getAttribute('position') as THREE.BufferAttribute).version;
    const g2 = buf.set(8.1, 0.62, m);
    expect(g2).toBe(g1);
    expect(g2.getIndex()!.array).toBe(index);
    expect((g2.getAttribute('position') as THREE.BufferAttribute).version).toBe(v + 1);
    const fresh = magnetopauseMesh(8.1, 0.62, m);
    expect(Array.from(g2.getAttribute('position').array)).toEqual(Array.from(fresh.positions));
    expect(Array.from(index)).toEqual(Array.from(fresh.index));
    const ref = new THREE.BufferGeometry();
    ref.setAttribute('position', new THREE.BufferAttribute(fresh.positions, 3));
    ref.computeBoundingSphere();
    expectClose(g2.boundingSphere!.radius, ref.boundingSphere!.radius, 1e-5, 'bounding sphere radius, RE');
  });
});

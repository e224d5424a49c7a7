import { describe, expect, it } from 'vitest';
import { expectClose } from '../helpers';
import { bundleSegments, graticuleSegments, latLonOf, magnetopauseMesh, ovalBandMesh, sphereXyz } from '../../src/app/lib/sphere';
import type { BoundaryCurve } from '../../workers/protocol';
import { RAD_PER_DEG } from '../../src/physics/constants';

// A rotation GSM → GEO (row-major): 30° about z then 20° about x, an arbitrary proper rotation.
function rotation(): Float64Array {
  const a = 30 * RAD_PER_DEG, b = 20 * RAD_PER_DEG;
  const rz = [Math.cos(a), -Math.sin(a), 0, Math.sin(a), Math.cos(a), 0, 0, 0, 1];
  const rx = [1, 0, 0, 0, Math.cos(b), -Math.sin(b), 0, Math.sin(b), Math.cos(b)];
  const m = new Float64Array(9);
  for (let i = 0; i < 3; i++) for (let j = 0; j < 3; j++) for (let k = 0; k < 3; k++) m[3 * i + j] += rz[3 * i + k] * rx[3 * k + j];
  return m;
}

describe('display geometry', () => {
  it('magnetopause mesh vertices lie on the Shue et al. (1998) surface r = r0 (2/(1+cos θ))^α about GSM x', () => {
    // Worked shape of references §3: Dp = 2 nPa, Bz = 0 → r0 = 10.2519 RE, α = 0.58965 (r(90°) = 15.43 RE).
    const r0 = 10.2519, alpha = 0.58965, m = rotation();
    const { positions, index } = magnetopauseMesh(r0, alpha, m, -40, 24, 16);
    let worst = 0;
    let minX = Infinity;
    for (let i = 0; i < positions.length; i += 3) {
      const [gx, gy, gz] = [positions[i], positions[i + 1], positions[i + 2]];
      // GSM = Mᵀ · GEO.
      const x = m[0] * gx + m[3] * gy + m[6] * gz, y = m[1] * gx + m[4] * gy + m[7] * gz, z = m[2] * gx + m[5] * gy + m[8] * gz;
      const r = Math.hypot(x, y, z);
      const shue = r0 * Math.pow(2 / (1 + x / r), alpha);
      worst = Math.max(worst, Math.abs(r - shue) / shue);
      minX = Math.min(minX, x);
    }
    expectClose(worst, 0, 2e-6, 'largest relative distance of a vertex from the surface (float32 rounding)');
    expectClose(minX, -40, 1e-3, 'tail cut at x = −40 RE');
    // Nose vertex (θ = 0) at r0 along GSM x.
    expectClose(Math.hypot(positions[0], positions[1], positions[2]), r0, 1e-5, 'nose distance, RE');
    expectClose(r0 * Math.pow(2, alpha), 15.43, 0.005, 'r(90°) of the worked case (references §3)');
    expect(Math.max(...index)).toBeLessThan(positions.length / 3);
  });

  it('line bundle: one segment per consecutive point pair, never across lines, colours per kind', () => {
    const b = { pointsGeo: new Float64Array(3 * 5), offsets: Int32Array.from([0, 3, 3, 5]), types: Uint8Array.from([0, 2, 1]) };
    const { index, colours } = bundleSegments(b);
    expect(Array.from(index)).toEqual([0, 1, 1, 2, 3, 4]);
    expect(Array.from(colours.subarray(9, 12))).not.toEqual(Array.from(colours.subarray(0, 3)));
  });

  it('lat/lon ↔ xyz round trip; graticules stay on their sphere', () => {
    for (const [la, lo] of [[67.4, 26.6], [-80, -170], [0, 180]]) {
      const [x, y, z] = sphereXyz(la, lo, 1.5);
      const [la2, lo2] = latLonOf(x, y, z);
      expectClose(la2, la, 1e-12, 'lat round trip');
      expectClose(Math.abs(((lo2 - lo + 540) % 360) - 180), 0, 1e-12, 'lon round trip');
    }
    const g = graticuleSegments(1.01, 10, 30, [0.1, -0.2, 0.97]);
    for (let i = 0; i < g.length; i += 3) expectClose(Math.hypot(g[i], g[i + 1], g[i + 2]), 1.01, 1e-6, 'magnetic graticule radius');
  });

  it('oval band skips sectors without a boundary and keeps missing vertices finite', () => {
    const n = 4;
    const c: BoundaryCurve = {
      hemisphere: 'north', mltHours: Float64Array.from([0, 6, 12, 18]),
      openClosedMagLatDeg: new Float64Array(n), openClosedGeoLatDeg: Float64Array.from([75, 76, NaN, 74]), openClosedGeoLonDeg: Float64Array.from([0, 90, 180, -90]),
      equatorwardMagLatDeg: new Float64Array(n), equatorwardGeoLatDeg: Float64Array.from([65, 66, 70, 64]), equatorwardGeoLonDeg: Float64Array.from([0, 90, 180, -90]),
      openClosedReason: [null, null, 'no closed lines at this MLT', null], equatorwardReason: [null, null, null, null],
    };
    const m = ovalBandMesh(c, 1.02);
    expect(m.index.length).toBe(2 * 6); // sectors 0→1 and 3→0 only
    expect(m.positions.every(Number.isFinite)).toBe(true);
  });
});

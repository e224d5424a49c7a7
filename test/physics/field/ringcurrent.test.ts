import { describe, expect, it } from 'vitest';
import { expectAtMost, expectClose } from '../../helpers';
import { ellipticKE, prepareRingCurrent, ringCurrentParameters, dpsEnergyJ, ringPeakRe, type RingCurrentParameters } from '../../../src/physics/field/ringcurrent';

/** K and E by composite Simpson quadrature of their defining integrals (independent of the AGM). */
function quadKE(m: number): [number, number] {
  const n = 20000, h = Math.PI / 2 / n;
  let k = 0, e = 0;
  for (let i = 0; i <= n; i++) {
    const w = i === 0 || i === n ? 1 : i % 2 ? 4 : 2;
    const s = Math.sin(i * h);
    const q = 1 - m * s * s;
    k += w / Math.sqrt(q);
    e += w * Math.sqrt(q);
  }
  return [(k * h) / 3, (e * h) / 3];
}

/** Biot–Savart of a thin loop (radius a, μ0I = mu0I nT·RE) at (ρ, 0, z), by quadrature over the loop (textbook). */
function biotSavartLoop(a: number, mu0I: number, rho: number, z: number): [number, number] {
  const n = 4000;
  let bx = 0, bz = 0;
  for (let i = 0; i < n; i++) {
    const p = ((i + 0.5) * 2 * Math.PI) / n;
    const dl = (2 * Math.PI * a) / n;
    const lx = -Math.sin(p) * dl, ly = Math.cos(p) * dl;
    const rx = rho - a * Math.cos(p), ry = -a * Math.sin(p), rz = z;
    const r3 = Math.pow(rx * rx + ry * ry + rz * rz, 1.5);
    // dB = μ0 I/(4π) dl × r / r³
    bx += (ly * rz) / r3;
    bz += (lx * ry - ly * rx) / r3;
  }
  return [(mu0I / (4 * Math.PI)) * bx, (mu0I / (4 * Math.PI)) * bz];
}

describe('complete elliptic integrals by the AGM (Abramowitz & Stegun §17.6)', () => {
  it('matches A&S Table 17.1 values and Simpson quadrature of the defining integrals', () => {
    const o = new Float64Array(2);
    ellipticKE(o, 0.5);
    expectClose(o[0], 1.8540746773013719, 1e-14, 'K(0.5) (A&S Table 17.1, from memory)');
    expectClose(o[1], 1.3506438810476755, 1e-14, 'E(0.5) (A&S Table 17.1, from memory)');
    for (const m of [0, 1e-6, 0.1, 0.7, 0.95, 0.999]) {
      ellipticKE(o, m);
      const [k, e] = quadKE(m);
      expectClose(o[0], k, 2e-8 * k, `K(${m}) vs quadrature`);
      expectClose(o[1], e, 1e-10, `E(${m}) vs quadrature`);
    }
  });
});

const single = (o: Partial<RingCurrentParameters> = {}): RingCurrentParameters => ({ centreNt: -50, radiiRe: [4], shares: [1], thicknessRe: [0.5], peakRe: 4, ...o });

describe('ring current (softened current loops, references §10)', () => {
  it('a softened loop is the Biot–Savart loop field at z_e = √(z² + d²) with B_ρ scaled by z/z_e (derived)', () => {
    const p = single();
    const ring = prepareRingCurrent(p, 0, 1);
    const q = 16 + 0.25;
    const mu0I = (2 * -50 * q * Math.sqrt(q)) / 16; // centre field μ0Ia²/(2(a²+d²)^{3/2}) (textbook on-axis formula)
    const o = new Float64Array(3);
    for (const [rho, z] of [[2, 0.3], [4, 0], [4.2, -1], [7, 2], [0.5, 3], [12, -5]]) {
      o.fill(0);
      ring.evaluate(o, rho, 0, z);
      const ze = Math.sqrt(z * z + 0.25);
      const [br, bz] = biotSavartLoop(4, mu0I, rho, ze);
      expectClose(o[0], br * (z / ze), 1e-6 * Math.abs(bz) + 1e-9, `B_ρ at ρ ${rho}, z ${z}`);
      expectClose(o[2], bz, 1e-6 * Math.abs(bz) + 1e-9, `B_z at ρ ${rho}, z ${z}`);
    }
  });

  it('the field at Earth\'s centre equals the requested Dst* to 0.1 nT, with and without tilt', () => {
    for (const dst of [-30, -100, -260, -600]) {
      for (const tilt of [0, 25, -35]) {
        const t = (tilt * Math.PI) / 180;
        const ring = prepareRingCurrent(ringCurrentParameters(dst), Math.sin(t), Math.cos(t));
        const o = new Float64Array(3);
        ring.evaluate(o, 0, 0, 0);
        // Axis (sin ψ, 0, cos ψ) in GSM: the component along it.
        expectClose(o[0] * Math.sin(t) + o[2] * Math.cos(t), dst, 0.1, `centre field along the axis, Dst* ${dst}, tilt ${tilt}`);
        expectClose(o[0] * Math.cos(t) - o[2] * Math.sin(t), 0, 1e-9, 'no transverse field at the centre');
      }
    }
  });

  it('is divergence-free (central differences, h = 1e-4 RE) and bounded, also near the loops and the axis', () => {
    const ring = prepareRingCurrent(ringCurrentParameters(-300), Math.sin(0.3), Math.cos(0.3));
    const o = new Float64Array(3);
    const at = (x: number, y: number, z: number, i: number): number => { o.fill(0); ring.evaluate(o, x, y, z); return o[i]; };
    const h = 1e-4;
    let worst = 0;
    let maxB = 0;
    for (let i = 0; i < 400; i++) {
      // A deterministic spread of points, 0–15 RE, including near the axis and the loop radii.
      const r = 0.05 + 15 * ((i * 0.618034) % 1);
      const th = Math.PI * ((i * 0.414214) % 1), ph = 2 * Math.PI * ((i * 0.732051) % 1);
      const x = r * Math.sin(th) * Math.cos(ph), y = r * Math.sin(th) * Math.sin(ph), z = r * Math.cos(th);
      const div = (at(x + h, y, z, 0) - at(x - h, y, z, 0) + at(x, y + h, z, 1) - at(x, y - h, z, 1) + at(x, y, z + h, 2) - at(x, y, z - h, 2)) / (2 * h);
      const b = Math.hypot(at(x, y, z, 0), at(x, y, z, 1), at(x, y, z, 2));
      maxB = Math.max(maxB, b);
      worst = Math.max(worst, Math.abs(div) / Math.max(b, 1));
    }
    expectAtMost(worst, 1e-5, 'max |∇·B|/|B| (per RE)');
    expectAtMost(maxB, 2000, 'largest |B| of a −300 nT ring (bounded)');
    o.fill(0); ring.evaluate(o, 0, 0, 1e-12);
    expect(o.every(Number.isFinite)).toBe(true);
  });

  it('far away it tends to the dipole of moment Σ I·πa² (derived)', () => {
    const p = ringCurrentParameters(-150);
    const ring = prepareRingCurrent(p, 0, 1);
    // Loop moments from the textbook on-axis centre field of each softened loop: μ0I = 2B_c(a² + d²)^{3/2}/a².
    let m = 0; // μ0 m /4π, nT RE³
    p.radiiRe.forEach((a, j) => {
      const d = p.thicknessRe[j], q = a * a + d * d;
      const mu0I = (2 * p.shares[j] * p.centreNt * q * Math.sqrt(q)) / (a * a);
      m += (mu0I * Math.PI * a * a) / (4 * Math.PI);
    });
    expectClose(ring.dipoleNtRe3, m, 1e-9 * Math.abs(m), 'reported far-field moment');
    const o = new Float64Array(3);
    // The next term of the multipole expansion is O(a²/r²) relative (derived): tolerance 2(a_max² + d²)/r² of the dipole value.
    const aMax = Math.max(...p.radiiRe), dMax = Math.max(...p.thicknessRe);
    for (const r of [200, 1000]) {
      const rel = (2 * (aMax * aMax + dMax * dMax)) / (r * r);
      o.fill(0); ring.evaluate(o, r, 0, 0);
      // Equator of a dipole along +z: B_z = −μ0m/(4πr³); on the axis B_z = 2μ0m/(4πr³).
      expectClose(o[2], -m / r ** 3, (Math.abs(m) / r ** 3) * rel, `equatorial far field at ${r} RE`);
      o.fill(0); ring.evaluate(o, 0, 0, r);
      expectClose(o[2], (2 * m) / r ** 3, (2 * Math.abs(m) / r ** 3) * rel, `axial far field at ${r} RE`);
    }
  });

  it('reports the Dessler–Parker–Sckopke energy: ΔB −100 nT ↔ 3.846e15 J for B0 29,742.5 nT (references §10), to 0.5 %', () => {
    const ring = prepareRingCurrent(ringCurrentParameters(-100), 0, 1);
    const o = new Float64Array(3);
    ring.evaluate(o, 0, 0, 0);
    expectClose(dpsEnergyJ(o[2], 29742.5), 3.846e15, 0.005 * 3.846e15, 'DPS energy of the −100 nT ring');
  });

  it('moves earthward as the storm deepens and vanishes for Dst* ≥ 0', () => {
    expect(ringPeakRe(0)).toBe(4.5);
    expect(ringPeakRe(-100)).toBeLessThan(ringPeakRe(-50));
    expect(ringPeakRe(-400)).toBeGreaterThanOrEqual(3);
    const ring = prepareRingCurrent(ringCurrentParameters(20), 0, 1);
    const o = new Float64Array(3);
    ring.evaluate(o, 3, 1, 0.5);
    expect([...o]).toEqual([0, 0, 0]);
  });
});

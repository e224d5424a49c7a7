import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { expectAtMost, expectBetween, expectClose } from '../../../helpers';
import { addTiltedDipoleField } from '../../../../src/physics/field/dipole';
import { MU0, RAD_PER_DEG } from '../../../../src/physics/constants';
import { InputError } from '../../../../src/physics/errors';
import { magnetopauseNormal, magnetopausePoint, shueMagnetopause, shueRadius, type MagnetopauseShape } from '../../../../src/physics/field/magnetopause';
import { prepareCompression, prepareCompressionOnSurface, type CompressionField, type FieldWriter } from '../../../../src/physics/field/compression/fit';
import { sphereSurface } from '../../../../src/physics/field/compression/surface';
import { prepareModel, FAR_TAIL_FIT } from '../../../../src/physics/field/model';

/** The 2025 dipole (references §1, §4). */
const B0 = 29733;

function tiltedDipole(tiltDeg: number): FieldWriter {
  const s = Math.sin(tiltDeg * RAD_PER_DEG), c = Math.cos(tiltDeg * RAD_PER_DEG);
  return (o, x, y, z) => {
    o[0] = 0; o[1] = 0; o[2] = 0;
    addTiltedDipoleField(o, x, y, z, B0, s, c);
  };
}

/** Dipole with an arbitrary north axis â: B = B0 (â r² − 3 (â·r) r) / r⁵ (derived from the moment −B0 â). */
function axisDipole(ax: number, ay: number, az: number): FieldWriter {
  return (o, x, y, z) => {
    const r2 = x * x + y * y + z * z, r = Math.sqrt(r2), ar = ax * x + ay * y + az * z, k = B0 / (r2 * r2 * r);
    o[0] = (ax * r2 - 3 * ar * x) * k;
    o[1] = (ay * r2 - 3 * ar * y) * k;
    o[2] = (az * r2 - 3 * ar * z) * k;
  };
}

/** Area-weighted rms and max of |B·n|/|B| on an independent (θ, φ) grid over the fitted region. */
function surfaceResidual(mp: MagnetopauseShape, total: FieldWriter, thetaMax: number): { rms: number; max: number } {
  const p = new Float64Array(3), n = new Float64Array(3), b = new Float64Array(3);
  let sw = 0, sr = 0, mx = 0;
  const NT = 50, NP = 40;
  for (let i = 0; i < NT; i++) {
    const th = ((i + 0.37) * thetaMax) / NT;
    const r = shueRadius(mp, th);
    // Surface element of r(θ): r² sin θ √(1 + (r'/r)²) dθ dφ, r'/r = α tan(θ/2) (derived).
    const w = r * r * Math.sin(th) * Math.sqrt(1 + (mp.alpha * Math.tan(th / 2)) ** 2);
    for (let j = 0; j < NP; j++) {
      magnetopausePoint(p, mp, th, ((j + 0.21) * 2 * Math.PI) / NP);
      magnetopauseNormal(n, mp, p[0], p[1], p[2]);
      total(b, p[0], p[1], p[2]);
      const res = Math.abs(b[0] * n[0] + b[1] * n[1] + b[2] * n[2]) / Math.hypot(b[0], b[1], b[2]);
      sw += w;
      sr += w * res * res;
      mx = Math.max(mx, res);
    }
  }
  return { rms: Math.sqrt(sr / sw), max: mx };
}

function withCompression(shielded: FieldWriter, f: CompressionField): FieldWriter {
  return (o, x, y, z) => {
    shielded(o, x, y, z);
    f.evaluate(o, x, y, z);
  };
}

describe('conducting sphere (exact limit, derived; references §4)', () => {
  it('a centred dipole inside a sphere R = 10 gets a uniform 2B0/R³ along its axis (59.466 nT), untilted and tilted', () => {
    const R = 10;
    const u = (2 * B0) / R ** 3;
    expectClose(u, 59.466, 1e-12, '2B0/R³ for B0 29,733 nT, R 10');
    const o = new Float64Array(3);
    const axes: Array<[number, number, number, string]> = [
      [0, 0, 1, 'untilted'],
      [Math.sin(0.3), 0, Math.cos(0.3), 'tilt 17.2° sunward'],
      [Math.sin(-0.6), 0, Math.cos(-0.6), 'tilt −34.4°'],
      [0.3, 0.4, Math.sqrt(0.75), 'axis out of the x–z plane (y-odd terms)'],
    ];
    for (const [ax, ay, az, what] of axes) {
      const f = prepareCompressionOnSurface(sphereSurface(R), axisDipole(ax, ay, az));
      expect(f.yOdd, `${what}: y-odd terms chosen`).toBe(ay !== 0);
      expectAtMost(f.rmsResidualRel, 1e-14, `${what}: rms normal residual on the sphere`);
      for (const [x, y, z] of [[0, 0, 0], [5, 3, -2], [-7, 0, 5], [2, -8, 1], [-3, -3, -8]]) {
        o[0] = 0; o[1] = 0; o[2] = 0;
        f.evaluate(o, x, y, z);
        // references §4 asks for 1e-6; measured error ≤ 2e-13 nT.
        expectClose(o[0], u * ax, 1e-12, `${what}: Bx at (${x},${y},${z})`);
        expectClose(o[1], u * ay, 1e-12, `${what}: By at (${x},${y},${z})`);
        expectClose(o[2], u * az, 1e-12, `${what}: Bz at (${x},${y},${z})`);
      }
    }
  });
});

describe('compression field on the Shue surface', () => {
  it('rms |B·n|/|B| ≤ 1 % over the fitted region for Pdyn 0.5–10 nPa, Bz −10..10 nT, tilt −35..35° (independent grid)', () => {
    let worstRms = 0, worstMax = 0, worstReported = 0;
    for (const pd of [0.5, 2, 10]) {
      for (const bz of [-10, 0, 10]) {
        for (const tilt of [-35, 0, 35]) {
          const mp = shueMagnetopause(pd, bz);
          const sh = tiltedDipole(tilt);
          const f = prepareCompression(mp, sh);
          expectClose(f.fitRegion.xMinRe, -2 * mp.r0Re, 1e-9, 'fitted region ends at x = −2 r0');
          const r = surfaceResidual(mp, withCompression(sh, f), f.fitRegion.thetaMaxRad);
          worstRms = Math.max(worstRms, r.rms);
          worstMax = Math.max(worstMax, r.max);
          worstReported = Math.max(worstReported, f.rmsResidualRel);
        }
      }
    }
    // Target 1 % (task brief); measured worst rms 6.1e-4, max 7.5e-3, reported 6.0e-4.
    expectAtMost(worstRms, 7e-4, 'worst area-weighted rms residual (independent grid)');
    expectAtMost(worstReported, 7e-4, 'worst reported rmsResidualRel');
    expectAtMost(worstMax, 8e-3, 'worst pointwise residual');
  });

  it('subsolar compression factor is between 2 and 3, near 2.44 (Mead & Beard 1964, from memory, ±0.2)', () => {
    for (const pd of [0.5, 2, 10]) {
      const mp = shueMagnetopause(pd, 0);
      const sh = tiltedDipole(0);
      const tot = withCompression(sh, prepareCompression(mp, sh));
      const o = new Float64Array(3);
      const x = 0.999 * mp.r0Re;
      tot(o, x, 0, 0);
      const factor = Math.hypot(o[0], o[1], o[2]) / (B0 / x ** 3);
      expectBetween(factor, 2, 3, `compression factor at the nose, Pdyn ${pd}`);
      expectClose(factor, 2.44, 0.2, `compression factor near 2.44, Pdyn ${pd}`);
    }
  });

  it('nose pressure balance B²/(2μ0) ≈ 0.88·Pdyn to ±30 % (Spreiter et al. 1966, from memory)', () => {
    for (const pd of [0.5, 2, 10]) {
      const mp = shueMagnetopause(pd, 0);
      const sh = tiltedDipole(0);
      const tot = withCompression(sh, prepareCompression(mp, sh));
      const o = new Float64Array(3);
      tot(o, 0.999 * mp.r0Re, 0, 0);
      const bT = Math.hypot(o[0], o[1], o[2]) * 1e-9;
      const pMagNpa = ((bT * bT) / (2 * MU0)) * 1e9;
      // Measured ratios 1.17 (0.5 nPa), 1.02 (2), 0.87 (10).
      expectClose(pMagNpa / (0.88 * pd), 1, 0.3, `magnetic pressure / (0.88 Pdyn), Pdyn ${pd}`);
    }
  });

  it('field at Earth centre is 5–25 nT per √nPa (O’Brien & McPherron 2000: 7.26; Burton et al. 1975: 15.8, from memory)', () => {
    for (const pd of [0.5, 2, 10]) {
      const f = prepareCompression(shueMagnetopause(pd, 0), tiltedDipole(0));
      const o = new Float64Array(3);
      f.evaluate(o, 0, 0, 0);
      expectClose(o[0], 0, 1e-9, `Bx at the centre, no tilt (symmetry), Pdyn ${pd}`);
      expectBetween(o[2] / Math.sqrt(pd), 5, 25, `Bz(0)/√Pdyn, Pdyn ${pd}`);
    }
  });

  it('is divergence- and curl-free (central differences, h = 1e-3 RE; derived: ∇²φ = 0)', () => {
    const mp = shueMagnetopause(3, -4);
    const f = prepareCompression(mp, tiltedDipole(25));
    const fy = prepareCompression(mp, axisDipole(0.3, 0.4, Math.sqrt(0.75)));
    const h = 1e-3;
    const a = new Float64Array(3), b = new Float64Array(3), c = new Float64Array(3);
    let worst = 0;
    for (const field of [f, fy]) {
      for (let k = 0; k < 40; k++) {
        const x = mp.r0Re * (0.8 - 2.5 * ((k * 0.618) % 1)), y = 20 * (((k * 0.377) % 1) - 0.5), z = 20 * (((k * 0.853) % 1) - 0.5);
        const J: number[][] = [];
        for (let ix = 0; ix < 3; ix++) {
          a.fill(0); b.fill(0);
          field.evaluate(a, x + (ix === 0 ? h : 0), y + (ix === 1 ? h : 0), z + (ix === 2 ? h : 0));
          field.evaluate(b, x - (ix === 0 ? h : 0), y - (ix === 1 ? h : 0), z - (ix === 2 ? h : 0));
          J.push([(a[0] - b[0]) / (2 * h), (a[1] - b[1]) / (2 * h), (a[2] - b[2]) / (2 * h)]);
        }
        c.fill(0);
        field.evaluate(c, x, y, z);
        const scale = Math.hypot(c[0], c[1], c[2]) / mp.r0Re;
        const div = J[0][0] + J[1][1] + J[2][2];
        const curl = Math.hypot(J[1][2] - J[2][1], J[2][0] - J[0][2], J[0][1] - J[1][0]);
        worst = Math.max(worst, Math.abs(div) / scale, curl / scale);
      }
    }
    // Measured ≤ 8e-9 of |B_c|/r0 (the finite-difference truncation).
    expectAtMost(worst, 2e-8, 'max |∇·B|, |∇×B| relative to |B_c|/r0');
  });

  it('stays bounded and finite far down the tail (x = −200 RE and beyond) and tends to its uniform part', () => {
    const f = prepareCompression(shueMagnetopause(2, 0), tiltedDipole(35));
    const a = new Float64Array(3), b = new Float64Array(3), c = new Float64Array(3);
    f.evaluate(c, 0, 0, 0);
    const centre = Math.hypot(c[0], c[1], c[2]);
    for (const [y, z] of [[0, 0], [20, 20], [-30, 10], [5, -25]]) {
      a.fill(0); b.fill(0);
      f.evaluate(a, -200, y, z);
      f.evaluate(b, -1000, y, z);
      const ma = Math.hypot(a[0], a[1], a[2]);
      expectAtMost(ma, 0.1 * centre, `|B_c| at x −200 (y ${y}, z ${z}) vs ${centre.toFixed(1)} nT at the centre`);
      // Every exponential term has decayed by e^(−0.35·200/r0) < 1e-2 relative; measured |diff| ≤ 5e-3 nT.
      expectAtMost(Math.hypot(a[0] - b[0], a[1] - b[1], a[2] - b[2]), 1e-2, `x −200 vs x −1000 (y ${y}, z ${z})`);
    }
    a.fill(0);
    f.evaluate(a, 1e6, 3, 4);
    expect(a.every(Number.isFinite), 'finite even far sunward (exponent clamped)').toBe(true);
  });

  it('never produces NaN inside the magnetopause (property, fast-check: random conditions, random interior points)', () => {
    const o = new Float64Array(3);
    fc.assert(
      fc.property(
        fc.double({ min: 0.2, max: 30, noNaN: true }),
        fc.double({ min: -40, max: 40, noNaN: true }),
        fc.double({ min: -40, max: 40, noNaN: true }),
        fc.array(fc.tuple(fc.double({ min: 0, max: 3.13, noNaN: true }), fc.double({ min: -Math.PI, max: Math.PI, noNaN: true }), fc.double({ min: 0, max: 0.999, noNaN: true })), { minLength: 5, maxLength: 20 }),
        (pd, bz, tilt, pts) => {
          const mp = shueMagnetopause(pd, bz);
          const sh = tiltedDipole(tilt);
          const f = prepareCompression(mp, sh);
          expect(Number.isFinite(f.rmsResidualRel) && f.rmsResidualRel < 0.05, `rms residual ${f.rmsResidualRel} at Pdyn ${pd}, Bz ${bz}, tilt ${tilt}`).toBe(true);
          for (const [th, ph, frac] of pts) {
            const r = Math.min(frac * shueRadius(mp, th), 400);
            o.fill(0);
            f.evaluate(o, r * Math.cos(th), r * Math.sin(th) * Math.cos(ph), r * Math.sin(th) * Math.sin(ph));
            expect(o.every(Number.isFinite), `finite B_c at θ ${th}, φ ${ph}, r ${r}`).toBe(true);
          }
        },
      ),
      { numRuns: 60 },
    );
  });

  it('adds y-odd terms only for a y-asymmetric shielded field, and they are needed there', () => {
    const mp = shueMagnetopause(2, 0);
    expect(prepareCompression(mp, tiltedDipole(30)).yOdd).toBe(false);
    const asym = axisDipole(Math.sin(0.5) * Math.cos(0.6), Math.sin(0.5) * Math.sin(0.6), Math.cos(0.5));
    const auto = prepareCompression(mp, asym);
    expect(auto.yOdd).toBe(true);
    expect(auto.nTerms).toBe(43);
    // Measured: 2.4e-4 with y-odd terms, 0.105 without.
    expectAtMost(auto.rmsResidualRel, 3e-4, 'rms residual, axis 28.6° out of the x–z plane, y-odd terms on');
    expectBetween(prepareCompression(mp, asym, { yOdd: false }).rmsResidualRel, 0.05, 1, 'rms residual with y-odd terms forced off');
  });

  it('the unrolled default evaluator equals the generic kernel, and evaluate ADDS into out', () => {
    const mp = shueMagnetopause(4, -6);
    for (const sh of [tiltedDipole(-20), axisDipole(0.2, -0.3, Math.sqrt(0.87))]) {
      const a = prepareCompression(mp, sh);
      const g = prepareCompression(mp, sh, { unrolled: false });
      const u = new Float64Array(3), v = new Float64Array(3);
      let worst = 0;
      for (let k = 0; k < 200; k++) {
        const x = 7 - 30 * ((k * 0.618) % 1), y = 30 * (((k * 0.377) % 1) - 0.5), z = 30 * (((k * 0.853) % 1) - 0.5);
        u.fill(0); v.fill(0);
        a.evaluate(u, x, y, z);
        g.evaluate(v, x, y, z);
        worst = Math.max(worst, Math.hypot(u[0] - v[0], u[1] - v[1], u[2] - v[2]));
      }
      expectAtMost(worst, 1e-12, 'unrolled vs generic, nT');
      const o = new Float64Array([1, 2, 3]);
      const b = new Float64Array(3);
      a.evaluate(b, -3, 4, 5);
      a.evaluate(o, -3, 4, 5);
      expect(Array.from(o)).toEqual([1 + b[0], 2 + b[1], 3 + b[2]]);
    }
  });

  it('validates its options', () => {
    const mp = shueMagnetopause(2, 0);
    const sh = tiltedDipole(0);
    expect(() => prepareCompression(mp, sh, { order: 0 })).toThrow(InputError);
    expect(() => prepareCompression(mp, sh, { order: 2.5 })).toThrow(/integer 1\.\.8/);
    expect(() => prepareCompression(mp, sh, { spacing: 0 })).toThrow(InputError);
    expect(() => prepareCompression(mp, sh, { fitDepthR0: -1 })).toThrow(/fitDepthR0/);
    expect(() => prepareCompression(mp, sh, { farTail: { depthRe: 60, weight: 2 } })).toThrow(/farTail\.weight.*0\.\.1/);
    expect(() => prepareCompression(mp, sh, { farTail: { depthRe: Number.NaN, weight: 0.05 } })).toThrow(/farTail\.depthRe/);
    expect(() => prepareCompression(mp, sh, { farTail: { depthRe: 60, weight: 0.05, spacing: 0 } })).toThrow(/farTail\.spacing/);
    expect(() => sphereSurface(0)).toThrow(InputError);
  });
});

describe('far-tail band of the fit (references §4, §12)', () => {
  const TIME = '2025-03-20T12:00:00Z';
  const CASES: [number, number][] = [[0.5, 0], [2, 0], [5, 0], [10, 0], [2, -5], [10, -20], [30, -40], [50, -50], [0.5, 5]];
  /** The model's compression field (dipole + tail + ring current shielded) at depths d, d − 0.25 r0, d + 0.25 r0. */
  function fits(p: number, bz: number, farTail?: null): CompressionField[] {
    const d = Math.max(2, 20.5 / shueMagnetopause(p, bz).r0Re);
    return [d, d - 0.25, d + 0.25].map((dd) => prepareModel({ time: TIME, internal: 'dipole', tiltDeg: 0, tail: true, pdynNpa: p, bzNt: bz }, { compression: { fitDepthR0: dd, ...(farTail === null ? { farTail } : {}) } }).compression!);
  }
  /** Largest change of B_c (nT) per fit-depth step over x = −20…−60 RE, z = 0, ±5 RE (y = 0), and largest |B_c| for x ≤ −30 RE. */
  function farTailFigures(farTail?: null): { step: number; size: number } {
    const a = new Float64Array(3), b = new Float64Array(3);
    let step = 0, size = 0;
    for (const [p, bz] of CASES) {
      const f = fits(p, bz, farTail);
      for (let x = -20; x >= -60; x -= 5) {
        for (const z of [0, 5, -5]) {
          a.fill(0);
          f[0].evaluate(a, x, 0, z);
          if (x <= -30) size = Math.max(size, Math.hypot(a[0], a[1], a[2]));
          for (const k of [1, 2]) {
            b.fill(0);
            f[k].evaluate(b, x, 0, z);
            step = Math.max(step, Math.hypot(a[0] - b[0], a[1] - b[1], a[2] - b[2]));
          }
        }
      }
    }
    return { step, size };
  }

  it('far down the tail B_c no longer depends on where the fitted region ends: ≤ 0.08 nT per 0.25 r0 step (1.2 nT without the band), |B_c| ≤ 3.5 nT beyond 30 RE (6.6 nT without)', () => {
    // A numerical parameter must not change the field (references §4). Measured with the band: 0.070 nT, 3.34 nT;
    // without it: 1.19 nT, 6.61 nT (both at 10 nPa, Bz 0).
    const on = farTailFigures();
    expectAtMost(on.step, 0.08, 'largest change of B_c per fit-depth step with the band');
    expectAtMost(on.size, 3.5, 'largest |B_c| for x ≤ −30 RE with the band');
    const off = farTailFigures(null);
    expectBetween(off.step, 1, 2, 'the same figure without the band (what the band fixes)');
    expectBetween(off.size, 6, 8, 'largest |B_c| for x ≤ −30 RE without the band');
  }, 60_000);

  it('reports the band apart from the fitted region: residual and sample count of the fitted region only; band to −60 RE at weight 0.05', () => {
    const on = prepareModel({ time: TIME, internal: 'dipole', tiltDeg: 0, tail: true, pdynNpa: 2, bzNt: 0 }).compression!;
    const off = prepareModel({ time: TIME, internal: 'dipole', tiltDeg: 0, tail: true, pdynNpa: 2, bzNt: 0 }, { compression: { farTail: null } }).compression!;
    expect(off.farBand).toBeNull();
    expect(on.farBand).not.toBeNull();
    expect(on.nSamples).toBe(off.nSamples);
    expect(on.fitRegion).toEqual(off.fitRegion);
    expectClose(on.fitRegion.xMinRe, -2 * shueMagnetopause(2, 0).r0Re, 1e-6, 'fitted region ends at −max(2 r0, 20.5 RE) = −2 r0 at 2 nPa, Bz 0 (r0 10.2519 RE, references §3)');
    expect(on.farBand!.weight).toBe(FAR_TAIL_FIT.weight);
    // Rings every 1 r0 from the edge: the last ring's centre lies within half a spacing of −60 RE (along the surface).
    expectBetween(on.farBand!.xMinRe, -60, -60 + 0.5 * 10.25, 'x of the last far-tail ring');
    // The band costs a little shielding in the fitted region: measured 0.95 % → 1.02 %.
    expectBetween(on.rmsResidualRel - off.rmsResidualRel, 0, 0.001, 'rms residual added by the band');
    // A fit that already reaches beyond −60 RE has no band.
    const deep = prepareCompression(shueMagnetopause(2, 0), tiltedDipole(0), { fitDepthR0: 7, farTail: FAR_TAIL_FIT });
    expect(deep.farBand).toBeNull();
  });
});

import { describe, expect, it } from 'vitest';
import { expectAtMost, expectBetween, expectClose } from '../../helpers';
import { addTiltedDipoleField } from '../../../src/physics/field/dipole';
import { RE_KM } from '../../../src/physics/constants';
import { InputError } from '../../../src/physics/errors';
import { DEFAULT_IMF_EFFICIENCY, DEFAULT_IMF_SATURATION_NT, prepareImf } from '../../../src/physics/field/imf';

/** B0 of the references §5 worked values. */
const B0 = 29800;

/** Total Bz of an untilted dipole plus the IMF term at an equatorial point. */
function equatorialBz(imf: ReturnType<typeof prepareImf>, r: number, phi: number): number {
  const o = new Float64Array(3);
  const x = r * Math.cos(phi), y = r * Math.sin(phi);
  addTiltedDipoleField(o, x, y, 0, B0, 0, 1);
  imf.evaluate(o, x, y, 0);
  return o[2];
}

/** Root of f on [lo, hi] by bisection (f changes sign). */
function bisect(f: (r: number) => number, lo: number, hi: number): number {
  let flo = f(lo);
  for (let i = 0; i < 200; i++) {
    const mid = 0.5 * (lo + hi);
    const fm = f(mid);
    if (Math.sign(fm) === Math.sign(flo)) { lo = mid; flo = fm; } else hi = mid;
  }
  return 0.5 * (lo + hi);
}

describe('penetrating IMF term (Dungey 1961, Phys. Rev. Lett. 6, 47)', () => {
  it('without saturation adds exactly ε·(0, By, Bz) everywhere, on top of what is in out', () => {
    const eps = 0.37;
    const imf = prepareImf(4.5, -7.25, eps, Infinity);
    for (const [x, y, z] of [[0, 0, 0], [12, -3, 5], [-200, 40, -60]]) {
      const o = new Float64Array([1.5, -2, 3]);
      imf.evaluate(o, x, y, z);
      expect(Array.from(o)).toEqual([1.5, -2 + eps * 4.5, 3 + eps * -7.25]);
    }
    expect(imf.byNt).toBe(eps * 4.5);
    expect(imf.bzNt).toBe(eps * -7.25);
  });

  it('efficiency 0 turns it off', () => {
    const o = new Float64Array([1, 2, 3]);
    prepareImf(10, -10, 0).evaluate(o, 5, 5, 5);
    expect(Array.from(o)).toEqual([1, 2, 3]);
  });

  it('validates efficiency in [0, 1] and the IMF components', () => {
    for (const e of [-0.01, 1.01, Number.NaN, Infinity]) {
      try {
        prepareImf(0, -5, e);
        throw new Error('no error');
      } catch (err) {
        expect(err).toBeInstanceOf(InputError);
        expect((err as InputError).field).toBe('imfEfficiency');
        expect((err as Error).message).toMatch(/0\.\.1/);
      }
    }
    expect(() => prepareImf(Number.NaN, 0, 0.5)).toThrow(/byNt/);
    expect(() => prepareImf(0, 2000, 0.5)).toThrow(/bzNt.*−1000\.\.1000 nT/);
    expect(prepareImf(0, -5, 1, Infinity).bzNt).toBe(-5);
    expect(() => prepareImf(0, -5, 1, 0)).toThrow(/imfSaturationNt/);
  });

  it('Dungey neutral ring: total Bz vanishes at r_n = (B0/(εb))^(1/3) on the equator (references §5, derived)', () => {
    // Worked value (references §5): b = 5 nT → r_n = 18.131 RE; b = 10 nT → 14.390 RE.
    for (const [b, rn] of [[5, 18.131], [10, 14.39]]) {
      const imf = prepareImf(0, -b, 1, Infinity);
      for (const phi of [0, 1.1, Math.PI, -2.3]) {
        const root = bisect((r) => equatorialBz(imf, r, phi), 2, 60);
        expectClose(root, rn, 5e-4, `null radius, b ${b} nT, φ ${phi}`);
        expectClose(root, Math.cbrt(B0 / b), 1e-9, `(B0/b)^(1/3), b ${b} nT`);
        expectAtMost(Math.abs(equatorialBz(imf, Math.cbrt(B0 / b), phi)), 1e-12, `|Bz| at r_n, b ${b}`);
        expect(equatorialBz(imf, 0.9 * rn, phi)).toBeGreaterThan(0);
        expect(equatorialBz(imf, 1.1 * rn, phi)).toBeLessThan(0);
      }
    }
    // With efficiency ε the ring sits at (B0/(ε b))^(1/3).
    const half = prepareImf(0, -5, 0.5, Infinity);
    expectClose(bisect((r) => equatorialBz(half, r, 0.4), 2, 80), Math.cbrt(B0 / 2.5), 1e-9, 'null radius with ε 0.5');
  });

  it('northward IMF puts the nulls on the dipole axis at (2B0/b)^(1/3) (references §5, derived)', () => {
    const b = 5;
    const imf = prepareImf(0, b, 1, Infinity);
    const zn = Math.cbrt((2 * B0) / b);
    for (const s of [1, -1]) {
      const o = new Float64Array(3);
      addTiltedDipoleField(o, 0, 0, s * zn, B0, 0, 1);
      imf.evaluate(o, 0, 0, s * zn);
      expectAtMost(Math.hypot(o[0], o[1], o[2]), 1e-12, `|B| at z = ${s}·${zn.toFixed(3)} RE`);
    }
  });

  it('DEFAULT_IMF_EFFICIENCY gives an open flux inside the typical 0.3–0.9 GWb for Bz −5 nT (Boakes et al. 2009; Dungey formulas, references §5)', () => {
    expectBetween(DEFAULT_IMF_EFFICIENCY, 0, 1, 'default efficiency');
    // The default penetrated field at Bz −5 nT (with the saturation) is the earlier calibration's value ε·b = 0.7 × 5 = 3.5 nT.
    const b = -prepareImf(0, -5, DEFAULT_IMF_EFFICIENCY).bzNt;
    expectClose(b, 3.5, 1e-3, 'default penetrated field at Bz −5 nT');
    const rn = Math.cbrt(B0 / b);
    // sin²θc = 3 / [2 r_n (1 + b/(2B0))] at r = 1 (references §5).
    const s2 = 3 / (2 * rn * (1 + b / (2 * B0)));
    // Open flux = ∫ B_r dA over the cap = 2π B0 RE² sin²θc (derived; reproduces 0.63 GWb for b = 5 nT).
    const fluxGwb = (2 * Math.PI * B0 * 1e-9 * (RE_KM * 1e3) ** 2 * s2) / 1e9;
    const s2Full = 3 / (2 * Math.cbrt(B0 / 5) * (1 + 5 / (2 * B0)));
    expectClose((2 * Math.PI * B0 * 1e-9 * (RE_KM * 1e3) ** 2 * s2Full) / 1e9, 0.63, 0.005, 'references §5 worked open flux, b 5 nT');
    expectBetween(fluxGwb, 0.3, 0.9, 'open flux per hemisphere with the default ε, Bz −5 nT');
    const latDeg = 90 - (Math.asin(Math.sqrt(s2)) * 180) / Math.PI;
    expectClose(latDeg, 74.3, 0.05, 'boundary latitude quoted in the doc comment (74.3° for ε = 0.7)');
  });

  it('saturates in the Hill–Siscoe form b = εB·B_s/(εB + B_s) (Hill 1984; Siscoe et al. 2002; references §10)', () => {
    const bs = DEFAULT_IMF_SATURATION_NT;
    for (const [by, bz] of [[0, -50], [0, -30], [20, -20], [-5, 10]]) {
      const e = DEFAULT_IMF_EFFICIENCY;
      const bt = e * Math.hypot(by, bz);
      const f = bs / (bt + bs);
      const imf = prepareImf(by, bz, e);
      expectClose(imf.bzNt, e * bz * f, 1e-12, `penetrated Bz for (${by}, ${bz})`);
      expectClose(imf.byNt, e * by * f, 1e-12, `penetrated By for (${by}, ${bz})`);
      expectAtMost(Math.hypot(imf.byNt, imf.bzNt), bs, 'never above the saturation field');
    }
    // Worked (derived): ε 0.9333, B_s 14 nT: Bz −30 → 9.333 nT; −50 → 10.769 nT; growth 1.4 nT where the unsaturated term grows 18.7 nT.
    expect(bs).toBe(14);
    expectClose(-prepareImf(0, -30, 0.9333).bzNt, (27.999 * 14) / 41.999, 1e-9, 'Bz −30 worked value');
    expectClose(-prepareImf(0, -50, 0.9333).bzNt, (46.665 * 14) / 60.665, 1e-9, 'Bz −50 worked value');
    // The quiet calibration: 3.5 nT penetrated at Bz −5 (references §12).
    expectClose(-prepareImf(0, -5, DEFAULT_IMF_EFFICIENCY).bzNt, 3.5, 1e-4, 'penetrated field at Bz −5 nT');
  });
});

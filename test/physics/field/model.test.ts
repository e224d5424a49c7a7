import { describe, it, expect } from 'vitest';
import { prepareModel, normalizeConditions } from '../../../src/physics/field/model';
import { addTiltedDipoleField } from '../../../src/physics/field/dipole';
import { InputError } from '../../../src/physics/errors';
import { expectClose, expectAtMost } from '../../helpers';

const T = '2025-03-20T22:00:00Z';
const base = { time: T, pdynNpa: 2, bzNt: -3, byNt: 2, internal: 'dipole' as const, magnetopause: true, imfEfficiency: 0.3 };

describe('model composition (DESIGN: B = B_internal + B_compression + B_imf)', () => {
  it('with every external term off the field is the tilted dipole of the date (derived)', () => {
    const m = prepareModel({ ...base, magnetopause: false, imfEfficiency: 0, tail: false }, { ringCurrent: false });
    const out = new Float64Array(3), ref = new Float64Array(3);
    for (const [x, y, z] of [[3, 1, 2], [-6, 2, -1], [0.5, -0.7, 1.1]]) {
      m.evaluate(out, x, y, z);
      ref.fill(0);
      addTiltedDipoleField(ref, x, y, z, m.dipole.b0Nt, m.frames.sinTilt, m.frames.cosTilt);
      for (let k = 0; k < 3; k++) expectClose(out[k], ref[k], 1e-12 * Math.hypot(...ref), `component ${k} at ${x},${y},${z}`);
    }
  });

  it('the IMF term adds exactly ε·(0, By, Bz) (Dungey 1961 superposition)', () => {
    // Saturation off (Infinity): the bare superposition.
    const off = prepareModel({ ...base, magnetopause: false, imfEfficiency: 0 }, { imfSaturationNt: Infinity });
    const on = prepareModel({ ...base, magnetopause: false, imfEfficiency: 0.3 }, { imfSaturationNt: Infinity });
    const a = new Float64Array(3), b = new Float64Array(3);
    off.evaluate(a, 4, -2, 1);
    on.evaluate(b, 4, -2, 1);
    expectClose(b[0] - a[0], 0, 1e-12, 'Bx difference');
    expectClose(b[1] - a[1], 0.3 * 2, 1e-12, 'By difference');
    expectClose(b[2] - a[2], 0.3 * -3, 1e-12, 'Bz difference');
  });

  it('the compression term switches with the magnetopause and adds a few tens of nT near Earth', () => {
    const off = prepareModel({ ...base, magnetopause: false });
    const on = prepareModel({ ...base, magnetopause: true });
    const a = new Float64Array(3), b = new Float64Array(3);
    off.evaluate(a, 0.5, 0, 0);
    on.evaluate(b, 0.5, 0, 0);
    const d = Math.hypot(b[0] - a[0], b[1] - a[1], b[2] - a[2]);
    // references §4: 5–25 nT per √nPa near the centre (O'Brien & McPherron 2000; Burton et al. 1975, from memory)
    expect(d / Math.sqrt(2)).toBeGreaterThan(5);
    expect(d / Math.sqrt(2)).toBeLessThan(25);
    expect(on.isInside(20, 0, 0)).toBe(false);
    expect(off.isInside(20, 0, 0)).toBe(true);
  });

  it('IGRF and dipole agree far from Earth (higher degrees fall off as r^-(n+2))', () => {
    const d = prepareModel({ ...base, magnetopause: false, imfEfficiency: 0 });
    const g = prepareModel({ ...base, magnetopause: false, imfEfficiency: 0, internal: 'igrf' });
    const a = new Float64Array(3), b = new Float64Array(3);
    d.evaluate(a, 6, 2, 1);
    g.evaluate(b, 6, 2, 1);
    const rel = Math.hypot(a[0] - b[0], a[1] - b[1], a[2] - b[2]) / Math.hypot(...a);
    // The quadrupole/dipole ratio is ~ (g2/g1)/r ≈ 0.1/6: a few per cent at 6 RE (IGRF-14 coefficients).
    expectAtMost(rel, 0.05, 'relative IGRF − dipole difference at 6.6 RE');
  });

  it('bad input is refused with the field named and the allowed range', () => {
    expect(() => normalizeConditions({ ...base, pdynNpa: -1 })).toThrow(/pdynNpa: .*allowed range/);
    expect(() => normalizeConditions({ ...base, bzNt: 2000 })).toThrow(InputError);
    expect(() => normalizeConditions({ ...base, imfEfficiency: 1.5 })).toThrow(/imfEfficiency/);
    expect(() => normalizeConditions({ ...base, internal: 'x' as never })).toThrow(/"dipole" or "igrf"/);
    expect(() => normalizeConditions({ ...base, time: 'yesterday' })).toThrow(/time/);
    expect(() => prepareModel({ ...base, time: '1890-01-01T00:00:00Z' })).toThrow(/1900/);
  });

  it('warns outside the Shue fitted range but still prepares (Shue et al. 1997 range)', () => {
    const m = prepareModel({ ...base, pdynNpa: 20 });
    expect(m.warnings.length).toBeGreaterThan(0);
    const out = new Float64Array(3);
    m.evaluate(out, 2, 0, 0);
    expect(Number.isFinite(out[2])).toBe(true);
  });
});

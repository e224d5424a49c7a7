import { describe, expect, it } from 'vitest';
import { expectAtMost, expectBetween, expectClose } from '../../helpers';
import { prepareTail, tailParameters, DEFAULT_TAIL_CALIBRATION, type TailParameters } from '../../../src/physics/field/tail';
import { prepareModel } from '../../../src/physics/field/model';
import { InputError } from '../../../src/physics/errors';
import { magnetopauseNormal, magnetopausePoint, shueRadius } from '../../../src/physics/field/magnetopause';
import { makeTracer, ovalBoundaries, mltGrid, openFluxWb } from '../../../src/physics/mapping';
import { RE_KM, RAD_PER_DEG } from '../../../src/physics/constants';

/** A straight, untapered sheet (the 2D analytic limit). */
const straight = (o: Partial<TailParameters> = {}): TailParameters => ({ lobeNt: 20, innerRe: 10, outerRe: [1e4], thicknessRe: 0.5, hingeRe: 8, widthRe: Infinity, taperPower: 1, ...o });

describe('tail current sheet (2D vector potential, derived)', () => {
  it('far above and below a wide band the field is the lobe field ±μ0K/2 (infinite-sheet limit, derived)', () => {
    const t = prepareTail(straight(), 0, 1);
    const o = new Float64Array(3);
    for (const z of [3, 10]) {
      // Infinite band: Bx = b z/√(z² + D²) exactly (derived); the finite band (x' from −10⁴ to −10 RE) lowers it by (s/π)(1/|u_o| + 1/|u_i|) ≤ 1.6e-3 relative here.
      const lobe = (20 * z) / Math.sqrt(z * z + 0.25);
      o.fill(0); t.evaluate(o, -3000, 7, z);
      expectClose(o[0], lobe, 2e-3 * 20, `north-lobe Bx at z = ${z} RE`);
      o.fill(0); t.evaluate(o, -3000, 7, -z);
      expectClose(o[0], -lobe, 2e-3 * 20, `south-lobe Bx at z = −${z} RE`);
      expectClose(o[1], 0, 0, 'By = 0 (current along y)');
    }
  });

  it('equals the superposed line currents integrated numerically over the band (closed form vs quadrature, derived)', () => {
    const p = straight({ innerRe: 8, outerRe: [30], thicknessRe: 2 });
    const t = prepareTail(p, 0, 1);
    const o = new Float64Array(3);
    // Regularised line current at x': Bx = (b/π)·z/ρ², Bz = −(b/π)(x − x')/ρ², ρ² = (x − x')² + z² + D², per unit x' (b = μ0K/2).
    const quad = (x: number, z: number): [number, number] => {
      const n = 20000, a = -30, c = -8, h = (c - a) / n;
      let bx = 0, bz = 0;
      for (let i = 0; i < n; i++) {
        const xp = a + (i + 0.5) * h;
        const r2 = (x - xp) ** 2 + z * z + 4;
        bx += (z / r2) * h;
        bz += (-(x - xp) / r2) * h;
      }
      return [(20 / Math.PI) * bx, (20 / Math.PI) * bz];
    };
    for (const [x, z] of [[-5, 1], [-12, 0.5], [-20, -3], [4, 6], [-35, 2]]) {
      o.fill(0); t.evaluate(o, x, 0, z);
      const [bx, bz] = quad(x, z);
      // Midpoint rule, 20,000 panels: error < 1e-6 nT here.
      expectClose(o[0], bx, 1e-5, `Bx at (${x}, ${z})`);
      expectClose(o[2], bz, 1e-5, `Bz at (${x}, ${z})`);
    }
  });

  it('nested bands: the single-atan2 angle sum equals the per-band closed form Σ[atan(u_o/s) − atan(u_i/s)], also where it exceeds π and 2π (derived)', () => {
    // Thin sheet (D = 0.3 RE): inside all three bands each angle is near π, so the sum approaches 3π.
    const p = straight({ innerRe: 8, outerRe: [20, 45, 300], thicknessRe: 0.3 });
    const t = prepareTail(p, 0, 1);
    const o = new Float64Array(3);
    let turnsSeen = 0;
    for (const x of [30, 0, -7.9, -8, -8.1, -15, -19.99, -20, -20.01, -30, -44.9, -45.1, -100, -299.9, -300.1, -2000]) {
      for (const z of [0, 1e-9, -0.01, 0.2, -1, 3, -12, 80]) {
        const s2 = z * z + 0.09, s = Math.sqrt(s2), ui = x + 8;
        let sum = 0, logRatio = 0;
        for (const e of p.outerRe) {
          sum += Math.atan((x + e) / s) - Math.atan(ui / s);
          logRatio += Math.log(((x + e) ** 2 + s2) / (ui * ui + s2));
        }
        if (sum > Math.PI) turnsSeen++;
        const b = 20 / 3; // per band
        o.fill(0); t.evaluate(o, x, 0, z);
        // Rounding only: the two forms differ by < 1e-13 relative (measured 1e-14).
        expectClose(o[0], (b / Math.PI) * (z / s) * sum, 1e-12 * (Math.abs(o[0]) + 1e-3), `Bx at (${x}, ${z})`);
        expectClose(o[2], -(b / (2 * Math.PI)) * logRatio, 1e-12 * (Math.abs(o[2]) + 1e-3), `Bz at (${x}, ${z})`);
      }
    }
    expect(turnsSeen).toBeGreaterThan(10);
  });

  it('is divergence-free with the hinge, taper and several bands (central differences, h = 1e-4 RE; derived: B = ∇×(A ŷ))', () => {
    const p = tailParameters(3, -6);
    const h = 1e-4;
    const a = new Float64Array(3), b = new Float64Array(3), c = new Float64Array(3);
    let worst = 0;
    for (const tilt of [-30, 0, 25]) {
      const t = prepareTail(p, Math.sin(tilt * RAD_PER_DEG), Math.cos(tilt * RAD_PER_DEG));
      for (let k = 0; k < 40; k++) {
        const x = 5 - 40 * ((k * 0.618) % 1), y = 30 * (((k * 0.377) % 1) - 0.5), z = 16 * (((k * 0.853) % 1) - 0.5);
        let div = 0;
        for (let ix = 0; ix < 3; ix++) {
          a.fill(0); b.fill(0);
          t.evaluate(a, x + (ix === 0 ? h : 0), y + (ix === 1 ? h : 0), z + (ix === 2 ? h : 0));
          t.evaluate(b, x - (ix === 0 ? h : 0), y - (ix === 1 ? h : 0), z - (ix === 2 ? h : 0));
          div += (a[ix] - b[ix]) / (2 * h);
        }
        c.fill(0); t.evaluate(c, x, y, z);
        worst = Math.max(worst, Math.abs(div) / (Math.hypot(c[0], c[1], c[2]) / p.thicknessRe + 1e-3));
      }
    }
    // Measured ≈ 1e-8 (finite-difference rounding).
    expectAtMost(worst, 1e-6, 'max |∇·B| relative to |B|/D');
  });

  it('the hinged sheet centre (Bx = 0) follows the dipole equator near Earth and lies flat at R_H tan ψ far out (our hinge, derived)', () => {
    const psi = 20 * RAD_PER_DEG;
    const t = prepareTail(straight({ innerRe: 2, outerRe: [200], thicknessRe: 1 }), Math.sin(psi), Math.cos(psi));
    const o = new Float64Array(3);
    const bxAt = (x: number, z: number) => { o.fill(0); t.evaluate(o, x, 0, z); return o[0]; };
    const centre = (x: number): number => {
      let lo = -30, hi = 30;
      for (let i = 0; i < 80; i++) { const m = 0.5 * (lo + hi); if (bxAt(x, m) > 0) hi = m; else lo = m; }
      return 0.5 * (lo + hi);
    };
    // Dipole equator x sin ψ + z cos ψ = 0 → z = −x tan ψ; z0 = −tan ψ R_H x/√(x² + R_H²) departs by O(x³/R_H²).
    expectClose(centre(-1), Math.tan(psi) * 1 / Math.sqrt(1 + 1 / 64), 1e-9, 'centre at x = −1 RE (hinge formula)');
    expectClose(centre(-1), Math.tan(psi), 0.01, 'centre at x = −1 RE vs the dipole equator');
    expectClose(centre(-150), 8 * Math.tan(psi), 0.01, 'centre far down the tail vs R_H tan ψ');
  });

  it('parameters: lobe ∝ √Pdyn, stronger (to the saturation) and closer for southward Bz, lengths scale with the Shue standoff', () => {
    const c = DEFAULT_TAIL_CALIBRATION;
    const q = tailParameters(2, 0), q8 = tailParameters(8, 0);
    // Soft cap L/(1 + (L/cap)⁴)^¼ (tail.ts): −0.46 % at the quiet 29.5 nT.
    const capped = (l: number): number => l / Math.pow(1 + (l / c.lobeCapNt) ** 4, 0.25);
    expectClose(q.lobeNt, capped(c.lobeNt), 1e-12, 'lobe field at the reference conditions');
    expectClose(q.lobeNt, c.lobeNt, 0.005 * c.lobeNt, 'the cap leaves the quiet lobe within 0.5 %');
    expectClose(q8.lobeNt, capped(2 * c.lobeNt), 1e-12, 'lobe ∝ √Pdyn (pressure balance) before the cap');
    // Saturation: never above the cap, however high the pressure.
    expectAtMost(tailParameters(30, -40).lobeNt, c.lobeCapNt, 'lobe at Pdyn 30, Bz −40');
    expectAtMost(tailParameters(1000, -100).lobeNt, c.lobeCapNt, 'lobe at Pdyn 1000');
    expect(tailParameters(50, -50).outerRe.at(-1)).toBeGreaterThanOrEqual(c.farEndMinRe);
    expect(tailParameters(2, 0, c, 9.5).innerRe).toBe(9.5);
    // At Pdyn 2, Bz 0 the Shue standoff is the reference 10.2519 RE (references §3), so the scale is 1.
    expectClose(q.innerRe, c.innerRe, 1e-4, 'inner edge at Pdyn 2, Bz 0');
    expect(q8.innerRe).toBeLessThan(q.innerRe);
    const s5 = tailParameters(2, -5), s50 = tailParameters(2, -50), n5 = tailParameters(2, 5);
    expectClose(s5.lobeNt, capped(c.lobeNt * (1 + 5 * c.lobePerSouthNt)), 1e-12, 'lobe growth with southward Bz');
    expectClose(s50.lobeNt, capped(c.lobeNt * c.lobeMaxFactor), 1e-12, 'lobe growth saturates');
    expectClose(n5.lobeNt, q.lobeNt, 1e-12, 'northward Bz: no growth');
    expect(s5.innerRe).toBeLessThan(q.innerRe);
    expectBetween(s50.innerRe, c.innerMinRe, c.innerMinRe, 'closest inner edge');
  });

  it('rejects bad parameters naming the field', () => {
    expect(() => prepareTail(straight({ outerRe: [5] }), 0, 1)).toThrow(InputError);
    expect(() => prepareTail(straight({ outerRe: [5] }), 0, 1)).toThrow(/outerRe/);
    expect(() => prepareTail(straight({ thicknessRe: 0 }), 0, 1)).toThrow(/thicknessRe/);
    expect(() => prepareTail(straight(), 0, 0)).toThrow(/cosTilt/);
    expect(() => tailParameters(-1, 0)).toThrow(/pdynNpa/);
  });
});

describe('tail in the model: the compression fit shields internal + tail', () => {
  /** Area-weighted rms of |B·n|/|B| on an independent (θ, φ) grid over the fitted region (as in compression.test.ts). */
  function residual(m: ReturnType<typeof prepareModel>): number {
    const mp = m.magnetopause!;
    const tm = m.compression!.fitRegion.thetaMaxRad;
    const p = new Float64Array(3), n = new Float64Array(3), b = new Float64Array(3);
    let sw = 0, sr = 0;
    for (let i = 0; i < 50; i++) {
      const th = ((i + 0.37) * tm) / 50;
      const r = shueRadius(mp, th);
      const w = r * r * Math.sin(th) * Math.sqrt(1 + (mp.alpha * Math.tan(th / 2)) ** 2);
      for (let j = 0; j < 40; j++) {
        magnetopausePoint(p, mp, th, ((j + 0.21) * 2 * Math.PI) / 40);
        magnetopauseNormal(n, mp, p[0], p[1], p[2]);
        // The shielded field: internal + tail + ring current + compression (the IMF is not shielded).
        m.evaluateInternal(b, p[0], p[1], p[2]);
        m.tail!.evaluate(b, p[0], p[1], p[2]);
        m.ringCurrent.evaluate(b, p[0], p[1], p[2]);
        m.compression!.evaluate(b, p[0], p[1], p[2]);
        const res = Math.abs(b[0] * n[0] + b[1] * n[1] + b[2] * n[2]) / Math.hypot(b[0], b[1], b[2]);
        sw += w; sr += w * res * res;
      }
    }
    return Math.sqrt(sr / sw);
  }

  it('rms |B·n|/|B| over the fitted region (x ≥ −max(2 r0, 20.5 RE)), Pdyn 0.5–10 nPa, Bz −10..10 nT: ≤ 1.76 % at zero tilt, ≤ 2.45 % at tilt ±35° (target 1 %, not met)', () => {
    let worst0 = 0, worstTilt = 0;
    for (const pd of [0.5, 2, 10]) {
      for (const bz of [-10, 0, 10]) {
        for (const tilt of [-35, 0, 35]) {
          const m = prepareModel({ internal: 'dipole', time: '2025-03-20T12:00:00Z', tiltDeg: tilt, pdynNpa: pd, bzNt: bz, tail: true });
          const r = residual(m);
          if (tilt === 0) worst0 = Math.max(worst0, r);
          else worstTilt = Math.max(worstTilt, r);
        }
      }
    }
    // Measured before the storm-time model: 0.97 % (tilt 0), 1.71 % (tilt ±35°). The storm-time model fits at least 20.5 RE down
    // the tail (2.9 r0 at 10 nPa, so the compression field stays small far down the tail) and shields
    // the ring current too (estimated Dst* −114 nT at Bz −10): measured 1.70 % (tilt 0, 10 nPa, Bz −10)
    // and 2.38 % (tilt ±35°, 10 nPa). The far-tail band of the fit (weight 0.05 to x = −60 RE, references §12) and
    // the lobe field of 29.5 nT: 1.754 % (tilt 0) and 2.447 % (tilt −35°), both at 10 nPa, Bz −10 (1.730 % and
    // 2.394 % without the band), so the zero-tilt bound moved from 1.75 % to 1.76 %.
    expectAtMost(worst0, 0.0176, 'worst rms residual at zero tilt');
    expectAtMost(worstTilt, 0.0245, 'worst rms residual at tilt ±35°');
  }, 60_000);

  it('switches: tail off gives no tail term; on adds the sheet and changes the field; default is on', () => {
    const base = { internal: 'dipole' as const, time: '2025-03-20T12:00:00Z', pdynNpa: 2, bzNt: -2 };
    const off = prepareModel({ ...base, tail: false }), on = prepareModel({ ...base, tail: true }), def = prepareModel(base);
    expect(off.tail).toBeNull();
    expect(on.tail).not.toBeNull();
    expect(def.conditions.tail).toBe(true);
    const a = new Float64Array(3), b = new Float64Array(3);
    off.evaluate(a, -10, 0, 0); on.evaluate(b, -10, 0, 0);
    // The sheet weakens the equatorial Bz earthward of and inside the current (stretching, derived from the sign of the current).
    expect(b[2]).toBeLessThan(a[2]);
    expect(() => prepareModel({ ...base, tail: 'yes' as unknown as boolean })).toThrow(/tail/);
  });
});

describe('openFluxWb (flux through the polar cap, derived)', () => {
  it('reproduces the Dungey open flux: b = 5 nT → 0.63 GWb, b = 10 nT → 0.79 GWb (references §5, B0 = 29,800 nT, r = 1, ε = 1)', () => {
    for (const [b, worked] of [[5, 0.63], [10, 0.79]]) {
      // 2020.0: B0 = 29,804.7 nT (references §2), within 0.02 % of the worked 29,800.
      // Bare Dungey superposition: no saturation, no ring current.
      const m = prepareModel({ internal: 'dipole', time: '2020-01-01T00:00:00Z', tiltDeg: 0, magnetopause: false, tail: false, imfEfficiency: 1, bzNt: -b, byNt: 0 }, { imfSaturationNt: Infinity, ringCurrent: false });
      const t = makeTracer(m, { altKm: 0, ellipsoid: false });
      const [north, south] = ovalBoundaries(m, t, ['north', 'south'], mltGrid(3));
      const b0 = m.dipole.b0Nt;
      // Φ = π RE² sin²θc (2B0 + b) at r = 1, sin²θc = 3/[2 r_n (1 + b/(2B0))] (references §5, derived).
      const rn = Math.cbrt(b0 / b);
      const s2 = 3 / (2 * rn * (1 + b / (2 * b0)));
      const exact = Math.PI * (RE_KM * 1e3) ** 2 * s2 * (2 * b0 + b) * 1e-9;
      for (const h of [north, south]) {
        const f = openFluxWb(m, h, { altKm: 0 });
        // Boundary bisection to 0.01° → |dΦ/Φ| ≤ 2·0.005°/θc·cot… ≈ 1e-3.
        expectClose(f / exact, 1, 2e-3, `${h.hemisphere} open flux vs the formula with B0 ${b0.toFixed(1)} nT`);
        expectClose(f / 1e9, worked, 0.005, `${h.hemisphere} open flux vs the worked ${worked} GWb`);
      }
    }
  }, 60_000);

  it('is NaN when a sector has no open–closed boundary, and rejects unequal sectors', () => {
    const m = prepareModel({ internal: 'dipole', time: '2020-01-01T00:00:00Z', tiltDeg: 0, magnetopause: false, tail: false, imfEfficiency: 0 });
    const t = makeTracer(m);
    const [h] = ovalBoundaries(m, t, ['north'], mltGrid(6));
    expect(Number.isFinite(openFluxWb(m, h)), 'pure dipole: lines beyond 100 RE count as open, a small cap').toBe(true);
    const gap = { ...h, sectors: h.sectors.map((s, i) => (i === 1 ? { ...s, openClosed: null } : s)) };
    expect(Number.isNaN(openFluxWb(m, gap))).toBe(true);
    const bad = { hemisphere: 'north' as const, sectors: [0, 1, 5].map((mlt) => ({ mltHours: mlt, openClosed: null, equatorward: null })) };
    expect(() => openFluxWb(m, bad)).toThrow(/equally spaced/);
  });
});

import { describe, it, expect } from 'vitest';
import { Tracer, type TraceField } from '../../../src/physics/trace/tracer';
import { LINE_CLOSED, LINE_OPEN, LINE_UNRESOLVED } from '../../../src/physics/trace/line-type';
import { dipoleField, addTiltedDipoleField } from '../../../src/physics/field/dipole';
import { equatorCrossing } from '../../../src/physics/trace/footpoint';
import { expectClose, expectAtMost, expectBetween } from '../../helpers';
import { RAD_PER_DEG, DEG_PER_RAD, RE_KM } from '../../../src/physics/constants';

const B0 = 29733; // references §1: the 2025 dipole

/** Untilted centred dipole, no boundary: the analytic reference of references §1. */
function dipoleOnly(b0 = B0): TraceField {
  return {
    evaluate(o, x, y, z) { dipoleField(o, x, y, z, b0); },
    isInside: () => true,
    boundaryMinRe: Infinity,
    geoZRow: new Float64Array([0, 0, 1]),
  };
}

function latOf(p: Float64Array, i: number): number {
  return Math.asin(p[3 * i + 2] / Math.hypot(p[3 * i], p[3 * i + 1], p[3 * i + 2])) * DEG_PER_RAD;
}

/** Dipole arc length equator → λ (references §1, derived): s = L/(2√3)[x√(1+x²) + asinh x], x = √3 sin λ. */
function arcLength(L: number, latRad: number): number {
  const x = Math.sqrt(3) * Math.sin(latRad);
  return (L / (2 * Math.sqrt(3))) * (x * Math.sqrt(1 + x * x) + Math.asinh(x));
}

describe('tracer against the analytic dipole (references §1, derived)', () => {
  it('footpoint latitude within 0.001° for L 2–12 at 110 km (cos²λ = (1+h/RE)/L)', () => {
    const t = new Tracer(dipoleOnly(), { ellipsoid: false, altKm: 110 });
    let worst = 0;
    for (let L = 2; L <= 12; L += 0.25) {
      expect(t.trace(L, 0, 0)).toBe(LINE_CLOSED);
      const exact = Math.acos(Math.sqrt((1 + 110 / RE_KM) / L)) * DEG_PER_RAD;
      worst = Math.max(worst, Math.abs(latOf(t.points, t.footPlus) - exact), Math.abs(latOf(t.points, t.footMinus) + exact));
    }
    // Measured 2.6e-4° with the default step factor.
    expectAtMost(worst, 1e-3, 'max footpoint latitude error (deg)');
  });

  it.each([
    // references §1 table: L, Λ at h=0, λ at h=110 km, lengths h=0 / 110 km, B_eq
    [4, 60.0, 59.715, 9.004, 8.968, 464.6],
    [6.6, 67.092, 66.884, 16.197, 16.162, 103.4],
    [10, 71.565, 71.401, 25.59, 25.555, 29.73],
  ])('L = %s: worked values of references §1', (L, lam0, lam110, len0, len110, beq) => {
    const t0 = new Tracer(dipoleOnly(), { ellipsoid: false, altKm: 0 });
    t0.trace(L, 0, 0);
    expectClose(latOf(t0.points, t0.footPlus), lam0, 1e-3, `Λ at h = 0, L = ${L}`);
    expectClose(t0.lengthRe, len0, 1.5e-3, `length h = 0, L = ${L} (table rounded to 1e-3)`);
    const t = new Tracer(dipoleOnly(), { ellipsoid: false, altKm: 110 });
    t.trace(L, 0, 0);
    expectClose(latOf(t.points, t.footPlus), lam110, 1e-3, `λ at 110 km, L = ${L}`);
    expectClose(t.lengthRe, len110, 1.5e-3, `length h = 110 km, L = ${L}`);
    const eq = equatorCrossing(t.points, t.bMag, t.nPoints)!;
    expectClose(eq.bNt, beq, beq * 5e-4, `equatorial |B| = B0/L³, L = ${L}`);
    expectClose(eq.rRe, L, 1e-4 * L, 'minimum-|B| distance equals L');
  });

  it('length matches the analytic arc length to 4e-4 RE for L 2–12', () => {
    const t = new Tracer(dipoleOnly(), { ellipsoid: false, altKm: 110 });
    for (let L = 2; L <= 12; L += 1) {
      t.trace(L, 0, 0);
      const lam = Math.acos(Math.sqrt((1 + 110 / RE_KM) / L));
      expectClose(t.lengthRe, 2 * arcLength(L, lam), 4e-4, `length L = ${L} (RE)`);
    }
  });

  it('the footpoint lies on the stop surface exactly (interpolated, not the last step)', () => {
    const t = new Tracer(dipoleOnly(), { ellipsoid: false, altKm: 110 });
    t.trace(5.3, 0, 0);
    for (const i of [t.footMinus, t.footPlus]) {
      const p = t.points;
      expectClose(Math.hypot(p[3 * i], p[3 * i + 1], p[3 * i + 2]), 1 + 110 / RE_KM, 1e-10, 'footpoint radius');
    }
  });

  it('RK4 global error falls ~16× when the step halves (derived: 4th order)', () => {
    const L = 6;
    const exact = Math.acos(Math.sqrt((1 + 110 / RE_KM) / L)) * DEG_PER_RAD;
    const err = (sf: number) => {
      const t = new Tracer(dipoleOnly(), { ellipsoid: false, altKm: 110, stepFactor: sf, hMaxRe: 10 });
      t.trace(L, 0, 0);
      return Math.abs(latOf(t.points, t.footPlus) - exact);
    };
    const e1 = err(0.2), e2 = err(0.1), e3 = err(0.05);
    const order1 = Math.log2(e1 / e2), order2 = Math.log2(e2 / e3);
    expectBetween(order1, 3.5, 4.6, 'observed order 0.2→0.1');
    expectBetween(order2, 3.5, 4.6, 'observed order 0.1→0.05');
  });

  it('a seed below the footpoint surface maps up to it and on to the far end', () => {
    // Ground seed at 65° on the dipole; footpoints at 110 km: both on the line through the seed.
    const t = new Tracer(dipoleOnly(), { ellipsoid: false, altKm: 110 });
    const lat = 65 * RAD_PER_DEG;
    const type = t.trace(Math.cos(lat), 0, Math.sin(lat));
    expect(type).toBe(LINE_CLOSED);
    const L = 1 / Math.cos(lat) ** 2;
    const exact = Math.acos(Math.sqrt((1 + 110 / RE_KM) / L)) * DEG_PER_RAD;
    expectClose(latOf(t.points, t.footPlus), exact, 1e-3, 'near footpoint above the seed');
    expectClose(latOf(t.points, t.footMinus), -exact, 1e-3, 'conjugate footpoint');
  });

  it('tilted dipole: the conjugate has the same magnetic longitude and opposite latitude (derived)', () => {
    const tilt = 25 * RAD_PER_DEG;
    const s = Math.sin(tilt), c = Math.cos(tilt);
    const field: TraceField = {
      evaluate(o, x, y, z) { o[0] = 0; o[1] = 0; o[2] = 0; addTiltedDipoleField(o, x, y, z, B0, s, c); },
      isInside: () => true, boundaryMinRe: Infinity, geoZRow: new Float64Array([0, 0, 1]),
    };
    const t = new Tracer(field, { ellipsoid: false, altKm: 0 });
    for (const [lat, lon] of [[62, 30], [55, 140], [70, -100]]) {
      const la = lat * RAD_PER_DEG, lo = lon * RAD_PER_DEG;
      // Seed in SM, rotate to GSM (x_gsm = x_sm cos ψ + z_sm sin ψ, z_gsm = −x_sm sin ψ + z_sm cos ψ).
      const xs = Math.cos(la) * Math.cos(lo), ys = Math.cos(la) * Math.sin(lo), zs = Math.sin(la);
      t.trace(xs * c + zs * s, ys, -xs * s + zs * c);
      const p = t.points, i = t.footMinus;
      const xg = p[3 * i], yg = p[3 * i + 1], zg = p[3 * i + 2];
      const xsm = xg * c - zg * s, zsm = xg * s + zg * c;
      expectClose(Math.asin(zsm / Math.hypot(xsm, yg, zsm)) * DEG_PER_RAD, -lat, 3e-4, 'conjugate magnetic latitude (ground footpoint; measured 1.3e-4°)');
      expectClose(Math.atan2(yg, xsm) * DEG_PER_RAD, lon, 3e-4, 'conjugate magnetic longitude');
    }
  });
});

describe('stop rules', () => {
  it('a line leaving through a boundary is open', () => {
    const f = dipoleOnly();
    const field: TraceField = { ...f, isInside: (x, y, z) => Math.hypot(x, y, z) < 8, boundaryMinRe: 8 };
    const t = new Tracer(field, { ellipsoid: false });
    expect(t.trace(10, 0, 0)).toBe(LINE_OPEN);
    expect(t.trace(6, 0, 0)).toBe(LINE_CLOSED);
  });
  it('a distance limit makes a line open; a step budget makes it unresolved (reported)', () => {
    expect(new Tracer(dipoleOnly(), { ellipsoid: false, rMaxRe: 20 }).trace(30, 0, 0)).toBe(LINE_OPEN);
    const t = new Tracer(dipoleOnly(), { ellipsoid: false, maxSteps: 10 });
    expect(t.trace(8, 0, 0)).toBe(LINE_UNRESOLVED);
    expect(t.nPoints).toBeGreaterThan(10);
  });
  it('a zero field (a null point) ends the line as unresolved, never NaN', () => {
    const field: TraceField = { evaluate(o) { o[0] = 0; o[1] = 0; o[2] = 0; }, isInside: () => true, boundaryMinRe: Infinity, geoZRow: new Float64Array([0, 0, 1]) };
    expect(new Tracer(field).trace(3, 0, 0)).toBe(LINE_UNRESOLVED);
  });
});

describe('landing and seeds on the stop surface', () => {
  it('a seed on the stop surface is its own footpoint, and the far footpoint is the dipole conjugate (references §1, derived)', () => {
    const t = new Tracer(dipoleOnly(), { ellipsoid: false, altKm: 110 });
    const rStop = 1 + 110 / RE_KM;
    for (const latDeg of [55, 65, 72]) {
      const lat = latDeg * RAD_PER_DEG;
      const x = rStop * Math.cos(lat), z = rStop * Math.sin(lat);
      expect(t.trace(x, 0, z)).toBe(LINE_CLOSED);
      // The northern seed: the +B half goes down at once, the −B half starts at the seed itself.
      expect(t.footPlus).toBe(t.seedIndex);
      const p = t.points, i = t.footPlus;
      expect([p[3 * i], p[3 * i + 1], p[3 * i + 2]]).toEqual([x, 0, z]);
      // Dipole: the conjugate footpoint at the same height has the opposite latitude.
      expectClose(latOf(p, t.footMinus), -latDeg, 3e-4, `conjugate of ${latDeg}° (same L, same height)`);
      expectClose(Math.hypot(p[3 * t.footMinus], p[3 * t.footMinus + 1], p[3 * t.footMinus + 2]), rStop, 1e-10, 'far footpoint radius');
    }
  });

  it('the Hermite landing agrees with a fine-step trace: footpoint error falls with the step like RK4 (derived: both O(h⁴))', () => {
    // Footpoint latitude error against the analytic dipole (references §1) with a coarse and a halved step; the
    // landing happens on the last step's cubic Hermite curve, so a landing error of lower order would show here.
    const L = 7.3;
    const exact = Math.acos(Math.sqrt((1 + 110 / RE_KM) / L)) * DEG_PER_RAD;
    const err = (sf: number) => {
      const t = new Tracer(dipoleOnly(), { ellipsoid: false, altKm: 110, stepFactor: sf, hMaxRe: 10 });
      t.trace(L, 0, 0);
      return Math.max(Math.abs(latOf(t.points, t.footPlus) - exact), Math.abs(latOf(t.points, t.footMinus) + exact));
    };
    const order = Math.log2(err(0.16) / err(0.08));
    expectBetween(order, 3.3, 4.7, 'observed order 0.16→0.08 including the landing');
  });

  it('counts one evaluation per landing beyond the crossing step (no repeated partial steps)', () => {
    let evals = 0;
    const f = dipoleOnly();
    const counting: TraceField = { ...f, evaluate(o, x, y, z) { evals++; f.evaluate(o, x, y, z); } };
    const t = new Tracer(counting, { ellipsoid: false, altKm: 110 });
    t.trace(5, 0, 0);
    expect(t.evals).toBe(evals);
    // Each half: 1 at the seed + 4 per full step (3 stages + the step end) + 1 at the landed point.
    const steps = t.nPoints - 1 - 2; // points beyond the seed, less the two landed footpoints
    expect(evals).toBe(2 + 4 * (steps + 2) + 2);
  });
});

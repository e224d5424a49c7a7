import { describe, expect, it } from 'vitest';
import { expectAtMost, expectClose, pointAngleDeg } from '../../helpers';
import { ellipticKE, ellipticKEPoly, prepareRingCurrent, ringCurrentParameters, RING_POLY_MIN_M } from '../../../src/physics/field/ringcurrent';
import { prepareModel, type PreparedModel } from '../../../src/physics/field/model';
import { Tracer, type TraceField } from '../../../src/physics/trace/tracer';
import { geoFromGeodetic } from '../../../src/physics/frames/geodesy';
import { applyMat3 } from '../../../src/physics/frames/rotations';
import { agmRingEvaluate } from './ring-agm-reference';

describe('K and E by the polynomials of Abramowitz & Stegun 17.3.34 / 17.3.36', () => {
  it('agree with the AGM (A&S §17.6) to the stated 2e-8 over m ∈ [0, 1 − 1e-12], and with A&S Table 17.1 at m = 0.5', () => {
    const p = new Float64Array(2), q = new Float64Array(2);
    let worstK = 0, worstE = 0;
    const check = (m1Wanted: number): void => {
      const m = 1 - m1Wanted, m1 = 1 - m; // m1 exactly 1 − m (Sterbenz), so both functions see the same parameter
      ellipticKEPoly(p, m1);
      ellipticKE(q, m);
      worstK = Math.max(worstK, Math.abs(p[0] - q[0]));
      worstE = Math.max(worstE, Math.abs(p[1] - q[1]));
    };
    for (let i = 0; i <= 20000; i++) check(1 - i / 20000 + (i === 20000 ? 1e-12 : 0)); // m = 0 … 1 − 1e-12, uniform in m
    for (let e = -12; e <= 0; e += 0.01) check(10 ** e); // m1 log-uniform (near m = 1)
    // Measured: K 1.35e-8, E 1.57e-8 (A&S state |ε| ≤ 2e-8 for each).
    expectAtMost(worstK, 2e-8, 'largest |K_poly − K_AGM|');
    expectAtMost(worstE, 2e-8, 'largest |E_poly − E_AGM|');
    ellipticKEPoly(p, 0.5);
    expectClose(p[0], 1.8540746773013719, 2e-8, 'K(0.5) (A&S Table 17.1, from memory)');
    expectClose(p[1], 1.3506438810476755, 2e-8, 'E(0.5) (A&S Table 17.1, from memory)');
  });
});

/** Points 0.02–40 RE, log-uniform in radius, with a share close to the dipole axis and to the loops' radii. */
function testPoints(n: number, seed: number): Float64Array {
  let s = seed;
  const rnd = (): number => ((s = (s * 1103515245 + 12345) % 2147483648) / 2147483648);
  const pts = new Float64Array(3 * n);
  for (let i = 0; i < n; i++) {
    const r = Math.exp(Math.log(0.02) + Math.log(40 / 0.02) * rnd());
    let u = 2 * rnd() - 1;
    if (i % 4 === 0) u = Math.sign(u || 1) * (1 - 1e-6 * rnd()); // within ~1e-3 r of the axis (m small: the AGM branch)
    const ph = 2 * Math.PI * rnd(), sq = Math.sqrt(1 - u * u);
    pts[3 * i] = r * sq * Math.cos(ph); pts[3 * i + 1] = r * sq * Math.sin(ph); pts[3 * i + 2] = r * u;
  }
  return pts;
}

describe('ring current with the polynomial K, E against the AGM ring (references §10)', () => {
  it(`differs by ≤ 3e-8 |Dst*| over 0.02–40 RE, near the axis and the loops, storms −10 to −600 nT, tilt ±35° (m < ${RING_POLY_MIN_M}: AGM)`, () => {
    const o = new Float64Array(3), r = new Float64Array(3);
    let worst = 0, worstLocal = 0;
    for (const dst of [-10, -80, -250, -600]) {
      for (const tiltDeg of [-35, 0, 20]) {
        const t = (tiltDeg * Math.PI) / 180;
        const ring = prepareRingCurrent(ringCurrentParameters(dst), Math.sin(t), Math.cos(t));
        const ref = agmRingEvaluate(ring, Math.sin(t), Math.cos(t));
        const pts = testPoints(4000, 97 - dst);
        for (let i = 0; i < pts.length; i += 3) {
          o.fill(0); r.fill(0);
          ring.evaluate(o, pts[i], pts[i + 1], pts[i + 2]);
          ref(r, pts[i], pts[i + 1], pts[i + 2]);
          const d = Math.hypot(o[0] - r[0], o[1] - r[1], o[2] - r[2]);
          worst = Math.max(worst, d / Math.abs(ring.params.centreNt));
          worstLocal = Math.max(worstLocal, d / Math.hypot(r[0], r[1], r[2]));
        }
      }
    }
    // Bound (derived): |ΔK|, |ΔE| ≤ 2e-8 give a field error of order 2e-8 of the loops' field scale (the centre
    // field Dst*), and ≤ 6.8·2e-8/m² of B_ρ where m is small (B_ρ ≪ B_z there). Measured 1.0e-8 |Dst*|; relative
    // to the local ring field 5.3e-7 at worst (where B_z changes sign beside the loops, |B| ≈ 0.004 |Dst*|).
    expectAtMost(worst, 3e-8, 'largest |B_poly − B_AGM| / |Dst*|');
    expectAtMost(worstLocal, 1e-6, 'largest |B_poly − B_AGM| / |B_AGM|');
  });

  it('moves traced footpoints by ≤ 1e-4° (random invented sites, storm indices, solar wind; IGRF and dipole)', () => {
    let s = 31415;
    const rnd = (): number => ((s = (s * 1103515245 + 12345) % 2147483648) / 2147483648);
    const g = new Float64Array(3), p = new Float64Array(3);
    let worst = 0, compared = 0;
    for (let k = 0; k < 12; k++) {
      const model = prepareModel({
        time: new Date(Date.UTC(2025, 0, 1) + Math.floor(rnd() * 365 * 24) * 3_600_000).toISOString(),
        internal: k % 3 === 0 ? 'dipole' : 'igrf', pdynNpa: 0.8 + 6 * rnd(), bzNt: -12 + 16 * rnd(), byNt: -6 + 12 * rnd(),
        dstNt: -20 - 280 * rnd(), tail: true,
      });
      const fast = new Tracer(model);
      const slow = new Tracer(withAgmRing(model));
      for (let j = 0; j < 12; j++) {
        geoFromGeodetic(g, (40 + 38 * rnd()) * (rnd() < 0.5 ? 1 : -1), 360 * rnd() - 180, 110);
        applyMat3(p, model.frames.gsmFromGeo, g[0], g[1], g[2]);
        const typeSlow = slow.trace(p[0], p[1], p[2]);
        const typeFast = fast.trace(p[0], p[1], p[2]);
        expect(typeFast, `line type at ${k}/${j}`).toBe(typeSlow);
        for (const end of ['footMinus', 'footPlus'] as const) {
          expect(fast[end] >= 0, `${end} present in both at ${k}/${j}`).toBe(slow[end] >= 0);
          if (slow[end] < 0) continue;
          worst = Math.max(worst, pointAngleDeg(fast.points, fast[end], slow.points, slow[end]));
          compared++;
        }
      }
    }
    expect(compared).toBeGreaterThan(150);
    // Measured worst 1.3e-7° over 268 footpoints.
    expectAtMost(worst, 1e-4, 'largest footpoint difference, polynomial vs AGM ring (deg)');
  });
});

/** The model's field with its ring replaced by the AGM ring (every other term, the fit and the boundary its own). */
function withAgmRing(model: PreparedModel): TraceField {
  const ring = model.ringCurrent;
  const ref = agmRingEvaluate(ring, model.frames.sinTilt, model.frames.cosTilt);
  const w = new Float64Array(3);
  return {
    evaluate(out, x, y, z) {
      model.evaluate(out, x, y, z);
      w.fill(0);
      ring.evaluate(w, x, y, z);
      out[0] -= w[0]; out[1] -= w[1]; out[2] -= w[2];
      ref(out, x, y, z);
    },
    isInside: model.isInside,
    boundaryMinRe: model.boundaryMinRe,
    geoZRow: model.geoZRow,
    neutralLineXRe: model.neutralLineXRe,
  };
}


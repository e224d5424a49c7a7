/**
 * Classification traces (Tracer.trace with returnStopRe, used by the boundary searches): a line's
 * return leg stops where it comes back inward below the return radius. Reference: the full trace
 * of the same line by the same tracer (to the ground) — the line type must be the same and the
 * equatorial crossing (minimum |B|, what the equatorward edge uses) identical to the bit, since
 * every point up to the stop is the full trace's point. Random conditions up to the limits of
 * `classificationReturnRe` (|Dst*| up to 800 nT), random footpoints 30–89.99° in both
 * hemispheres, IGRF and the centred dipole. Fixed seed; FC_SEED=<n> explores other cases.
 */
import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { prepareModel } from '../../../src/physics/field/model';
import { makeTracer, classificationReturnRe } from '../../../src/physics/mapping';
import { equatorCrossing, gsmAtMagneticLatMlt } from '../../../src/physics/trace/footpoint';
import { END_RETURNED, END_SURFACE, LINE_CLOSED } from '../../../src/physics/trace/line-type';

const seed = Number(process.env.FC_SEED ?? 20261203);

describe('classification traces (returnStopRe) against full traces', () => {
  it('give the full trace\'s line type and equatorial crossing, with fewer evaluations', () => {
    let evalsFull = 0, evalsShort = 0, returned = 0, lines = 0;
    fc.assert(fc.property(
      fc.record({
        ms: fc.integer({ min: Date.UTC(2021, 0, 1), max: Date.UTC(2029, 11, 31) }),
        pdynNpa: fc.double({ min: 0.5, max: 40, noNaN: true }),
        bzNt: fc.double({ min: -50, max: 10, noNaN: true }),
        byNt: fc.double({ min: -15, max: 15, noNaN: true }),
        dstNt: fc.option(fc.double({ min: -900, max: 20, noNaN: true }), { nil: null }),
        internal: fc.constantFrom('igrf' as const, 'dipole' as const),
      }),
      fc.array(fc.record({ lat: fc.double({ min: 30, max: 89.99, noNaN: true }), mlt: fc.double({ min: 0, max: 24, noNaN: true, maxExcluded: true }), south: fc.boolean() }), { minLength: 6, maxLength: 6 }),
      (c, probes) => {
        const m = prepareModel({ time: new Date(c.ms).toISOString(), pdynNpa: c.pdynNpa, bzNt: c.bzNt, byNt: c.byNt, dstNt: c.dstNt, internal: c.internal, magnetopause: true, imfEfficiency: 0.9333, tail: true });
        const rRet = classificationReturnRe(m);
        const t = makeTracer(m, { altKm: 110, ellipsoid: true });
        const p = new Float64Array(3);
        for (const q of probes) {
          gsmAtMagneticLatMlt(p, m.frames, q.south ? -q.lat : q.lat, q.mlt, 110, true);
          const full = t.trace(p[0], p[1], p[2]);
          evalsFull += t.evals;
          const eqFull = full === LINE_CLOSED ? equatorCrossing(t.points, t.bMag, t.nPoints) : null;
          const short = t.trace(p[0], p[1], p[2], rRet);
          evalsShort += t.evals;
          lines++;
          if (t.endMinus === END_RETURNED || t.endPlus === END_RETURNED) returned++;
          const what = `${JSON.stringify(c)} at ${q.south ? -q.lat : q.lat}°, MLT ${q.mlt} (return radius ${rRet} RE)`;
          expect(short, `${what}: line type`).toBe(full);
          const eqShort = short === LINE_CLOSED ? equatorCrossing(t.points, t.bMag, t.nPoints) : null;
          expect(eqShort?.rRe ?? null, `${what}: equatorial distance`).toBe(eqFull?.rRe ?? null);
        }
      },
    ), { seed, numRuns: 60 });
    // The stop is used (not a test of nothing) and saves evaluations.
    expect(returned / lines).toBeGreaterThan(0.15);
    expect(evalsShort).toBeLessThan(0.95 * evalsFull);
  });

  it('end a dipole line where it comes back below the return radius, and not a line that never rises above it', () => {
    // Centred dipole, no external terms: the line from 60° (L = 4.07 at 110 km) has its apex at ~4 RE.
    const m = prepareModel({ time: '2025-03-20T12:00:00Z', pdynNpa: 2, bzNt: 0, byNt: 0, internal: 'dipole', magnetopause: false, imfEfficiency: 0, tail: false, tiltDeg: 0, dstNt: 0 });
    const t = makeTracer(m, { altKm: 110, ellipsoid: false });
    const p = new Float64Array(3);
    gsmAtMagneticLatMlt(p, m.frames, 60, 0, 110, false);
    t.trace(p[0], p[1], p[2], 2);
    expect(t.endPlus === END_RETURNED || t.endMinus === END_RETURNED).toBe(true);
    // The −B half is stored reversed at the front of the points, the +B half at the back.
    const [last, prev] = t.endMinus === END_RETURNED ? [0, 1] : [t.nPoints - 1, t.nPoints - 2];
    const r = (i: number) => Math.hypot(t.points[3 * i], t.points[3 * i + 1], t.points[3 * i + 2]);
    expect(r(last)).toBeLessThan(2);
    expect(r(prev)).toBeGreaterThanOrEqual(2);
    expect(t.footMinus === -1 || t.footPlus === -1).toBe(true);
    // 40°: L = 1.71 at 110 km, below the return radius: traced to the ground.
    gsmAtMagneticLatMlt(p, m.frames, 40, 0, 110, false);
    t.trace(p[0], p[1], p[2], 2);
    expect([t.endMinus, t.endPlus].includes(END_RETURNED)).toBe(false);
    expect([t.endMinus, t.endPlus].includes(END_SURFACE)).toBe(true);
  });
});

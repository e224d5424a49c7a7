/**
 * Property: a hint changes the cost of a boundary search, never its answer (DEVELOPERS.md,
 * "Boundary searches"). For random conditions, MLTs, hemispheres and hints — good ones (the
 * answer itself, slightly off), bad ones (degrees off, above the pole region, below the floor,
 * one edge only, tiny and huge bracket widths) — the hinted search equals the unhinted one to the
 * search tolerance (0.01°) on both boundaries, and gives the same missing-boundary reasons.
 * Reference: the unhinted search of the same model and tracer (sectorBoundaries without a hint).
 * Runs with a fixed seed so a failure reproduces; FC_SEED=<n> explores other cases.
 */
import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { expectClose } from '../../helpers';
import { prepareModel } from '../../../src/physics/field/model';
import { makeTracer, sectorBoundaries, type BoundaryHint, type SectorBoundaries } from '../../../src/physics/mapping';

const TOL_DEG = 0.01;

const conditions = fc.record({
  // Inside IGRF-14's span (2020–2030).
  ms: fc.integer({ min: Date.UTC(2021, 0, 1), max: Date.UTC(2029, 11, 31) }),
  pdynNpa: fc.double({ min: 0.5, max: 30, noNaN: true }),
  bzNt: fc.double({ min: -30, max: 10, noNaN: true }),
  byNt: fc.double({ min: -10, max: 10, noNaN: true }),
  dstNt: fc.option(fc.double({ min: -300, max: 20, noNaN: true }), { nil: null }),
  internal: fc.constantFrom('igrf' as const, 'dipole' as const),
});

/** How a hint is made from the unhinted answer (or from nothing): every kind a caller could pass. */
type HintKind =
  | { kind: 'offset'; dOc: number; dEq: number; halfWidthDeg?: number }
  | { kind: 'fixed'; oc?: number; eq?: number; halfWidthDeg?: number };

const hintKinds: fc.Arbitrary<HintKind> = fc.oneof(
  // Near the answer (a neighbouring MLT's answer), with the default or an explicit width.
  fc.record({ kind: fc.constant('offset' as const), dOc: fc.double({ min: -0.5, max: 0.5, noNaN: true }), dEq: fc.double({ min: -0.5, max: 0.5, noNaN: true }), halfWidthDeg: fc.option(fc.double({ min: 0.01, max: 3, noNaN: true }), { nil: undefined }) }),
  // Degrees off in either direction.
  fc.record({ kind: fc.constant('offset' as const), dOc: fc.double({ min: -8, max: 8, noNaN: true }), dEq: fc.double({ min: -8, max: 8, noNaN: true }) }),
  // Anywhere (including below the 30° floor and at the pole), one edge or both.
  fc.record({ kind: fc.constant('fixed' as const), oc: fc.option(fc.double({ min: 0, max: 90, noNaN: true }), { nil: undefined }), eq: fc.option(fc.double({ min: 0, max: 90, noNaN: true }), { nil: undefined }), halfWidthDeg: fc.option(fc.double({ min: 0, max: 10, noNaN: true }), { nil: undefined }) }),
);

const absLat = (b: SectorBoundaries['openClosed']): number | undefined => (b ? Math.abs(b.magLatDeg) : undefined);

function makeHint(k: HintKind, ref: SectorBoundaries): BoundaryHint {
  if (k.kind === 'fixed') return { openClosedLatDeg: k.oc, equatorwardLatDeg: k.eq, halfWidthDeg: k.halfWidthDeg };
  const oc = absLat(ref.openClosed), eq = absLat(ref.equatorward);
  return {
    openClosedLatDeg: oc === undefined ? undefined : oc + k.dOc,
    equatorwardLatDeg: eq === undefined ? undefined : eq + k.dEq,
    halfWidthDeg: k.halfWidthDeg,
  };
}

function expectSame(got: SectorBoundaries, ref: SectorBoundaries, what: string): void {
  expect(got.openClosedReason ?? null, `${what}: open–closed reason`).toBe(ref.openClosedReason ?? null);
  expect(got.equatorwardReason ?? null, `${what}: equatorward reason`).toBe(ref.equatorwardReason ?? null);
  for (const e of ['openClosed', 'equatorward'] as const) {
    const a = got[e], b = ref[e];
    expect(a === null, `${what}: ${e} found in one search only`).toBe(b === null);
    if (a && b) expectClose(a.magLatDeg, b.magLatDeg, TOL_DEG, `${what}: ${e} magnetic latitude (hinted vs unhinted)`);
  }
}

describe('boundary searches: hinted = unhinted to 0.01° (property, reference: the unhinted search)', () => {
  it('random conditions, MLTs, hemispheres and good or bad hints', () => {
    const seed = process.env.FC_SEED ? Number(process.env.FC_SEED) : 1403;
    fc.assert(
      fc.property(conditions, fc.double({ min: 0, max: 24, noNaN: true, maxExcluded: true }), fc.boolean(), fc.array(hintKinds, { minLength: 2, maxLength: 3 }), (c, mlt, north, kinds) => {
        const m = prepareModel({ time: new Date(c.ms).toISOString(), pdynNpa: c.pdynNpa, bzNt: c.bzNt, byNt: c.byNt, dstNt: c.dstNt, internal: c.internal });
        const t = makeTracer(m);
        const h = north ? 'north' : 'south';
        const ref = sectorBoundaries(m, t, h, mlt);
        const where = `${new Date(c.ms).toISOString()} Pdyn ${c.pdynNpa} Bz ${c.bzNt} By ${c.byNt} Dst ${c.dstNt} ${c.internal}, ${h} MLT ${mlt}`;
        for (const k of kinds) {
          const hint = makeHint(k, ref);
          expectSame(sectorBoundaries(m, t, h, mlt, {}, hint), ref, `${where}, hint ${JSON.stringify(hint)}`);
        }
      }),
      { numRuns: 150, seed },
    );
  }, 120_000);
});

/**
 * The main field of a date is prepared once and kept (model.ts, mainFieldOfDate): a model built
 * from the kept entry must equal a freshly prepared one to the bit, for every kind of main field,
 * whatever condition filled the cache, and a different instant must never get another's entry.
 * The reference is the model itself prepared with an empty cache (invariant, not a published value).
 */
import { describe, it, expect } from 'vitest';
import { prepareModel, clearMainFieldCache, type PreparedModel } from '../../../src/physics/field/model';
import type { FieldConditions } from '../../../src/physics/field/conditions';

type Input = Partial<FieldConditions> & { time: string };

/** GSM points from 1.0 to ~40 RE in every direction (deterministic). */
function points(n: number): Float64Array {
  const p = new Float64Array(3 * n);
  let seed = 97;
  const rnd = (): number => { seed = (seed * 16807) % 2147483647; return seed / 2147483647; };
  for (let i = 0; i < n; i++) {
    const r = Math.exp(Math.log(1.0) + rnd() * Math.log(40));
    const ct = 2 * rnd() - 1, ph = 2 * Math.PI * rnd(), st = Math.sqrt(1 - ct * ct);
    p[3 * i] = r * st * Math.cos(ph); p[3 * i + 1] = r * st * Math.sin(ph); p[3 * i + 2] = r * ct;
  }
  return p;
}

const PTS = points(1500);

/** Throws at the first number in which the two models differ (field, internal field, boundary, every prepared figure). */
function expectSameModel(a: PreparedModel, b: PreparedModel, what: string): void {
  const oa = new Float64Array(3), ob = new Float64Array(3);
  for (let i = 0; i < PTS.length; i += 3) {
    const x = PTS[i], y = PTS[i + 1], z = PTS[i + 2];
    a.evaluate(oa, x, y, z); b.evaluate(ob, x, y, z);
    for (let k = 0; k < 3; k++) if (!Object.is(oa[k], ob[k])) throw new Error(`${what}: B[${k}] at (${x}, ${y}, ${z}) is ${ob[k]}, fresh ${oa[k]}`);
    a.evaluateInternal(oa, x, y, z); b.evaluateInternal(ob, x, y, z);
    for (let k = 0; k < 3; k++) if (!Object.is(oa[k], ob[k])) throw new Error(`${what}: internal B[${k}] at (${x}, ${y}, ${z}) is ${ob[k]}, fresh ${oa[k]}`);
    if (a.isInside(x, y, z) !== b.isInside(x, y, z)) throw new Error(`${what}: inside test differs at (${x}, ${y}, ${z})`);
  }
  expect(b.dipole, `${what}: centred dipole`).toEqual(a.dipole);
  expect(b.compression?.rmsResidualRel, `${what}: fit residual`).toBe(a.compression?.rmsResidualRel);
  expect(b.compression?.conditionEstimate, `${what}: fit condition`).toBe(a.compression?.conditionEstimate);
  expect(b.sourceRe, `${what}: source distance`).toBe(a.sourceRe);
  expect(b.warnings, `${what}: warnings`).toEqual(a.warnings);
  expect(Array.from(b.frames.gsmFromGeo), `${what}: GSM ← GEO`).toEqual(Array.from(a.frames.gsmFromGeo));
}

const BASE: Input = { time: '2027-08-14T03:40:00Z', pdynNpa: 2, bzNt: -3, byNt: 2, tail: true };

describe('main field kept per date (model.ts): a cached preparation equals a fresh one to the bit', () => {
  for (const internal of ['igrf', 'dipole'] as const) {
    it(`${internal}: the same condition again, and a condition prepared after another one of the same date`, () => {
      const c: Input = { ...BASE, internal };
      const other: Input = { ...BASE, internal, pdynNpa: 6.5, bzNt: 4, dstNt: -80 };
      clearMainFieldCache();
      const fresh = prepareModel(c);
      clearMainFieldCache();
      const freshOther = prepareModel(other);
      const afterOther = prepareModel(c); // the date's main field comes from the cache filled by `other`
      expect(afterOther.dipole, 'the kept entry is used').toBe(freshOther.dipole);
      expectSameModel(fresh, afterOther, `${internal} after another condition`);
      expectSameModel(fresh, prepareModel(c), `${internal} same condition again`);
    });
  }

  it('instants one second apart, and more instants than the cache keeps, each get their own main field', () => {
    const times = Array.from({ length: 11 }, (_, i) => new Date(Date.parse(BASE.time) + (i === 1 ? 1000 : i * 86400e3 * 27)).toISOString());
    clearMainFieldCache();
    const fresh = times.map((time) => { clearMainFieldCache(); return prepareModel({ ...BASE, time, internal: 'igrf' }); });
    clearMainFieldCache();
    // Twice round: the second round hits the cache for the last instants and misses for the dropped first ones.
    for (let round = 0; round < 2; round++) {
      times.forEach((time, i) => expectSameModel(fresh[i], prepareModel({ ...BASE, time, internal: 'igrf' }), `${time} (round ${round})`));
    }
    expect(fresh[1].dipole.b0Nt, 'one second later the dipole differs (secular change)').not.toBe(fresh[0].dipole.b0Nt);
  });
});

import { describe, expect, it } from 'vitest';
import { createEngineApi } from '../../workers/engine-api';
import { prepareModel } from '../../src/physics/field/model';
import { pressureCorrectedDst } from '../../src/physics/field/storm-index';
import { expectClose } from '../helpers';

const C = { time: '2025-03-20T22:00:00Z', pdynNpa: 4, bzNt: -8, byNt: 0, internal: 'dipole' as const, magnetopause: true, imfEfficiency: 0.2, tail: true };
const SITE = [{ name: 'Loam Ridge', latDeg: 58, lonDeg: 12 }];

// The worker reports what its model used, so every export's metadata can carry it (storm index, its source, Dst*, speed, source distance).
describe('worker answers carry what the model used', () => {
  it('a given storm index: dstSource given, Dst* by the O\'Brien–McPherron pressure correction (references §10)', async () => {
    const api = createEngineApi();
    const r = await api.sites(1, { ...C, dstNt: -150, speedKms: 650 }, { altKm: 110, conjugateAltKm: 110 }, SITE);
    expect(r.error).toBeUndefined();
    const u = r.used!;
    expect([u.dstSource, u.dstNt, u.speedKms, u.speedSource]).toEqual(['given', -150, 650, 'given']);
    // Dst* = Dst − 7.26·√Pdyn + 11 (O'Brien & McPherron 2000): −150 − 14.52 + 11 = −153.52 nT.
    expectClose(u.dstStarNt, -153.52, 1e-9, 'Dst* for Dst −150 nT at 4 nPa');
    expectClose(u.dstStarNt, pressureCorrectedDst(-150, 4), 1e-12, 'Dst* as the engine function gives it');
    // The conjugate lies on the requested altitude surface (the tracer lands to 1e-10 RE; the reported height is geodetic, within 1 m).
    expectClose(r.sites[0].conjugate!.altKm, 110, 1e-3, 'conjugate altitude (km)');
  });

  it('no source distance in the request: the model\'s storm-following value, marked as from the conditions; a set one is reported as set', async () => {
    const api = createEngineApi();
    const follow = await api.oval(1, C, { altKm: 110, mltStepHours: 6 });
    expect(follow.used!.sourceReSet).toBe(false);
    expect(follow.used!.sourceRe).toBe(prepareModel(C).sourceRe);
    expect(follow.used!.dstSource).toBe('estimated');
    const set = await api.oval(2, C, { altKm: 110, mltStepHours: 6, sourceRe: 8 });
    expect([set.used!.sourceRe, set.used!.sourceReSet]).toEqual([8, true]);
  });

  it('the lowest boundary latitude reaches the searches: a floor above the equatorward edge leaves no edge below it', async () => {
    const api = createEngineApi();
    const storm = { ...C, pdynNpa: 10, bzNt: -20, dstNt: -250 };
    const low = await api.oval(1, storm, { altKm: 110, mltStepHours: 6, minLatDeg: 30 });
    const high = await api.oval(2, storm, { altKm: 110, mltStepHours: 6, minLatDeg: 60 });
    const midnight = (r: typeof low) => r.curves[0].equatorwardMagLatDeg[0];
    expect(midnight(low)).toBeLessThan(60);
    expect(Number.isNaN(midnight(high)) || midnight(high) >= 60).toBe(true);
  });
});
